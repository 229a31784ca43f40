import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { CalendarClock, ChevronRight } from 'lucide-react';
import { LifeSafetyCaution, TriangleMark } from '@/components/coverage/finding-mark';
import { OpeningSymbol } from '@/components/coverage/opening-symbol';
import { ButtonLink } from '@/components/ui/button';
import { SeverityBadge } from '@/components/ui/severity-badge';
import { paths } from '@/config/paths';
import { formatDateTime } from '@/lib/format';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { bySeverity } from '@domain/severity';
import { portalSummaryQuery } from '@/features/portal/api/portal-queries';
import { FirmContactCard, PortalCard, PortalTitle } from '@/features/portal/components/portal-parts';
import { DeviceBadges } from '@/features/portal/components/device-badges';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  await queryClient.ensureQueryData(portalSummaryQuery(params.siteId ?? ''));
  return null;
}

/** How many findings or due devices the home page lists before pointing to the full page. */
const SHOWN = 4;

function Count({ value, label, tone }: { value: number; label: string; tone?: 'ok' | 'bad' }) {
  return (
    <div className="flex flex-col-reverse justify-end rounded-md bg-paper px-3 py-2">
      <dt className="text-sm leading-snug text-slate-500">{label}</dt>
      <dd className={`text-2xl font-semibold tabular-nums ${tone === 'ok' ? 'text-sage-600' : tone === 'bad' && value > 0 ? 'text-clay-600' : 'text-ink'}`}>{value}</dd>
    </div>
  );
}

/** A home at a glance: protection, life safety, upkeep due, the next visit and who to call. */
export default function PortalSitePage() {
  const { siteId = '' } = useParams();
  const { data } = useSuspenseQuery(portalSummaryQuery(siteId));
  const { site, coverage, lifeSafety, devicesDueSoon, nextVisit, firm } = data;
  const findings = bySeverity(lifeSafety.findings);
  const { total, protected: covered, unprotectedGroundReachable } = coverage.openings;
  const address = [site.address.line1, site.address.city].filter(Boolean).join(', ');

  return (
    <>
      <PortalTitle title={site.name} context={address} />
      <div className="grid gap-5 lg:grid-cols-2 lg:items-start">
        <div className="space-y-5">
          <PortalCard title="Protection" id="protection">
            {total === 0 ? (
              <p className="text-slate-500">Your firm has not recorded the doors and windows of this home yet.</p>
            ) : (
              <>
                <p className="flex items-start gap-3 text-lg leading-snug font-semibold text-ink">
                  <OpeningSymbol kind="window" state={covered === total ? 'protected' : 'none'} className="mt-0.5 size-8" />
                  <span>{coverage.summary}</span>
                </p>
                <dl className="mt-4 grid grid-cols-3 gap-2">
                  <Count value={covered} label="Protected" tone="ok" />
                  <Count value={total - covered} label="No sensor yet" tone="bad" />
                  <Count value={unprotectedGroundReachable} label="Of those, reachable from the ground" tone="bad" />
                </dl>
              </>
            )}
            <Link to={paths.portal.coverage(siteId)} className="mt-4 flex min-h-12 items-center justify-between rounded-md border border-line px-3 font-medium text-brass-700 hover:bg-paper">
              See every door and window <ChevronRight className="size-5" aria-hidden="true" />
            </Link>
          </PortalCard>

          <PortalCard title="Smoke and carbon monoxide" id="life-safety">
            {findings.length === 0 ? (
              <p className="text-sm text-slate-500">Nothing to point out for the rooms and alarms your firm has recorded.</p>
            ) : (
              <ul className="space-y-2.5" aria-label="Life-safety findings">
                {findings.slice(0, SHOWN).map((f, i) => (
                  <li key={`${f.code}-${i}`} className="flex items-start gap-2 text-sm">
                    <span className="flex shrink-0 items-center gap-1.5">
                      <TriangleMark tone={f.severity === 'error' ? 'clay' : f.severity === 'warning' ? 'ochre' : 'slate'} />
                      <SeverityBadge severity={f.severity} />
                    </span>
                    <span className="min-w-0">{f.message}</span>
                  </li>
                ))}
              </ul>
            )}
            {findings.length > SHOWN && (
              <Link to={paths.portal.coverage(siteId)} className="mt-2 inline-flex min-h-12 items-center gap-1 text-sm font-medium text-brass-700 hover:underline">
                {findings.length - SHOWN} more — see the rules and where <ChevronRight className="size-4" aria-hidden="true" />
              </Link>
            )}
            <LifeSafetyCaution className="mt-3" />
          </PortalCard>
        </div>

        <div className="space-y-5">
          <PortalCard title="Next visit" id="next-visit">
            {nextVisit?.scheduledStart ? (
              <p className="flex items-start gap-3">
                <CalendarClock className="mt-0.5 size-5 shrink-0 text-brass-700" aria-hidden="true" />
                <span>
                  <span className="block font-medium">{formatDateTime(nextVisit.scheduledStart, site.timeZone)}</span>
                  <span className="block text-sm text-slate-500">{JOB_KIND_LABELS[nextVisit.kind as keyof typeof JOB_KIND_LABELS] ?? nextVisit.kind}</span>
                </span>
              </p>
            ) : (
              <p className="text-sm text-slate-500">No visit booked.</p>
            )}
            <div className="mt-4 flex flex-wrap gap-2">
              <ButtonLink to={`${paths.portal.service(siteId)}#request`} size="lg">
                Ask for a visit
              </ButtonLink>
              <ButtonLink to={paths.portal.service(siteId)} size="lg" variant="secondary">
                All visits
              </ButtonLink>
            </div>
          </PortalCard>

          <PortalCard title="Batteries and upkeep" id="upkeep">
            {devicesDueSoon.length === 0 ? (
              <p className="text-sm text-slate-500">Nothing due in the coming months.</p>
            ) : (
              <ul className="divide-y divide-line">
                {devicesDueSoon.slice(0, SHOWN).map((d) => (
                  <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                    <span className="flex min-w-0 items-start gap-2">
                      {d.lifeSafety && <TriangleMark tone="slate" className="mt-1" />}
                      <span className="min-w-0">
                        <span className="block font-medium">{d.description}</span>
                        <span className="block text-sm text-slate-500">{d.kind}</span>
                      </span>
                    </span>
                    <DeviceBadges device={d} />
                  </li>
                ))}
              </ul>
            )}
            <Link to={paths.portal.devices(siteId)} className="mt-3 inline-flex min-h-12 items-center gap-1 font-medium text-brass-700 hover:underline">
              {devicesDueSoon.length > SHOWN ? `${devicesDueSoon.length - SHOWN} more to look at — all devices` : 'All devices'} <ChevronRight className="size-4" aria-hidden="true" />
            </Link>
          </PortalCard>

          <FirmContactCard firm={firm} />
        </div>
      </div>
    </>
  );
}
