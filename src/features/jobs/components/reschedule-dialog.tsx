import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ArrowRight } from 'lucide-react';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { paths } from '@/config/paths';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiJob, ApiUser } from '@/types/api';
import { jobSiteQuery, useRescheduleJob } from '../api/jobs-queries';
import { isEditableState } from '../job-rules';
import { formatWhen, fromLocalInput, toLocalInput, zoneLabel } from '../time';
import { JobStateBadge, OverlapFlag, technicianOptions } from './job-bits';

function Form({
  job,
  technicians,
  canManage,
  onClose,
}: {
  job: ApiJob;
  technicians: ApiUser[] | undefined;
  canManage: boolean;
  onClose: () => void;
}) {
  const site = useQuery(jobSiteQuery(job.siteId));
  const timeZone = job.siteTimeZone ?? site.data?.timeZone;
  const reschedule = useRescheduleJob();
  const toast = useToast();
  const [technicianId, setTechnicianId] = useState(job.technicianId ?? '');
  const [start, setStart] = useState<string | null>(null);
  const [end, setEnd] = useState<string | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const editable = canManage && isEditableState(job.state);
  if (!timeZone) return <p className="text-sm text-slate-500">Loading the site’s time zone…</p>;
  const startValue = start ?? toLocalInput(job.scheduledStart, timeZone);
  const endValue = end ?? toLocalInput(job.scheduledEnd, timeZone);

  const save = () => {
    setFormError(null);
    const found: Record<string, string> = {};
    if (!startValue) found.scheduledStart = 'Give the start.';
    if (startValue && endValue && endValue <= startValue) found.scheduledEnd = 'The end must come after the start.';
    if (!technicianId) found.technicianId = 'Choose the technician.';
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    reschedule.mutate(
      {
        jobId: job.id,
        patch: {
          technicianId,
          scheduledStart: fromLocalInput(startValue, timeZone),
          scheduledEnd: endValue ? fromLocalInput(endValue, timeZone) : null,
        },
      },
      {
        onSuccess: (saved) => {
          toast.success(`Moved to ${formatWhen(saved.scheduledStart, saved.scheduledEnd, timeZone)}.`);
          onClose();
        },
        onError: (err) => {
          if (err instanceof ApiError) {
            setErrors(err.fields);
            setFormError(err.message);
          } else setFormError('Something went wrong. Try again.');
        },
      },
    );
  };

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <JobStateBadge state={job.state} />
        <span className="text-slate-500">{JOB_KIND_LABELS[job.kind]}</span>
        <OverlapFlag count={job.overlaps?.length ?? 0} />
      </div>
      <p className="text-sm">
        <span className="font-medium">{job.siteName}</span>
        <span className="block text-slate-500">{formatWhen(job.scheduledStart, job.scheduledEnd, timeZone)}</span>
      </p>
      {editable ? (
        <>
          <FormError message={formError} />
          <FormField label="Technician" error={errors.technicianId}>
            <Select value={technicianId} onChange={(e) => setTechnicianId(e.target.value)}>
              <option value="">Choose…</option>
              {technicianOptions(technicians, { id: job.technicianId, name: job.technicianName }).map((t) => (
                <option key={t.id} value={t.id}>
                  {t.name}
                </option>
              ))}
            </Select>
          </FormField>
          <div className="grid gap-4 sm:grid-cols-2">
            <FormField label="Start" error={errors.scheduledStart} hint={`Time at the site: ${zoneLabel(timeZone)}`}>
              <Input type="datetime-local" value={startValue} onChange={(e) => setStart(e.target.value)} />
            </FormField>
            <FormField label="End" error={errors.scheduledEnd}>
              <Input type="datetime-local" value={endValue} onChange={(e) => setEnd(e.target.value)} />
            </FormField>
          </div>
        </>
      ) : (
        <p className="text-sm text-slate-500">{canManage ? 'A closed job keeps its time.' : 'The office reschedules jobs.'}</p>
      )}
      <div className="flex flex-wrap items-center justify-between gap-2">
        <Link to={paths.firm.job(job.id)} className="inline-flex min-h-10 items-center gap-1 text-sm font-medium text-brass-700 hover:underline">
          Open the job <ArrowRight className="size-4" aria-hidden="true" />
        </Link>
        <span className="flex gap-2">
          <Button variant="secondary" onClick={onClose}>
            Close
          </Button>
          {editable && (
            <Button onClick={save} busy={reschedule.isPending}>
              {job.state === 'requested' ? 'Schedule' : 'Save time'}
            </Button>
          )}
        </span>
      </div>
    </div>
  );
}

/** The form way to (re)schedule a job: technician, start and end at the site; also the calendar's event details. */
export function RescheduleDialog({
  job,
  technicians,
  canManage,
  onClose,
}: {
  job: ApiJob | null;
  technicians: ApiUser[] | undefined;
  canManage: boolean;
  onClose: () => void;
}) {
  return (
    <Dialog open={job !== null} onClose={onClose} title={job?.summary ?? 'Job'}>
      {job && <Form key={job.id} job={job} technicians={technicians} canManage={canManage} onClose={onClose} />}
    </Dialog>
  );
}
