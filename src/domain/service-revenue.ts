/**
 * The operator's revenue numbers for the Mullion service, from the subscription history: one row
 * per change of a firm's subscription, kept as the Stripe webhooks arrive.
 */
import { TENANT_STATES, type TenantState } from './tenant-states';

const DAY_MS = 24 * 60 * 60 * 1000;

export interface SubscriptionHistoryRow {
  tenantId: string;
  planKey: string | null;
  state: TenantState;
  /** what the firm is contracted to pay per month from `from` on, in integer cents */
  monthlyAmountCents: number;
  /** the instant this row took effect */
  from: Date;
}

/**
 * States whose monthly amount counts as monthly recurring revenue (MRR). Past due still counts:
 * the firm is contracted and owes the money until the subscription is cancelled. Trialing pays
 * nothing yet; cancelled pays nothing; suspended (set by the operator) is left out like cancelled.
 */
export const MRR_STATES: readonly TenantState[] = ['active', 'past_due'];

/**
 * Each firm's row in effect at `at`: the latest row with `from` <= `at`. Rows may come in any
 * order; of two rows with the same `from`, the one later in the list wins (webhooks are stored
 * in the order they are processed).
 */
export function rowsInEffect(rows: readonly SubscriptionHistoryRow[], at: Date): SubscriptionHistoryRow[] {
  const latest = new Map<string, SubscriptionHistoryRow>();
  for (const row of rows) {
    if (row.from.getTime() > at.getTime()) continue;
    const seen = latest.get(row.tenantId);
    if (!seen || row.from.getTime() >= seen.from.getTime()) latest.set(row.tenantId, row);
  }
  return [...latest.values()];
}

/** MRR at `at` in cents: the sum of the monthly amounts of the firms active or past due then. */
export function currentMrrCents(rows: readonly SubscriptionHistoryRow[], at: Date): number {
  return rowsInEffect(rows, at)
    .filter((row) => MRR_STATES.includes(row.state))
    .reduce((sum, row) => sum + row.monthlyAmountCents, 0);
}

// ---------------------------------------------------------------------------------------------
// Months in a time zone
// ---------------------------------------------------------------------------------------------

/** A calendar month as 'YYYY-MM'. */
export function isoMonth(year: number, monthIndex: number): string {
  const normalised = new Date(Date.UTC(year, monthIndex, 1));
  return normalised.toISOString().slice(0, 7);
}

const monthLabelFormat = new Intl.DateTimeFormat('en-US', { month: 'short', year: 'numeric', timeZone: 'UTC' });

/** 'Mar 2026' for '2026-03'. */
export function monthLabel(month: string): string {
  const match = /^(\d{4})-(\d{2})$/.exec(month);
  if (!match) throw new RangeError(`Not a calendar month (YYYY-MM): ${month}`);
  return monthLabelFormat.format(new Date(Date.UTC(Number(match[1]), Number(match[2]) - 1, 1)));
}

interface ZonedParts {
  year: number;
  monthIndex: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

function zonedParts(at: Date, timeZone: string): ZonedParts {
  const parts = new Intl.DateTimeFormat('en-US', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: 'numeric',
    day: 'numeric',
    hour: 'numeric',
    minute: 'numeric',
    second: 'numeric',
  }).formatToParts(at);
  const part = (type: Intl.DateTimeFormatPartTypes) => Number(parts.find((p) => p.type === type)?.value);
  return {
    year: part('year'),
    monthIndex: part('month') - 1,
    day: part('day'),
    hour: part('hour'),
    minute: part('minute'),
    second: part('second'),
  };
}

/** How far the zone's wall clock is ahead of UTC at `at`, in ms. */
function zoneOffsetMs(at: Date, timeZone: string): number {
  const p = zonedParts(at, timeZone);
  const wallClockAsUtc = Date.UTC(p.year, p.monthIndex, p.day, p.hour, p.minute, p.second);
  return wallClockAsUtc - Math.floor(at.getTime() / 1000) * 1000;
}

/** The instant midnight begins on the first day of a month in a time zone. */
export function startOfMonthIn(year: number, monthIndex: number, timeZone: string): Date {
  const wallClock = Date.UTC(year, monthIndex, 1);
  const firstGuess = wallClock - zoneOffsetMs(new Date(wallClock), timeZone);
  // The offset at the guess may differ from the offset at the wall-clock instant (a change of
  // offset near midnight); one correction settles it.
  return new Date(wallClock - zoneOffsetMs(new Date(firstGuess), timeZone));
}

export interface MrrSeriesOptions {
  /** how many calendar months, the month of `end` included; 12 unless given */
  months?: number;
  /** now: the current month is measured at this instant */
  end: Date;
  /** the zone whose calendar months are counted; 'UTC' unless given */
  timeZone?: string;
}

export interface MrrPoint {
  month: string;
  label: string;
  mrrCents: number;
}

/**
 * MRR at the end of each of the last `months` calendar months, oldest first. A past month is
 * measured at its last instant (just before the next month begins in `timeZone`); the month of
 * `end` is measured at `end`.
 */
export function mrrSeries(rows: readonly SubscriptionHistoryRow[], options: MrrSeriesOptions): MrrPoint[] {
  const { end, months = 12, timeZone = 'UTC' } = options;
  const current = zonedParts(end, timeZone);
  const points: MrrPoint[] = [];
  for (let back = months - 1; back >= 0; back--) {
    const monthIndex = current.monthIndex - back;
    const at = back === 0 ? end : new Date(startOfMonthIn(current.year, monthIndex + 1, timeZone).getTime() - 1);
    const month = isoMonth(current.year, monthIndex);
    points.push({ month, label: monthLabel(month), mrrCents: currentMrrCents(rows, at) });
  }
  return points;
}

// ---------------------------------------------------------------------------------------------
// Firms
// ---------------------------------------------------------------------------------------------

/** How many firms are in each state; every state is present, with 0 when none. */
export function firmsByState(states: readonly TenantState[]): Record<TenantState, number> {
  const counts = Object.fromEntries(TENANT_STATES.map((state) => [state, 0])) as Record<TenantState, number>;
  for (const state of states) counts[state] += 1;
  return counts;
}

export interface TrialingFirm {
  id: string;
  state: TenantState;
  trialEndsAt: Date | null;
}

/**
 * Firms still on trial whose trial ends after `now` and at most `days` × 24 hours from now
 * (the end itself included), soonest first. A trial that has already ended is not listed.
 */
export function trialsEndingWithin<T extends TrialingFirm>(tenants: readonly T[], now: Date, days = 7): T[] {
  const horizon = now.getTime() + days * DAY_MS;
  const endsMs = (tenant: T): number => tenant.trialEndsAt?.getTime() ?? Number.NaN;
  return tenants
    .filter((tenant) => {
      if (tenant.state !== 'trialing' || tenant.trialEndsAt === null) return false;
      const ends = tenant.trialEndsAt.getTime();
      return ends > now.getTime() && ends <= horizon;
    })
    .sort((a, b) => endsMs(a) - endsMs(b));
}
