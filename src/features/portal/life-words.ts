/**
 * A device's upkeep in the household's words (design-language.md: "Battery due in March").
 * The server sends the dates from the firm's upkeep model; this only words them.
 */
import type { PortalDeviceLife } from '@/types/api';

export type LifeTone = 'ok' | 'warn' | 'bad' | 'neutral';

/** "March 2027" from "2027-03-14", whatever the browser's time zone. */
export function monthYear(date: string): string {
  return new Intl.DateTimeFormat('en-US', { month: 'long', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** The earlier of the battery date and the end-of-life date, and which one it is. */
function nextDate(life: PortalDeviceLife): { on: string; what: 'battery' | 'replace' } | null {
  const { batteryDueOn, endOfLifeOn } = life;
  if (endOfLifeOn && (!batteryDueOn || endOfLifeOn <= batteryDueOn)) return { on: endOfLifeOn, what: 'replace' };
  if (batteryDueOn) return { on: batteryDueOn, what: 'battery' };
  return null;
}

export function lifeWords(life: PortalDeviceLife): { text: string; tone: LifeTone } {
  const next = nextDate(life);
  if (!next) return { text: 'Nothing to change', tone: 'neutral' };
  const when = monthYear(next.on);
  if (life.state === 'due') return next.what === 'replace' ? { text: `Replacement due since ${when}`, tone: 'bad' } : { text: `Battery due since ${when}`, tone: 'bad' };
  if (life.state === 'soon') return next.what === 'replace' ? { text: `Replacement due in ${when}`, tone: 'warn' } : { text: `Battery due in ${when}`, tone: 'warn' };
  return next.what === 'replace' ? { text: `Good until ${when}`, tone: 'ok' } : { text: `Battery good until ${when}`, tone: 'ok' };
}
