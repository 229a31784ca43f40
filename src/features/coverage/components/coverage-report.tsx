/**
 * A site's coverage as people read it: the summary line, the counts, the findings (life
 * safety first, with its caution word for word), then floor by floor, room by room, every
 * opening with its symbol and state word.
 */
import { DEVICE_TYPE_LABELS } from '@domain/devices';
import { OPENING_KIND_LABELS, ROOM_KIND_LABELS } from '@domain/premises';
import { LifeSafetyCaution, TriangleMark } from '@/components/coverage/finding-mark';
import { OpeningSymbol, OpeningStateWords } from '@/components/coverage/opening-symbol';
import { PlanView, planImageSrc, type PlanPin } from '@/components/coverage/plan-view';
import { Badge } from '@/components/ui/badge';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { cn } from '@/lib/cn';
import type { ApiCoverage, ApiCoverageFinding, ApiCoverageRoom, ApiFloor, ApiPremisesZone } from '@/types/api';
import { SEVERITY_ORDER, type Evidence, type Severity } from '@domain/severity';
import { isLifeSafetyFinding } from '../api/coverage-queries';

/** The dashed "From memory" mark for a rule Mullion knows without a public text to cite (staff only). */
export function FromMemoryBadge() {
  return (
    <Badge tone="neutral" className="border-dashed">
      From memory
    </Badge>
  );
}

/** The note that explains the "From memory" mark, shown once under a list that carries it. */
export const FROM_MEMORY_NOTE = '“From memory” marks rules Mullion knows without a public text to cite: check them against your copy of the standard.';

/** A rule's source as people read it: the standard and section, without our own reference-file pointer. */
export function readableSource(source: string): string {
  return source.replace(/\s+[—-]\s+references\.md\b.*$/i, '').trim();
}

/** "Smoke alarm" → "smoke alarm", but "CO alarm" stays "CO alarm". */
function lowerFirst(text: string): string {
  return /^[A-Z][A-Z]/.test(text) ? text : text.charAt(0).toLowerCase() + text.slice(1);
}

function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

// ---------------------------------------------------------------------------------------------
// Summary
// ---------------------------------------------------------------------------------------------

function Count({ value, label, tone }: { value: number; label: string; tone?: 'ok' | 'bad' }) {
  return (
    <div className="flex flex-col-reverse justify-end rounded-md border border-line bg-paper/60 px-3 py-2">
      <dt className="text-xs leading-snug text-slate-500">{label}</dt>
      <dd className={cn('text-xl font-semibold tabular-nums', tone === 'ok' && 'text-sage-600', tone === 'bad' && value > 0 && 'text-clay-600')}>
        {value}
      </dd>
    </div>
  );
}

export function CoverageSummary({ coverage }: { coverage: ApiCoverage }) {
  const { total, protected: covered, unprotectedGroundReachable } = coverage.openings;
  const lifeSafety = coverage.findings.filter(isLifeSafetyFinding).length;
  return (
    <section aria-labelledby="coverage-summary" className="rounded-md border border-line bg-card p-4 sm:p-5">
      <h2 id="coverage-summary" className="sr-only">
        Summary
      </h2>
      <p className="text-xl leading-snug font-semibold text-ink sm:text-2xl">{coverage.summary}</p>
      <dl className="mt-4 grid grid-cols-2 gap-2 sm:grid-cols-4">
        <Count value={total} label="Openings" />
        <Count value={covered} label="Protected" tone="ok" />
        <Count value={total - covered} label="No sensor" tone="bad" />
        <Count value={unprotectedGroundReachable} label="Reachable from the ground, no sensor" tone="bad" />
      </dl>
      {lifeSafety > 0 && (
        <p className="mt-3 flex items-center gap-2 text-sm font-medium text-clay-600">
          <TriangleMark />
          {plural(lifeSafety, 'life-safety finding')} — see below.
        </p>
      )}
    </section>
  );
}

/** The symbols and their words, once per page. */
export function CoverageLegend() {
  return (
    <ul className="flex flex-wrap gap-x-5 gap-y-2 text-sm" aria-label="What the symbols mean">
      <li className="flex items-center gap-2">
        <OpeningSymbol kind="window" state="protected" className="size-6" />
        <span>
          <span className="font-medium text-sage-600">Protected</span> — a sensor in service
        </span>
      </li>
      <li className="flex items-center gap-2">
        <OpeningSymbol kind="window" state="none" className="size-6" />
        <span>
          <span className="font-medium text-clay-600">No sensor</span> — none, or not in service
        </span>
      </li>
    </ul>
  );
}

