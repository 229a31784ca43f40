/**
 * A firm's own business numbers from its clients' monitoring contracts (one per site, the
 * `contract` of a site in the API): recurring monthly revenue (RMR), starts and cancellations,
 * attrition, renewals due, and RMR month by month for a chart (product.md, "Billing": "A firm
 * dashboard shows its own RMR from client contracts and attrition").
 *
 * Every date is a calendar date 'YYYY-MM-DD' in the firm's own calendar; the arithmetic is done on
 * the date itself (as UTC calendar days), never on a local-time Date, so no time zone can shift
 * a day. Which contracts to pass (all sites, or only sites not archived) is the caller's choice.
 */
import { addDaysToDate } from './device-life';
import { isoMonth, monthLabel } from './service-revenue';

/** The contract fields of a site. */
export interface MonitoringContract {
  startsOn: string | null;
  termMonths: number | null;
  monthlyFeeCents: number | null;
  cancelledOn: string | null;
}

// ---------------------------------------------------------------------------------------------
// Calendar dates
// ---------------------------------------------------------------------------------------------

interface CalendarDate {
  year: number;
  monthIndex: number;
  day: number;
}

function parseCalendarDate(date: string): CalendarDate {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  const parsed = match ? { year: Number(match[1]), monthIndex: Number(match[2]) - 1, day: Number(match[3]) } : null;
  if (!parsed || parsed.monthIndex > 11 || parsed.day < 1 || parsed.day > daysInMonth(parsed.year, parsed.monthIndex)) {
    throw new RangeError(`Not a calendar date (YYYY-MM-DD): ${date}`);
  }
  return parsed;
}

function daysInMonth(year: number, monthIndex: number): number {
  return new Date(Date.UTC(year, monthIndex + 1, 0)).getUTCDate();
}

function formatCalendarDate(year: number, monthIndex: number, day: number): string {
  return new Date(Date.UTC(year, monthIndex, day)).toISOString().slice(0, 10);
}

/**
 * The same day `months` later (or earlier, if negative); a day the target month lacks becomes its
 * last day, as date-fns `addMonths` does: 2026-01-31 + 1 month = 2026-02-28, 2028-01-31 + 1 =
 * 2028-02-29.
 */
export function addMonthsToDate(date: string, months: number): string {
  const { year, monthIndex, day } = parseCalendarDate(date);
  const target = new Date(Date.UTC(year, monthIndex + Math.trunc(months), 1));
  const targetYear = target.getUTCFullYear();
  const targetMonth = target.getUTCMonth();
  return formatCalendarDate(targetYear, targetMonth, Math.min(day, daysInMonth(targetYear, targetMonth)));
}

/** The last day of a month as a date. */
function lastDayOfMonth(year: number, monthIndex: number): string {
  return formatCalendarDate(year, monthIndex, daysInMonth(year, monthIndex));
}

// ---------------------------------------------------------------------------------------------
// Active contracts and RMR
// ---------------------------------------------------------------------------------------------

/**
 * In force on `day`: started on or before it and not cancelled by then — `cancelledOn` is the first
 * day the contract is no longer in force. A contract without a start date is not a contract yet.
 * A contract without a fee is still in force (it counts in contract numbers) but brings 0 RMR.
 */
export function isContractActiveOn(contract: MonitoringContract, day: string): boolean {
  return (
    contract.startsOn !== null &&
    contract.startsOn <= day &&
    (contract.cancelledOn === null || contract.cancelledOn > day)
  );
}

/** How many contracts are in force on `day`. */
export function activeContractCount(contracts: readonly MonitoringContract[], day: string): number {
  return contracts.filter((contract) => isContractActiveOn(contract, day)).length;
}

/** Recurring monthly revenue on `today` in cents: the monthly fees of the contracts in force (a missing fee counts 0). */
export function recurringMonthlyRevenueCents(contracts: readonly MonitoringContract[], today: string): number {
  return contracts
    .filter((contract) => isContractActiveOn(contract, today))
    .reduce((sum, contract) => sum + (contract.monthlyFeeCents ?? 0), 0);
}

function isOnOrAfterAndBefore(date: string | null, from: string, to: string): date is string {
  return date !== null && date >= from && date < to;
}

/** Contracts whose start date is on or after `from` and before `to`. */
export function contractsStartedBetween<T extends MonitoringContract>(contracts: readonly T[], from: string, to: string): T[] {
  return contracts.filter((contract) => isOnOrAfterAndBefore(contract.startsOn, from, to));
}

/** Contracts (with a start date) whose cancellation date is on or after `from` and before `to`. */
export function contractsCancelledBetween<T extends MonitoringContract>(contracts: readonly T[], from: string, to: string): T[] {
  return contracts.filter((contract) => contract.startsOn !== null && isOnOrAfterAndBefore(contract.cancelledOn, from, to));
}

// ---------------------------------------------------------------------------------------------
// Attrition
// ---------------------------------------------------------------------------------------------

export interface AttritionOptions {
  /** the last day of the period (today) */
  periodEnd: string;
  /** the period's length in calendar months; 12 unless given */
  months?: number;
}

export interface Attrition {
  /** `months` before `periodEnd`: the day the opening count is taken */
  periodStart: string;
  periodEnd: string;
  cancelled: number;
  activeAtStart: number;
  activeAtEnd: number;
  averageActive: number;
  /** cancelled ÷ average active as a fraction (0.25 is 25 %); null when nothing was active */
  rate: number | null;
}

