/**
 * PUT /api/jobs/:jobId/walk-test: results per zone (passed / failed / not tested, monitoring
 * center confirmed, note) replaced by zone, zones of the job's site only, open jobs only, the
 * touched zones listed first in the job's JSON.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import type { Panel } from '@server/models/Panel';
import type { User } from '@server/models/User';
import { WalkTest } from '@server/models/WalkTest';
import type { Zone } from '@server/models/Zone';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildJob, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let panel: Panel;
let zones: Zone[];
let otherTech: User;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const START = new Date('2027-02-10T15:00:00Z');

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  otherTech = await buildUser(a.firm, 'technician');
  panel = await buildPanel(a.site);
  zones = [
    await buildZone(panel, { number: 9, description: 'Front door', deviceType: 'door_contact' }),
    await buildZone(panel, { number: 10, description: 'Den window' }),
    await buildZone(panel, { number: 11, description: 'Hall motion', deviceType: 'motion' }),
    await buildZone(panel, { number: 12, description: 'Kitchen window' }),
  ];
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anon = await visitor(t.app);
});
afterAll(async () => {
  await t.close();
});

const z = (i: number) => zones[i]!;

describe('PUT /api/jobs/:jobId/walk-test', () => {
  it('records results, the touched zones first, then by zone number; audited', async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START, touchedZoneIds: [z(3).id, z(1).id] });
    const res = await as.technician.put(`/api/jobs/${job.id}/walk-test`, [
      { zoneId: z(0).id, result: 'passed', monitoringConfirmed: true },
      { zoneId: z(1).id, result: 'failed', monitoringConfirmed: false, note: 'No signal at the receiver' },
      { zoneId: z(2).id, result: 'not_tested' },
      { zoneId: z(3).id, result: 'passed', monitoringConfirmed: true, note: 'Signal 5/5' },
    ]);
    expect(res.status).toBe(200);
    const rows = res.body.data.walkTest as { zoneId: string; zoneNumber: number; touched: boolean }[];
    expect(rows.map((r) => r.zoneNumber)).toEqual([10, 12, 9, 11]);
    expect(rows.map((r) => r.touched)).toEqual([true, true, false, false]);
    expect(rows[0]).toEqual({
      zoneId: z(1).id,
      panelId: panel.id,
      zoneNumber: 10,
      zoneDescription: 'Den window',
      touched: true,
      result: 'failed',
      monitoringConfirmed: false,
      note: 'No signal at the receiver',
      recordedById: a.technician.id,
      recordedAt: expect.any(String),
    });
    expect(rows[3]).toMatchObject({ result: 'not_tested', monitoringConfirmed: false, note: '' });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'job.walk_test_recorded', subjectId: job.id } })).toBe(1);
  });

  it('replaces the result of a zone sent again and keeps the others (upsert by zone)', async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    await as.technician.put(`/api/jobs/${job.id}/walk-test`, [
      { zoneId: z(0).id, result: 'failed', note: 'Magnet loose' },
      { zoneId: z(1).id, result: 'passed', monitoringConfirmed: true },
    ]);
    const res = await as.coordinator.put(`/api/jobs/${job.id}/walk-test`, [{ zoneId: z(0).id, result: 'passed', monitoringConfirmed: true, note: 'Magnet re-fixed' }]);
    expect(res.status).toBe(200);
    expect(res.body.data.walkTest).toHaveLength(2);
    expect(res.body.data.walkTest[0]).toMatchObject({ zoneId: z(0).id, result: 'passed', monitoringConfirmed: true, note: 'Magnet re-fixed', recordedById: a.coordinator.id });
    expect(await WalkTest.count({ where: { tenantId: a.firm.id, jobId: job.id } })).toBe(2);
    const empty = await as.coordinator.put(`/api/jobs/${job.id}/walk-test`, []);
    expect(empty.status).toBe(200);
    expect(empty.body.data.walkTest).toHaveLength(2);
  });

  it('answers 400 naming <index>.zoneId for a zone of another site or firm, or one listed twice; nothing saved', async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    const elsewhere = await buildZone(await buildPanel(await buildSite(a.firm, await buildClient(a.firm))), { number: 9 });
    const foreign = await buildZone(await buildPanel(b.site), { number: 9 });
    for (const [zoneId, index] of [
      [elsewhere.id, 1],
      [foreign.id, 1],
      [z(0).id, 1],
    ] as const) {
      const res = await as.technician.put(`/api/jobs/${job.id}/walk-test`, [
        { zoneId: z(0).id, result: 'passed' },
        { zoneId, result: 'passed' },
      ]);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([`${index}.zoneId`]);
    }
    expect(await WalkTest.count({ where: { tenantId: a.firm.id, jobId: job.id } })).toBe(0);
  });

  it('answers 400 naming the field for bad rows: unknown result, a failure without a note, a bad id, not a list', async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    const cases: [unknown, string][] = [
      [[{ zoneId: z(0).id, result: 'maybe' }], '0.result'],
      [[{ zoneId: z(0).id, result: 'passed' }, { zoneId: z(1).id, result: 'failed' }], '1.note'],
      [[{ zoneId: 'zone-9', result: 'passed' }], '0.zoneId'],
      [[{ zoneId: z(0).id, result: 'passed', monitoringConfirmed: 'yes' }], '0.monitoringConfirmed'],
    ];
    for (const [body, field] of cases) {
      const res = await as.technician.put(`/api/jobs/${job.id}/walk-test`, body as object);
      expect(res.status, field).toBe(400);
      expect(res.body.error.fields, field).toHaveProperty([field]);
    }
    const notList = await as.technician.put(`/api/jobs/${job.id}/walk-test`, { zoneId: z(0).id, result: 'passed' });
    expect(notList.status).toBe(400);
  });

  it('refuses a completed or cancelled job with 409', async () => {
    for (const state of ['completed', 'cancelled'] as const) {
      const job = await buildJob(a.site, { state, technicianId: a.technician.id, scheduledStart: START });
      const res = await as.technician.put(`/api/jobs/${job.id}/walk-test`, [{ zoneId: z(0).id, result: 'passed' }]);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
    }
  });

  it('answers 401 signed out, 403 to the operator and to a technician on another’s job, 404 to a client and for another firm', async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: otherTech.id, scheduledStart: START });
    const body = [{ zoneId: z(0).id, result: 'passed' }];
    expect((await as.anon.put(`/api/jobs/${job.id}/walk-test`, body)).status).toBe(401);
    expect((await as.operator.put(`/api/jobs/${job.id}/walk-test`, body)).status).toBe(403);
    expect((await as.technician.put(`/api/jobs/${job.id}/walk-test`, body)).status).toBe(403);
    expect((await as.client.put(`/api/jobs/${job.id}/walk-test`, body)).status).toBe(404);
    expect((await as.owner.put(`/api/jobs/${job.id}/walk-test`, body)).status).toBe(200);
    const theirs = await buildJob(b.site, { state: 'in_progress', technicianId: b.technician.id, scheduledStart: START });
    expect((await as.owner.put(`/api/jobs/${theirs.id}/walk-test`, body)).status).toBe(404);
    expect(await WalkTest.count({ where: { tenantId: b.firm.id, jobId: theirs.id } })).toBe(0);
  });
});
