/**
 * The panel's standby battery as worked out by the server: the duty it is sized for, the hours
 * of standby and minutes of alarm that duty needs, the amp-hours needed (and with headroom)
 * against the battery fitted, and when the battery is due. Each state is a word, a mark and a
 * colour. A fire panel carries the life-safety caution.
 */
import type { ReactNode } from 'react';
import { AlertTriangle, CheckCircle2, CircleHelp, Clock } from 'lucide-react';
import { SEALED_LEAD_ACID_LIFE_YEARS, STANDBY_SAFETY_MARGIN } from '@domain/panel-power';
import { LifeSafetyCaution } from '@/components/coverage/finding-mark';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import type { ApiPanel } from '@/types/api';
import { formatCalendarDate } from '@/features/zones/components/zone-life-badge';

const DUTY_WORDS = { household_fire: 'Household fire', commercial_fire: 'Commercial fire', intrusion: 'Intrusion only' } as const;

function ampHours(value: number): string {
  return `${Number(value.toFixed(2))} Ah`;
}

/** Today as YYYY-MM-DD in the firm's time zone (or the browser's). */
function todayIn(timeZone: string | undefined): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(new Date());
}

function StateBadge({ tone, children }: { tone: BadgeTone; children: string }) {
  const Icon = tone === 'ok' ? CheckCircle2 : tone === 'bad' ? AlertTriangle : tone === 'warn' ? Clock : CircleHelp;
  return (
    <Badge tone={tone}>
      <Icon className="size-3" aria-hidden="true" />
      {children}
    </Badge>
  );
}

function Row({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1 py-2 first:pt-0 last:pb-0">
      <dt className="text-sm text-slate-500">{label}</dt>
      <dd className="flex flex-wrap items-center justify-end gap-1.5 text-sm tabular-nums">{children}</dd>
    </div>
  );
}

/** `showCaution` is false where the page already shows the caution once (one caution per screen). */
export function StandbyBattery({ panel, timeZone, showCaution = true }: { panel: ApiPanel; timeZone?: string | undefined; showCaution?: boolean }) {
  const standby = panel.standby;
  if (!standby) return null;
  const fire = standby.duty !== 'intrusion';
  const fitted = panel.batteryAh ?? null;
  const required = standby.requiredAh;
  const margin = Math.round(STANDBY_SAFETY_MARGIN * 100);
  const today = todayIn(timeZone);
  const enough = fitted !== null && required !== null ? fitted >= required : null;
  const due = standby.batteryDueOn;
  const overdue = due !== null && due <= today;

  return (
    <Card title="Standby battery">
      <dl className="divide-y divide-line">
        <Row label="Sized for">
          <span className="font-medium">{DUTY_WORDS[standby.duty]}</span>
        </Row>
        <Row label="Must run">
          <span>
            {standby.standbyHours} h standby + {standby.alarmMinutes} min alarm
          </span>
        </Row>
        <Row label="Needed">
          {standby.neededAh !== null && required !== null ? (
            <span>
              {ampHours(standby.neededAh)} · {ampHours(required)} with {margin}% headroom
            </span>
          ) : (
            <span className="text-slate-500">Record the standby and alarm currents</span>
          )}
        </Row>
        <Row label="Fitted">
          {fitted !== null ? <span>{ampHours(fitted)}</span> : <span className="text-slate-500">Not recorded</span>}
          {enough === true && <StateBadge tone="ok">Enough</StateBadge>}
          {enough === false && <StateBadge tone={fire ? 'bad' : 'warn'}>Too small</StateBadge>}
        </Row>
        <Row label="Battery due">
          {due !== null ? (
            <>
              <span>{formatCalendarDate(due)}</span>
              {overdue && <StateBadge tone={fire ? 'bad' : 'warn'}>Replace now</StateBadge>}
            </>
          ) : (
            <span className="text-slate-500">Record the battery label date</span>
          )}
        </Row>
      </dl>
      <p className="mt-3 text-xs text-slate-500">
        {fire
          ? 'This panel carries smoke, heat or CO devices, so its battery is sized for fire.'
          : 'No smoke, heat or CO devices on this panel: sized for intrusion.'}{' '}
        Sealed lead-acid batteries are due about {SEALED_LEAD_ACID_LIFE_YEARS} years after the date on their label.
      </p>
      {fire && showCaution && <LifeSafetyCaution className="mt-3" />}
    </Card>
  );
}