// ---------------------------------------------------------------------------------------------
// Findings
// ---------------------------------------------------------------------------------------------

interface FindingGroup {
  key: string;
  severity: Severity;
  rule: string;
  source: string | undefined;
  evidence: Evidence | undefined;
  findings: ApiCoverageFinding[];
}

/** Findings of the same rule together, so the rule and its source are read once; most severe first. */
function groupByRule(findings: readonly ApiCoverageFinding[]): FindingGroup[] {
  const groups = new Map<string, FindingGroup>();
  for (const f of findings) {
    const key = `${f.code}|${f.rule}`;
    const group: FindingGroup = groups.get(key) ?? { key, severity: f.severity, rule: f.rule, source: f.source, evidence: f.evidence, findings: [] };
    // A rule can be raised at more than one level (a combination alarm's missing half is a check,
    // a wrongly programmed zone a fix): the group shows the most severe.
    if ((SEVERITY_ORDER[f.severity] ?? 3) < (SEVERITY_ORDER[group.severity] ?? 3)) group.severity = f.severity;
    group.findings.push(f);
    groups.set(key, group);
  }
  return [...groups.values()].sort((a, b) => (SEVERITY_ORDER[a.severity] ?? 3) - (SEVERITY_ORDER[b.severity] ?? 3));
}

function FindingGroupItem({ group, lifeSafety }: { group: FindingGroup; lifeSafety: boolean }) {
  return (
    <li className="py-3 first:pt-0 last:pb-0">
      <div className="flex flex-wrap items-center gap-2">
        {lifeSafety && <TriangleMark tone={group.severity === 'error' ? 'clay' : group.severity === 'warning' ? 'ochre' : 'slate'} />}
        <SeverityBadge severity={group.severity} />
        {group.evidence === 'memory' && <FromMemoryBadge />}
        {group.findings.length > 1 && <span className="text-xs text-slate-500">{group.findings.length} places</span>}
      </div>
      <p className="mt-1.5 text-sm font-semibold text-ink">
        <span className="sr-only">Rule: </span>
        {group.rule}
      </p>
      <ul className="mt-1 space-y-1">
        {group.findings.map((f, i) => (
          <li key={`${f.roomId ?? f.floorId ?? ''}-${i}`} className="flex gap-2 text-sm text-ink">
            <span className="mt-2 size-1 shrink-0 rounded-full bg-slate-500" aria-hidden="true" />
            <span className="min-w-0">{f.message}</span>
          </li>
        ))}
      </ul>
      {group.source && <p className="mt-1.5 text-xs text-slate-500">Source: {readableSource(group.source)}</p>}
    </li>
  );
}

/**
 * The smoke and CO findings, each with its triangle, severity word, rule and source, and the
 * caution word for word whenever the answer carries it or any finding is shown.
 */
export function LifeSafetyFindings({ coverage, className }: { coverage: ApiCoverage; className?: string }) {
  const lifeSafety = coverage.findings.filter(isLifeSafetyFinding);
  const showCaution = Boolean(coverage.caution) || coverage.findings.length > 0;
  return (
    <section aria-labelledby="life-safety-heading" className={cn('rounded-md border border-line bg-card', className)}>
      <header className="flex items-center gap-2 border-b border-line px-4 py-3">
        <TriangleMark tone={lifeSafety.length > 0 ? 'clay' : 'slate'} />
        <h2 id="life-safety-heading" className="text-sm font-semibold">
          Life safety{lifeSafety.length > 0 ? ` · ${lifeSafety.length}` : ''}
        </h2>
      </header>
      <div className="space-y-3 p-4">
        {lifeSafety.length > 0 ? (
          <ul className="divide-y divide-line" aria-label="Life-safety findings">
            {groupByRule(lifeSafety).map((g) => (
              <FindingGroupItem key={g.key} group={g} lifeSafety />
            ))}
          </ul>
        ) : (
          <p className="text-sm text-slate-500">No smoke or CO findings for the rooms and devices recorded.</p>
        )}
        {lifeSafety.some((f) => f.evidence === 'memory') && <p className="text-xs text-slate-500">{FROM_MEMORY_NOTE}</p>}
        {showCaution && <LifeSafetyCaution />}
      </div>
    </section>
  );
}

