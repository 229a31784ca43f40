import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Lock } from 'lucide-react';
import { JOB_KINDS, JOB_KIND_LABELS } from '@domain/jobs';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select, Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiJob } from '@/types/api';
import { techniciansQuery, useUpdateJob, type JobPatch } from '../api/jobs-queries';
import { fromLocalInput, toLocalInput, zoneLabel } from '../time';
import { technicianOptions } from './job-bits';

const detailsForm = z
  .object({
    kind: z.enum(JOB_KINDS, { error: 'Choose the kind of job.' }),
    summary: z.string().trim().min(1, 'Say what the job is about, like “Replace back-door contact”.').max(200, 'Use at most 200 characters.'),
    technicianId: z.string(),
    scheduledStart: z.string(),
    scheduledEnd: z.string(),
    clientNotes: z.string().max(4000, 'Use at most 4000 characters.'),
    internalNotes: z.string().max(4000, 'Use at most 4000 characters.'),
  })
  .superRefine((v, ctx) => {
    if (v.scheduledEnd && !v.scheduledStart) ctx.addIssue({ code: 'custom', path: ['scheduledStart'], message: 'Give a start as well as an end.' });
    if (v.scheduledStart && v.scheduledEnd && v.scheduledEnd <= v.scheduledStart)
      ctx.addIssue({ code: 'custom', path: ['scheduledEnd'], message: 'The end must come after the start.' });
  });
type DetailsValues = z.input<typeof detailsForm>;
const FIELDS = ['kind', 'summary', 'technicianId', 'scheduledStart', 'scheduledEnd', 'clientNotes', 'internalNotes'] as const;

function valuesOf(job: ApiJob, timeZone: string): DetailsValues {
  return {
    kind: job.kind,
    summary: job.summary,
    technicianId: job.technicianId ?? '',
    scheduledStart: toLocalInput(job.scheduledStart, timeZone),
    scheduledEnd: toLocalInput(job.scheduledEnd, timeZone),
    clientNotes: job.clientNotes,
    internalNotes: job.internalNotes ?? '',
  };
}

/**
 * What the job is, who does it and when (in the site's time zone), and its notes. The office
 * changes everything; the job's technician changes the notes.
 */
export function JobDetailsForm({ job, timeZone, canManage, editable }: { job: ApiJob; timeZone: string; canManage: boolean; editable: boolean }) {
  const update = useUpdateJob(job.id);
  const technicians = useQuery({ ...techniciansQuery(), enabled: canManage });
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState, reset } = useForm<DetailsValues>({
    resolver: zodResolver(detailsForm),
    // other changes to the job (a ticked checklist item) keep what is being typed here
    values: valuesOf(job, timeZone),
    resetOptions: { keepDirtyValues: true },
  });
  const scheduleLocked = !editable || !canManage;
  const onSubmit = handleSubmit((v) => {
    setFormError(null);
    const patch: JobPatch = { clientNotes: v.clientNotes, internalNotes: v.internalNotes };
    if (canManage) {
      Object.assign(patch, {
        kind: v.kind,
        summary: v.summary.trim(),
        technicianId: v.technicianId || null,
        scheduledStart: v.scheduledStart ? fromLocalInput(v.scheduledStart, timeZone) : null,
        scheduledEnd: v.scheduledEnd ? fromLocalInput(v.scheduledEnd, timeZone) : null,
      });
    }
    update.mutate(patch, {
      onSuccess: (saved) => {
        reset(valuesOf(saved, timeZone));
        toast.success(saved.state !== job.state ? 'Job saved and scheduled.' : 'Job saved.');
      },
      onError: (err) => setFormError(applyServerErrors(err, setError, FIELDS)),
    });
  });
  const e = formState.errors;
  const options = technicianOptions(technicians.data, { id: job.technicianId, name: job.technicianName });
  return (
    <Card title="Details">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        {editable && !canManage && (
          <p className="flex items-start gap-2 rounded-md bg-paper px-3 py-2 text-xs text-slate-500">
            <Lock className="mt-0.5 size-3.5 shrink-0" aria-hidden="true" /> The office sets the kind, summary, technician and times; you keep the
            notes here, and the checklist, parts, zones and walk test.
          </p>
        )}
        {canManage && (
          <>
            <FormField label="Summary" error={e.summary?.message}>
              <Input autoComplete="off" disabled={scheduleLocked} {...register('summary')} />
            </FormField>
            <div className="grid gap-4 sm:grid-cols-2">
              <FormField label="Kind" error={e.kind?.message}>
                <Select disabled={scheduleLocked} {...register('kind')}>
                  {JOB_KINDS.map((k) => (
                    <option key={k} value={k}>
                      {JOB_KIND_LABELS[k]}
                    </option>
                  ))}
                </Select>
              </FormField>
              <FormField label="Technician" error={e.technicianId?.message}>
                <Select disabled={scheduleLocked} {...register('technicianId')}>
                  <option value="">Not assigned yet</option>
                  {(canManage ? options : technicianOptions([], { id: job.technicianId, name: job.technicianName })).map((t) => (
                    <option key={t.id} value={t.id}>
                      {t.name}
                    </option>
                  ))}
                </Select>
              </FormField>
            </div>
            <div className="grid gap-4">
              <FormField label="Start" error={e.scheduledStart?.message} hint={`Time at the site: ${zoneLabel(timeZone)}`}>
                <Input type="datetime-local" disabled={scheduleLocked} {...register('scheduledStart')} />
              </FormField>
              <FormField label="End" error={e.scheduledEnd?.message}>
                <Input type="datetime-local" disabled={scheduleLocked} {...register('scheduledEnd')} />
              </FormField>
            </div>
          </>
        )}
        <FormField label="Notes for the client" error={e.clientNotes?.message} hint="Shown in the portal and printed on the completion report.">
          <Textarea rows={3} disabled={!editable} {...register('clientNotes')} />
        </FormField>
        <FormField label="Internal notes (staff only)" error={e.internalNotes?.message} hint="Never shown to the client.">
          <Textarea rows={3} disabled={!editable} className="bg-ochre-50/40" {...register('internalNotes')} />
        </FormField>
        {editable && (
          <div className="flex justify-end">
            <Button type="submit" busy={update.isPending} disabled={!formState.isDirty}>
              Save details
            </Button>
          </div>
        )}
      </form>
    </Card>
  );
}
