import { isOpenJobState, type JobKind, type JobState } from '@domain/jobs';
import type { ApiJob } from '@/types/api';

/** Kinds whose completion may record battery changes (the server's rule). */
export const BATTERY_JOB_KINDS: readonly JobKind[] = ['battery_round', 'service_call'];

export function isBatteryJob(kind: JobKind): boolean {
  return BATTERY_JOB_KINDS.includes(kind);
}

/** A closed job is service history: nothing on it changes any more. */
export function isEditableState(state: JobState): boolean {
  return isOpenJobState(state);
}

const DEFAULT_VISIT_MS = 60 * 60_000;

/** The job to do next: the one under way, else the first open one not yet over, else the first open one. */
export function nextJobOf(jobs: readonly ApiJob[], now: Date): ApiJob | undefined {
  const open = jobs.filter((j) => isOpenJobState(j.state));
  const endOf = (j: ApiJob) =>
    j.scheduledEnd ? Date.parse(j.scheduledEnd) : j.scheduledStart ? Date.parse(j.scheduledStart) + DEFAULT_VISIT_MS : Infinity;
  return open.find((j) => j.state === 'in_progress') ?? open.find((j) => endOf(j) >= now.getTime()) ?? open[0];
}
