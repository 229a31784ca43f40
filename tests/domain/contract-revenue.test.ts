/** A firm's numbers from its client monitoring contracts: RMR, starts, cancellations, attrition, renewals. */
import { format, addMonths as dateFnsAddMonths } from 'date-fns';
import { describe, expect, it } from 'vitest';
import {
  activeContractCount,
  addMonthsToDate,
  attritionRate,
  contractsCancelledBetween,
  contractsStartedBetween,
  currentTermEndsOn,
  isContractActiveOn,
  monthlyRevenueSeries,
  recurringMonthlyRevenueCents,
  renewalsDueWithin,
  type MonitoringContract,
} from '@domain/contract-revenue';

type TestContract = MonitoringContract & { id: string };

function contract(id: string, fields: Partial<MonitoringContract>): TestContract {
  return { id, startsOn: null, termMonths: null, monthlyFeeCents: null, cancelledOn: null, ...fields };
}

function ids(contracts: readonly { id: string }[]): string[] {
  return contracts.map((c) => c.id);
}

/** `count` contracts alike, ids prefix-1, prefix-2, … */
function many(count: number, prefix: string, fields: Partial<MonitoringContract>): TestContract[] {
  return Array.from({ length: count }, (_, i) => contract(`${prefix}-${i + 1}`, fields));
}

describe('addMonthsToDate', () => {
  it('keeps the day, or takes the last day of a shorter month (worked example computed by hand)', () => {
    expect(addMonthsToDate('2026-01-31', 1)).toBe('2026-02-28');
    expect(addMonthsToDate('2028-01-31', 1)).toBe('2028-02-29');
    expect(addMonthsToDate('2026-01-31', 2)).toBe('2026-03-31');
    expect(addMonthsToDate('2026-03-31', -1)).toBe('2026-02-28');
    expect(addMonthsToDate('2025-12-15', 1)).toBe('2026-01-15');
    expect(addMonthsToDate('2026-03-15', -12)).toBe('2025-03-15');
    expect(addMonthsToDate('2024-02-29', 12)).toBe('2025-02-28');
  });

  it('agrees with date-fns addMonths', () => {
    const dates = ['2026-01-31', '2026-03-31', '2024-02-29', '2025-12-31', '2026-05-15', '2026-08-30'];
    for (const date of dates) {
      const [y, m, d] = date.split('-').map(Number) as [number, number, number];
      for (const months of [-25, -13, -1, 1, 2, 11, 12, 13, 36]) {
        const expected = format(dateFnsAddMonths(new Date(y, m - 1, d), months), 'yyyy-MM-dd');
        expect(addMonthsToDate(date, months), `${date} + ${months}`).toBe(expected);
      }
    }
  });

  it('refuses what is not a calendar date', () => {
    expect(() => addMonthsToDate('2026-02-30', 1)).toThrow(RangeError);
    expect(() => addMonthsToDate('2026-13-01', 1)).toThrow(RangeError);
    expect(() => addMonthsToDate('26-01-01', 1)).toThrow(RangeError);
  });
});

describe('isContractActiveOn', () => {
  const c = contract('c', { startsOn: '2026-01-10', cancelledOn: '2026-03-01', monthlyFeeCents: 3000 });

  it('is in force from its start day up to the day before it is cancelled', () => {
    expect(isContractActiveOn(c, '2026-01-09')).toBe(false);
    expect(isContractActiveOn(c, '2026-01-10')).toBe(true);
    expect(isContractActiveOn(c, '2026-02-28')).toBe(true);
    expect(isContractActiveOn(c, '2026-03-01')).toBe(false);
  });

  it('is not a contract without a start date, and stays in force without a fee or cancellation', () => {
    expect(isContractActiveOn(contract('x', { monthlyFeeCents: 3000 }), '2026-01-10')).toBe(false);
    expect(isContractActiveOn(contract('y', { startsOn: '2020-01-01' }), '2030-01-01')).toBe(true);
  });
});

