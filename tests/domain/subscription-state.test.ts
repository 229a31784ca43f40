/** Subscription state: Stripe status → firm state, read-only firms, plan limits. */
import { describe, expect, it } from 'vitest';
import { PLANS, planByKey, type Plan } from '@domain/plans';
import {
  PAST_DUE_GRACE_DAYS,
  STRIPE_SUBSCRIPTION_STATUSES,
  graceEndsAt,
  isStripeSubscriptionStatus,
  limitCheck,
  limitsFor,
  readOnlyReason,
  tenantStateFromStripeStatus,
  type ReadOnlyInput,
} from '@domain/subscription-state';

const SECOND = 1000;
const DAY = 24 * 60 * 60 * SECOND;

function plan(key: string): Plan {
  const found = planByKey(key);
  if (!found) throw new Error(`test setup: no plan ${key}`);
  return found;
}

describe('tenantStateFromStripeStatus', () => {
  it('maps every Stripe subscription status', () => {
    const mapped = Object.fromEntries(STRIPE_SUBSCRIPTION_STATUSES.map((s) => [s, tenantStateFromStripeStatus(s)]));
    expect(mapped).toEqual({
      trialing: 'trialing',
      active: 'active',
      past_due: 'past_due',
      unpaid: 'past_due',
      canceled: 'cancelled',
      incomplete: null,
      incomplete_expired: 'cancelled',
      paused: 'cancelled',
    });
  });

  it('answers null (keep the firm state) for a status it does not know', () => {
    expect(tenantStateFromStripeStatus('frozen')).toBeNull();
    expect(tenantStateFromStripeStatus('')).toBeNull();
    // Stripe statuses are lower case; anything else is not one of them.
    expect(tenantStateFromStripeStatus('Active')).toBeNull();
    // American spelling is Stripe's; the firm state spelling is not a Stripe status.
    expect(tenantStateFromStripeStatus('cancelled')).toBeNull();
  });

  it('lets the caller tell "incomplete" (known, no change) from an unknown status', () => {
    expect(isStripeSubscriptionStatus('incomplete')).toBe(true);
    expect(isStripeSubscriptionStatus('frozen')).toBe(false);
  });

  it('never leads to suspended, which only the operator sets', () => {
    for (const status of STRIPE_SUBSCRIPTION_STATUSES) expect(tenantStateFromStripeStatus(status), status).not.toBe('suspended');
  });
});

describe('graceEndsAt', () => {
  it('is 7 × 24 hours after the firm became past due', () => {
    expect(PAST_DUE_GRACE_DAYS).toBe(7);
    const since = new Date('2026-03-03T10:00:00.000Z');
    // worked example computed by hand: 3 March 10:00 UTC + 7 days = 10 March 10:00 UTC
    expect(graceEndsAt(since).toISOString()).toBe('2026-03-10T10:00:00.000Z');
    expect(since.toISOString()).toBe('2026-03-03T10:00:00.000Z');
  });
});

