/**
 * How a firm's subscription state follows from Stripe, when a firm becomes read-only, and the
 * plan limits on active sites and staff seats (product.md, "Billing"; architecture.md, error
 * codes `read_only` and `plan_limit_reached`).
 *
 * Dates in messages are written in US English ("March 3, 2026"), like every other date the
 * product shows (src/lib/format.ts), in the time zone the caller passes (UTC by default).
 */
import { PLANS, planByKey, type Plan } from './plans';
import type { TenantState } from './tenant-states';

const DAY_MS = 24 * 60 * 60 * 1000;

// ---------------------------------------------------------------------------------------------
// Stripe subscription status → firm state
// ---------------------------------------------------------------------------------------------

/** The subscription statuses Stripe documents (API 2025 and later). */
export const STRIPE_SUBSCRIPTION_STATUSES = [
  'trialing',
  'active',
  'past_due',
  'unpaid',
  'canceled',
  'incomplete',
  'incomplete_expired',
  'paused',
] as const;
export type StripeSubscriptionStatus = (typeof STRIPE_SUBSCRIPTION_STATUSES)[number];

export function isStripeSubscriptionStatus(status: string): status is StripeSubscriptionStatus {
  return (STRIPE_SUBSCRIPTION_STATUSES as readonly string[]).includes(status);
}

const STATE_FOR_STRIPE_STATUS: Record<StripeSubscriptionStatus, TenantState | null> = {
  trialing: 'trialing',
  active: 'active',
  past_due: 'past_due',
  // Stripe gave up retrying but keeps the subscription open: still owed, still past due.
  unpaid: 'past_due',
  canceled: 'cancelled',
  // The first payment never succeeded within Stripe's 23 hours: there never was a subscription.
  incomplete_expired: 'cancelled',
  // Stripe pauses a subscription only when its trial ends without a payment method: nothing is
  // billed, so the firm is treated as having no subscription (read-only until it chooses a plan).
  paused: 'cancelled',
  // The first payment is still being attempted (or awaits the customer's confirmation); Stripe
  // follows within 23 hours with `active` or `incomplete_expired`. It does not change the firm.
  incomplete: null,
};

/**
 * The firm state a Stripe subscription status leads to, or null when the status must not change
 * the firm's state: `incomplete` (the first payment is still in progress) and any status this
 * code does not know (a newer Stripe API version) — the caller keeps the firm's current state,
 * and can tell the two apart with `isStripeSubscriptionStatus` to log the unknown one. Nothing
 * here maps to `suspended`, which only the operator sets.
 */
export function tenantStateFromStripeStatus(status: string): TenantState | null {
  return isStripeSubscriptionStatus(status) ? STATE_FOR_STRIPE_STATUS[status] : null;
}

// ---------------------------------------------------------------------------------------------
// Read-only firms
// ---------------------------------------------------------------------------------------------

/** Days a past-due firm keeps writing before it becomes read-only (product.md: "grace period"). */
export const PAST_DUE_GRACE_DAYS = 7;

/** The instant the grace ends: exactly 7 × 24 hours after the firm became past due. */
export function graceEndsAt(pastDueSince: Date): Date {
  return new Date(pastDueSince.getTime() + PAST_DUE_GRACE_DAYS * DAY_MS);
}

export type ReadOnlyCode = 'trial_ended' | 'past_due' | 'cancelled';

export interface ReadOnlyReason {
  code: ReadOnlyCode;
  message: string;
}

export interface ReadOnlyInput {
  state: TenantState;
  trialEndsAt: Date | null;
  planKey: string | null;
  pastDueSince: Date | null;
  now: Date;
}

export interface DateWordsOptions {
  /** IANA zone the dates in messages are written in; 'UTC' unless given (pass the firm's zone). */
  timeZone?: string;
}

const STILL_HERE = 'to keep adding and changing records; everything you saved is still here.';

/** "March 3, 2026" in the given zone. */
export function formatMessageDate(at: Date, timeZone = 'UTC'): string {
  return new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'long', day: 'numeric', timeZone }).format(at);
}

/**
 * Why a firm may read but not write, or null when it may write. Read-only when:
 * - trialing, without a plan, and the trial has ended (from `trialEndsAt` itself on, as
 *   `trialDaysLeft` is 0 from that instant);
 * - past due and the grace has ended (from `graceEndsAt(pastDueSince)` itself on; the grace is
 *   the 7 × 24 hours before it). Without a known `pastDueSince` the grace cannot be measured and
 *   the firm stays writable;
 * - cancelled.
 * A suspended firm answers null: suspension stops sign-in altogether and is handled elsewhere.
 */
