import { Op, QueryTypes, type Sequelize, type WhereOptions } from 'sequelize';
import type { ListQuery } from '@domain/schemas/common';
import { STAFF_ROLES } from '@domain/roles';
import type { TenantState } from '@domain/tenant-states';
import type { Ctx } from '../context';
import { errors } from '../errors';
import { AuditEvent } from '../models/AuditEvent';
import { Tenant } from '../models/Tenant';
import { recordAudit } from './audit-recorder';

const SORTABLE = { name: 'name', createdAt: 'createdAt', state: 'state', trialEndsAt: 'trialEndsAt' } as const;

/** Staff seats in use per firm (active owner, coordinators and technicians). */
export async function staffCounts(sequelize: Sequelize, tenantIds: string[]): Promise<Map<string, number>> {
  if (tenantIds.length === 0) return new Map();
  const rows = await sequelize.query<{ tenantId: string; n: number }>(
    `SELECT tenantId, COUNT(*) AS n FROM users WHERE tenantId IN (:ids) AND role IN (:roles) AND deactivatedAt IS NULL GROUP BY tenantId`,
    { replacements: { ids: tenantIds, roles: [...STAFF_ROLES] }, type: QueryTypes.SELECT },
  );
  return new Map(rows.map((r) => [r.tenantId, Number(r.n)]));
}

/** The operator's list of firms: deliberately across firms, firm-level fields only. */
export async function listTenants(query: ListQuery & { state?: TenantState | undefined }) {
  const where: WhereOptions = {};
  if (query.q) Object.assign(where, { [Op.or]: [{ name: { [Op.like]: `%${query.q}%` } }, { shortName: { [Op.like]: `%${query.q}%` } }] });
  if (query.state) Object.assign(where, { state: query.state });
  const sortKey = (query.sort ?? 'name').replace(/^-/, '');
  const column = SORTABLE[sortKey as keyof typeof SORTABLE];
  if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
  const direction = query.sort?.startsWith('-') ? 'DESC' : 'ASC';
  const { rows, count } = await Tenant.findAndCountAll({
    where,
    order: [[column, direction], ['id', 'ASC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  return { rows, count };
}

export async function setTenantSuspended(
  ctx: Ctx,
  tenant: Tenant,
  suspend: boolean,
  reason: string,
  now: Date,
): Promise<Tenant> {
  if (suspend && tenant.state === 'suspended') throw errors.conflict('This firm is already suspended.');
  if (!suspend && tenant.state !== 'suspended') throw errors.conflict('This firm is not suspended.');
  if (suspend) {
    // Open sessions stay stored: the session guard refuses each on its next request with
    // 403 firm_suspended and signs it out, so the person learns why.
    await tenant.update(
      { stateBeforeSuspension: tenant.state, state: 'suspended', suspendedAt: now, suspendedReason: reason },
      { transaction: ctx.transaction },
    );
  } else {
    const back: TenantState = tenant.stateBeforeSuspension && tenant.stateBeforeSuspension !== 'suspended' ? tenant.stateBeforeSuspension : 'active';
    await tenant.update({ state: back, stateBeforeSuspension: null, suspendedAt: null, suspendedReason: null }, { transaction: ctx.transaction });
  }
  await recordAudit(ctx, {
    action: suspend ? 'firm.suspended' : 'firm.restored',
    subjectType: 'Tenant',
    subjectId: tenant.id,
    tenantId: tenant.id,
    details: { reason, state: tenant.state },
  });
  return tenant;
}

/** The service's own actions on one firm (suspensions, restorations), newest first. */
export function operatorActionsOn(tenantId: string) {
  return AuditEvent.findAll({
    where: { tenantId, actorRole: 'operator' },
    order: [['createdAt', 'DESC']],
    limit: 50,
  });
}