/**
 * Attrition over the `months` months ending on `periodEnd`: contracts cancelled in the period
 * divided by the average number in force, where the average is (in force at the start + in
 * force at the end) ÷ 2 — common practice, no published source.
 *
 * The period runs from `periodStart` = `periodEnd` − `months` months (exclusive) to `periodEnd`
 * (inclusive): "in force at the start" is counted on `periodStart`, "at the end" on `periodEnd`,
 * and a cancellation counts when it takes effect after `periodStart` up to and including
 * `periodEnd`. So a contract cancelled on `periodStart` was already gone from the opening count
 * and is not counted again, while one cancelled on `periodEnd` was counted at the start, is gone
 * at the end and counts as cancelled. A contract that starts and is cancelled inside the period
 * counts as cancelled although it is in neither count (the simple average's known bias).
 */
export function attritionRate(contracts: readonly MonitoringContract[], options: AttritionOptions): Attrition {
  const { periodEnd, months = 12 } = options;
  const periodStart = addMonthsToDate(periodEnd, -months);
  const cancelled = contractsCancelledBetween(contracts, addDaysToDate(periodStart, 1), addDaysToDate(periodEnd, 1)).length;
  const activeAtStart = activeContractCount(contracts, periodStart);
  const activeAtEnd = activeContractCount(contracts, periodEnd);
  const averageActive = (activeAtStart + activeAtEnd) / 2;
  return {
    periodStart,
    periodEnd,
    cancelled,
    activeAtStart,
    activeAtEnd,
    averageActive,
    rate: averageActive === 0 ? null : cancelled / averageActive,
  };
}

// ---------------------------------------------------------------------------------------------
// Renewals
// ---------------------------------------------------------------------------------------------

/**
 * The end of the term a contract is in on `today`: contracts renew automatically, term after
 * term, so this is the first `startsOn` + k × `termMonths` (k = 1, 2, …) strictly after `today`,
 * each end counted from the start date (2026-01-31 with 1-month terms ends on 02-28, 03-31, 04-30
 * …, never drifting to the 28th). Null without a start date or a term.
 */
export function currentTermEndsOn(contract: MonitoringContract, today: string): string | null {
  const { startsOn, termMonths } = contract;
  if (startsOn === null || termMonths === null || termMonths < 1) return null;
  const start = parseCalendarDate(startsOn);
  const now = parseCalendarDate(today);
  const monthsElapsed = (now.year - start.year) * 12 + (now.monthIndex - start.monthIndex);
  // Start one term early to be safe with month-end days, then step to the first end after today.
  let terms = Math.max(1, Math.floor(monthsElapsed / termMonths));
  let end = addMonthsToDate(startsOn, terms * termMonths);
  while (end <= today) {
    terms += 1;
    end = addMonthsToDate(startsOn, terms * termMonths);
  }
  return end;
}

export type RenewalDue<T> = T & { renewsOn: string };

/**
 * Contracts in force on `today` with a term whose current term ends after `today` and at most
 * `days` days later (that day included), each with its `renewsOn`, soonest first. A contract
 * cancelled to take effect on or before its renewal day will not renew and is left out.
 */
export function renewalsDueWithin<T extends MonitoringContract>(contracts: readonly T[], today: string, days = 90): RenewalDue<T>[] {
  const horizon = addDaysToDate(today, days);
  const due: RenewalDue<T>[] = [];
  for (const contract of contracts) {
    if (!isContractActiveOn(contract, today)) continue;
    const renewsOn = currentTermEndsOn(contract, today);
    if (renewsOn === null || renewsOn > horizon) continue;
    if (contract.cancelledOn !== null && contract.cancelledOn <= renewsOn) continue;
    due.push({ ...contract, renewsOn });
  }
  return due.sort((a, b) => (a.renewsOn < b.renewsOn ? -1 : a.renewsOn > b.renewsOn ? 1 : 0));
}

// ---------------------------------------------------------------------------------------------
// RMR month by month
// ---------------------------------------------------------------------------------------------

export interface MonthlyRevenueOptions {
  /** how many calendar months, today's month included; 12 unless given */
  months?: number;
  today: string;
}

export interface MonthlyRevenuePoint {
  month: string;
  label: string;
  /** the day the month was measured: its last day, or today for the current month */
  measuredOn: string;
  rmrCents: number;
  activeContracts: number;
}

/** RMR at the end of each of the last `months` calendar months (the current one measured today), oldest first. */
export function monthlyRevenueSeries(contracts: readonly MonitoringContract[], options: MonthlyRevenueOptions): MonthlyRevenuePoint[] {
  const { today, months = 12 } = options;
  const now = parseCalendarDate(today);
  const points: MonthlyRevenuePoint[] = [];
  for (let back = months - 1; back >= 0; back--) {
    const first = new Date(Date.UTC(now.year, now.monthIndex - back, 1));
    const year = first.getUTCFullYear();
    const monthIndex = first.getUTCMonth();
    const measuredOn = back === 0 ? today : lastDayOfMonth(year, monthIndex);
    const month = isoMonth(year, monthIndex);
    points.push({
      month,
      label: monthLabel(month),
      measuredOn,
      rmrCents: recurringMonthlyRevenueCents(contracts, measuredOn),
      activeContracts: activeContractCount(contracts, measuredOn),
    });
  }
  return points;
}
