import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addYearsToDate, batteryLifeYears } from '@domain/device-life';
import { AuditEvent } from '@server/models/AuditEvent';
import { createTestApp, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithSite, buildPanel, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const VALID = { smokeEndOfLifeYears: 10, coEndOfLifeYears: 10, soonDays: 60, batteryYearsOverride: { motion: 4 }, averageCurrentMicroAmps: {} };

async function as(email: string) {
  const v = await visitor(t.app);
  await v.signIn(email, TEST_PASSWORD);
  return v;
}

describe('GET|PUT /api/firm/upkeep-settings', () => {
  it('answers 401 signed out, 403 to the operator and to a client', async () => {
    const { clientUser } = await buildFirmWithSite();
    const operator = await buildUser(null, 'operator');
    expect((await (await visitor(t.app)).get('/api/firm/upkeep-settings')).status).toBe(401);
    expect((await (await as(operator.email)).get('/api/firm/upkeep-settings')).status).toBe(403);
    expect((await (await as(clientUser.email)).get('/api/firm/upkeep-settings')).status).toBe(403);
  });

  it('starts from the defaults: smoke 10 years (NFPA 72, references.md 4.4), CO 7 years (firm setting; references.md 4.18, from memory)', async () => {
    const { technician } = await buildFirmWithSite();
    const res = await (await as(technician.email)).get('/api/firm/upkeep-settings');
    expect(res.status).toBe(200);
    expect(res.body.data.settings).toMatchObject({ smokeEndOfLifeYears: 10, coEndOfLifeYears: 7, soonDays: 90 });
  });

  it('lets only the owner change them (coordinator and technician 403), and audits the change', async () => {
    const { owner, coordinator, technician, firm } = await buildFirmWithSite();
    expect((await (await as(coordinator.email)).put('/api/firm/upkeep-settings', VALID)).status).toBe(403);
    expect((await (await as(technician.email)).put('/api/firm/upkeep-settings', VALID)).status).toBe(403);
    const res = await (await as(owner.email)).put('/api/firm/upkeep-settings', VALID);
    expect(res.status).toBe(200);
    expect(res.body.data.settings).toMatchObject({ coEndOfLifeYears: 10, soonDays: 60, batteryYearsOverride: { motion: 4 } });
    expect(await AuditEvent.count({ where: { tenantId: firm.id, action: 'firm.upkeep_settings_changed' } })).toBe(1);
  });

  it('answers 400 naming the field for out-of-range values', async () => {
    const { owner } = await buildFirmWithSite();
    const v = await as(owner.email);
    const res = await v.put('/api/firm/upkeep-settings', { ...VALID, smokeEndOfLifeYears: 30, batteryYearsOverride: { motion: 0 } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['batteryYearsOverride.motion', 'smokeEndOfLifeYears']);
    const unknown = await v.put('/api/firm/upkeep-settings', { ...VALID, batteryYearsOverride: { toaster: 2 } });
    expect(unknown.status).toBe(400);
  });

  it('refuses a smoke alarm life over 10 years (NFPA 72, references.md 4.4) and a usable capacity share outside 0.5–1, naming each field; saves nothing', async () => {
    const { owner, firm } = await buildFirmWithSite();
    const v = await as(owner.email);
    const twelve = await v.put('/api/firm/upkeep-settings', { ...VALID, smokeEndOfLifeYears: 12 });
    expect(twelve.status).toBe(400);
    expect(Object.keys(twelve.body.error.fields)).toEqual(['smokeEndOfLifeYears']);
    // 10 is the most, and allowed
    expect((await v.put('/api/firm/upkeep-settings', { ...VALID, smokeEndOfLifeYears: 10, coEndOfLifeYears: 6 })).status).toBe(200);
    for (const usableCapacityFraction of [0.3, 1.2, 'most']) {
      const res = await v.put('/api/firm/upkeep-settings', { ...VALID, usableCapacityFraction });
      expect(res.status, String(usableCapacityFraction)).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['usableCapacityFraction']);
    }
    for (const [field, value] of [['smokeDetectorEndOfLifeYears', 0], ['heatEndOfLifeYears', 7.5]] as const) {
      const res = await v.put('/api/firm/upkeep-settings', { ...VALID, [field]: value });
      expect(res.status, field).toBe(400);
      expect(res.body.error.fields).toHaveProperty([field]);
    }
    // only the one valid change was saved
    const now = (await v.get('/api/firm/upkeep-settings')).body.data.settings;
    expect(now).toMatchObject({ smokeEndOfLifeYears: 10, coEndOfLifeYears: 6, usableCapacityFraction: 0.8 });
    expect(await AuditEvent.count({ where: { tenantId: firm.id, action: 'firm.upkeep_settings_changed' } })).toBe(1);
  });

  it('saves and echoes the system smoke detector and heat periods and the usable capacity share, with their defaults', async () => {
    const { owner } = await buildFirmWithSite();
    const v = await as(owner.email);
    const before = (await v.get('/api/firm/upkeep-settings')).body.data;
    // defaults: 10 years each (common practice, a firm setting); 80% of the nominal capacity
    expect(before.settings).toMatchObject({ smokeDetectorEndOfLifeYears: 10, heatEndOfLifeYears: 10, usableCapacityFraction: 0.8 });
    expect(before.defaults).toMatchObject({ smokeDetectorEndOfLifeYears: 10, heatEndOfLifeYears: 10, usableCapacityFraction: 0.8 });
    const res = await v.put('/api/firm/upkeep-settings', { ...VALID, smokeDetectorEndOfLifeYears: 12, heatEndOfLifeYears: 15, usableCapacityFraction: 0.6 });
    expect(res.status).toBe(200);
    expect(res.body.data.settings).toMatchObject({ smokeDetectorEndOfLifeYears: 12, heatEndOfLifeYears: 15, usableCapacityFraction: 0.6 });
    expect((await v.get('/api/firm/upkeep-settings')).body.data.settings).toMatchObject({ smokeDetectorEndOfLifeYears: 12, heatEndOfLifeYears: 15, usableCapacityFraction: 0.6 });
  });

  it('the new settings change the zones’ computed life: heat and system smoke periods, and the battery forecast', async () => {
    const { owner, site } = await buildFirmWithSite();
    const panel = await buildPanel(site);
    await buildZone(panel, { number: 9, deviceType: 'heat', description: 'Kitchen heat', manufacturedOn: '2020-06-01' });
    await buildZone(panel, { number: 10, deviceType: 'smoke_detector', description: 'Office detector', manufacturedOn: '2020-06-01' });
    await buildZone(panel, { number: 11, deviceType: 'window_contact', description: 'Den window', batteryType: 'CR2032', batteryChangedOn: '2026-06-15' });
    const v = await as(owner.email);
    const lifeOf = async () => {
      const zones = (await v.get(`/api/panels/${panel.id}/zones`)).body.data as { description: string; life: { endOfLifeOn: string | null; batteryDueOn: string | null } }[];
      return new Map(zones.map((z) => [z.description, z.life]));
    };
    const before = await lifeOf();
    expect(before.get('Kitchen heat')!.endOfLifeOn).toBe('2030-06-01');
    expect(before.get('Office detector')!.endOfLifeOn).toBe('2030-06-01');
    // CR2032: 225 mAh × 0.8 at 5 µA ≈ 4.11 years
    expect(before.get('Den window')!.batteryDueOn).toBe(addYearsToDate('2026-06-15', batteryLifeYears(225 * 0.8, 5)));
    await v.put('/api/firm/upkeep-settings', { ...VALID, smokeDetectorEndOfLifeYears: 12, heatEndOfLifeYears: 15, usableCapacityFraction: 1 }).expect(200);
    const after = await lifeOf();
    expect(after.get('Kitchen heat')!.endOfLifeOn).toBe('2035-06-01');
    expect(after.get('Office detector')!.endOfLifeOn).toBe('2032-06-01');
    // the whole 225 mAh: ≈ 5.13 years
    expect(after.get('Den window')!.batteryDueOn).toBe(addYearsToDate('2026-06-15', batteryLifeYears(225, 5)));
    expect(after.get('Den window')!.batteryDueOn).toBe('2031-08-03');
  });

  it('changes the zones’ computed end of life: a CO alarm follows the firm’s period', async () => {
    const { owner, site } = await buildFirmWithSite();
    const panel = await buildPanel(site);
    const manufacturedOn = '2020-06-01';
    await buildZone(panel, { deviceType: 'co', description: 'Hall CO', manufacturedOn, serial: '0500001' });
    const v = await as(owner.email);
    const before = await v.get(`/api/panels/${panel.id}/zones`);
    expect(before.body.data[0].life.endOfLifeOn).toBe(addYearsToDate(manufacturedOn, 7));
    await v.put('/api/firm/upkeep-settings', VALID).expect(200);
    const after = await v.get(`/api/panels/${panel.id}/zones`);
    expect(after.body.data[0].life.endOfLifeOn).toBe('2030-06-01');
  });
});
