import { AlertTriangle, CheckCircle2, Clock } from 'lucide-react';
import type { DeviceType } from '@domain/devices';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import type { ApiZone } from '@/types/api';

/** Smoke, heat and CO alarms: the devices whose life the life-safety caution speaks of. */
export const LIFE_SAFETY_DEVICE_TYPES: readonly DeviceType[] = ['smoke', 'heat', 'co'];

export function isLifeSafetyDevice(deviceType: DeviceType | undefined): boolean {
  return deviceType !== undefined && LIFE_SAFETY_DEVICE_TYPES.includes(deviceType);
}

/** "Mar 2027" from a YYYY-MM-DD calendar date (no time zone shift). */
export function formatMonth(date: string): string {
  return new Intl.DateTimeFormat('en-US', { month: 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** "Mar 4, 2027" from a YYYY-MM-DD calendar date. */
export function formatCalendarDate(date: string | null | undefined): string {
  if (!date) return '—';
  return new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

interface LifeLine {
  tone: BadgeTone;
  text: string;
  title: string;
}

/** The words of a zone's device-life badge: the earlier of battery due and end of life decides. */
export function lifeLine(zone: Pick<ApiZone, 'life' | 'deviceType'>): LifeLine | null {
  const { batteryDueOn, endOfLifeOn, state } = zone.life;
  if (!batteryDueOn && !endOfLifeOn) return null;
  const endFirst = endOfLifeOn !== null && (batteryDueOn === null || endOfLifeOn <= batteryDueOn);
  const date = (endFirst ? endOfLifeOn : batteryDueOn) as string;
  const month = formatMonth(date);
  const title = [batteryDueOn && `Battery due ${formatCalendarDate(batteryDueOn)}`, endOfLifeOn && `End of life ${formatCalendarDate(endOfLifeOn)}`].filter(Boolean).join(' · ');
  const what = endFirst ? 'Replace alarm' : 'Battery';
  if (state === 'due') return { tone: 'bad', text: `${what} due ${month}`, title };
  if (state === 'soon') return { tone: 'warn', text: `${what} soon · ${month}`, title };
  return { tone: 'ok', text: `${endFirst ? 'Alarm' : 'Battery'} ok · ${month}`, title };
}

/** Device life as word + colour + mark: due (clay), soon (ochre), ok (sage), with the date. */
export function ZoneLifeBadge({ zone }: { zone: Pick<ApiZone, 'life' | 'deviceType'> }) {
  const line = lifeLine(zone);
  if (!line) return <span className="text-xs text-slate-500">No date</span>;
  const Icon = line.tone === 'bad' ? AlertTriangle : line.tone === 'warn' ? Clock : CheckCircle2;
  return (
    <span title={line.title}>
      <Badge tone={line.tone}>
        <Icon className="size-3" aria-hidden="true" />
        {line.text}
      </Badge>
    </span>
  );
}
