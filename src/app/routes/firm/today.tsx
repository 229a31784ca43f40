import { useState } from 'react';
import { useQueries, useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { subject } from '@domain/abilities';
import { isOpenJobState } from '@domain/jobs';
import { paths } from '@/config/paths';
import { EmptyState } from '@/components/ui/empty-state';
import { Select } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';
import { useAppAbility } from '@/lib/ability';
import { useSession } from '@/lib/auth';
import type { ApiJob } from '@/types/api';
import { jobListQuery, jobSiteQuery, techniciansQuery } from '@/features/jobs/api/jobs-queries';
import { DayCard } from '@/features/jobs/components/day-card';
import { nextJobOf } from '@/features/jobs/job-rules';
import { dayKey } from '@/features/jobs/time';

const HOUR = 3_600_000;
/**
 * The technician's day: today's jobs (today at each site) in time order as one column of
 * cards, the next one open. Owners and coordinators choose whose day to see.
 */
export default function TodayPage() {
  const session = useSession();
  const ability = useAppAbility();
  const firmZone = session.tenant?.timeZone ?? 'UTC';
  const isTechnician = session.user?.role === 'technician';
  const technicians = useQuery({ ...techniciansQuery(), enabled: !isTechnician });
  const [chosen, setChosen] = useState<string>('');
  const technicianId = isTechnician ? (session.user?.id ?? '') : chosen || technicians.data?.[0]?.id || '';
  // a window wide enough to hold "today" in every time zone; each job is then kept if it starts today at its site
  const [now] = useState(() => new Date());
  const list = useQuery({
    ...jobListQuery({
      page: 1,
      pageSize: 100,
      sort: 'scheduledStart',
      technicianId,
      from: new Date(now.getTime() - 30 * HOUR).toISOString(),
      to: new Date(now.getTime() + 30 * HOUR).toISOString(),
    }),
    enabled: Boolean(technicianId),
  });
  const candidates = (list.data?.data ?? []).filter((j) => j.scheduledStart && j.state !== 'cancelled');
  const siteIds = [...new Set(candidates.map((j) => j.siteId))];
  const sites = useQueries({ queries: siteIds.map((id) => jobSiteQuery(id)) });
  const siteOf = (id: string) => sites[siteIds.indexOf(id)]?.data;
  const zoneOf = (job: ApiJob) => job.siteTimeZone ?? siteOf(job.siteId)?.timeZone ?? firmZone;
  const jobs = candidates
    .filter((j) => dayKey(j.scheduledStart!, zoneOf(j)) === dayKey(now, zoneOf(j)))
    .sort((a, b) => Date.parse(a.scheduledStart!) - Date.parse(b.scheduledStart!));
  const next = nextJobOf(jobs, now);
  const [open, setOpen] = useState<Set<string> | null>(null);
  const expanded = open ?? new Set(next ? [next.id] : []);
  const toggle = (id: string) => {
    const set = new Set(expanded);
    if (set.has(id)) set.delete(id);
    else set.add(id);
    setOpen(set);
  };

  const technicianName = isTechnician ? session.user?.name : technicians.data?.find((t) => t.id === technicianId)?.name;
  const dateWords = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric', timeZone: firmZone }).format(now);
  const openCount = jobs.filter((j) => isOpenJobState(j.state)).length;

  return (
    <div className="mx-auto max-w-2xl">
      <PageHeader
        title={isTechnician ? 'Today' : `${technicianName ?? 'Technician'}’s day`}
        context={`${dateWords}${list.data ? ` · ${jobs.length === 1 ? '1 job' : `${jobs.length} jobs`}${openCount !== jobs.length ? `, ${openCount} still to do` : ''}` : ''}`}
        action={
          !isTechnician && (
            <div className="w-full sm:w-56">
              <label htmlFor="day-technician" className="sr-only">
                Technician
              </label>
              <Select
                id="day-technician"
                value={technicianId}
                onChange={(e) => {
                  setChosen(e.target.value);
                  setOpen(null);
                }}
              >
                {(technicians.data ?? []).map((t) => (
                  <option key={t.id} value={t.id}>
                    {t.name}
                  </option>
                ))}
              </Select>
            </div>
          )
        }
      />
      {!technicianId && !isTechnician ? (
        technicians.isPending ? (
          <Skeleton className="h-24 w-full" />
        ) : (
          <EmptyState title="No technicians yet">Invite a technician from Staff; their day appears here.</EmptyState>
        )
      ) : list.isPending ? (
        <div className="space-y-3" role="status" aria-label="Loading">
          <Skeleton className="h-40 w-full" />
          <Skeleton className="h-16 w-full" />
        </div>
      ) : list.isError ? (
        <p className="text-sm text-clay-600">{list.error.message}</p>
      ) : jobs.length === 0 ? (
        <EmptyState
          title="Nothing scheduled today"
          action={
            <Link to={paths.firm.jobs} className="text-sm font-medium text-brass-700 underline">
              See all jobs
            </Link>
          }
        >
          {isTechnician ? 'When the office schedules a visit for you today, it appears here.' : 'No visits for this technician today.'}
        </EmptyState>
      ) : (
        <ol className="space-y-3" aria-label="Today’s jobs in time order">
          {jobs.map((job) => (
            <li key={job.id}>
              <DayCard
                job={job}
                site={siteOf(job.siteId)}
                timeZone={zoneOf(job)}
                expanded={expanded.has(job.id)}
                onToggle={() => toggle(job.id)}
                isNext={job.id === next?.id}
                canUpdate={ability.can('update', subject('Job', { ...job, tenantId: session.tenant?.id }))}
              />
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
