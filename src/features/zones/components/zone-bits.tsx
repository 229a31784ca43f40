import { ZONE_STATUS_LABELS, type ZoneStatus } from '@domain/devices';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import type { ApiZone } from '@/types/api';

const STATUS_TONES: Record<ZoneStatus, BadgeTone> = { active: 'ok', bypassed: 'warn', removed: 'neutral' };

export function ZoneStatusBadge({ status }: { status: ZoneStatus }) {
  return <Badge tone={STATUS_TONES[status]}>{ZONE_STATUS_LABELS[status]}</Badge>;
}

/** The three switches, short words with the full meaning as a tooltip and for screen readers. */
export const ZONE_SWITCHES = [
  { key: 'reportsToMonitoring', short: 'Rep', long: 'Reports to the monitoring center' },
  { key: 'chime', short: 'Chime', long: 'Chime: the keypad announces it while disarmed' },
  { key: 'supervised', short: 'Sup', long: 'Supervised: trouble if the device stops checking in' },
] as const;

export function ZoneSwitches({ zone }: { zone: Pick<ApiZone, 'reportsToMonitoring' | 'chime' | 'supervised'> }) {
  const on = ZONE_SWITCHES.filter((s) => zone[s.key]);
  if (on.length === 0)
    return (
      <span className="text-xs text-slate-500" title="Not reported, no chime, not supervised">
        None
      </span>
    );
  return (
    <span className="inline-flex gap-0.5 whitespace-nowrap">
      {on.map((s) => (
        <abbr key={s.key} title={s.long} className="rounded border border-line bg-paper px-1 text-xs font-medium text-ink no-underline">
          <span aria-hidden="true">{s.short}</span>
          <span className="sr-only">{s.long}</span>
        </abbr>
      ))}
    </span>
  );
}

/** "Serial 0412877 is also zone 4 on Panel 1 at 12 Elm Street." — one note per other place the serial is in service. */
export function elsewhereNotes(zone: Pick<ApiZone, 'elsewhere'>): string[] {
  return (zone.elsewhere ?? []).map((e) => (typeof e === 'string' ? e : e.note));
}
