/** The operator's revenue numbers: MRR from the subscription history, firms by state, trials ending. */
import { describe, expect, it } from 'vitest';
import {
  currentMrrCents,
  firmsByState,
  monthLabel,
  mrrSeries,
  rowsInEffect,
  startOfMonthIn,
  trialsEndingWithin,
  type SubscriptionHistoryRow,
} from '@domain/service-revenue';
import type { TenantState } from '@domain/tenant-states';

function row(tenantId: string, from: string, state: TenantState, monthlyAmountCents: number, planKey: string | null = 'bench'): SubscriptionHistoryRow {
  return { tenantId, planKey, state, monthlyAmountCents, from: new Date(from) };
}

/**
 * Four firms:
 * - A: trial from 10 Jan, Bench ($49) from 24 Jan, past due from 5 Mar, cancelled from 2 Apr
 *   (the cancelled row still carries the amount: only the state decides);
 * - B: Crew ($149) from 1 Feb, Fleet ($399) from 15 Mar;
 * - C: trialing with Crew chosen from 10 Feb (Stripe trial: pays nothing yet);
 * - D: Bench from 1 Feb, suspended by the operator from 1 Mar.
 */
const HISTORY: SubscriptionHistoryRow[] = [
  row('A', '2026-01-10T09:00:00.000Z', 'trialing', 0, null),
  row('A', '2026-01-24T12:00:00.000Z', 'active', 4900),
  row('A', '2026-03-05T08:00:00.000Z', 'past_due', 4900),
  row('A', '2026-04-02T08:00:00.000Z', 'cancelled', 4900),
  row('B', '2026-02-01T00:00:00.000Z', 'active', 14900, 'crew'),
  row('B', '2026-03-15T00:00:00.000Z', 'active', 39900, 'fleet'),
  row('C', '2026-02-10T00:00:00.000Z', 'trialing', 14900, 'crew'),
  row('D', '2026-02-01T00:00:00.000Z', 'active', 4900),
  row('D', '2026-03-01T00:00:00.000Z', 'suspended', 4900),
];

describe('currentMrrCents', () => {
  it('sums active and past-due firms only (worked example computed by hand)', () => {
    // 15 Feb: A active 4900 + B active 14900 + C trialing 0 + D active 4900 = 24700
    expect(currentMrrCents(HISTORY, new Date('2026-02-15T00:00:00.000Z'))).toBe(24700);
    // 20 Mar: A past due 4900 (still counts) + B Fleet 39900 + C trialing 0 + D suspended 0 = 44800
    expect(currentMrrCents(HISTORY, new Date('2026-03-20T00:00:00.000Z'))).toBe(44800);
    // 10 Apr: A cancelled 0 + B 39900 + C 0 + D 0 = 39900
    expect(currentMrrCents(HISTORY, new Date('2026-04-10T00:00:00.000Z'))).toBe(39900);
  });

  it('is 0 before any row and for firms still on trial', () => {
    expect(currentMrrCents(HISTORY, new Date('2026-01-01T00:00:00.000Z'))).toBe(0);
    // 20 Jan: only A, trialing
    expect(currentMrrCents(HISTORY, new Date('2026-01-20T00:00:00.000Z'))).toBe(0);
    expect(currentMrrCents([], new Date('2026-01-20T00:00:00.000Z'))).toBe(0);
  });

  it('takes a row from the instant it takes effect (worked example computed by hand)', () => {
    const change = new Date('2026-03-15T00:00:00.000Z');
    // one ms before B moves to Fleet: A past due 4900 + B Crew 14900 = 19800
    expect(currentMrrCents(HISTORY, new Date(change.getTime() - 1))).toBe(19800);
    // at the instant: A 4900 + B Fleet 39900 = 44800
    expect(currentMrrCents(HISTORY, change)).toBe(44800);
  });

  it('does not depend on the order of the rows', () => {
    const at = new Date('2026-03-20T00:00:00.000Z');
    expect(currentMrrCents([...HISTORY].reverse(), at)).toBe(44800);
  });

  it('lets the later of two rows with the same instant win', () => {
    const same = '2026-02-01T00:00:00.000Z';
    const at = new Date('2026-02-02T00:00:00.000Z');
    expect(currentMrrCents([row('E', same, 'active', 4900), row('E', same, 'cancelled', 4900)], at)).toBe(0);
    expect(currentMrrCents([row('E', same, 'cancelled', 4900), row('E', same, 'active', 4900)], at)).toBe(4900);
  });
});

