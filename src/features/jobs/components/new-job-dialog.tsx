import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Controller, useForm, type Control } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { JOB_KINDS, JOB_KIND_LABELS } from '@domain/jobs';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiJob } from '@/types/api';
import { techniciansQuery, useCreateJob } from '../api/jobs-queries';
import { fromLocalInput, zoneLabel } from '../time';
import { SitePicker, type PickedSite } from './site-picker';

const newJobForm = z
  .object({
    site: z.custom<PickedSite | null>((v) => v !== null && typeof v === 'object', { message: 'Choose the site the job is at.' }),
    kind: z.enum(JOB_KINDS, { error: 'Choose the kind of job.' }),
    summary: z.string().trim().min(1, 'Say what the job is about, like “Replace back-door contact”.').max(200, 'Use at most 200 characters.'),
    technicianId: z.string(),
    scheduledStart: z.string(),
    scheduledEnd: z.string(),
  })
  .superRefine((v, ctx) => {
    if (v.scheduledEnd && !v.scheduledStart) ctx.addIssue({ code: 'custom', path: ['scheduledStart'], message: 'Give a start as well as an end.' });
    if (v.scheduledStart && v.scheduledEnd && v.scheduledEnd <= v.scheduledStart)
      ctx.addIssue({ code: 'custom', path: ['scheduledEnd'], message: 'The end must come after the start.' });
  });
type NewJobValues = z.input<typeof newJobForm>;

const FIELDS = ['kind', 'summary', 'technicianId', 'scheduledStart', 'scheduledEnd'] as const;

/** "2026-03-03T09:00" plus minutes, in the same wall-clock terms. */
function addMinutesLocal(value: string, minutes: number): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})/.exec(value);
  if (!m) return '';
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]), Number(m[4]), Number(m[5]) + minutes));
  return d.toISOString().slice(0, 16);
}

/** The site picker as a form control (FormField gives it its id and error state). */
function SiteField({
  control,
  id,
  invalid,
  'aria-describedby': describedBy,
}: {
  control: Control<NewJobValues>;
  id?: string;
  invalid?: boolean;
  'aria-describedby'?: string;
}) {
  return (
    <Controller
      control={control}
      name="site"
      render={({ field }) => (
        <SitePicker id={id} invalid={invalid} aria-describedby={describedBy} value={field.value ?? null} onChange={field.onChange} />
      )}
    />
  );
}

/**
 * A new job at a site: kind, summary, and (when known) the technician and the time at the
 * site. The firm's checklist for the kind is filled in by the server.
 */
export function NewJobDialog({
  open,
  onClose,
  site,
  onCreated,
}: {
  open: boolean;
  onClose: () => void;
  site?: PickedSite;
  onCreated?: (job: ApiJob) => void;
}) {
  const create = useCreateJob();
  const technicians = useQuery({ ...techniciansQuery(), enabled: open });
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, control, handleSubmit, setError, formState, reset, watch, setValue, getValues } = useForm<NewJobValues>({
    resolver: zodResolver(newJobForm),
    defaultValues: { site: site ?? null, kind: 'service_call', summary: '', technicianId: '', scheduledStart: '', scheduledEnd: '' },
  });
  const picked = watch('site');
  const timeZone = picked?.timeZone ?? 'UTC';
  const close = () => {
    reset({ site: site ?? null, kind: 'service_call', summary: '', technicianId: '', scheduledStart: '', scheduledEnd: '' });
    setFormError(null);
    onClose();
  };
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const chosen = values.site!;
    create.mutate(
      {
        siteId: chosen.id,
        kind: values.kind,
        summary: values.summary.trim(),
        technicianId: values.technicianId || null,
        scheduledStart: values.scheduledStart ? fromLocalInput(values.scheduledStart, chosen.timeZone) : null,
        scheduledEnd: values.scheduledEnd ? fromLocalInput(values.scheduledEnd, chosen.timeZone) : null,
      },
      {
        onSuccess: (job) => {
          toast.success(job.state === 'scheduled' ? 'Job scheduled.' : 'Job added as requested.');
          close();
          onCreated?.(job);
        },
        onError: (err) => setFormError(applyServerErrors(err, setError, FIELDS)),
      },
    );
  });
  const e = formState.errors;
  return (
    <Dialog open={open} onClose={close} title="New job" description="With a technician and a start it is scheduled; otherwise it waits as requested.">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="Site" error={e.site?.message}>
          <SiteField control={control} />
        </FormField>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField label="Kind" error={e.kind?.message}>
            <Select {...register('kind')}>
              {JOB_KINDS.map((k) => (
                <option key={k} value={k}>
                  {JOB_KIND_LABELS[k]}
                </option>
              ))}
            </Select>
          </FormField>
          <FormField label="Technician" error={e.technicianId?.message}>
            <Select {...register('technicianId')}>
              <option value="">Not assigned yet</option>
              {(technicians.data ?? []).map((t) => (
                <option key={t.id} value={t.id}>
                  {t.name}
                </option>
              ))}
            </Select>
          </FormField>
        </div>
        <FormField label="Summary" error={e.summary?.message} hint="What the visit is for, like “Replace back-door contact”.">
          <Input autoComplete="off" {...register('summary')} />
        </FormField>
        <div className="grid gap-4 sm:grid-cols-2">
          <FormField
            label="Start"
            error={e.scheduledStart?.message}
            hint={picked ? `Time at the site: ${zoneLabel(timeZone)}` : 'Choose the site first.'}
          >
            <Input
              type="datetime-local"
              disabled={!picked}
              {...register('scheduledStart', {
                onChange: (ev: { target: { value: string } }) => {
                  if (ev.target.value && !getValues('scheduledEnd')) setValue('scheduledEnd', addMinutesLocal(ev.target.value, 60));
                },
              })}
            />
          </FormField>
          <FormField label="End" error={e.scheduledEnd?.message}>
            <Input type="datetime-local" disabled={!picked} {...register('scheduledEnd')} />
          </FormField>
        </div>
        <p className="text-xs text-slate-500">
          The checklist for this kind of job comes from the firm’s settings; you can tick it off on the job page.
        </p>
        <div className="flex justify-end gap-2 pt-2">
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" busy={create.isPending}>
            Add job
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
