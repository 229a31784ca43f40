/**
 * Jobs (product.md, "Jobs"): kinds, states and the state machine
 * requested → scheduled → in progress → completed, or cancelled (with a reason) from any
 * open state. Pure: callers pass the facts a transition depends on.
 */
export const JOB_KINDS = ['install', 'service_call', 'battery_round', 'inspection', 'takeover', 'removal'] as const;
export type JobKind = (typeof JOB_KINDS)[number];

export const JOB_KIND_LABELS: Record<JobKind, string> = {
  install: 'Install',
  service_call: 'Service call',
  battery_round: 'Battery change',
  inspection: 'Yearly inspection',
  takeover: 'Takeover of an existing system',
  removal: 'Removal',
};

export const JOB_STATES = ['requested', 'scheduled', 'in_progress', 'completed', 'cancelled'] as const;
export type JobState = (typeof JOB_STATES)[number];

export const JOB_STATE_LABELS: Record<JobState, string> = {
  requested: 'Requested',
  scheduled: 'Scheduled',
  in_progress: 'In progress',
  completed: 'Completed',
  cancelled: 'Cancelled',
};

/** Every legal move; anything else is refused. */
export const JOB_TRANSITIONS: Readonly<Record<JobState, readonly JobState[]>> = {
  requested: ['scheduled', 'cancelled'],
  scheduled: ['requested', 'in_progress', 'cancelled'],
  in_progress: ['scheduled', 'completed', 'cancelled'],
  completed: [],
  cancelled: [],
};

export function isOpenJobState(state: JobState): boolean {
  return state !== 'completed' && state !== 'cancelled';
}

export interface TransitionFacts {
  /** the job has a technician and a scheduled start */
  scheduled: boolean;
  /** zones the job touched that have no walk-test result yet */
  touchedZonesWithoutResult: number;
  /** reason given for a cancellation */
  cancelReason?: string | null | undefined;
}

export type TransitionCheck = { ok: true } | { ok: false; field: 'to' | 'technicianId' | 'cancelReason' | 'walkTest'; message: string };

/** Whether a job may move from `from` to `to`, and if not, what to do about it. */
export function checkTransition(from: JobState, to: JobState, facts: TransitionFacts): TransitionCheck {
  if (from === to) return { ok: false, field: 'to', message: `The job is already ${JOB_STATE_LABELS[to].toLowerCase()}.` };
  if (!JOB_TRANSITIONS[from].includes(to))
    return {
      ok: false,
      field: 'to',
      message: isOpenJobState(from)
        ? `A ${JOB_STATE_LABELS[from].toLowerCase()} job cannot move to ${JOB_STATE_LABELS[to].toLowerCase()}.`
        : `A ${JOB_STATE_LABELS[from].toLowerCase()} job is closed; create a new job instead.`,
    };
  if ((to === 'scheduled' || to === 'in_progress') && !facts.scheduled)
    return { ok: false, field: 'technicianId', message: 'Assign a technician and a start time first.' };
  if (to === 'cancelled' && !facts.cancelReason?.trim()) return { ok: false, field: 'cancelReason', message: 'Say why the job is cancelled.' };
  if (to === 'completed' && facts.touchedZonesWithoutResult > 0)
    return {
      ok: false,
      field: 'walkTest',
      message: `${facts.touchedZonesWithoutResult} ${facts.touchedZonesWithoutResult === 1 ? 'zone this job touched has' : 'zones this job touched have'} no walk-test result yet. Test each one (a failed result with a note is allowed) before completing.`,
    };
  return { ok: true };
}

export const WALK_TEST_RESULTS = ['passed', 'failed', 'not_tested'] as const;
export type WalkTestResult = (typeof WALK_TEST_RESULTS)[number];

export const WALK_TEST_RESULT_LABELS: Record<WalkTestResult, string> = {
  passed: 'Passed',
  failed: 'Failed',
  not_tested: 'Not tested',
};

/** Checklist every install starts from: the mounting practice of product.md (firm-editable). */
export const DEFAULT_CHECKLISTS: Record<JobKind, string[]> = {
  install: [
    'Clean and dry each mounting surface before applying adhesive',
    'Contact on the fixed frame, magnet on the moving door or sash',
    'Contact and magnet aligned within the contact’s rated gap',
    'Enrol each device and record its zone, serial and input',
    'Walk-test every zone with the monitoring center',
    'Show the household how to arm, disarm and cancel a false alarm',
  ],
  service_call: ['Read the panel’s trouble and alarm memory', 'Fix or replace the faulty device', 'Walk-test the zones touched'],
  battery_round: ['Replace batteries due and record the date on each zone', 'Clear low-battery troubles at the panel', 'Walk-test the zones touched'],
  inspection: [
    'Test every zone with the monitoring center',
    'Check smoke and CO alarm dates of manufacture',
    'Check the panel’s standby battery and communicator',
    'Review the false-alarm settings',
  ],
  takeover: ['Record every existing zone: number, serial, input, type', 'Change the installer code', 'Walk-test every zone with the monitoring center'],
  removal: ['Notify the monitoring center the account is closing', 'Remove the devices the household no longer wants monitored'],
};
