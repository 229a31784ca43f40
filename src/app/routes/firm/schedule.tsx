import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { View } from 'react-big-calendar';
import { AlertTriangle, ClipboardList, Sun } from 'lucide-react';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { paths } from '@/config/paths';
import { Button, ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Select } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';
import { useAppAbility } from '@/lib/ability';
import { useSession } from '@/lib/auth';
import type { ApiJob } from '@/types/api';
import { jobListQuery, techniciansQuery } from '@/features/jobs/api/jobs-queries';
import { RescheduleDialog } from '@/features/jobs/components/reschedule-dialog';
import { ScheduleCalendar, visibleRange } from '@/features/jobs/components/schedule-calendar';
import { fromCalendarDate, toCalendarDate, zoneLabel } from '@/features/jobs/time';

const narrow = () => typeof window !== 'undefined' && typeof window.matchMedia === 'function' && window.matchMedia('(max-width: 767px)').matches;

/** Week and day views of the firm's jobs, per technician or all together; drag to reschedule. */
export default function SchedulePage() {
  const session = useSession();
  const ability = useAppAbility();
  const canManage = ability.can('create', 'Job');
  const isTechnician = session.user?.role === 'technician';
  const timeZone = session.tenant?.timeZone ?? 'UTC';
  const [view, setView] = useState<View>(() => (narrow() ? 'day' : 'week'));
  const [date, setDate] = useState<Date>(() => toCalendarDate(new Date().toISOString(), timeZone));
  const [technicianId, setTechnicianId] = useState<string>(isTechnician ? (session.user?.id ?? '') : '');
  const [opened, setOpened] = useState<ApiJob | null>(null);
  const technicians = useQuery(techniciansQuery());

  const range = visibleRange(date, view);
  const jobs = useQuery(
    jobListQuery({
      page: 1,
      pageSize: 100,
      sort: 'scheduledStart',
      technicianId: technicianId || undefined,
      from: fromCalendarDate(range.start, timeZone),
      to: fromCalendarDate(range.end, timeZone),
    }),
  );
  const waiting = useQuery({ ...jobListQuery({ page: 1, pageSize: 50, sort: '-createdAt', state: 'requested' }), enabled: canManage });
  const unscheduled = (waiting.data?.data ?? []).filter((j) => !j.scheduledStart);
  const shown = jobs.data?.data ?? [];
  const overlapping = shown.filter((j) => (j.overlaps?.length ?? 0) > 0).length;
  const total = jobs.data?.page.total ?? 0;
  // a job opened from the calendar shows its latest state after a move
  const current = opened ? (shown.find((j) => j.id === opened.id) ?? unscheduled.find((j) => j.id === opened.id) ?? opened) : null;

  return (
    <>
      <PageHeader
        title="Schedule"
        context={
          <>
            Times in the firm’s zone, {zoneLabel(timeZone)}.{canManage ? ' Drag a job to move it, or its lower edge to change its length.' : ''}
          </>
        }
        action={
          <>
            <ButtonLink to={paths.firm.jobs} variant="secondary">
              <ClipboardList className="size-4" aria-hidden="true" /> Jobs list
            </ButtonLink>
            {canManage && (
              <ButtonLink to={paths.firm.today} variant="secondary">
                <Sun className="size-4" aria-hidden="true" /> A technician’s day
              </ButtonLink>
            )}
          </>
        }
      />
      <div className="mb-3 flex flex-wrap items-end justify-between gap-3">
        <div className="w-full sm:w-64">
          <label htmlFor="schedule-technician" className="mb-1 block text-xs font-medium text-slate-500">
            Technician
          </label>
          <Select id="schedule-technician" value={technicianId} onChange={(e) => setTechnicianId(e.target.value)}>
            <option value="">{view === 'day' ? 'Everyone, side by side' : 'Everyone'}</option>
            {(technicians.data ?? []).map((t) => (
              <option key={t.id} value={t.id}>
                {t.id === session.user?.id ? `${t.name} (me)` : t.name}
              </option>
            ))}
          </Select>
        </div>
        <p className="text-sm text-slate-500" aria-live="polite">
          {jobs.data && (total === 1 ? '1 job' : `${total} jobs`)}
          {overlapping > 0 && (
            <span className="ml-2 inline-flex items-center gap-1 font-medium text-clay-600">
              <AlertTriangle className="size-4" aria-hidden="true" />{' '}
              {overlapping === 1 ? '1 job overlaps another' : `${overlapping} jobs overlap others`}
            </span>
          )}
          {total > shown.length && <span className="ml-2">Showing the first {shown.length}; choose a technician to see the rest.</span>}
        </p>
      </div>
      <div className="grid gap-6 xl:grid-cols-[1fr_16rem]">
        <div className="min-w-0">
          {jobs.isError ? (
            <p className="text-sm text-clay-600">{jobs.error.message}</p>
          ) : technicians.isPending ? (
            <Skeleton className="h-[28rem] w-full" />
          ) : (
            <ScheduleCalendar
              jobs={shown}
              technicians={technicianId ? (technicians.data ?? []).filter((t) => t.id === technicianId) : (technicians.data ?? [])}
              timeZone={timeZone}
              view={view}
              date={date}
              onView={setView}
              onNavigate={setDate}
              byTechnician={!technicianId}
              canManage={canManage}
              onOpen={setOpened}
            />
          )}
        </div>
        {canManage && (
          <Card title="Waiting to be scheduled" className="self-start">
            {waiting.isPending ? (
              <Skeleton className="h-16 w-full" />
            ) : unscheduled.length === 0 ? (
              <p className="text-sm text-slate-500">Every requested job has a time.</p>
            ) : (
              <ul className="divide-y divide-line">
                {unscheduled.map((j) => (
                  <li key={j.id} className="py-2 first:pt-0 last:pb-0">
                    <Link to={paths.firm.job(j.id)} className="block text-sm font-medium text-brass-700 hover:underline">
                      {j.summary}
                    </Link>
                    <p className="text-xs text-slate-500">
                      {JOB_KIND_LABELS[j.kind]} · {j.siteName}
                    </p>
                    <Button variant="secondary" size="sm" className="mt-1" onClick={() => setOpened(j)}>
                      Schedule…
                    </Button>
                  </li>
                ))}
              </ul>
            )}
          </Card>
        )}
      </div>
      <RescheduleDialog job={current} technicians={technicians.data} canManage={canManage} onClose={() => setOpened(null)} />
    </>
  );
}