describe('rowsInEffect', () => {
  it('gives one row per firm: the latest that has taken effect', () => {
    const inEffect = rowsInEffect(HISTORY, new Date('2026-03-20T00:00:00.000Z'));
    const byTenant = Object.fromEntries(inEffect.map((r) => [r.tenantId, `${r.state}:${r.planKey}`]));
    expect(byTenant).toEqual({ A: 'past_due:bench', B: 'active:fleet', C: 'trialing:crew', D: 'suspended:bench' });
  });
});

describe('monthLabel', () => {
  it('writes a month as its short name and year', () => {
    expect(monthLabel('2026-03')).toBe('Mar 2026');
    expect(monthLabel('2025-09')).toBe('Sep 2025');
    expect(monthLabel('2025-12')).toBe('Dec 2025');
  });

  it('refuses what is not a month', () => {
    expect(() => monthLabel('2026-3')).toThrow(RangeError);
  });
});

describe('startOfMonthIn', () => {
  it('finds midnight on the first of the month in a zone (worked example computed by hand)', () => {
    expect(startOfMonthIn(2026, 2, 'UTC').toISOString()).toBe('2026-03-01T00:00:00.000Z');
    // Chicago is UTC−6 in winter (CST) and UTC−5 in summer (CDT, from 8 March 2026)
    expect(startOfMonthIn(2026, 2, 'America/Chicago').toISOString()).toBe('2026-03-01T06:00:00.000Z');
    expect(startOfMonthIn(2026, 3, 'America/Chicago').toISOString()).toBe('2026-04-01T05:00:00.000Z');
    // London is UTC+1 in April (BST)
    expect(startOfMonthIn(2026, 3, 'Europe/London').toISOString()).toBe('2026-03-31T23:00:00.000Z');
    // month 12 of 2025 is January 2026
    expect(startOfMonthIn(2025, 12, 'UTC').toISOString()).toBe('2026-01-01T00:00:00.000Z');
  });
});