describe('recurringMonthlyRevenueCents', () => {
  const contracts = [
    contract('a', { startsOn: '2025-06-01', monthlyFeeCents: 3000 }),
    contract('b', { startsOn: '2025-09-15', monthlyFeeCents: 4500, cancelledOn: '2026-02-01' }),
    contract('c-no-fee', { startsOn: '2026-01-05', monthlyFeeCents: null }),
    contract('d-future', { startsOn: '2026-04-01', monthlyFeeCents: 2500 }),
    contract('e-no-start', { monthlyFeeCents: 9900 }),
    contract('f', { startsOn: '2024-01-01', monthlyFeeCents: 3995, cancelledOn: '2026-03-15' }),
  ];

  it('sums the fees of contracts in force; a missing fee counts as a contract with 0 (worked example computed by hand)', () => {
    // 15 Mar 2026: a 3000 + c 0 (f is cancelled that day) = 3000 from 2 contracts
    expect(recurringMonthlyRevenueCents(contracts, '2026-03-15')).toBe(3000);
    expect(activeContractCount(contracts, '2026-03-15')).toBe(2);
    // 14 Mar 2026: a 3000 + c 0 + f 3995 = 6995 from 3 contracts
    expect(recurringMonthlyRevenueCents(contracts, '2026-03-14')).toBe(6995);
    expect(activeContractCount(contracts, '2026-03-14')).toBe(3);
    // 31 Jan 2026: a 3000 + b 4500 + c 0 + f 3995 = 11495 from 4 contracts
    expect(recurringMonthlyRevenueCents(contracts, '2026-01-31')).toBe(11495);
    expect(activeContractCount(contracts, '2026-01-31')).toBe(4);
  });

  it('is 0 with no contracts', () => {
    expect(recurringMonthlyRevenueCents([], '2026-03-15')).toBe(0);
  });

  describe('contractsStartedBetween / contractsCancelledBetween', () => {
    it('includes the from day and excludes the to day', () => {
      expect(ids(contractsStartedBetween(contracts, '2025-09-15', '2026-01-05'))).toEqual(['b']);
      expect(ids(contractsStartedBetween(contracts, '2025-09-15', '2026-01-06'))).toEqual(['b', 'c-no-fee']);
      expect(ids(contractsCancelledBetween(contracts, '2026-02-01', '2026-03-15'))).toEqual(['b']);
      expect(ids(contractsCancelledBetween(contracts, '2026-02-02', '2026-03-16'))).toEqual(['f']);
    });

    it('ignores a cancellation date on a contract that never started', () => {
      const noStart = [contract('g', { cancelledOn: '2026-02-10' })];
      expect(contractsCancelledBetween(noStart, '2026-01-01', '2026-12-31')).toEqual([]);
      expect(contractsStartedBetween(noStart, '2000-01-01', '2100-01-01')).toEqual([]);
    });
  });
});