describe('readOnlyReason', () => {
  const TRIAL_END = new Date('2026-03-03T15:30:00.000Z');
  const PAST_DUE_SINCE = new Date('2026-03-03T10:00:00.000Z');
  const LONG_AGO = new Date('2025-01-01T00:00:00.000Z');

  function input(overrides: Partial<ReadOnlyInput>): ReadOnlyInput {
    return { state: 'trialing', trialEndsAt: TRIAL_END, planKey: null, pastDueSince: null, now: new Date('2026-03-01T00:00:00.000Z'), ...overrides };
  }

  describe('trial', () => {
    it('is writable until the trial ends', () => {
      expect(readOnlyReason(input({ now: new Date(TRIAL_END.getTime() - 1) }))).toBeNull();
    });

    it('is read-only one second after the trial ended, telling the owner to choose a plan on the Billing page', () => {
      expect(readOnlyReason(input({ now: new Date(TRIAL_END.getTime() + SECOND) }))).toEqual({
        code: 'trial_ended',
        message:
          'Your trial ended on March 3, 2026. Choose a plan on the Billing page to keep adding and changing records; everything you saved is still here.',
      });
    });

    it('is read-only from the instant the trial ends (trialDaysLeft is 0 then)', () => {
      expect(readOnlyReason(input({ now: TRIAL_END }))?.code).toBe('trial_ended');
    });

    it('stays writable after the trial when a plan has been chosen', () => {
      expect(readOnlyReason(input({ planKey: 'crew', now: new Date(TRIAL_END.getTime() + 30 * DAY) }))).toBeNull();
    });

    it('stays writable when no trial end is known', () => {
      expect(readOnlyReason(input({ trialEndsAt: null, now: new Date('2030-01-01T00:00:00.000Z') }))).toBeNull();
    });

    it('writes the end date in the time zone asked for, UTC by default', () => {
      // worked example computed by hand: 02:00 UTC on 4 March is 20:00 on 3 March in Chicago (CST, UTC−6; US daylight time starts 8 March 2026).
      const lateUtc = input({ trialEndsAt: new Date('2026-03-04T02:00:00.000Z'), now: new Date('2026-03-05T00:00:00.000Z') });
      expect(readOnlyReason(lateUtc)?.message).toContain('ended on March 4, 2026.');
      expect(readOnlyReason(lateUtc, { timeZone: 'UTC' })?.message).toContain('ended on March 4, 2026.');
      expect(readOnlyReason(lateUtc, { timeZone: 'America/Chicago' })?.message).toContain('ended on March 3, 2026.');
    });
  });

  describe('past due', () => {
    // worked example computed by hand: past due since 3 March 2026 10:00 UTC + 7 × 24 h = 10 March 2026 10:00 UTC
    const graceEnd = new Date('2026-03-10T10:00:00.000Z');

    it('is writable during the 7-day grace, up to its last millisecond', () => {
      expect(readOnlyReason(input({ state: 'past_due', pastDueSince: PAST_DUE_SINCE, now: PAST_DUE_SINCE }))).toBeNull();
      expect(readOnlyReason(input({ state: 'past_due', pastDueSince: PAST_DUE_SINCE, now: new Date(graceEnd.getTime() - 1) }))).toBeNull();
    });

    it('is read-only exactly 7 days after it became past due, telling the owner to update payment on the Billing page', () => {
      expect(readOnlyReason(input({ state: 'past_due', pastDueSince: PAST_DUE_SINCE, now: graceEnd }))).toEqual({
        code: 'past_due',
        message:
          'Your payment has been past due since March 3, 2026 and the 7-day grace period ended on March 10, 2026. ' +
          'Update your payment details on the Billing page to keep adding and changing records; everything you saved is still here.',
      });
    });

    it('stays writable when it is not known since when the firm is past due', () => {
      expect(readOnlyReason(input({ state: 'past_due', pastDueSince: null, now: new Date('2030-01-01T00:00:00.000Z') }))).toBeNull();
    });
  });

  it('is read-only when cancelled, whatever the plan and dates', () => {
    const expected = {
      code: 'cancelled',
      message: 'Your subscription has been cancelled. Choose a plan on the Billing page to keep adding and changing records; everything you saved is still here.',
    };
    expect(readOnlyReason(input({ state: 'cancelled', planKey: 'fleet', trialEndsAt: null }))).toEqual(expected);
    expect(readOnlyReason(input({ state: 'cancelled', trialEndsAt: new Date('2030-01-01T00:00:00.000Z') }))).toEqual(expected);
  });

  it('answers null for a suspended firm even when its trial ended and it is long past due', () => {
    expect(readOnlyReason(input({ state: 'suspended', trialEndsAt: LONG_AGO, pastDueSince: LONG_AGO, now: new Date('2026-03-20T00:00:00.000Z') }))).toBeNull();
  });

  it('answers null for an active firm', () => {
    expect(readOnlyReason(input({ state: 'active', planKey: 'bench', trialEndsAt: LONG_AGO, now: new Date('2026-03-20T00:00:00.000Z') }))).toBeNull();
  });
});

