import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { CalendarDays, Plus, X } from 'lucide-react';
import { JOB_KINDS, JOB_KIND_LABELS, JOB_STATES, JOB_STATE_LABELS, type JobKind, type JobState } from '@domain/jobs';
import { paths } from '@/config/paths';
import { Button, ButtonLink } from '@/components/ui/button';
import { DataTable, sortParam } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Input, Select } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { SearchField } from '@/components/ui/search-field';
import { TableSkeleton } from '@/components/ui/skeleton';
import { useAppAbility } from '@/lib/ability';
import { useSession } from '@/lib/auth';
import type { ApiJob } from '@/types/api';
import { jobListQuery, techniciansQuery, useSiteTimeZones } from '@/features/jobs/api/jobs-queries';
import { JobStateBadge, OverlapFlag } from '@/features/jobs/components/job-bits';
import { JobWhen } from '@/features/jobs/components/job-when';
import { NewJobDialog } from '@/features/jobs/components/new-job-dialog';
import { dayKey, nextDay, startOfDayIn } from '@/features/jobs/time';

const PAGE_SIZE = 25;

function FilterLabel({ htmlFor, children }: { htmlFor: string; children: string }) {
  return (
    <label htmlFor={htmlFor} className="mb-1 block text-xs font-medium text-slate-500">
      {children}
    </label>
  );
}