/** The other findings: ground-reachable openings without a sensor, rooms without interior detection. */
export function OtherFindings({ coverage, className }: { coverage: ApiCoverage; className?: string }) {
  const others = coverage.findings.filter((f) => !isLifeSafetyFinding(f));
  return (
    <section aria-labelledby="other-findings-heading" className={cn('rounded-md border border-line bg-card', className)}>
      <header className="border-b border-line px-4 py-3">
        <h2 id="other-findings-heading" className="text-sm font-semibold">
          Intrusion gaps{others.length > 0 ? ` · ${others.length}` : ''}
        </h2>
      </header>
      <div className="p-4">
        {others.length > 0 ? (
          <>
            <ul className="divide-y divide-line" aria-label="Other findings">
              {groupByRule(others).map((g) => (
                <FindingGroupItem key={g.key} group={g} lifeSafety={false} />
              ))}
            </ul>
            {others.some((f) => f.evidence === 'memory') && <p className="mt-3 text-xs text-slate-500">{FROM_MEMORY_NOTE}</p>}
          </>
        ) : (
          <p className="text-sm text-slate-500">
            No gaps: every opening reachable from the ground has a sensor, and every room with openings has interior detection.
          </p>
        )}
      </div>
    </section>
  );
}

// ---------------------------------------------------------------------------------------------
// Floors, rooms, openings
// ---------------------------------------------------------------------------------------------

function RoomCoverage({ room }: { room: ApiCoverageRoom }) {
  const devices = room.devices ?? [];
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
      {devices.length > 0 && (
        <p className="mt-2 text-xs text-slate-500">
          Also here:{' '}
          {devices.map((d, i) => (
            <span key={d.zoneId}>
              {i > 0 && ', '}
              {d.description} ({lowerFirst(DEVICE_TYPE_LABELS[d.deviceType])})
              {d.counts === false && <span className="font-medium text-clay-600"> — not programmed to protect, does not count</span>}
            </span>
          ))}
        </p>
      )}
    </li>
  );
}

interface CoverageFloorsProps {
  coverage: ApiCoverage;
  /** the premises' floors, for their plan images */
  planFloors?: readonly ApiFloor[] | undefined;
  zones?: readonly ApiPremisesZone[] | undefined;
  /** plans already resolved (the portal gets them with its coverage), by floor id */
  plans?: ReadonlyMap<string, { src: string; pins: PlanPin[] }> | undefined;
}

export function CoverageFloors({ coverage, planFloors, zones, plans }: CoverageFloorsProps) {
  const panels = new Set((zones ?? []).map((z) => z.panelId)).size;
  return (
    <div className="space-y-6">
      {coverage.floors.map((floor) => {
        const openings = floor.rooms.flatMap((r) => r.openings);
        const covered = openings.filter((o) => o.protected).length;
        const planFloor = planFloors?.find((f) => f.id === floor.id);
        const given = plans?.get(floor.id);
        const src = given ? given.src : planFloor ? planImageSrc(planFloor) : null;
        const pins: PlanPin[] = given
          ? given.pins
          : (zones ?? [])
              .filter((z) => z.pin?.floorId === floor.id && z.status !== 'removed')
              .map((z) => ({
                zoneId: z.id,
                number: z.number,
                description: z.description,
                panelLabel: panels > 1 ? z.panelLabel : undefined,
                x: z.pin!.x,
                y: z.pin!.y,
              }));
        return (
          <section key={floor.id} aria-labelledby={`coverage-floor-${floor.id}`} className="rounded-md border border-line bg-card">
            <header className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1 border-b border-line px-4 py-3">
              <h3 id={`coverage-floor-${floor.id}`} className="text-base font-semibold">
                {floor.name}
              </h3>
              <p className="text-sm text-slate-500">
                {floor.level !== undefined ? `Level ${floor.level}${floor.belowGrade ? ' · below grade' : ''} · ` : ''}
                {openings.length === 0 ? 'no openings' : `${covered} of ${plural(openings.length, 'opening')} protected`}
              </p>
            </header>
            <div className="p-4">
              {src && (
                <figure className="mb-4">
                  <PlanView src={src} alt={`Floor plan of ${floor.name}`} pins={pins} />
                  <figcaption className="mt-2 text-xs text-slate-500">
                    {pins.length > 0
                      ? `${plural(pins.length, 'device')} on the plan; tap, hover or focus a pin for its zone.`
                      : 'No devices placed on this plan yet.'}
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
