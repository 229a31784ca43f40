import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ChevronDown, ChevronRight, KeyRound, ListTree, MapPin, Navigation, Play, CheckCheck } from 'lucide-react';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { paths } from '@/config/paths';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-field';
import { cn } from '@/lib/cn';
import type { ApiJob, ApiSite } from '@/types/api';
import { jobQuery, siteZonesQuery } from '../api/jobs-queries';
import { isEditableState } from '../job-rules';
import { formatTime } from '../time';
import { CompleteJobDialog, useJobTransition } from './job-actions';
import { addressLine, JobStateBadge, mapsUrl, OverlapFlag } from './job-bits';
import { JobChecklist } from './job-checklist';

function Times({ job, timeZone }: { job: ApiJob; timeZone: string }) {
  if (!job.scheduledStart) return <span>No time set</span>;
  return (
    <span className="tabular-nums">
      {formatTime(job.scheduledStart, timeZone)}
      {job.scheduledEnd && ` – ${formatTime(job.scheduledEnd, timeZone)}`}
    </span>
  );
}

function StartComplete({ job }: { job: ApiJob }) {
  const { run, error, pending } = useJobTransition(job);
  const [completing, setCompleting] = useState(false);
  return (
    <div className="space-y-2">
      {job.state === 'scheduled' && (
        <Button size="lg" className="w-full" busy={pending} onClick={() => run({ to: 'in_progress' })}>
          <Play className="size-5" aria-hidden="true" /> Start job
        </Button>
      )}
      {job.state === 'in_progress' && (
        <Button size="lg" className="w-full" busy={pending} onClick={() => setCompleting(true)}>
          <CheckCheck className="size-5" aria-hidden="true" /> Complete job
        </Button>
      )}
      {error && (
        <div>
          <FormError message={error.message} />
          {error.field === 'walkTest' && (
            <Link
              to={`${paths.firm.job(job.id)}#walk-test`}
              className="mt-1 inline-flex min-h-12 items-center text-sm font-medium text-brass-700 underline"
            >
              Record the walk test
            </Link>
          )}
        </div>
      )}
      <CompleteJobDialog
        job={job}
        open={completing}
        onClose={() => setCompleting(false)}
        busy={pending}
        onConfirm={(ids) => run({ to: 'completed', ...(ids.length ? { batteryChangedZoneIds: ids } : {}) }, () => setCompleting(false))}
      />
    </div>
  );
}

function Panels({ siteId }: { siteId: string }) {
  const data = useQuery(siteZonesQuery(siteId));
  if (data.isPending) return <p className="text-sm text-slate-500">Loading panels…</p>;
  if (data.isError) return <p className="text-sm text-clay-600">{data.error.message}</p>;
  if (data.data.panels.length === 0) return <p className="text-sm text-slate-500">No panel recorded at this site yet.</p>;
  return (
    <ul className="space-y-1">
      {data.data.panels.map((p) => {
        const count = data.data.zones.filter((z) => z.panelId === p.id).length;
        return (
          <li key={p.id}>
            <Link
              to={paths.firm.panel(p.id)}
              className="flex min-h-12 items-center justify-between gap-2 rounded-md border border-line px-3 text-sm hover:border-brass-600"
            >
              <span className="flex items-center gap-2">
                <ListTree className="size-4 text-slate-500" aria-hidden="true" />
                <span>
                  Zone list of <span className="font-medium">{p.label}</span>
                </span>
              </span>
              <span className="text-xs text-slate-500">{count === 1 ? '1 zone' : `${count} zones`}</span>
            </Link>
          </li>
        );
      })}
    </ul>
  );
}

/**
 * One job of the day. Collapsed: time, site, kind and state. Expanded: the address with a
 * maps link, access notes, the checklist, the panels' zone lists, and big start/complete buttons.
 */
