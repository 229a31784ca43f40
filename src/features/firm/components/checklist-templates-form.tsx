import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { JOB_KINDS, JOB_KIND_LABELS, type JobKind } from '@domain/jobs';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/form-field';
import { Select, Textarea } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { api, ApiError } from '@/lib/api-client';
import { firmKeys } from '../api/firm-queries';

interface ChecklistsResponse {
  checklists: Record<JobKind, string[]>;
  defaults: Record<JobKind, string[]>;
}

const checklistsKey = [...firmKeys.all, 'checklists'] as const;

/** The checklist each new job starts from, per kind of job: one item per line. Owner only. */
export function ChecklistTemplatesForm() {
  const queryClient = useQueryClient();
  const query = useQuery({ queryKey: checklistsKey, queryFn: ({ signal }) => api.get<{ data: ChecklistsResponse }>('/api/firm/checklists', signal).then((r) => r.data) });
  const save = useMutation({
    mutationFn: (body: Partial<Record<JobKind, string[]>>) => api.put<{ data: ChecklistsResponse }>('/api/firm/checklists', body).then((r) => r.data),
    onSuccess: (data) => queryClient.setQueryData(checklistsKey, data),
  });
  const toast = useToast();
  const [kind, setKind] = useState<JobKind>('install');
  const [drafts, setDrafts] = useState<Partial<Record<JobKind, string>>>({});
  const [error, setError] = useState<string | null>(null);

  if (query.isPending) return <Skeleton className="h-40 w-full" />;
  if (query.isError) return <p className="text-sm text-clay-600">{query.error.message}</p>;
  const { checklists, defaults } = query.data;
  const text = drafts[kind] ?? checklists[kind].join('\n');
  const lines = (value: string) => value.split('\n').map((l) => l.trim()).filter(Boolean);

  const submit = () => {
    setError(null);
    const body: Partial<Record<JobKind, string[]>> = {};
    for (const k of JOB_KINDS) body[k] = drafts[k] !== undefined ? lines(drafts[k]) : checklists[k];
    save.mutate(body, {
      onSuccess: () => {
        toast.success('Job checklists saved.');
        setDrafts({});
      },
      onError: (err) => setError(err instanceof ApiError ? err.message : 'Something went wrong. Try again.'),
    });
  };

  return (
    <Card title="Job checklists">
      <div className="space-y-3">
        <p className="text-sm text-slate-500">New jobs start with the checklist of their kind. One item per line; technicians tick them on site.</p>
        <FormError message={error} />
        <div className="sm:w-64">
          <label htmlFor="checklist-kind" className="mb-1 block text-sm font-medium">
            Kind of job
          </label>
          <Select id="checklist-kind" value={kind} onChange={(e) => setKind(e.target.value as JobKind)}>
            {JOB_KINDS.map((k) => (
              <option key={k} value={k}>
                {JOB_KIND_LABELS[k]}
              </option>
            ))}
          </Select>
        </div>
        <div>
          <label htmlFor="checklist-items" className="mb-1 block text-sm font-medium">
            Checklist for {JOB_KIND_LABELS[kind].toLowerCase()}
          </label>
          <Textarea id="checklist-items" rows={8} value={text} onChange={(e) => setDrafts({ ...drafts, [kind]: e.target.value })} />
          <p className="mt-1 text-xs text-slate-500">{lines(text).length} items</p>
        </div>
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="ghost" onClick={() => setDrafts({ ...drafts, [kind]: defaults[kind].join('\n') })}>
            Use Mullion’s list
          </Button>
          <Button onClick={submit} busy={save.isPending} disabled={Object.keys(drafts).length === 0}>
            Save checklists
          </Button>
        </div>
      </div>
    </Card>
  );
}
