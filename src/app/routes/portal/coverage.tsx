import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { OPENING_KIND_LABELS } from '@domain/premises';
import { OpeningSymbol } from '@/components/coverage/opening-symbol';
import type { PlanPin } from '@/components/coverage/plan-view';
import { EmptyState } from '@/components/ui/empty-state';
import { CoverageLegend, CoverageSummary } from '@/features/coverage/components/coverage-report';
import { portalCoverageQuery } from '@/features/portal/api/portal-queries';
import { PortalCoverageFloors, PortalLifeSafetyFindings } from '@/features/portal/components/portal-coverage';
import { PortalCard, PortalTitle } from '@/features/portal/components/portal-parts';
import type { PortalCoverage } from '@/types/api';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(portalCoverageQuery(params.siteId ?? ''));
  return null;
}

/** Every opening without a sensor, named with its room and floor, ground-reachable ones first. */
function openingsWithoutSensor(coverage: PortalCoverage) {
  return coverage.floors
    .flatMap((floor) => floor.rooms.flatMap((room) => room.openings.filter((o) => !o.protected).map((o) => ({ ...o, room: room.name, floor: floor.name }))))
    .sort((a, b) => Number(b.groundReachable) - Number(a.groundReachable));
}

export default function PortalCoveragePage() {
  const { siteId = '' } = useParams();
  const { data: coverage } = useSuspenseQuery(portalCoverageQuery(siteId));
  const plans = new Map(
    coverage.plans.map((p) => [
      p.floorId,
      { src: p.imageUrl, pins: p.pins.map<PlanPin>((pin) => ({ zoneId: pin.zoneId, number: pin.number, description: `${pin.description} (${pin.kind.toLowerCase()})`, x: pin.x, y: pin.y })) },
    ]),
  );
  const missing = openingsWithoutSensor(coverage);

  return (
    <>
      <PortalTitle title="Doors and windows" context="Floor by floor, room by room: which openings have a sensor and what the keypad calls it." />
      {coverage.floors.length === 0 ? (
        <EmptyState title="Not recorded yet">Your firm has not recorded the floors, rooms, doors and windows of this home yet.</EmptyState>
      ) : (
        <div className="space-y-5">
          <CoverageSummary coverage={coverage} />
          <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,22rem)] lg:items-start">
            <div className="min-w-0 space-y-4">
              <div className="flex flex-wrap items-center justify-between gap-3">
                <h2 className="text-lg font-semibold">Floor by floor</h2>
                <CoverageLegend />
              </div>
              <PortalCoverageFloors coverage={coverage} plans={plans} />
            </div>
            <div className="min-w-0 space-y-5 lg:sticky lg:top-28">
              <PortalCard title="No sensor yet" id="no-sensor">
                {missing.length === 0 ? (
                  <p className="text-sm text-slate-500">Every door and window recorded has a sensor.</p>
                ) : (
                  <ul className="space-y-2" aria-label="Doors and windows without a sensor">
                    {missing.map((o) => (
                      <li key={o.id} className="flex items-center gap-3">
                        <OpeningSymbol kind={o.kind} state="none" />
                        <span className="min-w-0 text-sm">
                          <span className="block font-medium">
                            {o.label} <span className="font-normal text-slate-500">· {OPENING_KIND_LABELS[o.kind]}</span>
                          </span>
                          <span className="block text-slate-500">
                            {o.room}, {o.floor}
                            {o.groundReachable ? ' · reachable from the ground' : ''}
                          </span>
                        </span>
                      </li>
                    ))}
                  </ul>
                )}
                {missing.length > 0 && <p className="mt-3 text-sm text-slate-500">Ask your firm about a sensor for any of these when you next book a visit.</p>}
              </PortalCard>
              <PortalLifeSafetyFindings coverage={coverage} />
            </div>
          </div>
        </div>
      )}
    </>
  );
}