describe('limitsFor', () => {
  it('gives a plan its own limits', () => {
    expect(limitsFor('bench')).toEqual({ key: 'bench', name: 'Bench', activeSites: 75, staffSeats: 3, onTrial: false });
    expect(limitsFor('crew')).toMatchObject({ activeSites: 400, staffSeats: 10, onTrial: false });
  });

  it('gives a firm on trial without a plan the largest plan’s limits (Fleet)', () => {
    expect(limitsFor(null)).toEqual({ key: 'fleet', name: 'Fleet', activeSites: 2000, staffSeats: 40, onTrial: true });
    const largest = Math.max(...PLANS.map((p) => p.activeSites));
    expect(limitsFor(null).activeSites).toBe(largest);
  });

  it('refuses a plan key that is not in the catalogue', () => {
    expect(() => limitsFor('enterprise')).toThrow(RangeError);
  });
});

describe('limitCheck', () => {
  const bench = plan('bench');

  it('allows the last site one below the maximum and refuses at the maximum', () => {
    expect(limitCheck(bench, { activeSites: 74, staffSeats: 0 }, 'site')).toBeNull();
    expect(limitCheck(bench, { activeSites: 75, staffSeats: 0 }, 'site')).toEqual({
      code: 'plan_limit_reached',
      limit: 'activeSites',
      max: 75,
      message:
        'Your Bench plan allows 75 active sites and you have 75. Move to a larger plan on the Billing page, or mark a client who has left as cancelled (their sites stop counting).',
    });
  });

  it('does the same for staff seats', () => {
    expect(limitCheck(bench, { activeSites: 0, staffSeats: 2 }, 'seat')).toBeNull();
    expect(limitCheck(bench, { activeSites: 0, staffSeats: 3 }, 'seat')).toEqual({
      code: 'plan_limit_reached',
      limit: 'staffSeats',
      max: 3,
      message:
        'Your Bench plan allows 3 staff seats and you have 3. Move to a larger plan on the Billing page, or deactivate a staff member who has left.',
    });
  });

  it('looks only at what is being added', () => {
    expect(limitCheck(bench, { activeSites: 10, staffSeats: 3 }, 'site')).toBeNull();
    expect(limitCheck(bench, { activeSites: 75, staffSeats: 1 }, 'seat')).toBeNull();
  });

  it('refuses, with the real count, a firm already over its limit (after moving to a smaller plan)', () => {
    expect(limitCheck(bench, { activeSites: 80, staffSeats: 0 }, 'site')?.message).toContain('allows 75 active sites and you have 80.');
  });

  it('does not suggest a larger plan when none allows more, and groups thousands', () => {
    expect(limitCheck(plan('fleet'), { activeSites: 2000, staffSeats: 0 }, 'site')?.message).toBe(
      'Your Fleet plan allows 2,000 active sites and you have 2,000. That is the most any plan allows; mark a client who has left as cancelled (their sites stop counting) to add another.',
    );
    expect(limitCheck(plan('crew'), { activeSites: 400, staffSeats: 0 }, 'site')?.message).toContain('Move to a larger plan on the Billing page');
  });

  it('speaks of the trial for a firm without a plan, with the Fleet limits', () => {
    const trial = limitsFor(null);
    expect(limitCheck(trial, { activeSites: 1999, staffSeats: 39 }, 'site')).toBeNull();
    expect(limitCheck(trial, { activeSites: 1999, staffSeats: 39 }, 'seat')).toBeNull();
    expect(limitCheck(trial, { activeSites: 0, staffSeats: 40 }, 'seat')).toEqual({
      code: 'plan_limit_reached',
      limit: 'staffSeats',
      max: 40,
      message: 'Your trial allows 40 staff seats and you have 40. That is the most any plan allows; deactivate a staff member who has left to add another.',
    });
  });

  it('takes the limits from limitsFor for a chosen plan the same as from the plan itself', () => {
    const usage = { activeSites: 75, staffSeats: 3 };
    expect(limitCheck(limitsFor('bench'), usage, 'site')).toEqual(limitCheck(bench, usage, 'site'));
    expect(limitCheck(limitsFor('bench'), usage, 'seat')).toEqual(limitCheck(bench, usage, 'seat'));
  });
});
