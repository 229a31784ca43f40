import { describe, expect, it } from 'vitest';
import { TENANT_STATES, TRIAL_DAYS, canSignIn, trialDaysLeft, trialEndsAt } from '@domain/tenant-states';

const DAY = 24 * 60 * 60 * 1000;
const START = new Date('2025-03-01T15:30:00.000Z');

describe('trialEndsAt', () => {
  it('is 14 days after the start (product.md: 14-day trial)', () => {
    expect(TRIAL_DAYS).toBe(14);
    expect(trialEndsAt(START).toISOString()).toBe('2025-03-15T15:30:00.000Z');
  });

  it('counts whole 24-hour days in UTC, across a daylight-saving change', () => {
    // US clocks moved forward on 9 March 2025; the trial is still 14 × 24 hours.
    expect(trialEndsAt(START).getTime() - START.getTime()).toBe(14 * DAY);
  });

  it('takes another length when asked', () => {
    expect(trialEndsAt(START, 7).toISOString()).toBe('2025-03-08T15:30:00.000Z');
  });

  it('does not change the start date it was given', () => {
    const start = new Date(START);
    trialEndsAt(start);
    expect(start.toISOString()).toBe(START.toISOString());
  });
});

describe('trialDaysLeft', () => {
  const ends = trialEndsAt(START);

  it('is 14 at the very start', () => {
    expect(trialDaysLeft(ends, START)).toBe(14);
  });

  it('rounds a partial day up', () => {
    expect(trialDaysLeft(ends, new Date(START.getTime() + 1))).toBe(14);
    expect(trialDaysLeft(ends, new Date(START.getTime() + DAY))).toBe(13);
    expect(trialDaysLeft(ends, new Date(START.getTime() + DAY + 1))).toBe(13);
    expect(trialDaysLeft(ends, new Date(ends.getTime() - 1))).toBe(1);
    expect(trialDaysLeft(ends, new Date(ends.getTime() - 12 * 60 * 60 * 1000))).toBe(1);
  });

  it('is 0 at the end and never negative afterwards', () => {
    expect(trialDaysLeft(ends, ends)).toBe(0);
    expect(trialDaysLeft(ends, new Date(ends.getTime() + 1))).toBe(0);
    expect(trialDaysLeft(ends, new Date(ends.getTime() + 30 * DAY))).toBe(0);
  });
});

describe('canSignIn', () => {
  it('is false only for a suspended firm', () => {
    const answers = Object.fromEntries(TENANT_STATES.map((s) => [s, canSignIn(s)]));
    expect(answers).toEqual({
      trialing: true,
      active: true,
      past_due: true,
      suspended: false,
      cancelled: true,
    });
  });
});