describe('attritionRate', () => {
  it('divides cancellations by the average in force (worked example computed by hand)', () => {
    // Period: the 12 months to 15 Mar 2026, opening count on 15 Mar 2025.
    const contracts = [
      // 8 in force throughout; one without a fee still counts as a contract
      ...many(7, 'steady', { startsOn: '2024-01-01', monthlyFeeCents: 3000 }),
      contract('steady-no-fee', { startsOn: '2024-01-01' }),
      // 2 in force at the start and cancelled in the period, one on its last day
      contract('lost-in-august', { startsOn: '2024-06-01', monthlyFeeCents: 3000, cancelledOn: '2025-08-01' }),
      contract('lost-on-period-end', { startsOn: '2024-06-01', monthlyFeeCents: 3000, cancelledOn: '2026-03-15' }),
      // 4 new in the period, in force at the end
      ...many(4, 'new', { startsOn: '2025-05-01', monthlyFeeCents: 3500 }),
      // gone on the opening day itself: neither in the opening count nor cancelled in the period
      contract('gone-on-period-start', { startsOn: '2023-01-01', monthlyFeeCents: 3000, cancelledOn: '2025-03-15' }),
      // starts after the period; never started
      contract('starts-tomorrow', { startsOn: '2026-03-16', monthlyFeeCents: 3000 }),
      contract('no-start', { cancelledOn: '2025-10-01' }),
    ];
    // start: 8 + 2 = 10; end: 8 + 4 = 12; cancelled 2; average (10 + 12) / 2 = 11; 2 / 11 = 0.1818… (18.18 %)
    const result = attritionRate(contracts, { periodEnd: '2026-03-15', months: 12 });
    expect(result).toEqual({
      periodStart: '2025-03-15',
      periodEnd: '2026-03-15',
      cancelled: 2,
      activeAtStart: 10,
      activeAtEnd: 12,
      averageActive: 11,
      rate: 2 / 11,
    });
    expect(Math.round((result.rate ?? 0) * 10000) / 100).toBe(18.18);
  });

  it('treats cancellations on the period boundaries consistently (worked example computed by hand)', () => {
    const contracts = [
      contract('x-cancelled-on-start', { startsOn: '2024-01-01', cancelledOn: '2025-03-15' }),
      contract('y-cancelled-day-after-start', { startsOn: '2024-01-01', cancelledOn: '2025-03-16' }),
      contract('z-cancelled-on-end', { startsOn: '2024-01-01', cancelledOn: '2026-03-15' }),
      contract('w-cancelled-day-after-end', { startsOn: '2024-01-01', cancelledOn: '2026-03-16' }),
    ];
    // in force on 15 Mar 2025: y, z, w = 3; on 15 Mar 2026: w = 1; cancelled in the period: y, z = 2
    // average (3 + 1) / 2 = 2; rate 2 / 2 = 1 — and 3 at start − 2 cancelled + 0 started = 1 at end
    expect(attritionRate(contracts, { periodEnd: '2026-03-15' })).toMatchObject({
      cancelled: 2,
      activeAtStart: 3,
      activeAtEnd: 1,
      averageActive: 2,
      rate: 1,
    });
  });

  it('counts a contract that starts and is cancelled inside the period as cancelled only (worked example computed by hand)', () => {
    const contracts = [
      ...many(4, 'steady', { startsOn: '2024-01-01', monthlyFeeCents: 3000 }),
      contract('short-lived', { startsOn: '2025-06-01', monthlyFeeCents: 3000, cancelledOn: '2025-11-01' }),
    ];
    // start 4, end 4, cancelled 1; average 4; 1 / 4 = 0.25
    expect(attritionRate(contracts, { periodEnd: '2026-03-15' })).toMatchObject({
      cancelled: 1,
      activeAtStart: 4,
      activeAtEnd: 4,
      averageActive: 4,
      rate: 0.25,
    });
  });

  it('has no rate when nothing was in force at either end', () => {
    expect(attritionRate([], { periodEnd: '2026-03-15' })).toMatchObject({ cancelled: 0, averageActive: 0, rate: null });
    // one short-lived contract: 1 cancelled, but 0 in force at start and end — not a division by zero
    const shortLived = [contract('short-lived', { startsOn: '2025-06-01', cancelledOn: '2025-11-01' })];
    expect(attritionRate(shortLived, { periodEnd: '2026-03-15' })).toMatchObject({ cancelled: 1, averageActive: 0, rate: null });
  });

  it('takes a shorter period, counting months back from the end day with month-end rules', () => {
    // worked example computed by hand: 31 May − 3 months = 28 Feb 2026
    const contracts = [
      contract('a', { startsOn: '2026-01-01' }),
      contract('b', { startsOn: '2026-01-01', cancelledOn: '2026-03-01' }),
      contract('c', { startsOn: '2026-01-01', cancelledOn: '2026-02-28' }),
    ];
    // in force on 28 Feb: a, b = 2; on 31 May: a = 1; cancelled after 28 Feb up to 31 May: b = 1
    // average (2 + 1) / 2 = 1.5; 1 / 1.5 = 0.6667
    const result = attritionRate(contracts, { periodEnd: '2026-05-31', months: 3 });
    expect(result).toMatchObject({ periodStart: '2026-02-28', cancelled: 1, activeAtStart: 2, activeAtEnd: 1, averageActive: 1.5 });
    expect(result.rate).toBeCloseTo(2 / 3, 10);
  });
});

