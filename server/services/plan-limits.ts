import { limitCheck, limitsFor } from '@domain/subscription-state';
import { requireTenantId, type Ctx } from '../context';
import { errors } from '../errors';
import { Tenant } from '../models/Tenant';
import { usageOf } from './plan-usage';

/**
 * Refuses one more active site or staff seat past the firm's plan limit: 402
 * `plan_limit_reached`, with the limit named and what to do. Runs inside the write's
 * transaction, so the count and the insert see the same rows.
 */
export async function assertWithinPlan(ctx: Ctx, adding: 'site' | 'seat', now: Date): Promise<void> {
  const tenantId = requireTenantId(ctx);
  const tenant = await Tenant.findByPk(tenantId, { transaction: ctx.transaction ?? null, attributes: ['id', 'planKey'] });
  const limits = limitsFor(tenant?.planKey ?? null);
  const usage = await usageOf(tenantId, now, ctx.transaction ?? null);
  const reached = limitCheck(limits, usage, adding);
  if (reached) throw errors.planLimitReached(reached.message, { [reached.limit]: `Limit ${reached.max}` });
}
