import { Router } from 'express';
import { z } from 'zod';
import { operatorActionSchema } from '@domain/schemas/firm';
import { listQuery, uuid } from '@domain/schemas/common';
import { TENANT_STATES } from '@domain/tenant-states';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { requireUser } from '../../middlewares/session-guard';
import { inputOf, validate } from '../../middlewares/validate';
import { Tenant } from '../../models/Tenant';
import { User } from '../../models/User';
import { listTenants, operatorActionsOn, setTenantSuspended, staffCounts } from '../../services/operator-tenants';
import { planSummaryOf } from '../../services/plan-usage';
import { inTransaction, nowOf, pageOf, requireAbility } from '../helpers';
import { listInvoices } from '../../services/billing';

const tenantParams = z.object({ tenantId: uuid });
const tenantListQuery = listQuery.extend({ state: z.enum(TENANT_STATES, { error: 'Not a firm state.' }).optional() });

function presentOperatorTenant(tenant: Tenant, staffCount: number) {
  return {
    id: tenant.id,
    name: tenant.name,
    shortName: tenant.shortName,
    state: tenant.state,
    planKey: tenant.planKey,
    staffCount,
    trialEndsAt: tenant.trialEndsAt?.toISOString() ?? null,
    suspendedAt: tenant.suspendedAt?.toISOString() ?? null,
    suspendedReason: tenant.suspendedReason,
    createdAt: tenant.createdAt.toISOString(),
  };
}

/**
 * The operator console: firms across the service (deliberately cross-firm), firm-level
 * fields only — never a firm's client records.
 */
export function operatorRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/operator', requireUser, requireAbility('read', 'OperatorConsole'));

  router.get('/operator/tenants', validate({ query: tenantListQuery }), async (req, res) => {
    const { query } = inputOf(req, { query: tenantListQuery });
    const { rows, count } = await listTenants(query);
    const counts = await staffCounts(deps.sequelize, rows.map((r) => r.id));
    res.json({ data: rows.map((t) => presentOperatorTenant(t, counts.get(t.id) ?? 0)), page: pageOf(query.page, query.pageSize, count) });
  });

  async function loadTenant(tenantId: string): Promise<Tenant> {
    const tenant = await Tenant.findOne({ where: { id: tenantId } });
    if (!tenant) throw errors.notFound('firm');
    return tenant;
  }

  /** A firm's invoices as Stripe keeps them (none before its first checkout, or without payments set up). */
  router.get('/operator/tenants/:tenantId/invoices', validate({ params: tenantParams }), async (req, res) => {
    const { params } = inputOf(req, { params: tenantParams });
    const tenant = await loadTenant(params.tenantId);
    res.json({ data: deps.billing ? await listInvoices(tenant, deps.billing) : [] });
  });

  router.get('/operator/tenants/:tenantId', validate({ params: tenantParams }), async (req, res) => {
    const { params } = inputOf(req, { params: tenantParams });
    const tenant = await loadTenant(params.tenantId);
    const counts = await staffCounts(deps.sequelize, [tenant.id]);
    const owner = await User.findOne({ where: { tenantId: tenant.id, role: 'owner' } });
    const actions = await operatorActionsOn(tenant.id);
    const actorIds = [...new Set(actions.map((a) => a.actorId).filter((x): x is string => !!x))];
    const actors = actorIds.length ? await User.findAll({ where: { id: actorIds }, crossTenant: true }) : [];
    const actorName = new Map(actors.map((a) => [a.id, a.name]));
    const billing = await planSummaryOf(tenant, nowOf(deps));
    res.json({
      data: {
        ...presentOperatorTenant(tenant, counts.get(tenant.id) ?? 0),
        owner: owner ? { name: owner.name, email: owner.email } : null,
        billing,
        actions: actions.map((a) => ({
          id: a.id,
          action: a.action,
          at: a.createdAt.toISOString(),
          by: a.actorId ? (actorName.get(a.actorId) ?? 'Operator') : 'Operator',
          reason: typeof a.details?.reason === 'string' ? a.details.reason : null,
        })),
      },
    });
  });

  for (const verb of ['suspend', 'restore'] as const) {
    router.post(`/operator/tenants/:tenantId/${verb}`, requireAbility(verb, 'Tenant'), validate({ params: tenantParams, body: operatorActionSchema }), async (req, res) => {
      const { params, body } = inputOf(req, { params: tenantParams, body: operatorActionSchema });
      const tenant = await loadTenant(params.tenantId);
      await inTransaction(req, deps, (ctx) => setTenantSuspended(ctx, tenant, verb === 'suspend', body.reason, nowOf(deps)));
      const counts = await staffCounts(deps.sequelize, [tenant.id]);
      res.json({ data: presentOperatorTenant(tenant, counts.get(tenant.id) ?? 0) });
    });
  }

  return router;
}
