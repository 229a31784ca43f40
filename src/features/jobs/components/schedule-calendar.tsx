import { useMemo, useState } from 'react';
import { Calendar, dateFnsLocalizer, type EventProps, type ToolbarProps, type View } from 'react-big-calendar';
import withDragAndDropModule, { type EventInteractionArgs } from 'react-big-calendar/lib/addons/dragAndDrop';
import { addDays, addMinutes, format, getDay, parse, startOfDay, startOfWeek } from 'date-fns';
import { enUS } from 'date-fns/locale';
import { AlertTriangle, ChevronLeft, ChevronRight } from 'lucide-react';
import { JOB_STATE_LABELS } from '@domain/jobs';
import 'react-big-calendar/lib/css/react-big-calendar.css';
import 'react-big-calendar/lib/addons/dragAndDrop/styles.css';
import './schedule.css';
import { Button } from '@/components/ui/button';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import type { ApiJob, ApiUser } from '@/types/api';
import { useRescheduleJob, type JobPatch } from '../api/jobs-queries';
import { isEditableState } from '../job-rules';
import { fromCalendarDate, toCalendarDate } from '../time';

const localizer = dateFnsLocalizer({
  format,
  parse,
  startOfWeek: (d: Date) => startOfWeek(d, { weekStartsOn: 1 }),
  getDay,
  locales: { 'en-US': enUS },
});

export const UNASSIGNED = '__unassigned';

export interface JobEvent {
  id: string;
  title: string;
  start: Date;
  end: Date;
  resourceId: string;
  job: ApiJob;
}

interface Resource {
  id: string;
  title: string;
}

// The add-on ships as CommonJS only: the production bundle hands over its `exports` object, the dev server its default.
const withDragAndDrop = (withDragAndDropModule as unknown as { default?: typeof withDragAndDropModule }).default ?? withDragAndDropModule;
const DnDCalendar = withDragAndDrop<JobEvent, Resource>(Calendar);

/** The visible range of a view around a wall-clock date (for the list query). */
export function visibleRange(date: Date, view: View): { start: Date; end: Date } {
  if (view === 'day') {
    const start = startOfDay(date);
    return { start, end: addDays(start, 1) };
  }
  const start = startOfWeek(date, { weekStartsOn: 1 });
  return { start, end: addDays(start, 7) };
}

/** "Scheduled · 14 Quarry Lane: Fit back-door contact" — the state is in words, not only in colour. */
export function eventTitle(job: ApiJob): string {
  const overlap = (job.overlaps?.length ?? 0) > 0 ? 'Overlap! ' : '';
  return `${overlap}${JOB_STATE_LABELS[job.state]} · ${job.siteName}: ${job.summary}`;
}

function JobEventView({ event }: EventProps<JobEvent>) {
  const job = event.job;
  const overlap = (job.overlaps?.length ?? 0) > 0;
  return (
    <span className="block leading-tight">
      <span className="flex items-center gap-1 font-semibold">
        {overlap && <AlertTriangle className="overlap-icon size-3.5 shrink-0" aria-hidden="true" />}
        {overlap && <span>Overlap ·</span>}
        {JOB_STATE_LABELS[job.state]}
      </span>
      <span className="block truncate">{job.siteName}</span>
      <span className="block truncate opacity-85">{job.summary}</span>
      {job.technicianName && <span className="job-event-technician block truncate opacity-85">{job.technicianName}</span>}
    </span>
  );
}

function Toolbar({ label, onNavigate, onView, view }: ToolbarProps<JobEvent, Resource>) {
  return (
    <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
      <div className="flex items-center gap-1">
        <Button
          variant="secondary"
          size="md"
          className="px-2.5"
          onClick={() => onNavigate('PREV')}
          aria-label={view === 'day' ? 'Previous day' : 'Previous week'}
        >
          <ChevronLeft className="size-4" aria-hidden="true" />
        </Button>
        <Button variant="secondary" onClick={() => onNavigate('TODAY')}>
          Today
        </Button>
        <Button
          variant="secondary"
          size="md"
          className="px-2.5"
          onClick={() => onNavigate('NEXT')}
          aria-label={view === 'day' ? 'Next day' : 'Next week'}
        >
          <ChevronRight className="size-4" aria-hidden="true" />
        </Button>
        <h2 className="ml-2 text-sm font-semibold" aria-live="polite">
          {label}
        </h2>
      </div>
      <div role="group" aria-label="View" className="inline-flex rounded-md border border-line-strong p-0.5">
        {(['week', 'day'] as const).map((v) => (
          <button
            key={v}
            type="button"
            aria-pressed={view === v}
            onClick={() => onView(v)}
            className={cn('h-9 rounded-[5px] px-4 text-sm font-medium', view === v ? 'bg-ink text-paper' : 'text-ink hover:bg-slate-100')}
          >
            {v === 'week' ? 'Week' : 'Day'}
          </button>
        ))}
      </div>
    </div>
  );
}

/**
 * Jobs on a week or day grid in the firm's time zone, coloured by state with the state word in
 * each event; overlapping jobs of one technician are flagged. The office drags a job to move it
 * (in the day view with every technician, across technicians too) or drags its lower edge.
 */
