/**
 * POST /api/jobs/:jobId/transitions: every legal and illegal move through the API, the facts a
 * move needs (technician and start, a reason, walk-test results), who may move a job, and what
 * a move records (start, completion, cancellation reason).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JOB_STATES, JOB_TRANSITIONS, type JobState } from '@domain/jobs';
import { AuditEvent } from '@server/models/AuditEvent';
import { Job } from '@server/models/Job';
import type { User } from '@server/models/User';
import { WalkTest } from '@server/models/WalkTest';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildJob, buildPanel, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let otherTech: User;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const START = new Date('2027-02-10T15:00:00Z');

/** A job in `state` with a technician and a start (so only the state machine decides). */
function jobIn(state: JobState, technicianId = a.technician.id, overrides: Parameters<typeof buildJob>[1] = {}) {
  return buildJob(a.site, {
    state,
    technicianId,
    scheduledStart: START,
    ...(state === 'cancelled' ? { cancelReason: 'Client moved away' } : {}),
    ...(state === 'completed' ? { completedAt: START } : {}),
    ...overrides,
  });
}

async function reload(id: string): Promise<Job> {
  return (await Job.findOne({ where: { tenantId: a.firm.id, id } }))!;
}

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  otherTech = await buildUser(a.firm, 'technician');
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anon = await visitor(t.app);
  t.clock.now = new Date('2027-02-10T16:30:00Z');
});
afterAll(async () => {
  await t.close();
});

describe('every move through the API', () => {
  for (const from of JOB_STATES) {
    for (const to of JOB_STATES) {
      const legal = JOB_TRANSITIONS[from].includes(to);
      it(`${from} → ${to}: ${legal ? '200' : '409 conflict'}`, async () => {
        const job = await jobIn(from);
        const res = await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to, cancelReason: 'Client asked to cancel' });
        if (legal) {
          expect(res.status).toBe(200);
          expect(res.body.data.state).toBe(to);
          expect((await reload(job.id)).state).toBe(to);
          expect(await AuditEvent.count({ where: { tenantId: a.firm.id, subjectId: job.id } })).toBeGreaterThanOrEqual(1);
        } else {
          expect(res.status).toBe(409);
          expect(res.body.error.code).toBe('conflict');
          expect(res.body.error.fields).toHaveProperty('to');
          expect(res.body.error.message.length).toBeGreaterThan(10);
          expect((await reload(job.id)).state).toBe(from);
        }
      });
    }
  }
});

describe('what a move needs', () => {
  it('scheduling or starting needs a technician and a start (400 technicianId)', async () => {
    const noTech = await buildJob(a.site, { scheduledStart: START });
    const res = await as.coordinator.post(`/api/jobs/${noTech.id}/transitions`, { to: 'scheduled' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields)).toEqual(['technicianId']);
    const noStart = await buildJob(a.site, { technicianId: a.technician.id });
    expect((await as.coordinator.post(`/api/jobs/${noStart.id}/transitions`, { to: 'scheduled' })).body.error.fields).toHaveProperty('technicianId');
    // a scheduled job that lost its start (by data, not by the API) cannot be started either
    const lost = await buildJob(a.site, { state: 'scheduled', technicianId: a.technician.id });
    expect((await as.coordinator.post(`/api/jobs/${lost.id}/transitions`, { to: 'in_progress' })).status).toBe(400);
  });

  it('cancelling needs a reason (400 cancelReason), which is kept', async () => {
    const job = await jobIn('scheduled');
    for (const body of [{ to: 'cancelled' }, { to: 'cancelled', cancelReason: '   ' }]) {
      const res = await as.coordinator.post(`/api/jobs/${job.id}/transitions`, body);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['cancelReason']);
    }
    const ok = await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to: 'cancelled', cancelReason: 'Client sold the house' });
    expect(ok.status).toBe(200);
    expect(ok.body.data).toMatchObject({ state: 'cancelled', cancelReason: 'Client sold the house' });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'job.cancelled', subjectId: job.id } })).toBe(1);
  });

  it('completing needs a passed or failed walk-test result for every touched zone (400 walkTest)', async () => {
    const panel = await buildPanel(a.site);
    const z1 = await buildZone(panel, { number: 9, description: 'Front door' });
    const z2 = await buildZone(panel, { number: 10, description: 'Den window' });
    const job = await jobIn('in_progress', a.technician.id, { touchedZoneIds: [z1.id, z2.id] });
    const none = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(none.status).toBe(400);
    expect(Object.keys(none.body.error.fields)).toEqual(['walkTest']);
    expect(none.body.error.message).toMatch(/2 zones/);
    expect(none.body.error.message).toMatch(/zone 9 \(Front door\)/);
    await WalkTest.create({ tenantId: a.firm.id, jobId: job.id, zoneId: z1.id, result: 'passed', monitoringConfirmed: true, recordedById: null });
    await WalkTest.create({ tenantId: a.firm.id, jobId: job.id, zoneId: z2.id, result: 'not_tested', recordedById: null });
    const notTested = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(notTested.status).toBe(400);
    expect(notTested.body.error.message).toMatch(/1 zone this job touched has/);
    expect((await reload(job.id)).state).toBe('in_progress');
    await WalkTest.update({ result: 'failed', note: 'Contact gap too wide; new magnet ordered' }, { where: { tenantId: a.firm.id, jobId: job.id, zoneId: z2.id } });
    const ok = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(ok.status).toBe(200);
    expect(ok.body.data.state).toBe('completed');
  });

  it('answers 400 naming `to` for an unknown state', async () => {
    const job = await jobIn('scheduled');
    const res = await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to: 'paused' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['to']);
  });
});