describe('currentTermEndsOn', () => {
  it('is the first term end strictly after today, each counted from the start (worked example computed by hand)', () => {
    const monthly = contract('m', { startsOn: '2025-01-31', termMonths: 1 });
    // 31 Jan 2025 + 13 months = 28 Feb 2026 (2026 is not a leap year)
    expect(currentTermEndsOn(monthly, '2026-02-01')).toBe('2026-02-28');
    // on the renewal day the next term is already running: + 14 months = 31 Mar, not 28 Mar
    expect(currentTermEndsOn(monthly, '2026-02-28')).toBe('2026-03-31');
    expect(currentTermEndsOn(monthly, '2026-03-31')).toBe('2026-04-30');
  });

  it('handles a leap-day start on yearly terms (worked example computed by hand)', () => {
    const leap = contract('l', { startsOn: '2024-02-29', termMonths: 12 });
    expect(currentTermEndsOn(leap, '2025-01-10')).toBe('2025-02-28');
    expect(currentTermEndsOn(leap, '2027-06-01')).toBe('2028-02-29');
  });

  it('is the first term end for a contract that has not started, and null without a start or term', () => {
    expect(currentTermEndsOn(contract('f', { startsOn: '2026-05-10', termMonths: 12 }), '2026-01-01')).toBe('2027-05-10');
    expect(currentTermEndsOn(contract('n', { startsOn: '2026-01-01' }), '2026-02-01')).toBeNull();
    expect(currentTermEndsOn(contract('s', { termMonths: 12 }), '2026-02-01')).toBeNull();
  });

  it('finds the term of a long-running contract', () => {
    // 1 Mar 2000 + 26 × 12 months = 1 Mar 2026
    expect(currentTermEndsOn(contract('old', { startsOn: '2000-03-01', termMonths: 12 }), '2026-01-15')).toBe('2026-03-01');
  });
});

describe('renewalsDueWithin', () => {
  // today 15 Jan 2026, window 90 days → up to 15 Apr 2026 inclusive
  const today = '2026-01-15';
  const contracts = [
    contract('r3-beyond-window', { startsOn: '2025-06-10', termMonths: 12, monthlyFeeCents: 3000 }),
    contract('r2-36-months', { startsOn: '2023-03-01', termMonths: 36, monthlyFeeCents: 3000 }),
    contract('r1-monthly-month-end', { startsOn: '2025-01-31', termMonths: 1, monthlyFeeCents: 2500 }),
    contract('r4-no-term', { startsOn: '2025-02-01', monthlyFeeCents: 3000 }),
    contract('r5-cancelled', { startsOn: '2025-02-01', termMonths: 12, cancelledOn: '2025-12-01' }),
    contract('r6-cancelled-on-renewal', { startsOn: '2025-04-01', termMonths: 12, cancelledOn: '2026-04-01' }),
    contract('r7-last-day-of-window', { startsOn: '2025-04-15', termMonths: 12 }),
    contract('r8-day-after-window', { startsOn: '2025-04-16', termMonths: 12 }),
    contract('r9-renewed-today', { startsOn: '2025-01-15', termMonths: 12 }),
    contract('r10-not-started', { startsOn: '2026-02-01', termMonths: 1 }),
    contract('r11-no-fee', { startsOn: '2025-02-20', termMonths: 12, monthlyFeeCents: null }),
  ];

  it('lists contracts in force whose current term ends within the window, soonest first (worked example computed by hand)', () => {
    expect(renewalsDueWithin(contracts, today, 90).map((c) => [c.id, c.renewsOn])).toEqual([
      ['r1-monthly-month-end', '2026-01-31'], // 31 Jan 2025 + 12 months
      ['r11-no-fee', '2026-02-20'], // 20 Feb 2025 + 12 months
      ['r2-36-months', '2026-03-01'], // 1 Mar 2023 + 36 months
      ['r7-last-day-of-window', '2026-04-15'], // 15 Apr 2025 + 12 months = 15 Jan + 90 days
    ]);
  });

  it('looks 90 days ahead unless asked otherwise', () => {
    // 15 Apr 2026 (r7) is the 90th day after 15 Jan; 89 days reach 14 Apr only
    expect(ids(renewalsDueWithin(contracts, today))).toEqual(['r1-monthly-month-end', 'r11-no-fee', 'r2-36-months', 'r7-last-day-of-window']);
    expect(ids(renewalsDueWithin(contracts, today, 89))).toEqual(['r1-monthly-month-end', 'r11-no-fee', 'r2-36-months']);
    // worked example computed by hand: 15 Jan + 36 days = 20 Feb (16 days to 31 Jan, 20 more), + 35 days = 19 Feb
    expect(ids(renewalsDueWithin(contracts, today, 36))).toEqual(['r1-monthly-month-end', 'r11-no-fee']);
    expect(ids(renewalsDueWithin(contracts, today, 35))).toEqual(['r1-monthly-month-end']);
  });

  it('leaves out a contract whose cancellation takes effect before it would renew, but not one cancelled later', () => {
    const cancelledLater = contract('later', { startsOn: '2025-04-01', termMonths: 12, cancelledOn: '2026-04-02' });
    expect(renewalsDueWithin([contracts[5] as TestContract, cancelledLater], today).map((c) => c.id)).toEqual(['later']);
  });

  it('renews a month-end monthly contract on the last day of February', () => {
    const monthly = [contract('m', { startsOn: '2025-01-31', termMonths: 1 })];
    expect(renewalsDueWithin(monthly, '2026-02-01', 30)).toEqual([{ ...monthly[0], renewsOn: '2026-02-28' }]);
  });
});

