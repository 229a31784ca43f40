/**
 * Job times are stored in UTC and shown in the site's time zone (the schedule uses the
 * firm's). The browser's own zone never decides what a technician reads. Intl does the
 * zone lookups; calendar-day arithmetic is done on UTC dates (no zone can shift them), and
 * the schedule's week and day arithmetic uses date-fns.
 */

export interface WallTime {
  year: number;
  month: number; // 1–12
  day: number;
  hour: number;
  minute: number;
  second: number;
}

const partFormats = new Map<string, Intl.DateTimeFormat>();

function partsFormat(timeZone: string): Intl.DateTimeFormat {
  let f = partFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    partFormats.set(timeZone, f);
  }
  return f;
}

/** The wall-clock reading of an instant in a time zone. */
export function wallTimeIn(instant: Date, timeZone: string): WallTime {
  const p: Record<string, string> = {};
  for (const part of partsFormat(timeZone).formatToParts(instant)) p[part.type] = part.value;
  return {
    year: Number(p.year),
    month: Number(p.month),
    day: Number(p.day),
    hour: Number(p.hour) % 24,
    minute: Number(p.minute),
    second: Number(p.second),
  };
}

/** How far the zone's wall clock is ahead of UTC at that instant, in milliseconds. */
function offsetAt(instant: number, timeZone: string): number {
  const w = wallTimeIn(new Date(instant), timeZone);
  return Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - Math.floor(instant / 1000) * 1000;
}

/** The instant at which the zone's wall clock shows this time (the later one in a DST gap's shadow). */
export function instantOfWallTime(w: Pick<WallTime, 'year' | 'month' | 'day' | 'hour' | 'minute'>, timeZone: string): Date {
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute);
  let t = asUtc - offsetAt(asUtc, timeZone);
  t = asUtc - offsetAt(t, timeZone);
  return new Date(t);
}

/** `yyyy-MM-ddTHH:mm` for a datetime-local input showing the instant in the zone ('' for none). */
export function toLocalInput(iso: string | null | undefined, timeZone: string): string {
  if (!iso) return '';
  const w = wallTimeIn(new Date(iso), timeZone);
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${w.year}-${pad(w.month)}-${pad(w.day)}T${pad(w.hour)}:${pad(w.minute)}`;
}

/** The ISO UTC instant of a datetime-local value read in the zone; null when empty or unreadable. */
export function fromLocalInput(value: string, timeZone: string): string | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})/.exec(value.trim());
  if (!m) return null;
  const [, y, mo, d, h, mi] = m.map(Number) as [number, number, number, number, number, number];
  return instantOfWallTime({ year: y, month: mo, day: d, hour: h, minute: mi }, timeZone).toISOString();
}

/** The calendar day (`yyyy-MM-dd`) of an instant in the zone. */
export function dayKey(instant: string | Date, timeZone: string): string {
  return toLocalInput(typeof instant === 'string' ? instant : instant.toISOString(), timeZone).slice(0, 10);
}

/** The instant a calendar day (`yyyy-MM-dd`) begins in the zone. */
export function startOfDayIn(day: string, timeZone: string): Date {
  const [y, m, d] = day.split('-').map(Number) as [number, number, number];
  return instantOfWallTime({ year: y, month: m, day: d, hour: 0, minute: 0 }, timeZone);
}

/** The day after a `yyyy-MM-dd` day. */
export function nextDay(day: string): string {
  const [y, m, d] = day.split('-').map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + 1)).toISOString().slice(0, 10);
}

/** "9:00 AM" */
export function formatTime(iso: string, timeZone: string): string {
  return new Intl.DateTimeFormat('en-US', { hour: 'numeric', minute: '2-digit', timeZone }).format(new Date(iso));
}

/** "Tue, Mar 3" this year, "Thu, Jul 20, 2023" in another. */
export function formatDay(iso: string, timeZone: string, now: Date = new Date()): string {
  const otherYear = wallTimeIn(new Date(iso), timeZone).year !== wallTimeIn(now, timeZone).year;
  return new Intl.DateTimeFormat('en-US', {
    weekday: 'short',
    month: 'short',
    day: 'numeric',
    ...(otherYear ? { year: 'numeric' } : {}),
    timeZone,
  }).format(new Date(iso));
}

/** "Tue, Mar 3, 9:00 AM – 10:30 AM", or "Not scheduled". */
export function formatWhen(start: string | null, end: string | null, timeZone: string): string {
  if (!start) return 'Not scheduled';
  const first = `${formatDay(start, timeZone)}, ${formatTime(start, timeZone)}`;
  if (!end) return first;
  const sameDay = dayKey(start, timeZone) === dayKey(end, timeZone);
  return `${first} – ${sameDay ? formatTime(end, timeZone) : `${formatDay(end, timeZone)}, ${formatTime(end, timeZone)}`}`;
}

/** A short zone name for a hint: "America/Chicago" → "America/Chicago (CDT)". */
export function zoneLabel(timeZone: string, at: Date = new Date()): string {
  const short = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'short' }).formatToParts(at).find((p) => p.type === 'timeZoneName')?.value;
  const name = timeZone.replace(/_/g, ' ');
  return short && short !== timeZone ? `${name} (${short})` : name;
}

/**
 * The calendar shows wall-clock times of one zone on JavaScript dates that live in the
 * browser's zone: a Date whose local fields read what the zone's clock reads.
 */
export function toCalendarDate(iso: string, timeZone: string): Date {
  const w = wallTimeIn(new Date(iso), timeZone);
  return new Date(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
}

/** The ISO UTC instant of a calendar date read as the zone's wall clock. */
export function fromCalendarDate(date: Date, timeZone: string): string {
  return instantOfWallTime(
    { year: date.getFullYear(), month: date.getMonth() + 1, day: date.getDate(), hour: date.getHours(), minute: date.getMinutes() },
    timeZone,
  ).toISOString();
}