export default function JobsPage() {
  const session = useSession();
  const ability = useAppAbility();
  const navigate = useNavigate();
  const canCreate = ability.can('create', 'Job');
  const firmZone = session.tenant?.timeZone ?? 'UTC';
  const isTechnician = session.user?.role === 'technician';
  const [sorting, setSorting] = useState<SortingState>([{ id: 'scheduledStart', desc: false }]);
  const [page, setPage] = useState(1);
  const [q, setQ] = useState('');
  const [state, setState] = useState<JobState | ''>('');
  const [kind, setKind] = useState<JobKind | ''>('');
  const [technicianId, setTechnicianId] = useState<string>(isTechnician ? (session.user?.id ?? '') : '');
  // upcoming work first: from today at the firm; clear the dates to see the past
  const [fromDay, setFromDay] = useState(() => dayKey(new Date(), firmZone));
  const [toDay, setToDay] = useState('');
  const [creating, setCreating] = useState(false);
  const technicians = useQuery(techniciansQuery());

  const rangeError = fromDay && toDay && toDay < fromDay ? 'The last day comes before the first.' : null;
  const list = useQuery(
    jobListQuery({
      page,
      pageSize: PAGE_SIZE,
      sort: sortParam(sorting),
      q: q.trim() || undefined,
      state: state || undefined,
      kind: kind || undefined,
      technicianId: technicianId || undefined,
      from: fromDay && !rangeError ? startOfDayIn(fromDay, firmZone).toISOString() : undefined,
      to: toDay && !rangeError ? startOfDayIn(nextDay(toDay), firmZone).toISOString() : undefined,
    }),
  );
  const waiting = useQuery({ ...jobListQuery({ page: 1, pageSize: 1, state: 'requested' }), enabled: canCreate });
  const waitingCount = waiting.data?.page.total ?? 0;
  const zoneOf = useSiteTimeZones(list.data?.data ?? [], firmZone);
  const filtered = Boolean(q || state || kind || fromDay || toDay || (technicianId && !isTechnician));
  const filterChanged =
    <T,>(set: (v: T) => void) =>
    (v: T) => {
      set(v);
      setPage(1);
    };
  const clearFilters = () => {
    setQ('');
    setState('');
    setKind('');
    setTechnicianId(isTechnician ? (session.user?.id ?? '') : '');
    setFromDay('');
    setToDay('');
    setPage(1);
  };

  const columns = useMemo<ColumnDef<ApiJob, unknown>[]>(
    () => [
      {
        id: 'scheduledStart',
        header: 'When',
        cell: ({ row }) => <JobWhen start={row.original.scheduledStart} end={row.original.scheduledEnd} timeZone={zoneOf(row.original.siteId)} />,
      },
      {
        id: 'summary',
        header: 'Job',
        enableSorting: false,
        cell: ({ row }) => (
          <div className="min-w-0 py-0.5">
            <Link to={paths.firm.job(row.original.id)} className="line-clamp-2 font-medium text-brass-700 underline-offset-2 hover:underline">
              {row.original.summary}
            </Link>
            <p className="max-w-[14rem] truncate text-xs text-slate-500 md:hidden">{row.original.siteName}</p>
          </div>
        ),
      },
      { id: 'site', header: 'Site', enableSorting: false, meta: { hideOnMobile: true }, cell: ({ row }) => row.original.siteName },
      {
        id: 'kind',
        header: 'Kind',
        meta: { hideOnMobile: true },
        cell: ({ row }) => <span className="whitespace-nowrap">{JOB_KIND_LABELS[row.original.kind]}</span>,
      },
      {
        id: 'technician',
        header: 'Technician',
        enableSorting: false,
        meta: { hideOnMobile: true },
        cell: ({ row }) => row.original.technicianName ?? <span className="text-slate-500">Not assigned</span>,
      },
      {
        id: 'state',
        header: 'State',
        cell: ({ row }) => (
          <span className="flex flex-col items-start gap-1">
            <JobStateBadge state={row.original.state} />
            <OverlapFlag count={row.original.overlaps?.length ?? 0} compact />
          </span>
        ),
      },
    ],
    [zoneOf],
  );

  return (
    <>
      <PageHeader
        title="Jobs"
        context="Installs, service calls, battery changes and inspections, with their state and technician."
        action={
          <>
            <ButtonLink to={paths.firm.schedule} variant="secondary">
              <CalendarDays className="size-4" aria-hidden="true" /> Schedule
            </ButtonLink>
            {canCreate && (
              <Button onClick={() => setCreating(true)}>
                <Plus className="size-4" aria-hidden="true" /> New job
              </Button>
            )}
          </>
        }
      />
      <div className="mb-3 grid grid-cols-2 gap-2 lg:grid-cols-[minmax(14rem,1.4fr)_repeat(3,minmax(0,1fr))]">
        <div className="col-span-2 lg:col-span-1 lg:self-end">
          <SearchField label="Search jobs" placeholder="Search the summary" value={q} onChange={filterChanged(setQ)} />
        </div>
        <div>
          <FilterLabel htmlFor="job-state">State</FilterLabel>
          <Select id="job-state" value={state} onChange={(e) => filterChanged(setState)(e.target.value as JobState | '')}>
            <option value="">Any state</option>
            {JOB_STATES.map((s) => (
              <option key={s} value={s}>
                {JOB_STATE_LABELS[s]}
              </option>
            ))}
          </Select>
        </div>
        <div>
          <FilterLabel htmlFor="job-kind">Kind</FilterLabel>
          <Select id="job-kind" value={kind} onChange={(e) => filterChanged(setKind)(e.target.value as JobKind | '')}>
            <option value="">Any kind</option>
            {JOB_KINDS.map((k) => (
              <option key={k} value={k}>
                {JOB_KIND_LABELS[k]}
              </option>
            ))}
          </Select>
        </div>
        <div className="col-span-2 lg:col-span-1">
          <FilterLabel htmlFor="job-technician">Technician</FilterLabel>
          <Select id="job-technician" value={technicianId} onChange={(e) => filterChanged(setTechnicianId)(e.target.value)}>
            <option value="">Anyone</option>
            {(technicians.data ?? []).map((t) => (
              <option key={t.id} value={t.id}>
                {t.id === session.user?.id ? `${t.name} (me)` : t.name}
              </option>
            ))}
          </Select>
        </div>
      </div>
      <div className="mb-3 flex flex-wrap items-end gap-2">
        <div className="w-[calc(50%-0.25rem)] sm:w-44">
          <FilterLabel htmlFor="job-from">From</FilterLabel>
          <Input id="job-from" type="date" value={fromDay} onChange={(e) => filterChanged(setFromDay)(e.target.value)} invalid={!!rangeError} />
        </div>
        <div className="w-[calc(50%-0.25rem)] sm:w-44">
          <FilterLabel htmlFor="job-to">To</FilterLabel>
          <Input
            id="job-to"
            type="date"
            value={toDay}
            onChange={(e) => filterChanged(setToDay)(e.target.value)}
            invalid={!!rangeError}
            aria-describedby={rangeError ? 'job-range-error' : undefined}
          />
        </div>
        {filtered && (
          <Button variant="ghost" onClick={clearFilters}>
            <X className="size-4" aria-hidden="true" /> Clear filters
          </Button>
        )}
        {canCreate && waitingCount > 0 && !(state === 'requested' && !fromDay && !toDay) && (
          <Button
            variant="ghost"
            className="text-ochre-600"
            onClick={() => {
              clearFilters();
              setState('requested');
            }}
          >
            {waitingCount === 1 ? '1 requested job waits' : `${waitingCount} requested jobs wait`} for a time
          </Button>
        )}
        {rangeError && (
          <p id="job-range-error" role="alert" className="w-full text-xs font-medium text-clay-600">
            {rangeError}
          </p>
        )}
      </div>
      {list.isPending ? (
        <TableSkeleton />
      ) : list.isError ? (
        <p className="text-sm text-clay-600">{list.error.message}</p>
      ) : list.data.page.total === 0 ? (
        filtered || technicianId ? (
          <EmptyState
            title="No jobs match"
            action={
              <Button variant="secondary" onClick={clearFilters}>
                Clear filters
              </Button>
            }
          >
            {technicianId && isTechnician && !filtered
              ? 'Nothing is assigned to you. Choose “Anyone” to see every job of the firm.'
              : 'Widen the dates or choose another state, kind or technician.'}
          </EmptyState>
        ) : (
          <EmptyState title="No jobs yet" action={canCreate && <Button onClick={() => setCreating(true)}>Add the first job</Button>}>
            Jobs are visits to a site: installs, service calls, battery changes, inspections, takeovers and removals.
          </EmptyState>
        )
      ) : (
        <DataTable
          caption="Jobs of the firm"
          columns={columns}
          data={list.data.data}
          getRowId={(r) => r.id}
          sorting={sorting}
          onSortingChange={(s) => {
            setSorting(s);
            setPage(1);
          }}
          page={page}
          pageSize={PAGE_SIZE}
          total={list.data.page.total}
          onPageChange={setPage}
          busy={list.isPlaceholderData}
        />
      )}
      {canCreate && <NewJobDialog open={creating} onClose={() => setCreating(false)} onCreated={(job) => void navigate(paths.firm.job(job.id))} />}
    </>
  );
}
