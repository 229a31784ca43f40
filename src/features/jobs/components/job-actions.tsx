import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { JOB_TRANSITIONS, type JobState } from '@domain/jobs';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Textarea } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import type { ApiJob } from '@/types/api';
import { siteZonesQuery, useTransitionJob, type TransitionInput } from '../api/jobs-queries';
import { isBatteryJob } from '../job-rules';

/** The words on each legal move's button. */
export function transitionLabel(from: JobState, to: JobState): string {
  if (to === 'cancelled') return 'Cancel job';
  if (to === 'completed') return 'Complete job';
  if (to === 'in_progress') return 'Start job';
  if (to === 'requested') return 'Back to requested';
  return from === 'requested' ? 'Schedule' : 'Back to scheduled';
}

const DONE_MESSAGES: Record<JobState, string> = {
  requested: 'Job moved back to requested.',
  scheduled: 'Job scheduled.',
  in_progress: 'Job started.',
  completed: 'Job completed. The report is on its way to the client.',
  cancelled: 'Job cancelled.',
};

/** The moves this person may make from the job's state (technicians: start and complete their own jobs). */
export function allowedTransitions(job: Pick<ApiJob, 'state'>, { canManage, canUpdate }: { canManage: boolean; canUpdate: boolean }): JobState[] {
  if (!canUpdate) return [];
  return JOB_TRANSITIONS[job.state].filter((to) => canManage || to === 'in_progress' || to === 'completed');
}

/** A transition with its result: success → toast; refusal → the server's own words. */
export function useJobTransition(job: ApiJob) {
  const mutation = useTransitionJob(job.id);
  const toast = useToast();
  const [error, setError] = useState<{ message: string; field: string | null } | null>(null);
  const run = (input: TransitionInput, after?: () => void) => {
    setError(null);
    mutation.mutate(input, {
      onSuccess: () => toast.success(DONE_MESSAGES[input.to]),
      onError: (err) => {
        if (err instanceof ApiError) setError({ message: err.message, field: Object.keys(err.fields)[0] ?? null });
        else setError({ message: 'Something went wrong. Try again.', field: null });
      },
      onSettled: () => after?.(),
    });
  };
  return { run, error, pending: mutation.isPending, clearError: () => setError(null) };
}

