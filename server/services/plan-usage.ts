/**
 * What a firm uses of its plan's limits (product.md, "Billing"; src/domain/subscription-state.ts,
 * `limitCheck`): active sites and staff seats. Every query names the firm (the tenant guard
 * requires it), so the operator console and the firm's own routes can both call these.
 */
import { Op, type Transaction } from 'sequelize';
import { planByKey } from '@domain/plans';
import { STAFF_ROLES } from '@domain/roles';
import { limitsFor, type PlanUsage } from '@domain/subscription-state';
import { Client } from '../models/Client';
import { Invitation } from '../models/Invitation';
import { Site } from '../models/Site';
import type { Tenant } from '../models/Tenant';
import { User } from '../models/User';

/**
 * Active sites: every site of the firm whose client is not cancelled. Marking a client who has
 * left as cancelled is how a firm frees its sites (the plan-limit message says so).
 */
export async function countActiveSites(tenantId: string, transaction?: Transaction | null): Promise<number> {
  return Site.count({
    where: { tenantId },
    include: [{ model: Client, as: 'client', required: true, attributes: [], where: { tenantId, status: { [Op.ne]: 'cancelled' } } }],
    transaction: transaction ?? null,
  });
}

/**
 * Staff seats: the firm's owner, coordinators and technicians who are not deactivated, plus the
 * staff invitations still waiting for an answer (not accepted, not revoked, not expired at
 * `now`) — an invited colleague holds a seat from the moment they are invited. Client sign-ins
 * and client invitations never take a seat.
 */
export async function countStaffSeats(tenantId: string, now: Date, transaction?: Transaction | null): Promise<number> {
  const people = await User.count({
    where: { tenantId, role: { [Op.in]: [...STAFF_ROLES] }, deactivatedAt: null },
    transaction: transaction ?? null,
  });
  const invited = await Invitation.count({
    where: { tenantId, role: { [Op.ne]: 'client' }, acceptedAt: null, revokedAt: null, expiresAt: { [Op.gt]: now } },
    transaction: transaction ?? null,
  });
  return people + invited;
}

/** Both counts for a firm at `now`. */
export async function usageOf(tenantId: string, now: Date, transaction?: Transaction | null): Promise<PlanUsage> {
  const activeSites = await countActiveSites(tenantId, transaction);
  const staffSeats = await countStaffSeats(tenantId, now, transaction);
  return { activeSites, staffSeats };
}

export interface PlanSummary {
  planKey: string | null;
  planName: string | null;
  monthlyPriceCents: number | null;
  usage: PlanUsage;
  limits: { activeSites: number; staffSeats: number; onTrial: boolean };
}

/**
 * A firm's plan, its price, and its usage against the limits that apply. A firm without a plan
 * (on trial) borrows the trial's limits (`limitsFor(null)`); a key the catalogue does not know is
 * reported as it is, without a name or price, with those same limits, rather than failing.
 */
export async function planSummaryOf(tenant: Pick<Tenant, 'id' | 'planKey'>, now: Date, transaction?: Transaction | null): Promise<PlanSummary> {
  const plan = tenant.planKey ? planByKey(tenant.planKey) : undefined;
  const limits = limitsFor(plan ? plan.key : null);
  return {
    planKey: tenant.planKey,
    planName: plan?.name ?? null,
    monthlyPriceCents: plan?.monthlyPriceCents ?? null,
    usage: await usageOf(tenant.id, now, transaction),
    // on trial means no plan chosen yet; an unknown key is not a trial, though it borrows the same limits
    limits: { activeSites: limits.activeSites, staffSeats: limits.staffSeats, onTrial: tenant.planKey === null },
  };
}
