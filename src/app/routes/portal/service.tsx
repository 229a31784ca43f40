import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Download, FileText } from 'lucide-react';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { useSession } from '@/lib/auth';
import { formatDate, formatDateTime } from '@/lib/format';
import { portalDevicesQuery, portalServiceQuery, portalSitesQuery } from '@/features/portal/api/portal-queries';
import { PortalCard, PortalTitle } from '@/features/portal/components/portal-parts';
import { ServiceRequestForm } from '@/features/portal/components/service-request-form';
import type { PortalUpcomingVisit } from '@/types/api';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  const siteId = params.siteId ?? '';
  void queryClient.prefetchQuery(portalDevicesQuery(siteId));
  // the site's time zone, so visit times never show in the browser's zone first
  await Promise.all([queryClient.ensureQueryData(portalServiceQuery(siteId)), queryClient.ensureQueryData(portalSitesQuery())]);
  return null;
}

/** Where a visit stands, in the household's words. */
export function visitStateWords(visit: Pick<PortalUpcomingVisit, 'state' | 'scheduledStart'>): { word: string; tone: BadgeTone } {
  if (visit.state === 'requested') return { word: 'Requested — not booked yet', tone: 'warn' };
  if (visit.state === 'in_progress') return { word: 'Under way', tone: 'brass' };
  if (visit.state === 'scheduled') return { word: 'Booked', tone: 'ok' };
  if (visit.state === 'completed') return { word: 'Done', tone: 'ok' };
  return { word: 'Cancelled', tone: 'neutral' };
}

export default function PortalServicePage() {
  const { siteId = '' } = useParams();
  const { tenant } = useSession();
  const { data: service } = useSuspenseQuery(portalServiceQuery(siteId));
  const devices = useQuery(portalDevicesQuery(siteId));
  const sites = useQuery(portalSitesQuery());
  const timeZone = sites.data?.find((s) => s.id === siteId)?.timeZone;
  const firmName = tenant?.name ?? 'Your alarm firm';

  return (
    <>
      <PortalTitle title="Visits" context={`What ${firmName} has booked, what they did, and a way to ask for a visit.`} />
      <div className="grid gap-5 lg:grid-cols-2 lg:items-start">
        <div className="space-y-5">
          <PortalCard title="Coming up" id="upcoming">
            {service.upcoming.length === 0 ? (
              <p className="text-sm text-slate-500">Nothing booked or requested.</p>
            ) : (
              <ul className="divide-y divide-line" aria-label="Upcoming visits">
                {service.upcoming.map((v) => {
                  const state = visitStateWords(v);
                  return (
                    <li key={v.id} className="py-3 first:pt-0 last:pb-0">
                      <div className="flex flex-wrap items-center justify-between gap-2">
                        <span className="font-medium">{v.kindLabel}</span>
                        <Badge tone={state.tone}>{state.word}</Badge>
                      </div>
                      <p className="text-sm text-slate-500">
                        {v.scheduledStart ? formatDateTime(v.scheduledStart, timeZone) : `${firmName} will call to agree a time.`}
                        {v.technicianFirstName ? ` · with ${v.technicianFirstName}` : ''}
                      </p>
                      {v.summary && <p className="mt-1 text-sm">{v.summary}</p>}
                    </li>
                  );
                })}
              </ul>
            )}
          </PortalCard>
          <section id="request" aria-labelledby="request-heading" className="scroll-mt-32 rounded-md border border-line bg-card p-5">
            <h2 id="request-heading" className="mb-1 text-lg font-semibold">
              Ask for a visit
            </h2>
            <p className="mb-4 text-sm text-slate-500">
              {firmName} gets your request by e-mail and calls to book it. For an alarm going off now, call the monitoring center instead.
            </p>
            <ServiceRequestForm siteId={siteId} devices={devices.data ?? []} firmName={firmName} />
          </section>
        </div>

        <PortalCard title="Past visits" id="history">
          {service.past.length === 0 ? (
            <p className="text-sm text-slate-500">No visits recorded yet.</p>
          ) : (
            <ol className="space-y-4" aria-label="Past visits">
              {service.past.map((v) => {
                const state = visitStateWords(v);
                return (
                  <li key={v.id} className="rounded-md border border-line p-4">
                    <div className="flex flex-wrap items-center justify-between gap-2">
                      <span className="font-medium">{v.kindLabel}</span>
                      <Badge tone={state.tone}>{state.word}</Badge>
                    </div>
                    <p className="text-sm text-slate-500">{formatDate(v.completedAt ?? v.scheduledStart, timeZone)}</p>
                    {v.clientNotes && <p className="mt-2 text-sm whitespace-pre-line">{v.clientNotes}</p>}
                    {(v.files.length > 0 || v.reportUrl) && (
                      <ul className="mt-3 flex flex-wrap gap-2">
                        {v.reportUrl && (
                          <li>
                            <a href={v.reportUrl} className="inline-flex min-h-12 items-center gap-2 rounded-md border border-line px-3 text-sm font-medium text-brass-700 hover:bg-paper">
                              <Download className="size-4" aria-hidden="true" /> Visit report (PDF)
                            </a>
                          </li>
                        )}
                        {v.files.map((f) => (
                          <li key={f.id}>
                            <a href={f.fileUrl} className="inline-flex min-h-12 items-center gap-2 rounded-md border border-line px-3 text-sm font-medium text-brass-700 hover:bg-paper">
                              <FileText className="size-4" aria-hidden="true" /> {f.title || 'File'}
                            </a>
                          </li>
                        ))}
                      </ul>
                    )}
                  </li>
                );
              })}
            </ol>
          )}
        </PortalCard>
      </div>
    </>
  );
}
