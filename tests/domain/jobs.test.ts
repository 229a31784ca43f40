/**
 * The job state machine (product.md, "Jobs"): requested → scheduled → in progress →
 * completed, or cancelled with a reason from any open state. Every pair of states is
 * checked, legal and illegal.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_CHECKLISTS, JOB_KINDS, JOB_STATES, checkTransition, isOpenJobState, type JobState } from '@domain/jobs';

const READY = { scheduled: true, touchedZonesWithoutResult: 0, cancelReason: 'Client moved away' };

const LEGAL: [JobState, JobState][] = [
  ['requested', 'scheduled'],
  ['requested', 'cancelled'],
  ['scheduled', 'requested'],
  ['scheduled', 'in_progress'],
  ['scheduled', 'cancelled'],
  ['in_progress', 'scheduled'],
  ['in_progress', 'completed'],
  ['in_progress', 'cancelled'],
];

describe('job transitions', () => {
  const pairs = JOB_STATES.flatMap((from) => JOB_STATES.map((to) => [from, to] as [JobState, JobState]));
  it.each(pairs)('%s → %s', (from, to) => {
    const legal = LEGAL.some(([a, b]) => a === from && b === to);
    const result = checkTransition(from, to, READY);
    expect(result.ok).toBe(legal);
    if (!result.ok) expect(result.field).toBe('to');
  });

  it('closed jobs stay closed and say so', () => {
    const result = checkTransition('completed', 'scheduled', READY);
    expect(result).toEqual({ ok: false, field: 'to', message: 'A completed job is closed; create a new job instead.' });
    expect(isOpenJobState('completed')).toBe(false);
    expect(isOpenJobState('cancelled')).toBe(false);
    expect(isOpenJobState('in_progress')).toBe(true);
  });

  it('needs a technician and a start before scheduling or starting', () => {
    expect(checkTransition('requested', 'scheduled', { ...READY, scheduled: false })).toMatchObject({ ok: false, field: 'technicianId' });
    expect(checkTransition('scheduled', 'in_progress', { ...READY, scheduled: false })).toMatchObject({ ok: false, field: 'technicianId' });
  });

  it('needs a reason to cancel', () => {
    expect(checkTransition('scheduled', 'cancelled', { ...READY, cancelReason: '  ' })).toMatchObject({ ok: false, field: 'cancelReason' });
    expect(checkTransition('scheduled', 'cancelled', { ...READY, cancelReason: undefined })).toMatchObject({ ok: false, field: 'cancelReason' });
  });

  it('refuses to complete while touched zones have no walk-test result, naming how many', () => {
    const one = checkTransition('in_progress', 'completed', { ...READY, touchedZonesWithoutResult: 1 });
    expect(one).toMatchObject({ ok: false, field: 'walkTest' });
    expect(one.ok ? '' : one.message).toMatch(/^1 zone this job touched has no walk-test result yet/);
    const three = checkTransition('in_progress', 'completed', { ...READY, touchedZonesWithoutResult: 3 });
    expect(three.ok ? '' : three.message).toMatch(/^3 zones this job touched have no walk-test result yet/);
  });
});

describe('default checklists', () => {
  it('has one for every job kind, and the install checklist carries the mounting practice (product.md)', () => {
    for (const kind of JOB_KINDS) expect(DEFAULT_CHECKLISTS[kind].length).toBeGreaterThan(0);
    const install = DEFAULT_CHECKLISTS.install.join(' | ');
    expect(install).toMatch(/surface/i);
    expect(install).toMatch(/fixed frame/i);
    expect(install).toMatch(/magnet on the moving door or sash/i);
    expect(install).toMatch(/rated gap/i);
  });
});
