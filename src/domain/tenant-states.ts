/** Subscription state of a firm (tenant). `suspended` is set by the operator only. */
export const TENANT_STATES = ['trialing', 'active', 'past_due', 'suspended', 'cancelled'] as const;
export type TenantState = (typeof TENANT_STATES)[number];

export const TENANT_STATE_LABELS: Record<TenantState, string> = {
  trialing: 'Trial',
  active: 'Active',
  past_due: 'Past due',
  suspended: 'Suspended',
  cancelled: 'Cancelled',
};

/** Days a new firm may use Mullion before choosing a plan (product.md: 14-day trial). */
export const TRIAL_DAYS = 14;

const DAY_MS = 24 * 60 * 60 * 1000;

export function trialEndsAt(startedAt: Date, days: number = TRIAL_DAYS): Date {
  return new Date(startedAt.getTime() + days * DAY_MS);
}

/** Whole days left in a trial, never negative; a partial day counts as a day. */
export function trialDaysLeft(endsAt: Date, now: Date): number {
  const ms = endsAt.getTime() - now.getTime();
  return ms <= 0 ? 0 : Math.ceil(ms / DAY_MS);
}

/** A suspended firm's people cannot sign in and their open sessions stop working. */
export function canSignIn(state: TenantState): boolean {
  return state !== 'suspended';
}