export function ScheduleCalendar({
  jobs,
  technicians,
  timeZone,
  view,
  date,
  onView,
  onNavigate,
  byTechnician,
  canManage,
  onOpen,
}: {
  jobs: ApiJob[];
  technicians: ApiUser[];
  timeZone: string;
  view: View;
  date: Date;
  onView: (view: View) => void;
  onNavigate: (date: Date) => void;
  byTechnician: boolean;
  canManage: boolean;
  onOpen: (job: ApiJob) => void;
}) {
  const reschedule = useRescheduleJob();
  const toast = useToast();
  // where a dragged job sits until the server has answered
  const [moves, setMoves] = useState<Record<string, { start: Date; end: Date; resourceId: string }>>({});

  const events = useMemo<JobEvent[]>(
    () =>
      jobs
        .filter((j) => j.scheduledStart && j.state !== 'cancelled')
        .map((job) => {
          const start = toCalendarDate(job.scheduledStart!, timeZone);
          const end = job.scheduledEnd ? toCalendarDate(job.scheduledEnd, timeZone) : addMinutes(start, 60);
          const moved = moves[job.id];
          return { id: job.id, title: eventTitle(job), start, end, resourceId: job.technicianId ?? UNASSIGNED, job, ...moved };
        }),
    [jobs, timeZone, moves],
  );
  const resources = useMemo<Resource[] | undefined>(() => {
    if (!byTechnician || view !== 'day') return undefined;
    const list: Resource[] = technicians.map((t) => ({ id: t.id, title: t.name }));
    for (const e of events)
      if (!list.some((r) => r.id === e.resourceId))
        list.push({ id: e.resourceId, title: e.resourceId === UNASSIGNED ? 'Not assigned' : (e.job.technicianName ?? 'Other') });
    return list;
  }, [byTechnician, view, technicians, events]);

  const move = ({ event, start, end, resourceId }: EventInteractionArgs<JobEvent>) => {
    const s = new Date(start);
    const e = new Date(end);
    const patch: JobPatch = { scheduledStart: fromCalendarDate(s, timeZone), scheduledEnd: fromCalendarDate(e, timeZone) };
    const target = resourceId !== undefined ? String(resourceId) : event.resourceId;
    if (target !== event.resourceId && target !== UNASSIGNED) patch.technicianId = target;
    if (patch.scheduledStart === event.job.scheduledStart && patch.scheduledEnd === event.job.scheduledEnd && !patch.technicianId) return;
    setMoves((m) => ({ ...m, [event.id]: { start: s, end: e, resourceId: target } }));
    reschedule.mutate(
      { jobId: event.id, patch },
      {
        onSuccess: (saved) => {
          const who = patch.technicianId ? ` for ${saved.technicianName ?? 'the technician'}` : '';
          toast.success(`“${saved.summary}” moved${who}.${(saved.overlaps?.length ?? 0) > 0 ? ' It now overlaps another job.' : ''}`);
        },
        onError: (err) => toast.error(err instanceof ApiError ? err.message : 'The job was not moved. Try again.'),
        onSettled: () =>
          setMoves((m) => {
            const next = { ...m };
            delete next[event.id];
            return next;
          }),
      },
    );
  };

  return (
    <div className={`mullion-schedule mullion-schedule--${view}`}>
      <DnDCalendar
        localizer={localizer}
        culture="en-US"
        events={events}
        view={view}
        views={['week', 'day']}
        onView={onView}
        date={date}
        onNavigate={onNavigate}
        getNow={() => toCalendarDate(new Date().toISOString(), timeZone)}
        resources={resources}
        resourceIdAccessor={(r) => r.id}
        resourceTitleAccessor={(r) => r.title}
        step={30}
        timeslots={2}
        min={new Date(1970, 0, 1, 6, 0)}
        max={new Date(1970, 0, 1, 21, 0)}
        scrollToTime={new Date(1970, 0, 1, 7, 0)}
        style={{ height: 'min(44rem, calc(100dvh - 14rem))', minHeight: '28rem' }}
        tooltipAccessor={(e) => e.title}
        eventPropGetter={(e) => ({
          className: cn(`job-event--${e.job.state}`, (e.job.overlaps?.length ?? 0) > 0 && 'job-event--overlap'),
        })}
        components={{ event: JobEventView, toolbar: Toolbar }}
        onSelectEvent={(e) => onOpen(e.job)}
        draggableAccessor={(e) => canManage && isEditableState(e.job.state)}
        resizableAccessor={(e) => canManage && isEditableState(e.job.state)}
        resizable
        onEventDrop={move}
        onEventResize={move}
        showMultiDayTimes
        dayLayoutAlgorithm="no-overlap"
        formats={{
          dayFormat: (d: Date) => format(d, 'EEE d'),
          timeGutterFormat: (d: Date) => format(d, 'h a'),
          dayHeaderFormat: (d: Date) => format(d, 'EEEE, MMMM d'),
          dayRangeHeaderFormat: ({ start, end }: { start: Date; end: Date }) =>
            `${format(start, 'MMM d')} – ${format(end, start.getMonth() === end.getMonth() ? 'd, yyyy' : 'MMM d, yyyy')}`,
        }}
      />
    </div>
  );
}
