import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addYearsToDate } from '@domain/device-life';
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
