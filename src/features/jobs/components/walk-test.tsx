import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Check, Minus, X } from 'lucide-react';
import { WALK_TEST_RESULTS, WALK_TEST_RESULT_LABELS, type WalkTestResult } from '@domain/jobs';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import type { ApiJob } from '@/types/api';
import { siteZonesQuery, useSaveWalkTest, type WalkTestInput } from '../api/jobs-queries';

interface Draft {
  result: WalkTestResult | null;
  monitoringConfirmed: boolean;
  note: string;
}

export const FAILED_NOTE_MESSAGE = 'Say what failed, so the next visit knows.';

const RESULT_ICONS = { passed: Check, failed: X, not_tested: Minus } as const;
const RESULT_ON: Record<WalkTestResult, string> = {
  passed: 'border-sage-600 bg-sage-600 text-white',
  failed: 'border-clay-600 bg-clay-600 text-white',
  not_tested: 'border-slate-500 bg-slate-500 text-white',
};

/** Checks drafts before the PUT: a result for each changed row, and a note for each failure. */
export function walkTestErrors(rows: { zoneId: string; draft: Draft }[]): Map<string, { result?: string; note?: string }> {
  const errors = new Map<string, { result?: string; note?: string }>();
  for (const { zoneId, draft } of rows) {
    if (!draft.result) errors.set(zoneId, { result: 'Choose passed, failed or not tested.' });
    else if (draft.result === 'failed' && !draft.note.trim()) errors.set(zoneId, { note: FAILED_NOTE_MESSAGE });
  }
  return errors;
}

const RESULT_TONES = { passed: 'ok', failed: 'bad', not_tested: 'neutral' } as const;

/** A closed job's (or someone else's) walk test: the recorded results only. */
function ReadOnlyResults({
  job,
  rows,
  untested,
}: {
  job: ApiJob;
  rows: { id: string; number: number; description: string; panelLabel: string }[];
  untested: number;
}) {
  const byZone = new Map(job.walkTest.map((w) => [w.zoneId, w]));
  if (rows.length === 0) return <p className="text-sm text-slate-500">No walk-test results recorded.</p>;
  return (
    <>
      <ul className="divide-y divide-line">
        {rows.map((z) => {
          const w = byZone.get(z.id)!;
          const Icon = RESULT_ICONS[w.result];
          return (
            <li
              key={z.id}
              className="grid gap-1 py-2 first:pt-0 sm:grid-cols-[1fr_auto] sm:items-start"
              aria-label={`Zone ${z.number} ${z.description}`}
            >
              <div className="min-w-0">
                <p className="text-sm">
                  <span className="font-semibold tabular-nums">Zone {z.number}</span> {z.description}
                  {job.touchedZoneIds.includes(z.id) && <span className="text-xs text-slate-500"> · touched by this job</span>}
                </p>
                {w.note && <p className="text-xs text-slate-500">{w.note}</p>}
              </div>
              <div className="flex flex-wrap items-center gap-1 sm:justify-end">
                <Badge tone={RESULT_TONES[w.result]}>
                  <Icon className="size-3.5" aria-hidden="true" /> {WALK_TEST_RESULT_LABELS[w.result]}
                </Badge>
                <Badge tone={w.monitoringConfirmed ? 'ok' : 'neutral'}>
                  {w.monitoringConfirmed ? 'Monitoring confirmed' : 'Monitoring not confirmed'}
                </Badge>
              </div>
            </li>
          );
        })}
      </ul>
      {untested > 0 && (
        <p className="mt-3 text-xs text-slate-500">
          {untested === 1 ? '1 other zone was' : `${untested} other zones were`} not tested on this visit.
        </p>
      )}
    </>
  );
}

/**
 * The walk test: every zone of the site's panels (the zones the job touched first), each with
 * passed / failed / not tested, whether the monitoring center confirmed the signal, and a
 * note (required for a failure). Changed rows are saved together with one PUT.
 */
