/**
 * The household's coverage page parts: smoke and CO findings on the one severity scale (no rule
 * sources: those are for staff), and floor by floor, room by room, every opening and the
 * devices in each room — a smoke, heat or CO device not set up to protect is said to be so,
 * never counted as protection.
 */
import { DEVICE_TYPE_LABELS } from '@domain/devices';
import { OPENING_KIND_LABELS, ROOM_KIND_LABELS } from '@domain/premises';
import { bySeverity } from '@domain/severity';
import { LifeSafetyCaution, TriangleMark } from '@/components/coverage/finding-mark';
import { OpeningStateWords, OpeningSymbol } from '@/components/coverage/opening-symbol';
import { PlanView, type PlanPin } from '@/components/coverage/plan-view';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { isLifeSafetyFinding } from '@/features/coverage/api/coverage-queries';
import type { ApiCoverage, ApiCoverageFinding, ApiCoverageRoom } from '@/types/api';
import { NOT_PROTECTING } from '../life-words';
import { PortalCard } from './portal-parts';

function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

interface FindingGroup {
  key: string;
  severity: ApiCoverageFinding['severity'];
  rule: string;
  findings: ApiCoverageFinding[];
}

/** Findings of the same rule together, the rule read once; most severe first. */
function groupByRule(findings: readonly ApiCoverageFinding[]): FindingGroup[] {
  const groups = new Map<string, FindingGroup>();
  for (const f of bySeverity(findings)) {
    const key = `${f.code}|${f.rule}`;
    const group = groups.get(key) ?? { key, severity: f.severity, rule: f.rule, findings: [] };
    group.findings.push(f);
    groups.set(key, group);
  }
  return [...groups.values()];
}

/**
 * The smoke and CO findings of the home, each with its triangle, severity word (Fix, Check,
 * Note), rule and places, and the caution word for word: the card reports on smoke and CO
 * coverage even when it has nothing to point out, so the caution is always there.
 */
export function PortalLifeSafetyFindings({ coverage }: { coverage: ApiCoverage }) {
  const lifeSafety = coverage.findings.filter(isLifeSafetyFinding);
  return (
    <PortalCard title="Smoke and carbon monoxide" id="life-safety">
      {lifeSafety.length === 0 ? (
        <p className="text-sm text-slate-500">Nothing to point out for the rooms and alarms your firm has recorded.</p>
      ) : (
        <ul className="divide-y divide-line" aria-label="Life-safety findings">
          {groupByRule(lifeSafety).map((g) => (
            <li key={g.key} className="py-3 first:pt-0 last:pb-0">
              <div className="flex items-center gap-2">
                <TriangleMark tone={g.severity === 'error' ? 'clay' : g.severity === 'warning' ? 'ochre' : 'slate'} />
                <SeverityBadge severity={g.severity} />
                {g.findings.length > 1 && <span className="text-xs text-slate-500">{g.findings.length} places</span>}
              </div>
              <p className="mt-1.5 text-sm font-semibold text-ink">{g.rule}</p>
              <ul className="mt-1 space-y-1">
                {g.findings.map((f, i) => (
                  <li key={`${f.roomId ?? f.floorId ?? ''}-${i}`} className="flex gap-2 text-sm text-ink">
                    <span className="mt-2 size-1 shrink-0 rounded-full bg-slate-500" aria-hidden="true" />
                    <span className="min-w-0">{f.message}</span>
                  </li>
                ))}
              </ul>
            </li>
          ))}
        </ul>
      )}
      <LifeSafetyCaution className="mt-3" />
    </PortalCard>
  );
}

type RoomDevice = NonNullable<ApiCoverageRoom['devices']>[number];

function deviceName(d: RoomDevice): string {
  return `${d.description} (${(DEVICE_TYPE_LABELS[d.deviceType] ?? 'device').toLowerCase()})`;
}