export function DayCard({
  job: listed,
  site,
  timeZone,
  expanded,
  onToggle,
  isNext,
  canUpdate,
}: {
  job: ApiJob;
  site: ApiSite | undefined;
  timeZone: string;
  expanded: boolean;
  onToggle: () => void;
  isNext: boolean;
  canUpdate: boolean;
}) {
  // the job's own cache entry: a tick or a start shows at once, before the day's list reloads
  const job = useQuery({ ...jobQuery(listed.id), initialData: listed }).data;
  const address = addressLine(site?.address);
  const headingId = `day-job-${job.id}`;
  const editable = canUpdate && isEditableState(job.state);
  return (
    <article
      aria-labelledby={headingId}
      className={cn('rounded-md border bg-card', isNext ? 'border-brass-600' : 'border-line', !isEditableState(job.state) && 'opacity-80')}
    >
      <h2 id={headingId} className="text-base">
        <button type="button" aria-expanded={expanded} onClick={onToggle} className="flex min-h-12 w-full items-start gap-3 px-4 py-3 text-left">
          {expanded ? (
            <ChevronDown className="mt-1 size-5 shrink-0 text-slate-500" aria-hidden="true" />
          ) : (
            <ChevronRight className="mt-1 size-5 shrink-0 text-slate-500" aria-hidden="true" />
          )}
          <span className="min-w-0 flex-1">
            <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
              <span className="font-semibold">
                <Times job={job} timeZone={timeZone} />
              </span>
              {isNext && <span className="text-xs font-semibold text-brass-700 uppercase">Next</span>}
            </span>
            <span className="block truncate font-medium">
              {job.siteName || site?.name}
              {site?.clientName && <span className="font-normal text-slate-500"> · {site.clientName}</span>}
            </span>
            <span className="block text-sm font-normal text-slate-500">
              {JOB_KIND_LABELS[job.kind]} · {job.summary}
            </span>
          </span>
          <span className="flex shrink-0 flex-col items-end gap-1">
            <JobStateBadge state={job.state} />
            <OverlapFlag count={job.overlaps?.length ?? 0} compact />
          </span>
        </button>
      </h2>
      {expanded && (
        <div className="space-y-4 border-t border-line px-4 py-4">
          {address ? (
            <a
              href={mapsUrl(address)}
              target="_blank"
              rel="noreferrer"
              className="flex min-h-12 items-center gap-3 rounded-md border border-line px-3 py-2 text-sm hover:border-brass-600"
            >
              <MapPin className="size-5 shrink-0 text-brass-700" aria-hidden="true" />
              <span className="min-w-0 flex-1">{address}</span>
              <span className="inline-flex shrink-0 items-center gap-1 text-xs font-medium text-brass-700">
                <Navigation className="size-4" aria-hidden="true" /> Map
              </span>
            </a>
          ) : (
            <p className="text-sm text-slate-500">Loading the address…</p>
          )}
          {site?.accessNotes && (
            <div className="rounded-md border border-ochre-600/30 bg-ochre-50 px-3 py-2">
              <p className="flex items-center gap-1 text-xs font-semibold text-ochre-600">
                <KeyRound className="size-3.5" aria-hidden="true" /> Access notes
              </p>
              <p className="mt-1 text-sm whitespace-pre-line">{site.accessNotes}</p>
            </div>
          )}
          {editable && <StartComplete job={job} />}
          <section aria-label="Checklist">
            <h3 className="mb-1 text-sm font-semibold">Checklist</h3>
            <JobChecklist job={job} editable={editable} />
          </section>
          <section aria-label="Panels">
            <h3 className="mb-1 text-sm font-semibold">Panels</h3>
            <Panels siteId={job.siteId} />
          </section>
          <Link
            to={paths.firm.job(job.id)}
            className="flex min-h-12 items-center justify-center gap-1 rounded-md border border-line-strong text-sm font-medium hover:bg-slate-100"
          >
            Open the job: walk test, photos, parts <ChevronRight className="size-4" aria-hidden="true" />
          </Link>
        </div>
      )}
    </article>
  );
}
