/**
 * A zone's device life and, for smoke, heat and CO devices, whether its zone protects: each a
 * word, a mark and a colour, with the detail as a tooltip (and for screen readers).
 */
import { useId, useState } from 'react';
import { AlertTriangle, CheckCircle2, ChevronDown, CircleHelp, Clock, BatteryWarning } from 'lucide-react';
import { isLifeSafetyDevice } from '@domain/devices';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { cn } from '@/lib/cn';
import type { ApiLifeSafetyProblem, ApiZone } from '@/types/api';

/** "Mar 2027" from a YYYY-MM-DD calendar date (no time zone shift). */
export function formatMonth(date: string): string {
  return new Intl.DateTimeFormat('en-US', { month: 'short', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** "Mar 4, 2027" from a YYYY-MM-DD calendar date. */
export function formatCalendarDate(date: string | null | undefined): string {
  if (!date) return '—';
  return new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T00:00:00Z`));
}

/** The warning for a life-safety device whose battery would not last a year. */
export const BATTERY_UNDER_ONE_YEAR = 'Battery forecast under 1 year (NFPA 72 §23.16.2)';

interface LifeLine {
  tone: BadgeTone;
  text: string;
  title: string;
  mark: 'ok' | 'soon' | 'due' | 'check';
}

type LifeZone = Pick<ApiZone, 'life' | 'deviceType'>;

/** What the end of life replaces: the detector, or the alarm. */
function deviceWord(zone: LifeZone): string {
  return zone.deviceType === 'smoke_detector' ? 'detector' : 'alarm';
}

function capital(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The words of a zone's device-life badge: the earlier of battery due and end of life decides. */
export function lifeLine(zone: LifeZone): LifeLine | null {
  const { batteryDueOn, endOfLifeOn, state, endOfLifeBasis } = zone.life;
  const device = deviceWord(zone);
  const endWords = endOfLifeOn
    ? `End of life ${formatCalendarDate(endOfLifeOn)}${endOfLifeBasis === 'installed' ? ' at the latest (counted from installation: no manufacture date on record)' : ''}`
    : null;
  const details = [batteryDueOn && `Battery due ${formatCalendarDate(batteryDueOn)}`, endWords].filter(Boolean);

  if (state === 'check') {
    const title =
      endOfLifeBasis === 'installed' && endOfLifeOn
        ? `No manufacture date on record: replace by ${formatMonth(endOfLifeOn)} at the latest`
        : 'No manufacture or installation date on record';
    const more = batteryDueOn ? ` · Battery due ${formatCalendarDate(batteryDueOn)}` : '';
    return { tone: 'warn', text: 'Check label date', title: `${title}. Record the date on the ${device}’s label.${more}`, mark: 'check' };
  }

  if (!batteryDueOn && !endOfLifeOn) return null;
  const endFirst = endOfLifeOn !== null && (batteryDueOn === null || endOfLifeOn <= batteryDueOn);
  const date = (endFirst ? endOfLifeOn : batteryDueOn) as string;
  const month = formatMonth(date);
  const title = details.join(' · ');
  const what = endFirst ? `Replace ${device}` : 'Battery';
  if (state === 'due') return { tone: 'bad', text: `${what} due ${month}`, title, mark: 'due' };
  if (state === 'soon') return { tone: 'warn', text: `${what} soon · ${month}`, title, mark: 'soon' };
  return { tone: 'ok', text: `${endFirst ? capital(device) : 'Battery'} ok · ${month}`, title, mark: 'ok' };
}

const MARKS = { ok: CheckCircle2, soon: Clock, due: AlertTriangle, check: CircleHelp } as const;

/**
 * Device life as word + colour + mark: due (clay), soon or check (ochre), ok (sage), with the date.
 * A life-safety device whose battery would not last a year also shows that warning.
 */
export function ZoneLifeBadge({ zone }: { zone: LifeZone }) {
  const line = lifeLine(zone);
  const underOneYear = zone.life.batteryUnderOneYear === true && isLifeSafetyDevice(zone.deviceType);
  const Icon = line ? MARKS[line.mark] : null;
  return (
    <span className="inline-flex flex-wrap items-center gap-1">
      {line && Icon ? (
        <span title={line.title}>
          <Badge tone={line.tone}>
            <Icon className="size-3" aria-hidden="true" />
            {line.text}
          </Badge>
          <span className="sr-only">: {line.title}</span>
        </span>
      ) : (
        <span className="text-xs text-slate-500">No date</span>
      )}
      {underOneYear && (
        <span title={`${BATTERY_UNDER_ONE_YEAR}: fit a battery that lasts at least a year, or check the current this device draws.`}>
          <Badge tone="warn">
            <BatteryWarning className="size-3" aria-hidden="true" />
            Battery under 1 year
          </Badge>
          <span className="sr-only">: {BATTERY_UNDER_ONE_YEAR}</span>
        </span>
      )}
    </span>
  );
}

/** "It is on a “Perimeter” zone, … Fix: set its zone type to Fire, always armed." — one line per problem. */
export function problemLines(problems: readonly ApiLifeSafetyProblem[]): string[] {
  return problems.map((p) => `${capital(p.what)}. To fix: ${p.fix}.`);
}

/**
 * The clay "Not protecting" badge of a smoke, heat or CO zone that is not programmed to protect:
 * the reasons and what to change are its tooltip, and open beneath it on a tap.
 */
export function NotProtectingBadge({ zone, className }: { zone: Pick<ApiZone, 'lifeSafetyProblems' | 'description'>; className?: string }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  const problems = zone.lifeSafetyProblems ?? [];
  if (problems.length === 0) return null;
  const lines = problemLines(problems);
  return (
    <span className={cn('inline-block max-w-80 text-left align-top', className)}>
      <button
        type="button"
        title={lines.join(' ')}
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
        className="rounded-md focus-visible:outline-2 focus-visible:outline-brass-600"
      >
        <Badge tone="bad">
          <AlertTriangle className="size-3" aria-hidden="true" />
          Not protecting
          <ChevronDown className={cn('size-3 transition-transform', open && 'rotate-180')} aria-hidden="true" />
        </Badge>
        <span className="sr-only">: why “{zone.description}” does not count as protection</span>
      </button>
      <ul id={id} hidden={!open} className="mt-1 space-y-1 text-xs whitespace-normal text-ink">
        {lines.map((line) => (
          <li key={line} className="border-l-2 border-clay-600 pl-2">
            {line}
          </li>
        ))}
      </ul>
    </span>
  );
}