/** Complete a job: for battery changes and service calls, tick the zones whose batteries were changed. */
export function CompleteJobDialog({
  job,
  open,
  onClose,
  onConfirm,
  busy,
}: {
  job: ApiJob;
  open: boolean;
  onClose: () => void;
  onConfirm: (batteryChangedZoneIds: string[]) => void;
  busy: boolean;
}) {
  const battery = isBatteryJob(job.kind);
  const zones = useQuery({ ...siteZonesQuery(job.siteId), enabled: open && battery });
  const [ticked, setTicked] = useState<Set<string>>(new Set());
  const touched = new Set(job.touchedZoneIds);
  const ordered = [...(zones.data?.zones ?? [])].sort((a, b) => Number(touched.has(b.id)) - Number(touched.has(a.id)));
  const toggle = (id: string) =>
    setTicked((prev) => {
      const next = new Set(prev);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Complete job"
      description="Completing records the time and you as the technician, and e-mails the completion report to the client."
    >
      <div className="space-y-4">
        {battery && (
          <fieldset>
            <legend className="mb-1 text-sm font-medium">Batteries changed on this visit</legend>
            <p className="mb-2 text-xs text-slate-500">Each ticked zone gets the completion date as its battery-changed date.</p>
            {zones.isPending ? (
              <p className="text-sm text-slate-500">Loading zones…</p>
            ) : ordered.length === 0 ? (
              <p className="text-sm text-slate-500">This site has no zones yet.</p>
            ) : (
              <ul className="max-h-72 divide-y divide-line overflow-y-auto rounded-md border border-line">
                {ordered.map((z) => (
                  <li key={z.id}>
                    <label className="flex min-h-12 cursor-pointer items-center gap-3 px-3 py-2">
                      <input type="checkbox" className="size-6 shrink-0 accent-brass-600" checked={ticked.has(z.id)} onChange={() => toggle(z.id)} />
                      <span className="min-w-0 text-sm">
                        <span className="font-medium">Zone {z.number}</span> {z.description}
                        <span className="block text-xs text-slate-500">
                          {z.panelLabel}
                          {z.batteryType ? ` · ${z.batteryType}` : ''}
                          {touched.has(z.id) ? ' · touched by this job' : ''}
                        </span>
                      </span>
                    </label>
                  </li>
                ))}
              </ul>
            )}
          </fieldset>
        )}
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Not yet
          </Button>
          <Button busy={busy} onClick={() => onConfirm([...ticked])}>
            Complete job
          </Button>
        </div>
      </div>
    </Dialog>
  );
}

function CancelJobDialog({
  open,
  onClose,
  onConfirm,
  busy,
}: {
  open: boolean;
  onClose: () => void;
  onConfirm: (reason: string) => void;
  busy: boolean;
}) {
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string | undefined>();
  return (
    <Dialog open={open} onClose={onClose} title="Cancel job" description="A cancelled job stays in the site’s service history with its reason.">
      <form
        noValidate
        className="space-y-4"
        onSubmit={(e) => {
          e.preventDefault();
          if (!reason.trim()) return setError('Say why the job is cancelled.');
          setError(undefined);
          onConfirm(reason.trim());
        }}
      >
        <FormField label="Reason" error={error} hint="Like “Client sold the house” or “Booked twice”.">
          <Textarea rows={3} maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} />
        </FormField>
        <div className="flex justify-end gap-2">
          <Button variant="secondary" onClick={onClose}>
            Keep the job
          </Button>
          <Button type="submit" variant="danger" busy={busy}>
            Cancel job
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/**
 * The legal next moves of a job as buttons (JOB_TRANSITIONS), for what this person may do.
 * A refusal shows the server's message as it is.
 */
export function JobActions({
  job,
  canManage,
  canUpdate,
  size = 'md',
  className,
}: {
  job: ApiJob;
  canManage: boolean;
  canUpdate: boolean;
  size?: 'md' | 'lg';
  className?: string;
}) {
  const moves = allowedTransitions(job, { canManage, canUpdate });
  const { run, error, pending } = useJobTransition(job);
  const [dialog, setDialog] = useState<'cancel' | 'complete' | null>(null);
  if (moves.length === 0 && !error) return null;
  const forward = (to: JobState) => (to === 'scheduled' ? job.state === 'requested' : to === 'in_progress' || to === 'completed');
  return (
    <div className={cn('space-y-2', className)}>
      <div className="flex flex-wrap gap-2">
        {moves.map((to) => (
          <Button
            key={to}
            size={size}
            variant={to === 'cancelled' ? 'ghost' : forward(to) ? 'primary' : 'secondary'}
            className={cn('max-sm:h-12 max-sm:px-5 max-sm:text-base', to === 'cancelled' && 'text-clay-600')}
            busy={pending && dialog === null}
            disabled={pending}
            onClick={() => {
              if (to === 'cancelled') setDialog('cancel');
              else if (to === 'completed') setDialog('complete');
              else run({ to });
            }}
          >
            {transitionLabel(job.state, to)}
          </Button>
        ))}
      </div>
      {error && (
        <div className="max-w-xl">
          <FormError message={error.message} />
          {error.field === 'walkTest' && (
            <a href="#walk-test" className="mt-1 inline-block text-sm text-brass-700 underline">
              Go to the walk test
            </a>
          )}
        </div>
      )}
      <CancelJobDialog
        open={dialog === 'cancel'}
        onClose={() => setDialog(null)}
        busy={pending}
        onConfirm={(reason) => run({ to: 'cancelled', cancelReason: reason }, () => setDialog(null))}
      />
      <CompleteJobDialog
        job={job}
        open={dialog === 'complete'}
        onClose={() => setDialog(null)}
        busy={pending}
        onConfirm={(ids) => run({ to: 'completed', ...(ids.length ? { batteryChangedZoneIds: ids } : {}) }, () => setDialog(null))}
      />
    </div>
  );
}