export function WalkTest({ job, editable }: { job: ApiJob; editable: boolean }) {
  const zones = useQuery(siteZonesQuery(job.siteId));
  const save = useSaveWalkTest(job.id);
  const toast = useToast();
  const [edits, setEdits] = useState<Map<string, Draft>>(new Map());
  const [errors, setErrors] = useState<Map<string, { result?: string; note?: string }>>(new Map());
  const [formError, setFormError] = useState<string | null>(null);

  const saved = new Map(job.walkTest.map((w) => [w.zoneId, w]));
  const touched = new Set(job.touchedZoneIds);
  const rows = [...(zones.data?.zones ?? [])].sort((a, b) => Number(touched.has(b.id)) - Number(touched.has(a.id)));
  const draftOf = (zoneId: string): Draft => {
    const edit = edits.get(zoneId);
    if (edit) return edit;
    const s = saved.get(zoneId);
    return s
      ? { result: s.result, monitoringConfirmed: s.monitoringConfirmed, note: s.note }
      : { result: null, monitoringConfirmed: false, note: '' };
  };
  const change = (zoneId: string, patch: Partial<Draft>) => {
    setEdits((prev) => new Map(prev).set(zoneId, { ...draftOf(zoneId), ...patch }));
    if (errors.has(zoneId)) {
      setErrors((prev) => {
        const next = new Map(prev);
        next.delete(zoneId);
        return next;
      });
    }
  };

  const submit = () => {
    setFormError(null);
    const changed = [...edits.entries()].map(([zoneId, draft]) => ({ zoneId, draft }));
    const found = walkTestErrors(changed);
    setErrors(found);
    if (found.size > 0) {
      setFormError(found.size === 1 ? 'One zone needs attention before saving.' : `${found.size} zones need attention before saving.`);
      return;
    }
    const body: WalkTestInput[] = changed.map(({ zoneId, draft }) => ({
      zoneId,
      result: draft.result!,
      monitoringConfirmed: draft.monitoringConfirmed,
      note: draft.note.trim(),
    }));
    save.mutate(body, {
      onSuccess: () => {
        setEdits(new Map());
        toast.success(body.length === 1 ? 'Walk-test result saved.' : `${body.length} walk-test results saved.`);
      },
      onError: (err) => {
        if (err instanceof ApiError) {
          // fields name the row: "2.note", "0.zoneId"
          const next = new Map<string, { result?: string; note?: string }>();
          for (const [key, message] of Object.entries(err.fields)) {
            const [index, field] = key.split('.');
            const row = body[Number(index)];
            if (row) next.set(row.zoneId, field === 'note' ? { note: message } : { result: message });
          }
          setErrors(next);
          setFormError(err.message);
        } else setFormError('The walk test was not saved. Try again.');
      },
    });
  };

  const recorded = rows.filter((z) => saved.has(z.id));
  const tested = rows.filter((z) => draftOf(z.id).result && draftOf(z.id).result !== 'not_tested').length;
  const touchedLeft = rows.filter((z) => touched.has(z.id) && !['passed', 'failed'].includes(draftOf(z.id).result ?? '')).length;

  return (
    <section id="walk-test" aria-labelledby="walk-test-title" className="scroll-mt-4 rounded-md border border-line bg-card">
      <header className="flex flex-wrap items-center justify-between gap-2 border-b border-line px-4 py-3">
        <h2 id="walk-test-title" className="text-sm font-semibold">
          Walk test
        </h2>
        {zones.data && rows.length > 0 && (
          <span className="text-xs text-slate-500">
            {tested} of {rows.length} zones tested
            {touched.size > 0 && touchedLeft > 0 ? ` · ${touchedLeft} touched ${touchedLeft === 1 ? 'zone' : 'zones'} still to test` : ''}
          </span>
        )}
      </header>
      <div className="p-4">
        {zones.isPending ? (
          <Skeleton className="h-24 w-full" />
        ) : zones.isError ? (
          <p className="text-sm text-clay-600">{zones.error.message}</p>
        ) : rows.length === 0 ? (
          <p className="text-sm text-slate-500">This site’s panels have no zones to test yet.</p>
        ) : !editable ? (
          <ReadOnlyResults job={job} rows={recorded} untested={rows.length - recorded.length} />
        ) : (
          <>
            <FormError message={formError} />
            <ul className={cn('divide-y divide-line', formError && 'mt-3')}>
              {rows.map((z) => {
                const d = draftOf(z.id);
                const err = errors.get(z.id);
                const noteId = `wt-note-${z.id}`;
                const label = `Zone ${z.number} ${z.description}`;
                return (
                  <li key={z.id} className="py-3 first:pt-0 last:pb-0" aria-label={label}>
                    <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
                      <div className="min-w-0">
                        <p className="text-sm">
                          <span className="font-semibold tabular-nums">Zone {z.number}</span> {z.description}
                        </p>
                        <p className="flex flex-wrap items-center gap-1 text-xs text-slate-500">
                          {z.panelLabel}
                          {touched.has(z.id) && <Badge tone="brass">Touched by this job</Badge>}
                          {edits.has(z.id) && <span className="text-ochre-600">· not saved yet</span>}
                        </p>
                      </div>
                      <div role="group" aria-label={`Result for ${label}`} className="grid shrink-0 grid-cols-3 gap-1">
                        {WALK_TEST_RESULTS.map((r) => {
                          const Icon = RESULT_ICONS[r];
                          const on = d.result === r;
                          return (
                            <button
                              key={r}
                              type="button"
                              aria-pressed={on}
                              disabled={!editable}
                              onClick={() => change(z.id, { result: r })}
                              className={cn(
                                'inline-flex h-12 items-center justify-center gap-1.5 rounded-md border px-3 text-sm font-medium whitespace-nowrap sm:h-10',
                                on ? RESULT_ON[r] : 'border-line-strong bg-card text-ink hover:bg-slate-100',
                                !editable && 'cursor-default',
                                !editable && !on && 'opacity-50',
                              )}
                            >
                              <Icon className="size-4" aria-hidden="true" />
                              {WALK_TEST_RESULT_LABELS[r]}
                            </button>
                          );
                        })}
                      </div>
                    </div>
                    {err?.result && (
                      <p role="alert" className="mt-1 text-xs font-medium text-clay-600 sm:text-right">
                        {err.result}
                      </p>
                    )}
                    {(d.result || d.note || d.monitoringConfirmed) && (
                      <div className="mt-2 space-y-1 rounded-md bg-paper/70 px-3 py-2">
                        <label className="flex min-h-12 w-fit items-center gap-3 text-sm sm:min-h-10">
                          <input
                            type="checkbox"
                            role="switch"
                            className="peer sr-only"
                            checked={d.monitoringConfirmed}
                            disabled={!editable}
                            onChange={(e) => change(z.id, { monitoringConfirmed: e.target.checked })}
                          />
                          <span
                            aria-hidden="true"
                            className={cn(
                              'relative h-6 w-10 shrink-0 rounded-full transition-colors peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-brass-600',
                              d.monitoringConfirmed ? 'bg-sage-600' : 'bg-line-strong',
                            )}
                          >
                            <span
                              className={cn(
                                'absolute top-1 size-4 rounded-full bg-white transition-all',
                                d.monitoringConfirmed ? 'left-5' : 'left-1',
                              )}
                            />
                          </span>
                          <span>
                            Monitoring center confirmed<span className="text-slate-500">{d.monitoringConfirmed ? '' : ': not yet'}</span>
                          </span>
                        </label>
                        <div className="flex flex-col gap-1 sm:flex-row sm:items-center sm:gap-2">
                          <label htmlFor={noteId} className="shrink-0 text-xs font-medium">
                            Note{d.result === 'failed' ? ' (required for a failure)' : ''}
                          </label>
                          <div className="min-w-0 flex-1">
                            <Input
                              id={noteId}
                              value={d.note}
                              maxLength={500}
                              disabled={!editable}
                              invalid={!!err?.note}
                              aria-describedby={err?.note ? `${noteId}-error` : undefined}
                              placeholder={d.result === 'failed' ? 'What failed, like “no signal at the panel”' : ''}
                              onChange={(e) => change(z.id, { note: e.target.value })}
                            />
                            {err?.note && (
                              <p id={`${noteId}-error`} role="alert" className="mt-1 text-xs font-medium text-clay-600">
                                {err.note}
                              </p>
                            )}
                          </div>
                        </div>
                      </div>
                    )}
                  </li>
                );
              })}
            </ul>
            {editable && (
              <div className="sticky bottom-16 z-10 -mx-4 mt-4 flex items-center justify-end gap-3 border-t border-line bg-card px-4 py-3 md:bottom-0">
                {edits.size > 0 && (
                  <span className="text-xs text-ochre-600">{edits.size === 1 ? '1 zone changed' : `${edits.size} zones changed`}</span>
                )}
                <Button onClick={submit} busy={save.isPending} disabled={edits.size === 0}>
                  Save walk test
                </Button>
              </div>
            )}
          </>
        )}
      </div>
    </section>
  );
}