describe('mrrSeries', () => {
  it('gives the MRR at the end of each month, the current one measured at `end` (worked example computed by hand)', () => {
    expect(mrrSeries(HISTORY, { months: 4, end: new Date('2026-04-10T12:00:00.000Z') })).toEqual([
      // 31 Jan 23:59:59.999: A active 4900
      { month: '2026-01', label: 'Jan 2026', mrrCents: 4900 },
      // end of Feb: A 4900 + B 14900 + C 0 + D 4900 = 24700
      { month: '2026-02', label: 'Feb 2026', mrrCents: 24700 },
      // end of Mar: A past due 4900 + B Fleet 39900 + D suspended 0 = 44800
      { month: '2026-03', label: 'Mar 2026', mrrCents: 44800 },
      // 10 Apr 12:00: A cancelled 0 + B 39900 = 39900
      { month: '2026-04', label: 'Apr 2026', mrrCents: 39900 },
    ]);
  });

  it('measures the current month at `end`, not at the end of the month', () => {
    const rows = [row('G', '2026-03-01T00:00:00.000Z', 'active', 1000), row('H', '2026-03-20T00:00:00.000Z', 'active', 2000)];
    const series = mrrSeries(rows, { months: 1, end: new Date('2026-03-10T00:00:00.000Z') });
    expect(series).toEqual([{ month: '2026-03', label: 'Mar 2026', mrrCents: 1000 }]);
  });

  it('counts months back across a year boundary, oldest first', () => {
    const series = mrrSeries([], { months: 4, end: new Date('2026-02-10T00:00:00.000Z') });
    expect(series.map((p) => [p.month, p.label])).toEqual([
      ['2025-11', 'Nov 2025'],
      ['2025-12', 'Dec 2025'],
      ['2026-01', 'Jan 2026'],
      ['2026-02', 'Feb 2026'],
    ]);
  });

  it('gives 12 months unless asked otherwise', () => {
    const series = mrrSeries(HISTORY, { end: new Date('2026-02-10T00:00:00.000Z') });
    expect(series).toHaveLength(12);
    expect(series[0]?.month).toBe('2025-03');
    expect(series[11]?.month).toBe('2026-02');
  });

  it('ends each month at midnight in the zone asked for (worked example computed by hand)', () => {
    const rows = [
      // 03:00 UTC on 1 March is 21:00 on 28 February in Chicago
      row('E', '2026-03-01T03:00:00.000Z', 'active', 10000),
      // 06:00 UTC on 1 March is midnight starting 1 March in Chicago: March, not February
      row('F', '2026-03-01T06:00:00.000Z', 'active', 500),
    ];
    const end = new Date('2026-03-10T00:00:00.000Z');
    expect(mrrSeries(rows, { months: 2, end }).map((p) => p.mrrCents)).toEqual([0, 10500]);
    expect(mrrSeries(rows, { months: 2, end, timeZone: 'UTC' }).map((p) => p.mrrCents)).toEqual([0, 10500]);
    expect(mrrSeries(rows, { months: 2, end, timeZone: 'America/Chicago' }).map((p) => p.mrrCents)).toEqual([10000, 10500]);
  });

  it('takes the current month from `end` in the zone asked for', () => {
    // 1 March 03:00 UTC is still February in Chicago
    const end = new Date('2026-03-01T03:00:00.000Z');
    expect(mrrSeries([], { months: 1, end })[0]?.month).toBe('2026-03');
    expect(mrrSeries([], { months: 1, end, timeZone: 'America/Chicago' })[0]?.month).toBe('2026-02');
  });
});

describe('firmsByState', () => {
  it('counts every state, with zeros', () => {
    expect(firmsByState(['active', 'active', 'trialing', 'past_due'])).toEqual({
      trialing: 1,
      active: 2,
      past_due: 1,
      suspended: 0,
      cancelled: 0,
    });
    expect(firmsByState([])).toEqual({ trialing: 0, active: 0, past_due: 0, suspended: 0, cancelled: 0 });
  });
});

describe('trialsEndingWithin', () => {
  const now = new Date('2026-03-01T12:00:00.000Z');
  const firm = (id: string, state: TenantState, trialEndsAt: string | null) => ({
    id,
    name: `Firm ${id}`,
    state,
    trialEndsAt: trialEndsAt === null ? null : new Date(trialEndsAt),
  });
  const firms = [
    firm('exactly-7-days', 'trialing', '2026-03-08T12:00:00.000Z'),
    firm('7-days-and-1ms', 'trialing', '2026-03-08T12:00:00.001Z'),
    firm('ended-1s-ago', 'trialing', '2026-03-01T11:59:59.000Z'),
    firm('ends-now', 'trialing', '2026-03-01T12:00:00.000Z'),
    firm('active', 'active', '2026-03-02T00:00:00.000Z'),
    firm('no-end', 'trialing', null),
    firm('in-36-hours', 'trialing', '2026-03-03T00:00:00.000Z'),
  ];

  it('lists trials ending after now and within 7 days (that instant included), soonest first', () => {
    expect(trialsEndingWithin(firms, now).map((f) => f.id)).toEqual(['in-36-hours', 'exactly-7-days']);
  });

  it('takes another window and keeps the firms as given', () => {
    expect(trialsEndingWithin(firms, now, 1)).toEqual([]);
    const within2 = trialsEndingWithin(firms, now, 2);
    expect(within2).toHaveLength(1);
    expect(within2[0]?.name).toBe('Firm in-36-hours');
  });
});