describe('monthlyRevenueSeries', () => {
  const contracts = [
    contract('p', { startsOn: '2025-10-01', monthlyFeeCents: 3000 }),
    contract('q', { startsOn: '2025-11-30', monthlyFeeCents: 4000, cancelledOn: '2026-01-01' }),
    contract('s-no-fee', { startsOn: '2025-12-01' }),
    contract('t-starts-today', { startsOn: '2026-02-10', monthlyFeeCents: 2000 }),
    contract('u-starts-tomorrow', { startsOn: '2026-02-11', monthlyFeeCents: 5000 }),
  ];

  it('gives RMR at the end of each month and today for the current one, across a year boundary (worked example computed by hand)', () => {
    expect(monthlyRevenueSeries(contracts, { months: 4, today: '2026-02-10' })).toEqual([
      // 30 Nov: p 3000 + q 4000 (started that day) = 7000
      { month: '2025-11', label: 'Nov 2025', measuredOn: '2025-11-30', rmrCents: 7000, activeContracts: 2 },
      // 31 Dec: p 3000 + q 4000 (cancelled from 1 Jan) + s 0 = 7000
      { month: '2025-12', label: 'Dec 2025', measuredOn: '2025-12-31', rmrCents: 7000, activeContracts: 3 },
      // 31 Jan: p 3000 + s 0 = 3000
      { month: '2026-01', label: 'Jan 2026', measuredOn: '2026-01-31', rmrCents: 3000, activeContracts: 2 },
      // today 10 Feb: p 3000 + s 0 + t 2000 = 5000
      { month: '2026-02', label: 'Feb 2026', measuredOn: '2026-02-10', rmrCents: 5000, activeContracts: 3 },
    ]);
  });

  it('gives 12 months unless asked otherwise, and ends February on the 29th in a leap year', () => {
    const series = monthlyRevenueSeries([], { today: '2026-02-10' });
    expect(series).toHaveLength(12);
    expect(series[0]?.month).toBe('2025-03');
    expect(monthlyRevenueSeries([], { months: 2, today: '2028-03-05' }).map((p) => p.measuredOn)).toEqual(['2028-02-29', '2028-03-05']);
  });
});
