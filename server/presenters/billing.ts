import { PLANS, planByKey } from '@domain/plans';
import { graceEndsAt, limitsFor, readOnlyReason, type PlanUsage } from '@domain/subscription-state';
import { TENANT_STATE_LABELS, trialDaysLeft, type TenantState } from '@domain/tenant-states';
import type { Tenant } from '../models/Tenant';
import { hasLiveSubscription } from '../services/billing';

/** Why the firm is read-only right now, or null (the message names what to do). */
export function readOnlyOf(tenant: Tenant, now: Date) {
  return readOnlyReason(
    { state: tenant.state, trialEndsAt: tenant.trialEndsAt ?? null, planKey: tenant.planKey ?? null, pastDueSince: tenant.pastDueSince ?? null, now },
    { timeZone: tenant.timeZone },
  );
}

/** The billing page's answer: plan, state, trial and grace dates, usage against limits, the catalogue. */
export function presentBilling(tenant: Tenant, usage: PlanUsage, { now, paymentsConfigured }: { now: Date; paymentsConfigured: boolean }) {
  const plan = tenant.planKey ? planByKey(tenant.planKey) : undefined;
  const limits = limitsFor(plan ? plan.key : null);
  return {
    state: tenant.state,
    stateLabel: TENANT_STATE_LABELS[tenant.state as TenantState],
    planKey: plan?.key ?? null,
    plan: plan ? { key: plan.key, name: plan.name, monthlyPriceCents: plan.monthlyPriceCents, staffSeats: plan.staffSeats, activeSites: plan.activeSites } : null,
    trialEndsAt: tenant.trialEndsAt?.toISOString() ?? null,
    trialDaysLeft: tenant.state === 'trialing' && tenant.trialEndsAt ? trialDaysLeft(tenant.trialEndsAt, now) : null,
    pastDueSince: tenant.pastDueSince?.toISOString() ?? null,
    graceEndsAt: tenant.pastDueSince ? graceEndsAt(tenant.pastDueSince).toISOString() : null,
    currentPeriodEnd: tenant.currentPeriodEnd?.toISOString() ?? null,
    cancelAtPeriodEnd: Boolean(tenant.cancelAtPeriodEnd),
    readOnly: readOnlyOf(tenant, now),
    usage,
    limits: { activeSites: limits.activeSites, staffSeats: limits.staffSeats, onTrial: Boolean(limits.onTrial) },
    hasSubscription: hasLiveSubscription(tenant),
    paymentsConfigured,
    plans: PLANS.map((p) => ({ key: p.key, name: p.name, monthlyPriceCents: p.monthlyPriceCents, staffSeats: p.staffSeats, activeSites: p.activeSites, pitch: p.pitch })),
  };
}
export type PresentedBilling = ReturnType<typeof presentBilling>;
