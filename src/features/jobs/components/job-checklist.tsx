import { useQueryClient } from '@tanstack/react-query';
import { Check } from 'lucide-react';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import type { ApiChecklistItem, ApiJob } from '@/types/api';
import { jobKeys, useUpdateJob } from '../api/jobs-queries';

/**
 * The job's checklist with big tick boxes (48 px rows): each tick is saved at once. The tick
 * shows straight away and goes back if the server refuses it.
 */
export function JobChecklist({ job, editable }: { job: ApiJob; editable: boolean }) {
  const update = useUpdateJob(job.id);
  const queryClient = useQueryClient();
  const toast = useToast();
  const items = job.checklist;
  const done = items.filter((i) => i.done).length;

  const toggle = (index: number) => {
    const before = queryClient.getQueryData<ApiJob>(jobKeys.detail(job.id)) ?? job;
    const checklist: ApiChecklistItem[] = before.checklist.map((item, i) => (i === index ? { ...item, done: !item.done } : item));
    queryClient.setQueryData<ApiJob>(jobKeys.detail(job.id), { ...before, checklist });
    update.mutate(
      { checklist },
      {
        onError: (err) => {
          queryClient.setQueryData<ApiJob>(jobKeys.detail(job.id), (cur) => (cur ? { ...cur, checklist: before.checklist } : cur));
          toast.error(err instanceof ApiError ? err.message : 'The tick was not saved. Try again.');
        },
      },
    );
  };

  if (items.length === 0) return <p className="text-sm text-slate-500">This job has no checklist.</p>;
  return (
    <div>
      <p className="mb-2 text-xs text-slate-500" aria-live="polite">
        {done} of {items.length} done
      </p>
      <ul className="divide-y divide-line rounded-md border border-line">
        {items.map((item, i) => (
          <li key={`${i}-${item.label}`}>
            <label className={cn('flex min-h-12 items-center gap-3 px-3 py-2', editable ? 'cursor-pointer hover:bg-paper/60' : 'cursor-default')}>
              <input type="checkbox" className="peer sr-only" checked={item.done} disabled={!editable} onChange={() => toggle(i)} />
              <span
                aria-hidden="true"
                className={cn(
                  'grid size-7 shrink-0 place-items-center rounded-md border-2 peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-brass-600',
                  item.done ? 'border-sage-600 bg-sage-600 text-white' : 'border-line-strong bg-card',
                )}
              >
                {item.done && <Check className="size-5" strokeWidth={3} />}
              </span>
              <span className={cn('text-sm', item.done && 'text-slate-500 line-through decoration-slate-500/60')}>{item.label}</span>
            </label>
          </li>
        ))}
      </ul>
    </div>
  );
}