function RoomCoverage({ room }: { room: ApiCoverageRoom }) {
  const devices = room.devices ?? [];
  const counting = devices.filter((d) => d.counts !== false);
  const notCounting = devices.filter((d) => d.counts === false);
  return (
    <li className="py-3 first:pt-0 last:pb-0">
      <h4 className="text-sm font-semibold">
        {room.name}
        {room.kind && <span className="font-normal text-slate-500"> · {ROOM_KIND_LABELS[room.kind]}</span>}
      </h4>
      {room.openings.length === 0 ? (
        <p className="mt-1 text-sm text-slate-500">No doors or windows recorded.</p>
      ) : (
        <ul className="mt-2 space-y-2">
          {room.openings.map((o) => {
            const state = o.protected ? 'protected' : 'none';
            return (
              <li key={o.id} className="flex items-center gap-3">
                <OpeningSymbol kind={o.kind} state={state} />
                <div className="min-w-0 text-sm">
                  <p className="break-words">
                    <span className="font-medium">{o.label}</span>
                    <span className="text-slate-500">
                      {' '}
                      · {OPENING_KIND_LABELS[o.kind]}
                      {o.groundReachable ? ' · reachable from the ground' : ''}
                    </span>
                  </p>
                  <OpeningStateWords state={state} zoneDescription={o.zoneDescription} className="block" />
                </div>
              </li>
            );
          })}
        </ul>
      )}
      {counting.length > 0 && <p className="mt-2 text-xs text-slate-500">Also here: {counting.map(deviceName).join(', ')}</p>}
      {notCounting.length > 0 && (
        <ul className="mt-2 space-y-1" aria-label={`Not set up to protect in ${room.name}`}>
          {notCounting.map((d) => (
            <li key={d.zoneId} className="flex items-start gap-2 text-sm">
              <TriangleMark tone="clay" className="mt-0.5" />
              <span className="min-w-0">
                <span className="font-medium text-clay-600">{NOT_PROTECTING}</span> — {deviceName(d)} is here but not set up to protect. Ask your alarm firm to
                change how it is programmed.
              </span>
            </li>
          ))}
        </ul>
      )}
    </li>
  );
}

/** Floor by floor: the plan with its pins (when the firm shared one), then each room. */
export function PortalCoverageFloors({ coverage, plans }: { coverage: ApiCoverage; plans: ReadonlyMap<string, { src: string; pins: PlanPin[] }> }) {
  return (
    <div className="space-y-6">
      {coverage.floors.map((floor) => {
        const openings = floor.rooms.flatMap((r) => r.openings);
        const covered = openings.filter((o) => o.protected).length;
        const plan = plans.get(floor.id);
        return (
          <section key={floor.id} aria-labelledby={`coverage-floor-${floor.id}`} className="rounded-md border border-line bg-card">
            <header className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1 border-b border-line px-4 py-3">
              <h3 id={`coverage-floor-${floor.id}`} className="text-base font-semibold">
                {floor.name}
              </h3>
              <p className="text-sm text-slate-500">{openings.length === 0 ? 'No doors or windows' : `${covered} of ${plural(openings.length, 'door or window', 'doors and windows')} protected`}</p>
            </header>
            <div className="p-4">
              {plan && (
                <figure className="mb-4">
                  <PlanView src={plan.src} alt={`Floor plan of ${floor.name}`} pins={plan.pins} />
                  <figcaption className="mt-2 text-xs text-slate-500">
                    {plan.pins.length > 0 ? `${plural(plan.pins.length, 'device')} on the plan; tap a pin for its name.` : 'No devices placed on this plan yet.'}
                  </figcaption>
                </figure>
              )}
              {floor.rooms.length === 0 ? (
                <p className="text-sm text-slate-500">No rooms recorded on this floor.</p>
              ) : (
                <ul className="divide-y divide-line">
                  {floor.rooms.map((room) => (
                    <RoomCoverage key={room.id} room={room} />
                  ))}
                </ul>
              )}
            </div>
          </section>
        );
      })}
    </div>
  );
}