export function readOnlyReason(input: ReadOnlyInput, options: DateWordsOptions = {}): ReadOnlyReason | null {
  const timeZone = options.timeZone ?? 'UTC';
  const { state, now } = input;
  switch (state) {
    case 'suspended':
    case 'active':
      return null;
    case 'cancelled':
      return {
        code: 'cancelled',
        message: `Your subscription has been cancelled. Choose a plan on the Billing page ${STILL_HERE}`,
      };
    case 'trialing': {
      const { trialEndsAt, planKey } = input;
      if (planKey !== null || trialEndsAt === null || now.getTime() < trialEndsAt.getTime()) return null;
      return {
        code: 'trial_ended',
        message: `Your trial ended on ${formatMessageDate(trialEndsAt, timeZone)}. Choose a plan on the Billing page ${STILL_HERE}`,
      };
    }
    case 'past_due': {
      const { pastDueSince } = input;
      if (pastDueSince === null) return null;
      const graceEnd = graceEndsAt(pastDueSince);
      if (now.getTime() < graceEnd.getTime()) return null;
      return {
        code: 'past_due',
        message:
          `Your payment has been past due since ${formatMessageDate(pastDueSince, timeZone)} and the ` +
          `${PAST_DUE_GRACE_DAYS}-day grace period ended on ${formatMessageDate(graceEnd, timeZone)}. ` +
          `Update your payment details on the Billing page ${STILL_HERE}`,
      };
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Plan limits
// ---------------------------------------------------------------------------------------------

/** The limits that apply to a firm: a plan's own, or the ones a firm on trial borrows. */
export interface PlanLimits extends Pick<Plan, 'key' | 'name' | 'activeSites' | 'staffSeats'> {
  /** true when the firm has no plan yet and uses these limits for its trial */
  onTrial?: boolean;
}

export interface PlanUsage {
  activeSites: number;
  staffSeats: number;
}

export type LimitedResource = 'activeSites' | 'staffSeats';

export interface PlanLimitReached {
  code: 'plan_limit_reached';
  limit: LimitedResource;
  max: number;
  message: string;
}

function largestPlan(): Plan {
  return PLANS.reduce((largest, plan) => (plan.activeSites > largest.activeSites ? plan : largest));
}

/**
 * The limits for a firm's plan key. A firm on trial without a plan (null) gets the largest
 * plan's limits (Fleet), so a trial can try Mullion at full size and is never stopped by a
 * limit it would not meet on the plan it then picks. An unknown key is a programming error
 * (keys come from the catalogue) and throws a RangeError.
 */
export function limitsFor(planKey: string | null): PlanLimits {
  if (planKey === null) {
    const { key, name, activeSites, staffSeats } = largestPlan();
    return { key, name, activeSites, staffSeats, onTrial: true };
  }
  const plan = planByKey(planKey);
  if (!plan) throw new RangeError(`Unknown plan key: ${planKey}`);
  const { key, name, activeSites, staffSeats } = plan;
  return { key, name, activeSites, staffSeats, onTrial: false };
}

const numberWords = new Intl.NumberFormat('en-US');

function countOf(count: number, one: string, many: string): string {
  return `${numberWords.format(count)} ${count === 1 ? one : many}`;
}

const RESOURCE_WORDS: Record<LimitedResource, { one: string; many: string; freeOne: string }> = {
  activeSites: { one: 'active site', many: 'active sites', freeOne: 'mark a client who has left as cancelled (their sites stop counting)' },
  staffSeats: { one: 'staff seat', many: 'staff seats', freeOne: 'deactivate a staff member who has left' },
};

/** True when some plan in the catalogue allows more of the resource than `max`. */
function largerPlanExists(limit: LimitedResource, max: number): boolean {
  return PLANS.some((plan) => plan[limit] > max);
}

/**
 * Whether adding one site or one staff seat stays within the limits: null when it does, else
 * the `plan_limit_reached` error. The limit is reached when usage is at (or above) the maximum;
 * one below still allows one more. The message names the plan (or the trial), the numbers, and
 * what to do: move to a larger plan on the Billing page when one exists, or free one up.
 */
export function limitCheck(plan: PlanLimits, usage: PlanUsage, adding: 'site' | 'seat'): PlanLimitReached | null {
  const limit: LimitedResource = adding === 'site' ? 'activeSites' : 'staffSeats';
  const max = plan[limit];
  const used = usage[limit];
  if (used < max) return null;
  const words = RESOURCE_WORDS[limit];
  const whose = plan.onTrial ? 'Your trial' : `Your ${plan.name} plan`;
  const allows = `${whose} allows ${countOf(max, words.one, words.many)} and you have ${numberWords.format(used)}.`;
  const whatToDo = largerPlanExists(limit, max)
    ? `Move to a larger plan on the Billing page, or ${words.freeOne}.`
    : `That is the most any plan allows; ${words.freeOne} to add another.`;
  return { code: 'plan_limit_reached', limit, max, message: `${allows} ${whatToDo}` };
}