describe('what a move records', () => {
  it('starting records the first start; completing records when and by whom', async () => {
    const job = await jobIn('scheduled');
    t.clock.now = new Date('2027-02-10T15:05:00Z');
    const started = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'in_progress' });
    expect(started.body.data).toMatchObject({ state: 'in_progress', startedAt: '2027-02-10T15:05:00.000Z', completedAt: null });
    // sent back and started again: the first start stays
    await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to: 'scheduled' });
    t.clock.now = new Date('2027-02-10T15:45:00Z');
    const again = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'in_progress' });
    expect(again.body.data.startedAt).toBe('2027-02-10T15:05:00.000Z');
    t.clock.now = new Date('2027-02-10T16:30:00Z');
    const done = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(done.body.data).toMatchObject({ state: 'completed', completedAt: '2027-02-10T16:30:00.000Z', completedById: a.technician.id });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'job.completed', subjectId: job.id, actorId: a.technician.id } })).toBe(1);
  });
});

describe('who may move a job', () => {
  it('answers 401 signed out, 403 to the operator, 404 to a client and for another firm’s job', async () => {
    const job = await jobIn('scheduled');
    expect((await as.anon.post(`/api/jobs/${job.id}/transitions`, { to: 'in_progress' })).status).toBe(401);
    expect((await as.operator.post(`/api/jobs/${job.id}/transitions`, { to: 'in_progress' })).status).toBe(403);
    expect((await as.client.post(`/api/jobs/${job.id}/transitions`, { to: 'in_progress' })).status).toBe(404);
    const theirs = await buildJob(b.site, { state: 'scheduled', technicianId: b.technician.id, scheduledStart: START });
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      expect((await as[role].post(`/api/jobs/${theirs.id}/transitions`, { to: 'in_progress' })).status).toBe(404);
    }
    expect((await Job.findOne({ where: { tenantId: b.firm.id, id: theirs.id } }))!.state).toBe('scheduled');
  });

  it('lets the owner make any legal move', async () => {
    const job = await jobIn('requested');
    expect((await as.owner.post(`/api/jobs/${job.id}/transitions`, { to: 'scheduled' })).status).toBe(200);
    expect((await as.owner.post(`/api/jobs/${job.id}/transitions`, { to: 'requested' })).status).toBe(200);
  });

  it('lets a technician start and complete only their own jobs; other moves are the office’s (403)', async () => {
    const own = await jobIn('scheduled');
    for (const to of ['requested', 'cancelled'] as const) {
      const res = await as.technician.post(`/api/jobs/${own.id}/transitions`, { to, cancelReason: 'Not home' });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/office/);
    }
    expect((await as.technician.post(`/api/jobs/${own.id}/transitions`, { to: 'in_progress' })).status).toBe(200);
    expect((await as.technician.post(`/api/jobs/${own.id}/transitions`, { to: 'scheduled' })).status).toBe(403);
    expect((await as.technician.post(`/api/jobs/${own.id}/transitions`, { to: 'completed' })).status).toBe(200);

    const theirs = await jobIn('scheduled', otherTech.id);
    const res = await as.technician.post(`/api/jobs/${theirs.id}/transitions`, { to: 'in_progress' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/another technician/);
    expect((await reload(theirs.id)).state).toBe('scheduled');
  });
});
