import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { AlertTriangle, ArrowLeft, FileDown, MapPin, UserRound } from 'lucide-react';
import { subject } from '@domain/abilities';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { paths } from '@/config/paths';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { useAppAbility } from '@/lib/ability';
import { useSession } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { jobQuery, jobSiteQuery, jobUrls } from '@/features/jobs/api/jobs-queries';
import { JobActions } from '@/features/jobs/components/job-actions';
import { JobStateBadge, OverlapFlag } from '@/features/jobs/components/job-bits';
import { JobChecklist } from '@/features/jobs/components/job-checklist';
import { JobDetailsForm } from '@/features/jobs/components/job-details-form';
import { JobFiles } from '@/features/jobs/components/job-files';
import { JobParts } from '@/features/jobs/components/job-parts';
import { TouchedZones } from '@/features/jobs/components/touched-zones';
import { WalkTest } from '@/features/jobs/components/walk-test';
import { isEditableState } from '@/features/jobs/job-rules';
import { formatWhen, zoneLabel } from '@/features/jobs/time';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  const job = await queryClient.ensureQueryData(jobQuery(params.jobId ?? ''));
  void queryClient.prefetchQuery(jobSiteQuery(job.siteId));
  return null;
}

export default function JobPage() {
  const { jobId = '' } = useParams();
  const { data: job } = useSuspenseQuery(jobQuery(jobId));
  const site = useQuery(jobSiteQuery(job.siteId));
  const session = useSession();
  const ability = useAppAbility();
  const timeZone = job.siteTimeZone ?? site.data?.timeZone ?? session.tenant?.timeZone ?? 'UTC';
  const canManage = ability.can('create', 'Job');
  const canUpdate = ability.can('update', subject('Job', { ...job, tenantId: session.tenant?.id }));
  const editable = canUpdate && isEditableState(job.state);
  const overlaps = job.overlaps ?? [];

  return (
    <>
      <Link to={paths.firm.jobs} className="mb-4 inline-flex items-center gap-1 text-sm text-slate-500 hover:text-ink">
        <ArrowLeft className="size-4" aria-hidden="true" /> Jobs
      </Link>
      <div className="mb-6 space-y-3">
        <div className="flex flex-wrap items-center gap-2">
          <JobStateBadge state={job.state} />
          <Badge>{JOB_KIND_LABELS[job.kind]}</Badge>
          {job.requestedByClient && <Badge tone="brass">Asked for by the client</Badge>}
          <OverlapFlag count={overlaps.length} />
        </div>
        <h1 className="text-xl font-semibold break-words text-ink">{job.summary}</h1>
        <div className="flex flex-col gap-1 text-sm text-slate-500 sm:flex-row sm:flex-wrap sm:gap-x-4">
          <Link to={paths.firm.site(job.siteId)} className="inline-flex items-center gap-1 text-brass-700 hover:underline">
            <MapPin className="size-4" aria-hidden="true" /> {site.data?.clientName ? `${site.data.clientName} · ` : ''}
            {job.siteName || site.data?.name || 'Site'}
          </Link>
          <span>
            {formatWhen(job.scheduledStart, job.scheduledEnd, timeZone)}
            {job.scheduledStart && <span className="text-xs"> · {zoneLabel(timeZone, new Date(job.scheduledStart))}</span>}
          </span>
          <span className="inline-flex items-center gap-1">
            <UserRound className="size-4" aria-hidden="true" /> {job.technicianName ?? 'No technician yet'}
          </span>
        </div>
        <JobActions job={job} canManage={canManage} canUpdate={canUpdate} />
        {!canUpdate && isEditableState(job.state) && (
          <p className="text-xs text-slate-500">
            This job is assigned to {job.technicianName ?? 'another technician'}: you can read it; its technician or the office changes it.
          </p>
        )}
      </div>

      {overlaps.length > 0 && (
        <div role="note" className="mb-6 flex items-start gap-2 rounded-md border border-clay-600/40 bg-clay-50 px-3 py-2 text-sm text-clay-600">
          <AlertTriangle className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
          <span>
            Overlap: {job.technicianName ?? 'The technician'} has {overlaps.length === 1 ? 'another job' : `${overlaps.length} other jobs`} at the
            same time.{' '}
            {overlaps
              .map((id, i) => (
                <Link key={id} to={paths.firm.job(id)} className="font-medium underline">
                  {overlaps.length === 1 ? 'Open it' : `Job ${i + 1}`}
                </Link>
              ))
              .reduce<React.ReactNode[]>((acc, el, i) => (i === 0 ? [el] : [...acc, ', ', el]), [])}
          </span>
        </div>
      )}
      {job.state === 'completed' && (
        <Card className="mb-6">
          <div className="flex flex-col gap-3 sm:flex-row sm:items-center sm:justify-between">
            <p className="text-sm">
              Completed {formatDateTime(job.completedAt, timeZone)}
              {job.technicianName ? ` by ${job.technicianName}` : ''}.
            </p>
            {job.reportUrl !== null && (
              <a
                href={job.reportUrl ?? jobUrls.report(job.id)}
                className="inline-flex h-10 items-center gap-2 rounded-md bg-brass-600 px-4 text-sm font-medium text-white hover:bg-brass-700"
              >
                <FileDown className="size-4" aria-hidden="true" /> Completion report (PDF)
              </a>
            )}
          </div>
        </Card>
      )}
      {job.state === 'cancelled' && (
        <Card className="mb-6">
          <p className="text-sm">
            <span className="font-medium">Cancelled.</span> {job.cancelReason ? `Reason: ${job.cancelReason}` : ''}
          </p>
        </Card>
      )}

      <div className="grid gap-6 lg:grid-cols-5">
        <div className="min-w-0 space-y-6 lg:col-span-3">
          <Card title="Checklist">
            <JobChecklist job={job} editable={editable} />
          </Card>
          <TouchedZones job={job} editable={editable} />
          <WalkTest job={job} editable={editable} />
          <JobFiles job={job} canUpload={editable} />
        </div>
        <div className="min-w-0 space-y-6 lg:col-span-2">
          <JobDetailsForm job={job} timeZone={timeZone} canManage={canManage} editable={editable} />
          <JobParts job={job} editable={editable} />
        </div>
      </div>
    </>
  );
}
