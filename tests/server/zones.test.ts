/**
 * Zones of a panel: list (with device life and the same serial elsewhere), add (next number
 * and device-type defaults), change, remove, delete; clashes refused with the clash named;
 * every change logged and marking the panel "changed since last programmed".
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addYearsToDate, batteryLifeYears } from '@domain/device-life';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { AuditEvent } from '@server/models/AuditEvent';
import { Panel } from '@server/models/Panel';
import { Site } from '@server/models/Site';
import { Tenant } from '@server/models/Tenant';
import { Zone } from '@server/models/Zone';
import { ZoneChange } from '@server/models/ZoneChange';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let b: Awaited<ReturnType<typeof buildFirmWithSite>>;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anonymous', Visitor> = {} as never;
const STAFF = ['owner', 'coordinator', 'technician'] as const;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

async function panelOf(site: Site = a.site, overrides: Parameters<typeof buildPanel>[1] = {}) {
  return buildPanel(site, overrides);
}

async function changedSinceProgrammed(panelId: string, tenantId = a.firm.id): Promise<boolean> {
  return (await Panel.findOne({ where: { tenantId, id: panelId } }))!.changedSinceProgrammed;
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
  as.anonymous = await visitor(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('POST /api/panels/:panelId/zones', () => {
  it('takes the next free wireless number and the device type’s defaults', async () => {
    const panel = await panelOf();
    await buildZone(panel, { number: 9 });
    await buildZone(panel, { number: 11 });
    const res = await as.technician.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0412877' });
    expect(res.status).toBe(201);
    expect(res.body.data).toEqual({
      id: expect.any(String),
      panelId: panel.id,
      siteId: a.site.id,
      number: 10,
      description: 'Den window',
      deviceType: 'window_contact',
      zoneType: 'perimeter',
      serial: '0412877',
      input: 1,
      reportsToMonitoring: true,
      chime: true,
      supervised: true,
      status: 'active',
      roomId: null,
      openingId: null,
      installedOn: null,
      batteryType: null,
      batteryChangedOn: null,
      manufacturedOn: null,
      pin: null,
      // a window contact has no end of life (basis null) and no battery type recorded, so no forecast
      life: { batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: null, state: 'ok', batteryYears: null, batteryUnderOneYear: false },
      // not a smoke, heat or CO device: nothing for the life-safety zone check to say
      lifeSafetyProblems: [],
      elsewhere: [],
      warnings: [],
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    const smoke = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Hall smoke', deviceType: 'smoke' });
    expect(smoke.body.data).toMatchObject({ number: 12, zoneType: 'fire_24h', chime: false, reportsToMonitoring: true, supervised: true });
    const door = await as.coordinator.post(`/api/panels/${panel.id}/zones`, { description: 'Front door', deviceType: 'door_contact', chime: false });
    expect(door.body.data).toMatchObject({ number: 13, zoneType: 'entry_exit', chime: false });
    const fob = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Keyfob 1', deviceType: 'keyfob' });
    expect(fob.body.data).toMatchObject({ zoneType: 'monitor_only', reportsToMonitoring: false, supervised: false });
  });

  it('keeps the serial as a string with its leading zeros', async () => {
    const panel = await panelOf();
    const res = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0004128' });
    expect(res.body.data.serial).toBe('0004128');
    expect((await Zone.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } }))!.serial).toBe('0004128');
  });

  it('warns (without refusing) about a number outside the wireless range', async () => {
    const panel = await panelOf();
    const res = await as.owner.post(`/api/panels/${panel.id}/zones`, { number: 3, description: 'Hardwired door', deviceType: 'door_contact' });
    expect(res.status).toBe(201);
    expect(res.body.data.warnings).toEqual([expect.objectContaining({ code: 'outside_wireless_range', field: 'number' })]);
  });

  it('logs the creation, marks the panel changed and writes an audit event', async () => {
    const panel = await panelOf();
    expect(await changedSinceProgrammed(panel.id)).toBe(false);
    const res = await as.technician.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0412877' });
    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, panelId: panel.id } });
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({ action: 'created', zoneId: res.body.data.id, zoneNumber: 9, actorId: a.technician.id, actorName: a.technician.name });
    expect(log[0]!.changes).toMatchObject({ number: [null, 9], description: [null, 'Den window'], serial: [null, '0412877'], chime: [null, true] });
    expect(await changedSinceProgrammed(panel.id)).toBe(true);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.created', subjectId: res.body.data.id } })).toBe(1);
  });

  it('answers 409 zone_number_taken naming the zone that holds the number', async () => {
    const panel = await panelOf();
    await buildZone(panel, { number: 9, description: 'Kitchen window' });
    const res = await as.owner.post(`/api/panels/${panel.id}/zones`, { number: 9, description: 'Den window', deviceType: 'window_contact' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('zone_number_taken');
    expect(res.body.error.fields.number).toContain('Zone 9 is already “Kitchen window”');
    expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(1);
  });

  it('answers 409 conflict naming the zone with the same serial and input; another input is fine', async () => {
    const panel = await panelOf();
    await buildZone(panel, { number: 9, serial: '0412877', input: 1 });
    const res = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0412877' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(res.body.error.fields.serial).toContain('already zone 9');
    // the same transmitter's second input is another zone
    const second = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window 2', deviceType: 'window_contact', serial: '0412877', input: 2 });
    expect(second.status).toBe(201);
    // "412877" is another serial: leading zeros matter
    expect((await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Attic', deviceType: 'motion', serial: '412877' })).status).toBe(201);
  });

  it('names both fields when number and serial both clash', async () => {
    const panel = await panelOf();
    await buildZone(panel, { number: 9, serial: '0412877' });
    const res = await as.owner.post(`/api/panels/${panel.id}/zones`, { number: 9, description: 'Den window', deviceType: 'window_contact', serial: '0412877' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('zone_number_taken');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['number', 'serial']);
  });

  it('answers 400 naming number beyond the panel’s capacity, and when the panel is full', async () => {
    const panel = await panelOf(a.site, { zoneCapacity: 12, wirelessZoneFrom: 9, wirelessZoneTo: 10 });
    const beyond = await as.owner.post(`/api/panels/${panel.id}/zones`, { number: 13, description: 'Den window', deviceType: 'window_contact' });
    expect(beyond.status).toBe(400);
    expect(beyond.body.error.code).toBe('validation_failed');
    expect(beyond.body.error.fields.number).toContain('beyond this panel');
    await buildZone(panel, { number: 9 });
    await buildZone(panel, { number: 10 });
    const full = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact' });
    expect(full.status).toBe(400);
    expect(full.body.error.fields.number).toContain('Every wireless zone number on this panel (9–10) is in use');
    // a number given outside the wireless range still fits
    expect((await as.owner.post(`/api/panels/${panel.id}/zones`, { number: 1, description: 'Hardwired door', deviceType: 'door_contact' })).status).toBe(201);
  });

  it('answers 400 naming each bad field', async () => {
    const panel = await panelOf();
    const cases: [Record<string, unknown>, string][] = [
      [{ description: '', deviceType: 'window_contact' }, 'description'],
      [{ description: 'x'.repeat(41), deviceType: 'window_contact' }, 'description'],
      [{ description: 'Den', deviceType: 'laser_grid' }, 'deviceType'],
      [{ description: 'Den', deviceType: 'window_contact', zoneType: 'sometimes' }, 'zoneType'],
      [{ description: 'Den', deviceType: 'window_contact', serial: '04 12' }, 'serial'],
      [{ description: 'Den', deviceType: 'window_contact', serial: 412877 }, 'serial'],
      [{ description: 'Den', deviceType: 'window_contact', number: 0 }, 'number'],
      [{ description: 'Den', deviceType: 'window_contact', input: 9 }, 'input'],
      [{ description: 'Den', deviceType: 'window_contact', chime: 'yes' }, 'chime'],
      [{ description: 'Den', deviceType: 'window_contact', manufacturedOn: '2020-13-01' }, 'manufacturedOn'],
    ];
    for (const [body, field] of cases) {
      const res = await as.owner.post(`/api/panels/${panel.id}/zones`, body);
      expect(res.status, field).toBe(400);
      expect(res.body.error.fields, field).toHaveProperty([field]);
    }
    expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(0);
  });

  it('refuses a client (404), another firm (404), the operator (403) and a signed-out visitor (401)', async () => {
    const panel = await panelOf();
    const other = await panelOf(b.site);
    const body = { description: 'Den window', deviceType: 'window_contact' };
    expect((await as.client.post(`/api/panels/${panel.id}/zones`, body)).status).toBe(404);
    expect((await as.owner.post(`/api/panels/${other.id}/zones`, body)).status).toBe(404);
    expect((await as.operator.post(`/api/panels/${panel.id}/zones`, body)).status).toBe(403);
    expect((await as.anonymous.post(`/api/panels/${panel.id}/zones`, body)).status).toBe(401);
    expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(0);
    expect(await Zone.count({ where: { tenantId: b.firm.id, panelId: other.id } })).toBe(0);
  });

  it('lets exactly one of two simultaneous requests take a number', async () => {
    const panel = await panelOf();
    const body = { number: 20, description: 'Den window', deviceType: 'window_contact' };
    const results = await Promise.all([as.owner.post(`/api/panels/${panel.id}/zones`, body), as.technician.post(`/api/panels/${panel.id}/zones`, body)]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(1);
  });
});

describe('GET /api/panels/:panelId/zones', () => {
  it('lists the zones by number for every staff role, with the caution', async () => {
    const panel = await panelOf();
    await buildZone(panel, { number: 12, description: 'Attic' });
    await buildZone(panel, { number: 9, description: 'Den window' });
    await buildZone(panel, { number: 9, description: 'Old den window', status: 'removed' });
    for (const role of STAFF) {
      const res = await as[role].get(`/api/panels/${panel.id}/zones`);
      expect(res.status, role).toBe(200);
      expect((res.body.data as { number: number; status: string }[]).map((z) => `${z.number} ${z.status}`)).toEqual(['9 active', '9 removed', '12 active']);
      expect(res.body.page).toEqual({ number: 1, size: 1000, total: 3 });
      expect(res.body.caution).toBe(LIFE_SAFETY_CAUTION);
    }
    const paged = await as.owner.get(`/api/panels/${panel.id}/zones?page=2&pageSize=2`);
    expect((paged.body.data as { number: number }[]).map((z) => z.number)).toEqual([12]);
  });

  it('refuses a client (404), another firm (404), the operator (403) and a signed-out visitor (401)', async () => {
    const panel = await panelOf();
    const other = await panelOf(b.site);
    expect((await as.client.get(`/api/panels/${panel.id}/zones`)).status).toBe(404);
    expect((await as.owner.get(`/api/panels/${other.id}/zones`)).status).toBe(404);
    expect((await as.operator.get(`/api/panels/${panel.id}/zones`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/panels/${panel.id}/zones`)).status).toBe(401);
  });

  it('works out device life: a smoke alarm made 11 years ago is due', async () => {
    const panel = await panelOf();
    const saved = t.clock.now;
    try {
      t.clock.now = new Date('2026-06-15T17:00:00Z');
      await buildZone(panel, { number: 9, description: 'Hall smoke', deviceType: 'smoke', manufacturedOn: '2015-06-01' });
      await buildZone(panel, { number: 10, description: 'Den window', batteryType: 'CR2032', batteryChangedOn: '2026-06-15' });
      await buildZone(panel, { number: 11, description: 'Bedroom smoke', deviceType: 'smoke', manufacturedOn: '2016-08-01' });
      const res = await as.owner.get(`/api/panels/${panel.id}/zones`);
      const [smoke, window, newer] = res.body.data;
      // NFPA 72: 10 years from manufacture (references.md 4.4); the label date is known, so the basis is 'manufactured'
      expect(smoke.life).toEqual({ batteryDueOn: null, endOfLifeOn: '2025-06-01', endOfLifeBasis: 'manufactured', state: 'due', batteryYears: null, batteryUnderOneYear: false });
      // CR2032 (225 mAh nominal) × 0.8 usable (the default usableCapacityFraction) = 180 mAh at 5 µA:
      // 36,000 h ≈ 4.11 years → 4 years and 39 days (it was 5 years and 49 days on the full 225 mAh)
      expect(window.life).toEqual({
        batteryDueOn: addYearsToDate('2026-06-15', batteryLifeYears(225 * 0.8, 5)),
        endOfLifeOn: null,
        endOfLifeBasis: null,
        state: 'ok',
        batteryYears: batteryLifeYears(225 * 0.8, 5),
        batteryUnderOneYear: false,
      });
      expect(window.life.batteryDueOn).toBe('2030-07-24');
      expect(window.life.batteryYears).toBeCloseTo(4.107, 3);
      // within the 90 days before end of life: soon
      expect(newer.life).toEqual({ batteryDueOn: null, endOfLifeOn: '2026-08-01', endOfLifeBasis: 'manufactured', state: 'soon', batteryYears: null, batteryUnderOneYear: false });
    } finally {
      t.clock.now = saved;
    }
  });

  it('takes today in the site’s time zone and the firm’s upkeep settings', async () => {
    const firm = await buildFirmWithSite();
    await Site.update({ timeZone: 'America/Chicago' }, { where: { tenantId: firm.firm.id, id: firm.site.id } });
    const panel = await panelOf(firm.site);
    await buildZone(panel, { number: 9, description: 'Hall smoke', deviceType: 'smoke', manufacturedOn: '2016-03-01' });
    await buildZone(panel, { number: 10, description: 'Kitchen CO', deviceType: 'co', manufacturedOn: '2020-01-15' });
    const owner = await signedIn(firm.owner);
    const saved = t.clock.now;
    try {
      // 03:00 UTC on 1 March is still 28 February in Chicago: end of life is tomorrow there
      t.clock.now = new Date('2026-03-01T03:00:00Z');
      const early = await owner.get(`/api/panels/${panel.id}/zones`);
      expect(early.body.data[0].life).toEqual({ batteryDueOn: null, endOfLifeOn: '2026-03-01', endOfLifeBasis: 'manufactured', state: 'soon', batteryYears: null, batteryUnderOneYear: false });
      // CO end of life is the firm's setting: 7 years by default, 5 when the firm says so
      expect(early.body.data[1].life).toMatchObject({ endOfLifeOn: '2027-01-15', state: 'ok' });
      t.clock.now = new Date('2026-03-01T07:00:00Z');
      expect((await owner.get(`/api/panels/${panel.id}/zones`)).body.data[0].life.state).toBe('due');

      await Tenant.update({ upkeepSettings: { coEndOfLifeYears: 5 } }, { where: { id: firm.firm.id } });
      const again = await signedIn(firm.owner); // the session reloads the firm
      expect((await again.get(`/api/panels/${panel.id}/zones`)).body.data[1].life).toMatchObject({ endOfLifeOn: '2025-01-15', state: 'due' });
    } finally {
      t.clock.now = saved;
    }
  });

  it('flags the same serial in service on another panel of the firm, never another firm’s', async () => {
    const panel = await panelOf(a.site, { label: 'Main panel' });
    const otherSite = await buildSite(a.firm, a.client, { name: '12 Elm Street' });
    const elsewhere = await panelOf(otherSite, { label: 'Panel 1' });
    await buildZone(elsewhere, { number: 4, serial: '0499001' });
    await buildZone(elsewhere, { number: 5, serial: '0499001', status: 'removed' });
    await buildZone(await panelOf(b.site), { number: 7, serial: '0499001' });
    const created = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0499001' });
    expect(created.status).toBe(201);
    expect(created.body.data.elsewhere).toEqual([
      {
        zoneId: expect.any(String),
        panelId: elsewhere.id,
        siteId: otherSite.id,
        panelLabel: 'Panel 1',
        siteName: '12 Elm Street',
        number: 4,
        note: 'Serial 0499001 is also zone 4 on Panel 1 at 12 Elm Street.',
      },
    ]);
    const list = await as.owner.get(`/api/panels/${panel.id}/zones`);
    expect(list.body.data[0].elsewhere).toHaveLength(1);
  });
});

describe('GET|PATCH|DELETE /api/zones/:zoneId', () => {
  it('reads one zone for staff; 404 for a client and another firm; 403 operator; 401 signed out', async () => {
    const zone = await buildZone(await panelOf(), { number: 9, serial: '0412877' });
    const other = await buildZone(await panelOf(b.site), { number: 9 });
    for (const role of STAFF) expect((await as[role].get(`/api/zones/${zone.id}`)).body.data.serial).toBe('0412877');
    expect((await as.client.get(`/api/zones/${zone.id}`)).status).toBe(404);
    expect((await as.owner.get(`/api/zones/${other.id}`)).status).toBe(404);
    expect((await as.operator.get(`/api/zones/${zone.id}`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/zones/${zone.id}`)).status).toBe(401);
  });

  it('changes only the fields sent, logs old → new and marks the panel only for programmed fields', async () => {
    const panel = await panelOf();
    const zone = await buildZone(panel, { number: 9, description: 'Den window', serial: '0412877' });
    expect(await changedSinceProgrammed(panel.id)).toBe(false);

    const battery = await as.technician.patch(`/api/zones/${zone.id}`, { batteryType: 'CR2032', batteryChangedOn: '2026-01-10' });
    expect(battery.status).toBe(200);
    expect(battery.body.data).toMatchObject({ description: 'Den window', batteryType: 'CR2032', batteryChangedOn: '2026-01-10' });
    expect(await changedSinceProgrammed(panel.id)).toBe(false); // a battery is not programmed into the panel

    const renamed = await as.coordinator.patch(`/api/zones/${zone.id}`, { description: 'Den window (east)', chime: false });
    expect(renamed.status).toBe(200);
    expect(await changedSinceProgrammed(panel.id)).toBe(true);

    expect((await as.technician.post(`/api/panels/${panel.id}/programmed`)).body.data.changedSinceProgrammed).toBe(false);
    const same = await as.technician.patch(`/api/zones/${zone.id}`, { description: 'Den window (east)' });
    expect(same.status).toBe(200);
    expect(await changedSinceProgrammed(panel.id)).toBe(false); // nothing changed: nothing logged
    expect((await as.owner.patch(`/api/zones/${zone.id}`, { serial: '0412878' })).status).toBe(200);
    expect(await changedSinceProgrammed(panel.id)).toBe(true);

    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, panelId: panel.id }, order: [['createdAt', 'ASC']] });
    expect(log.map((c) => c.action)).toEqual(['updated', 'updated', 'programmed', 'updated']);
    expect(log[0]!.changes).toEqual({ batteryType: [null, 'CR2032'], batteryChangedOn: [null, '2026-01-10'] });
    expect(log[1]!.changes).toEqual({ description: ['Den window', 'Den window (east)'], chime: [true, false] });
    expect(log[1]!.actorName).toBe(a.coordinator.name);
    expect(log[3]!.changes).toEqual({ serial: ['0412877', '0412878'] });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.updated', subjectId: zone.id } })).toBe(3);
  });

  it('refuses a clash with 409 and a bad field with 400, changing nothing', async () => {
    const panel = await panelOf();
    await buildZone(panel, { number: 9, description: 'Kitchen window', serial: '0412877' });
    const zone = await buildZone(panel, { number: 10, description: 'Den window', serial: '0412878' });
    const number = await as.owner.patch(`/api/zones/${zone.id}`, { number: 9 });
    expect(number.status).toBe(409);
    expect(number.body.error.code).toBe('zone_number_taken');
    expect(number.body.error.fields.number).toContain('Kitchen window');
    const serial = await as.owner.patch(`/api/zones/${zone.id}`, { serial: '0412877' });
    expect(serial.status).toBe(409);
    expect(serial.body.error).toMatchObject({ code: 'conflict', fields: { serial: expect.stringContaining('zone 9') } });
    const bad = await as.owner.patch(`/api/zones/${zone.id}`, { description: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('description');
    expect((await as.owner.patch(`/api/zones/${zone.id}`, { number: 65 })).body.error.fields).toHaveProperty('number');
    const stored = await Zone.findOne({ where: { tenantId: a.firm.id, id: zone.id } });
    expect(stored).toMatchObject({ number: 10, serial: '0412878', description: 'Den window' });
    // keeping its own number and serial is no clash
    expect((await as.owner.patch(`/api/zones/${zone.id}`, { number: 10, serial: '0412878', description: 'Den' })).status).toBe(200);
  });

  it('removes a zone: the row stays, its number is free again, the log says removed', async () => {
    const panel = await panelOf();
    const zone = await buildZone(panel, { number: 9, description: 'Den window', serial: '0412877' });
    const res = await as.technician.patch(`/api/zones/${zone.id}`, { status: 'removed' });
    expect(res.status).toBe(200);
    expect(res.body.data.status).toBe('removed');
    expect((await as.technician.get(`/api/panels/${panel.id}`)).body.data.nextZoneNumber).toBe(9);
    const replacement = await as.technician.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0412877' });
    expect(replacement.status).toBe(201);
    expect(replacement.body.data.number).toBe(9);
    expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(2);
    const log = await ZoneChange.findOne({ where: { tenantId: a.firm.id, zoneId: zone.id } });
    expect(log).toMatchObject({ action: 'removed', changes: { status: ['active', 'removed'] } });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.removed', subjectId: zone.id } })).toBe(1);
    // bringing the old zone back would clash with its replacement
    const back = await as.technician.patch(`/api/zones/${zone.id}`, { status: 'active' });
    expect(back.status).toBe(409);
    // editing the removed zone's description is no clash and changes nothing programmed
    await as.technician.post(`/api/panels/${panel.id}/programmed`);
    expect((await as.technician.patch(`/api/zones/${zone.id}`, { description: 'Den window (old)' })).status).toBe(200);
    expect(await changedSinceProgrammed(panel.id)).toBe(false);
  });

  it('deletes a zone outright but keeps its change-log rows', async () => {
    const panel = await panelOf();
    const created = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0412877' });
    await as.owner.post(`/api/panels/${panel.id}/programmed`);
    const res = await as.coordinator.delete(`/api/zones/${created.body.data.id}`);
    expect(res.status).toBe(204);
    expect(await Zone.count({ where: { tenantId: a.firm.id, id: created.body.data.id } })).toBe(0);
    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, zoneId: created.body.data.id }, order: [['createdAt', 'ASC']] });
    expect(log.map((c) => c.action)).toEqual(['created', 'deleted']);
    expect(log[1]!.changes).toMatchObject({ number: [9, null], serial: ['0412877', null] });
    expect(await changedSinceProgrammed(panel.id)).toBe(true);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.deleted', subjectId: created.body.data.id } })).toBe(1);
    expect((await as.coordinator.delete(`/api/zones/${created.body.data.id}`)).status).toBe(404);
  });

  it('refuses changes and deletes to a client (404), another firm (404), the operator (403) and a signed-out visitor (401)', async () => {
    const zone = await buildZone(await panelOf(), { number: 9 });
    const other = await buildZone(await panelOf(b.site), { number: 9 });
    for (const [v, status] of [
      [as.client, 404],
      [as.operator, 403],
      [as.anonymous, 401],
    ] as const) {
      expect((await v.patch(`/api/zones/${zone.id}`, { description: 'Taken' })).status).toBe(status);
      expect((await v.delete(`/api/zones/${zone.id}`)).status).toBe(status);
    }
    for (const role of STAFF) {
      expect((await as[role].patch(`/api/zones/${other.id}`, { description: 'Taken' })).status).toBe(404);
      expect((await as[role].delete(`/api/zones/${other.id}`)).status).toBe(404);
    }
    expect((await Zone.findOne({ where: { tenantId: a.firm.id, id: zone.id } }))!.description).toBe('Den window');
    expect((await Zone.findOne({ where: { tenantId: b.firm.id, id: other.id } }))!.description).toBe('Den window');
    expect((await as.owner.patch('/api/zones/zone-nine', { description: 'x' })).body.error.fields).toHaveProperty('zoneId');
  });

  it('lets every staff role change and delete zones', async () => {
    const panel = await panelOf();
    for (const role of STAFF) {
      const zone = await buildZone(panel, { number: 30 });
      expect((await as[role].patch(`/api/zones/${zone.id}`, { description: `By ${role}` })).status, role).toBe(200);
      expect((await as[role].delete(`/api/zones/${zone.id}`)).status, role).toBe(204);
    }
  });
});
