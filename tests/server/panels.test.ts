/**
 * Panels: list and add under a site, read, change, delete, "programmed", the change log.
 * Owners, coordinators and technicians manage panels; a client reads none (404); the operator
 * has no firm (403); another firm's site or panel answers 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CP01_DEFAULTS } from '@domain/cp01';
import { AuditEvent } from '@server/models/AuditEvent';
import { Panel } from '@server/models/Panel';
import { Zone } from '@server/models/Zone';
import { ZoneChange } from '@server/models/ZoneChange';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildPanel, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let b: Awaited<ReturnType<typeof buildFirmWithSite>>;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anonymous', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const newPanel = (overrides: Record<string, unknown> = {}) => ({
  label: 'Main panel',
  makeModel: 'Test panel TP-64',
  zoneCapacity: 64,
  wirelessZoneFrom: 9,
  wirelessZoneTo: 64,
  commPath: 'cellular',
  installedOn: '2025-03-14',
  ...overrides,
});

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anonymous = await visitor(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('POST /api/sites/:siteId/panels', () => {
  it('adds a panel with the CP-01 default settings and the read-only fields worked out', async () => {
    const res = await as.owner.post(`/api/sites/${a.site.id}/panels`, newPanel());
    expect(res.status).toBe(201);
    expect(res.body.data).toEqual({
      id: expect.any(String),
      siteId: a.site.id,
      label: 'Main panel',
      makeModel: 'Test panel TP-64',
      zoneCapacity: 64,
      wirelessZoneFrom: 9,
      wirelessZoneTo: 64,
      commPath: 'cellular',
      installedOn: '2025-03-14',
      // power fields default to a household panel with nothing recorded yet
      occupancy: 'household',
      standbyCurrentMa: null,
      alarmCurrentMa: null,
      batteryAh: null,
      batteryManufacturedOn: null,
      pathFailureReportMin: null,
      // no fire or CO zones yet: sized as an intrusion panel (UL 1023: 4 h standby, 4 min alarm);
      // nothing can be worked out until the currents are recorded
      standby: { duty: 'intrusion', standbyHours: 4, alarmMinutes: 4, neededAh: null, requiredAh: null, batteryDueOn: null },
      settings: { ...CP01_DEFAULTS },
      programmedAt: null,
      changedSinceProgrammed: false,
      nextZoneNumber: 9,
      zoneCount: 0,
      // CP-01 defaults pass; the audit now also holds the power findings: with nothing recorded on an
      // intrusion-only panel, two notes (info, not life safety) asking for the currents and the battery date
      audit: [
        expect.objectContaining({ topic: 'power', code: 'standby_battery_unknown', severity: 'info', field: 'standbyCurrentMa', lifeSafety: false }),
        expect.objectContaining({ topic: 'power', code: 'standby_battery_age_unknown', severity: 'info', field: 'batteryManufacturedOn', lifeSafety: false }),
      ],
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    const stored = await Panel.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } });
    expect(stored!.settings).toEqual(CP01_DEFAULTS);
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'panel.created', subjectId: stored!.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.actorId).toBe(a.owner.id);
  });

  it('keeps settings that are given and reports their CP-01 findings', async () => {
    const res = await as.technician.post(`/api/sites/${a.site.id}/panels`, newPanel({ settings: { ...CP01_DEFAULTS, exitDelaySec: 30 } }));
    expect(res.status).toBe(201);
    expect(res.body.data.settings.exitDelaySec).toBe(30);
    // the audit also carries the power findings (topic 'power'); the CP-01 part is this one finding
    const cp01 = (res.body.data.audit as { topic: string }[]).filter((f) => f.topic === 'cp01');
    expect(cp01).toEqual([expect.objectContaining({ code: 'exit_delay_too_short', severity: 'error', field: 'exitDelaySec', topic: 'cp01' })]);
    // most severe first: the CP-01 error comes before the power notes
    expect(res.body.data.audit[0]).toMatchObject({ code: 'exit_delay_too_short' });
  });

  it('lets coordinators and technicians add panels too', async () => {
    for (const who of [as.coordinator, as.technician]) {
      expect((await who.post(`/api/sites/${a.site.id}/panels`, newPanel({ label: 'Garage panel' }))).status).toBe(201);
    }
  });

  it('answers 400 naming each bad field', async () => {
    const cases: [Record<string, unknown>, string][] = [
      [{ label: '' }, 'label'],
      [{ commPath: 'carrier_pigeon' }, 'commPath'],
      [{ zoneCapacity: 0 }, 'zoneCapacity'],
      [{ wirelessZoneFrom: 20, wirelessZoneTo: 10 }, 'wirelessZoneTo'],
      [{ zoneCapacity: 32, wirelessZoneTo: 64 }, 'wirelessZoneTo'],
      [{ installedOn: '2025-02-30' }, 'installedOn'],
      [{ settings: { ...CP01_DEFAULTS, exitDelaySec: -5 } }, 'settings.exitDelaySec'],
    ];
    const before = await Panel.count({ where: { tenantId: a.firm.id } });
    for (const [overrides, field] of cases) {
      const res = await as.owner.post(`/api/sites/${a.site.id}/panels`, newPanel(overrides));
      expect(res.status, field).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields).toHaveProperty([field]);
    }
    expect(await Panel.count({ where: { tenantId: a.firm.id } })).toBe(before);
  });

  it('refuses a client (404), the operator (403) and a signed-out visitor (401)', async () => {
    const before = await Panel.count({ where: { tenantId: a.firm.id } });
    const client = await as.client.post(`/api/sites/${a.site.id}/panels`, newPanel());
    expect(client.status).toBe(404);
    expect(client.body.error.code).toBe('not_found');
    expect((await as.operator.post(`/api/sites/${a.site.id}/panels`, newPanel())).status).toBe(403);
    expect((await as.anonymous.post(`/api/sites/${a.site.id}/panels`, newPanel())).status).toBe(401);
    expect(await Panel.count({ where: { tenantId: a.firm.id } })).toBe(before);
  });

  it('answers 404 for another firm’s site and adds nothing there', async () => {
    const res = await as.owner.post(`/api/sites/${b.site.id}/panels`, newPanel());
    expect(res.status).toBe(404);
    expect(await Panel.count({ where: { tenantId: b.firm.id } })).toBe(0);
  });
});

describe('GET /api/sites/:siteId/panels', () => {
  it('lists the site’s panels with their zone counts and next numbers, paged', async () => {
    const own = await buildFirmWithSite();
    const first = await buildPanel(own.site, { label: 'Alpha panel' });
    await buildPanel(own.site, { label: 'Beta panel' });
    await buildZone(first, { number: 9, serial: '0412877' });
    await buildZone(first, { number: 10, serial: '0412878', status: 'removed' });
    const owner = await signedIn(own.owner);
    const res = await owner.get(`/api/sites/${own.site.id}/panels?pageSize=1`);
    expect(res.status).toBe(200);
    expect(res.body.page).toEqual({ number: 1, size: 1, total: 2 });
    expect(res.body.data).toHaveLength(1);
    expect(res.body.data[0]).toMatchObject({ label: 'Alpha panel', zoneCount: 1, nextZoneNumber: 10 });
    const sorted = await owner.get(`/api/sites/${own.site.id}/panels?sort=-label`);
    expect((sorted.body.data as { label: string }[]).map((p) => p.label)).toEqual(['Beta panel', 'Alpha panel']);
    expect((await owner.get(`/api/sites/${own.site.id}/panels?sort=colour`)).body.error.fields).toHaveProperty('sort');
  });

  it('answers every staff role, 404 to a client (even for their own site) and for another firm, 403 to the operator, 401 signed out', async () => {
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      expect((await as[role].get(`/api/sites/${a.site.id}/panels`)).status, role).toBe(200);
    }
    expect((await as.client.get(`/api/sites/${a.site.id}/panels`)).status).toBe(404);
    expect((await as.owner.get(`/api/sites/${b.site.id}/panels`)).status).toBe(404);
    expect((await as.operator.get(`/api/sites/${a.site.id}/panels`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/sites/${a.site.id}/panels`)).status).toBe(401);
    expect((await as.owner.get('/api/sites/not-a-uuid/panels')).body.error.fields).toHaveProperty('siteId');
  });
});

describe('GET|PATCH|DELETE /api/panels/:panelId', () => {
  it('reads a panel for every staff role; 404 for a client and for another firm; 403 operator; 401 signed out', async () => {
    const panel = await buildPanel(a.site);
    const other = await buildPanel(b.site);
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/panels/${panel.id}`);
      expect(res.status, role).toBe(200);
      expect(res.body.data.id).toBe(panel.id);
    }
    expect((await as.client.get(`/api/panels/${panel.id}`)).status).toBe(404);
    const foreign = await as.owner.get(`/api/panels/${other.id}`);
    expect(foreign.status).toBe(404);
    expect(JSON.stringify(foreign.body)).not.toContain(b.firm.id);
    expect((await as.operator.get(`/api/panels/${panel.id}`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/panels/${panel.id}`)).status).toBe(401);
  });

  it('merges partial settings, logs the settings change and marks the panel changed since programmed', async () => {
    const panel = await buildPanel(a.site);
    const res = await as.technician.patch(`/api/panels/${panel.id}`, { label: 'Basement panel', settings: { exitDelaySec: 90, autoStay: false } });
    expect(res.status).toBe(200);
    expect(res.body.data.label).toBe('Basement panel');
    expect(res.body.data.settings).toEqual({ ...CP01_DEFAULTS, exitDelaySec: 90, autoStay: false });
    expect(res.body.data.changedSinceProgrammed).toBe(true);
    // the CP-01 part of the audit (the power findings are topic 'power')
    const cp01 = (res.body.data.audit as { topic: string }[]).filter((f) => f.topic === 'cp01');
    expect(cp01).toEqual([expect.objectContaining({ code: 'auto_stay_off', severity: 'warning', evidence: 'memory', topic: 'cp01' })]);
    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, panelId: panel.id } });
    expect(log).toHaveLength(1);
    expect(log[0]!.changes).toEqual({ 'settings.exitDelaySec': [60, 90], 'settings.autoStay': [true, false] });
    expect(log[0]!.actorName).toBe(a.technician.name);
    const audit = await AuditEvent.findOne({ where: { tenantId: a.firm.id, action: 'panel.updated', subjectId: panel.id } });
    expect((audit!.details as { changed: string[] }).changed.sort()).toEqual(['label', 'settings.autoStay', 'settings.exitDelaySec']);
  });

  it('changes only the fields sent; a label change does not mark the panel', async () => {
    const panel = await buildPanel(a.site, { settings: { exitDelaySec: 75 } });
    const res = await as.coordinator.patch(`/api/panels/${panel.id}`, { makeModel: 'Test panel TP-128' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ label: 'Main panel', makeModel: 'Test panel TP-128', changedSinceProgrammed: false });
    expect(res.body.data.settings.exitDelaySec).toBe(75);
  });

  it('checks the range on the merged values and refuses a capacity below a zone in use', async () => {
    const panel = await buildPanel(a.site, { zoneCapacity: 64, wirelessZoneFrom: 9, wirelessZoneTo: 40 });
    await buildZone(panel, { number: 40, description: 'Back door', deviceType: 'door_contact' });
    await buildZone(panel, { number: 50, description: 'Old window', status: 'removed' });
    const inverted = await as.owner.patch(`/api/panels/${panel.id}`, { wirelessZoneFrom: 50 });
    expect(inverted.status).toBe(400);
    expect(inverted.body.error.fields).toHaveProperty('wirelessZoneFrom');
    const beyond = await as.owner.patch(`/api/panels/${panel.id}`, { zoneCapacity: 32 });
    expect(beyond.status).toBe(400);
    expect(beyond.body.error.fields).toHaveProperty('zoneCapacity');
    const inUse = await as.owner.patch(`/api/panels/${panel.id}`, { zoneCapacity: 39, wirelessZoneTo: 39 });
    expect(inUse.status).toBe(400);
    expect(inUse.body.error.fields.zoneCapacity).toContain('Zone 40 (“Back door”)');
    expect((await as.owner.patch(`/api/panels/${panel.id}`, { settings: { swingerLimit: 'two' } })).body.error.fields).toHaveProperty(['settings.swingerLimit']);
    const stored = await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } });
    expect(stored!.zoneCapacity).toBe(64);
    // the removed zone 50 does not hold the capacity up
    expect((await as.owner.patch(`/api/panels/${panel.id}`, { zoneCapacity: 45 })).status).toBe(200);
  });

  it('refuses a client (404), another firm (404), the operator (403) and a signed-out visitor (401)', async () => {
    const panel = await buildPanel(a.site);
    const other = await buildPanel(b.site);
    expect((await as.client.patch(`/api/panels/${panel.id}`, { label: 'Mine now' })).status).toBe(404);
    expect((await as.owner.patch(`/api/panels/${other.id}`, { label: 'Mine now' })).status).toBe(404);
    expect((await as.operator.patch(`/api/panels/${panel.id}`, { label: 'Mine now' })).status).toBe(403);
    expect((await as.anonymous.patch(`/api/panels/${panel.id}`, { label: 'Mine now' })).status).toBe(401);
    expect((await as.client.delete(`/api/panels/${panel.id}`)).status).toBe(404);
    expect((await as.owner.delete(`/api/panels/${other.id}`)).status).toBe(404);
    expect((await as.operator.delete(`/api/panels/${panel.id}`)).status).toBe(403);
    expect((await as.anonymous.delete(`/api/panels/${panel.id}`)).status).toBe(401);
    expect((await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } }))!.label).toBe('Main panel');
    expect((await Panel.findOne({ where: { tenantId: b.firm.id, id: other.id } }))!.label).toBe('Main panel');
  });

  it('deletes a panel with its zones, audited', async () => {
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const panel = await buildPanel(a.site);
      await buildZone(panel, { number: 9 });
      const res = await as[role].delete(`/api/panels/${panel.id}`);
      expect(res.status, role).toBe(204);
      expect(await Panel.count({ where: { tenantId: a.firm.id, id: panel.id } })).toBe(0);
      expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(0);
      const audit = await AuditEvent.findOne({ where: { tenantId: a.firm.id, action: 'panel.deleted', subjectId: panel.id } });
      expect(audit!.details).toMatchObject({ zoneCount: 1, label: 'Main panel' });
      expect((await as[role].get(`/api/panels/${panel.id}`)).status).toBe(404);
    }
  });
});

describe('POST /api/panels/:panelId/programmed and GET /api/panels/:panelId/changes', () => {
  it('records the programming: programmedAt now, the mark cleared, a log row and an audit event', async () => {
    const panel = await buildPanel(a.site, { changedSinceProgrammed: true });
    const res = await as.technician.post(`/api/panels/${panel.id}/programmed`);
    expect(res.status).toBe(200);
    expect(res.body.data.programmedAt).toBe(t.clock.now.toISOString());
    expect(res.body.data.changedSinceProgrammed).toBe(false);
    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, panelId: panel.id, action: 'programmed' } });
    expect(log).toHaveLength(1);
    expect(log[0]!.actorId).toBe(a.technician.id);
    expect(log[0]!.changes).toMatchObject({ changedSinceProgrammed: [true, false] });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'panel.programmed', subjectId: panel.id } })).toBe(1);
  });

  it('is refused to a client (404), another firm (404), the operator (403) and a signed-out visitor (401)', async () => {
    const panel = await buildPanel(a.site, { changedSinceProgrammed: true });
    const other = await buildPanel(b.site, { changedSinceProgrammed: true });
    expect((await as.client.post(`/api/panels/${panel.id}/programmed`)).status).toBe(404);
    expect((await as.owner.post(`/api/panels/${other.id}/programmed`)).status).toBe(404);
    expect((await as.operator.post(`/api/panels/${panel.id}/programmed`)).status).toBe(403);
    expect((await as.anonymous.post(`/api/panels/${panel.id}/programmed`)).status).toBe(401);
    expect((await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } }))!.changedSinceProgrammed).toBe(true);
    expect((await Panel.findOne({ where: { tenantId: b.firm.id, id: other.id } }))!.changedSinceProgrammed).toBe(true);
  });

  it('lists the change log newest first, paged, with who, when, zone, action and old → new', async () => {
    const panel = await buildPanel(a.site);
    const created = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Front door', deviceType: 'door_contact', serial: '0412877' });
    expect(created.status).toBe(201);
    await new Promise((r) => setTimeout(r, 5));
    expect((await as.technician.patch(`/api/zones/${created.body.data.id}`, { description: 'Front door (main)' })).status).toBe(200);
    await new Promise((r) => setTimeout(r, 5));
    expect((await as.technician.post(`/api/panels/${panel.id}/programmed`)).status).toBe(200);

    const res = await as.coordinator.get(`/api/panels/${panel.id}/changes`);
    expect(res.status).toBe(200);
    expect(res.body.page).toEqual({ number: 1, size: 25, total: 3 });
    expect((res.body.data as { action: string }[]).map((c) => c.action)).toEqual(['programmed', 'updated', 'created']);
    expect(res.body.data[1]).toEqual({
      id: expect.any(String),
      at: expect.any(String),
      actorId: a.technician.id,
      actorName: a.technician.name,
      zoneId: created.body.data.id,
      zoneNumber: 9,
      action: 'updated',
      changes: [{ field: 'description', from: 'Front door', to: 'Front door (main)' }],
    });
    expect(res.body.data[2].changes).toContainEqual({ field: 'serial', from: null, to: '0412877' });
    expect(res.body.data[2].actorName).toBe(a.owner.name);

    const paged = await as.coordinator.get(`/api/panels/${panel.id}/changes?page=2&pageSize=2`);
    expect(paged.body.page).toEqual({ number: 2, size: 2, total: 3 });
    expect((paged.body.data as { action: string }[]).map((c) => c.action)).toEqual(['created']);
  });

  it('shows the log only to the firm’s staff', async () => {
    const panel = await buildPanel(a.site);
    const other = await buildPanel(b.site);
    expect((await as.technician.get(`/api/panels/${panel.id}/changes`)).status).toBe(200);
    expect((await as.client.get(`/api/panels/${panel.id}/changes`)).status).toBe(404);
    expect((await as.owner.get(`/api/panels/${other.id}/changes`)).status).toBe(404);
    expect((await as.operator.get(`/api/panels/${panel.id}/changes`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/panels/${panel.id}/changes`)).status).toBe(401);
    expect((await as.owner.get(`/api/panels/${panel.id}/changes?pageSize=1000`)).body.error.fields).toHaveProperty('pageSize');
  });
});
