/**
 * GET /api/sites/:siteId/history: a site's timeline — completed and cancelled jobs, zone
 * change-log entries and panel programming records of its panels — newest first, filtered by
 * type, paged; each entry links to its detail.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Panel } from '@server/models/Panel';
import type { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { ZoneChange } from '@server/models/ZoneChange';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildJob, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let site: Site;
let panel: Panel;
const ids: Record<string, string> = {};
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

interface Entry {
  type: string;
  at: string;
  title: string;
  detail: string;
  link: { kind: string; id: string };
}

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anon = await visitor(t.app);

  site = await buildSite(a.firm, a.client, { name: 'History home' });
  panel = await buildPanel(site, { label: 'Hall panel' });
  const zone = await buildZone(panel, { number: 9, description: 'Front door' });

  // a zone change through the API (day 1), then programming (day 2)
  t.clock.now = new Date('2027-01-05T15:00:00Z');
  expect((await as.technician.patch(`/api/zones/${zone.id}`, { description: 'Front door (main)' })).status).toBe(200);
  await ZoneChange.update({ createdAt: new Date('2027-01-05T15:00:00Z') }, { where: { tenantId: a.firm.id, panelId: panel.id } });
  expect((await as.technician.post(`/api/panels/${panel.id}/programmed`)).status).toBe(200);
  await ZoneChange.update({ createdAt: new Date('2027-01-06T15:00:00Z') }, { where: { tenantId: a.firm.id, panelId: panel.id, action: 'programmed' } });

  // a completed job (day 3), a cancelled one (day 4), and open jobs that are not history
  const done = await buildJob(site, { kind: 'inspection', state: 'in_progress', technicianId: a.technician.id, scheduledStart: new Date('2027-01-07T15:00:00Z'), summary: 'Yearly inspection', clientNotes: 'All zones tested.' });
  t.clock.now = new Date('2027-01-07T17:00:00Z');
  expect((await as.technician.post(`/api/jobs/${done.id}/transitions`, { to: 'completed' })).status).toBe(200);
  ids.done = done.id;
  const cancelled = await buildJob(site, { kind: 'service_call', state: 'scheduled', technicianId: a.technician.id, scheduledStart: new Date('2027-01-09T15:00:00Z'), summary: 'Keypad beeping' });
  t.clock.now = new Date('2027-01-08T12:00:00Z');
  expect((await as.coordinator.post(`/api/jobs/${cancelled.id}/transitions`, { to: 'cancelled', cancelReason: 'Client fixed it' })).status).toBe(200);
  // no cancellation time column: the history uses the closed job's last change, stamped by the database clock
  await t.sequelize.query('UPDATE jobs SET "updatedAt" = ? WHERE "tenantId" = ? AND id = ?', {
    replacements: ['2027-01-08 12:00:00.000 +00:00', a.firm.id, cancelled.id],
  });
  ids.cancelled = cancelled.id;
  await buildJob(site, { summary: 'Still requested' });
  ids.zone = zone.id;
  ids.panel = panel.id;
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/sites/:siteId/history', () => {
  it('answers the timeline newest first, each entry linking to its detail', async () => {
    const res = await as.coordinator.get(`/api/sites/${site.id}/history`);
    expect(res.status).toBe(200);
    const entries = res.body.data as Entry[];
    expect(entries.map((e) => e.type)).toEqual(['job', 'job', 'programming', 'zone_change']);
    expect(res.body.page).toEqual({ number: 1, size: 25, total: 4 });
    const [cancelled, done, programmed, change] = entries as [Entry, Entry, Entry, Entry];
    expect(cancelled).toEqual({
      type: 'job',
      at: expect.any(String),
      title: 'Service call cancelled: Keypad beeping',
      detail: 'Reason: Client fixed it',
      link: { kind: 'job', id: ids.cancelled },
    });
    expect(done).toMatchObject({ at: '2027-01-07T17:00:00.000Z', title: 'Yearly inspection completed: Yearly inspection', link: { kind: 'job', id: ids.done } });
    expect(done.detail).toContain(a.technician.name);
    expect(done.detail).toContain('All zones tested.');
    expect(programmed).toMatchObject({ at: '2027-01-06T15:00:00.000Z', title: 'Panel “Hall panel” programmed', link: { kind: 'panel', id: ids.panel } });
    expect(programmed.detail).toContain(a.technician.name);
    expect(change).toMatchObject({ at: '2027-01-05T15:00:00.000Z', link: { kind: 'zone', id: ids.zone } });
    expect(change.title).toBe('Zone 9 “Front door (main)” changed on “Hall panel”');
    expect(change.detail).toContain('description: Front door → Front door (main)');
    const times = entries.map((e) => Date.parse(e.at));
    expect([...times].sort((x, y) => y - x)).toEqual(times);
  });

  it('filters by type and pages across the sources', async () => {
    const jobs = await as.owner.get(`/api/sites/${site.id}/history?type=job`);
    expect((jobs.body.data as Entry[]).map((e) => e.link.id)).toEqual([ids.cancelled, ids.done]);
    expect(jobs.body.page.total).toBe(2);
    const programming = await as.owner.get(`/api/sites/${site.id}/history?type=programming`);
    expect((programming.body.data as Entry[]).map((e) => e.type)).toEqual(['programming']);
    const changes = await as.owner.get(`/api/sites/${site.id}/history?type=zone_change`);
    expect((changes.body.data as Entry[]).map((e) => e.type)).toEqual(['zone_change']);

    const page1 = await as.owner.get(`/api/sites/${site.id}/history?pageSize=3`);
    const page2 = await as.owner.get(`/api/sites/${site.id}/history?pageSize=3&page=2`);
    expect((page1.body.data as Entry[]).map((e) => e.type)).toEqual(['job', 'job', 'programming']);
    expect((page2.body.data as Entry[]).map((e) => e.type)).toEqual(['zone_change']);
    expect(page2.body.page).toEqual({ number: 2, size: 3, total: 4 });
  });

  it('includes battery changes recorded on completion as zone changes', async () => {
    const other = await buildSite(a.firm, await buildClient(a.firm));
    const otherPanel = await buildPanel(other);
    const zone = await buildZone(otherPanel, { number: 12, description: 'Hall smoke', deviceType: 'smoke' });
    const job = await buildJob(other, { kind: 'battery_round', state: 'in_progress', technicianId: a.technician.id, scheduledStart: new Date('2027-01-10T15:00:00Z') });
    t.clock.now = new Date('2027-01-10T17:00:00Z');
    expect((await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed', batteryChangedZoneIds: [zone.id] })).status).toBe(200);
    const res = await as.technician.get(`/api/sites/${other.id}/history`);
    const entries = res.body.data as Entry[];
    expect(entries.map((e) => e.type).sort()).toEqual(['job', 'zone_change']);
    const change = entries.find((e) => e.type === 'zone_change')!;
    expect(change.title).toBe('Zone 12 “Hall smoke” changed on “Main panel”');
    expect(change.detail).toContain('battery changed on: — → 2027-01-10');
  });

  it('answers 400 naming the field for a bad type or page', async () => {
    const bad = await as.owner.get(`/api/sites/${site.id}/history?type=alarm`);
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['type']);
    expect((await as.owner.get(`/api/sites/${site.id}/history?page=0`)).body.error.fields).toHaveProperty('page');
    expect((await as.owner.get('/api/sites/nope/history')).body.error.fields).toHaveProperty('siteId');
  });

  it('answers 401 signed out, 403 to the operator, 404 to a client (for now) and for another firm’s site', async () => {
    expect((await as.anon.get(`/api/sites/${site.id}/history`)).status).toBe(401);
    expect((await as.operator.get(`/api/sites/${site.id}/history`)).status).toBe(403);
    expect((await as.client.get(`/api/sites/${site.id}/history`)).status).toBe(404);
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      expect((await as[role].get(`/api/sites/${b.site.id}/history`)).status).toBe(404);
    }
  });
});
