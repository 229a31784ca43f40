/**
 * Zone pins on floor plans: PUT /api/zones/:zoneId/pin { floorId, x, y } with x and y as
 * fractions of the image (0..1), on a floor of the zone's own site; DELETE takes the pin off.
 * Staff roles only: a client 404, the operator 403, signed out 401, another firm's zone 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import type { User } from '@server/models/User';
import { Zone } from '@server/models/Zone';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFloor, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

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

async function zoneNow(zone: Zone): Promise<Zone> {
  return (await Zone.findOne({ where: { tenantId: zone.tenantId, id: zone.id } }))!;
}

let zoneNumber = 9;
async function zoneOnSite() {
  const panel = await buildPanel(a.site);
  return buildZone(panel, { number: zoneNumber++ });
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

describe('PUT /api/zones/:zoneId/pin', () => {
  it('places the pin (fractions of the image) and answers the zone with it, audited', async () => {
    const floor = await buildFloor(a.site);
    const zone = await zoneOnSite();
    const res = await as.owner.put(`/api/zones/${zone.id}/pin`, { floorId: floor.id, x: 0.25, y: 0.75 });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: zone.id, number: zone.number, pin: { floorId: floor.id, x: 0.25, y: 0.75 } });
    const stored = await zoneNow(zone);
    expect([stored.pinFloorId, stored.pinX, stored.pinY]).toEqual([floor.id, 0.25, 0.75]);
    const audit = await AuditEvent.findOne({ where: { tenantId: a.firm.id, action: 'zone.pin_set', subjectId: zone.id } });
    expect(audit!.details).toEqual({ floorId: floor.id, x: 0.25, y: 0.75 });
    expect((await as.owner.get(`/api/zones/${zone.id}`)).body.data.pin).toEqual({ floorId: floor.id, x: 0.25, y: 0.75 });
  });

  it('lets every staff role move the pin, to the edges (0 and 1) and to another floor of the site', async () => {
    const ground = await buildFloor(a.site, { name: 'Ground floor', level: 0 });
    const upstairs = await buildFloor(a.site, { name: 'Upstairs', level: 1 });
    const zone = await zoneOnSite();
    const moves = [
      ['owner', ground.id, 0, 0],
      ['coordinator', ground.id, 1, 1],
      ['technician', upstairs.id, 0.5, 0.125],
    ] as const;
    for (const [role, floorId, x, y] of moves) {
      const res = await as[role].put(`/api/zones/${zone.id}/pin`, { floorId, x, y });
      expect(res.status, role).toBe(200);
      expect(res.body.data.pin).toEqual({ floorId, x, y });
    }
  });

  it('answers 400 naming x or y outside 0..1 (or missing), and floorId when it is missing or not a uuid', async () => {
    const floor = await buildFloor(a.site);
    const zone = await zoneOnSite();
    const cases: [Record<string, unknown>, string][] = [
      [{ floorId: floor.id, x: 1.01, y: 0.5 }, 'x'],
      [{ floorId: floor.id, x: -0.1, y: 0.5 }, 'x'],
      [{ floorId: floor.id, x: 0.5, y: 2 }, 'y'],
      [{ floorId: floor.id, x: 0.5, y: -1 }, 'y'],
      [{ floorId: floor.id, x: '0.5', y: 0.5 }, 'x'],
      [{ floorId: floor.id, y: 0.5 }, 'x'],
      [{ floorId: floor.id, x: 0.5 }, 'y'],
      [{ x: 0.5, y: 0.5 }, 'floorId'],
      [{ floorId: 'ground', x: 0.5, y: 0.5 }, 'floorId'],
    ];
    for (const [body, field] of cases) {
      const res = await as.owner.put(`/api/zones/${zone.id}/pin`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.fields).toHaveProperty([field]);
    }
    expect((await zoneNow(zone)).pinFloorId).toBeNull();
  });

  it('answers 400 naming floorId for a floor of another site or another firm, the same way', async () => {
    const zone = await zoneOnSite();
    const otherSite = await buildFloor(await buildSite(a.firm, a.client));
    const otherFirm = await buildFloor(b.site);
    const here = await as.owner.put(`/api/zones/${zone.id}/pin`, { floorId: otherSite.id, x: 0.5, y: 0.5 });
    expect(here.status).toBe(400);
    expect(here.body.error.fields).toHaveProperty(['floorId']);
    const there = await as.owner.put(`/api/zones/${zone.id}/pin`, { floorId: otherFirm.id, x: 0.5, y: 0.5 });
    expect(there.body.error).toEqual(here.body.error);
    expect((await zoneNow(zone)).pinFloorId).toBeNull();
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.pin_set', subjectId: zone.id } })).toBe(0);
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s zone (404)', async () => {
    const floor = await buildFloor(a.site);
    const zone = await zoneOnSite();
    const body = { floorId: floor.id, x: 0.5, y: 0.5 };
    const client = await as.client.put(`/api/zones/${zone.id}/pin`, body);
    expect(client.status).toBe(404);
    expect(client.body.error.code).toBe('not_found');
    expect((await as.operator.put(`/api/zones/${zone.id}/pin`, body)).status).toBe(403);
    expect((await as.anonymous.put(`/api/zones/${zone.id}/pin`, body)).status).toBe(401);
    const theirFloor = await buildFloor(b.site);
    const theirZone = await buildZone(await buildPanel(b.site), { number: 9 });
    expect((await as.owner.put(`/api/zones/${theirZone.id}/pin`, { floorId: theirFloor.id, x: 0.5, y: 0.5 })).status).toBe(404);
    expect((await zoneNow(zone)).pinFloorId).toBeNull();
    expect((await zoneNow(theirZone)).pinFloorId).toBeNull();
  });
});

describe('DELETE /api/zones/:zoneId/pin', () => {
  it('takes the pin off (204), audited; the zone answers pin: null', async () => {
    const floor = await buildFloor(a.site);
    const zone = await zoneOnSite();
    await zone.update({ pinFloorId: floor.id, pinX: 0.4, pinY: 0.6 });
    const res = await as.technician.delete(`/api/zones/${zone.id}/pin`);
    expect(res.status).toBe(204);
    const stored = await zoneNow(zone);
    expect([stored.pinFloorId, stored.pinX, stored.pinY]).toEqual([null, null, null]);
    expect((await as.owner.get(`/api/zones/${zone.id}`)).body.data.pin).toBeNull();
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.pin_cleared', subjectId: zone.id } })).toBe(1);
    // again: nothing to take off, nothing written
    expect((await as.technician.delete(`/api/zones/${zone.id}/pin`)).status).toBe(204);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'zone.pin_cleared', subjectId: zone.id } })).toBe(1);
  });

  it('lets every staff role take a pin off', async () => {
    const floor = await buildFloor(a.site);
    for (const role of STAFF) {
      const zone = await zoneOnSite();
      await zone.update({ pinFloorId: floor.id, pinX: 0.5, pinY: 0.5 });
      expect((await as[role].delete(`/api/zones/${zone.id}/pin`)).status, role).toBe(204);
      expect((await zoneNow(zone)).pinFloorId, role).toBeNull();
    }
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s zone (404), a bad id (400)', async () => {
    const floor = await buildFloor(a.site);
    const zone = await zoneOnSite();
    await zone.update({ pinFloorId: floor.id, pinX: 0.5, pinY: 0.5 });
    expect((await as.client.delete(`/api/zones/${zone.id}/pin`)).status).toBe(404);
    expect((await as.operator.delete(`/api/zones/${zone.id}/pin`)).status).toBe(403);
    expect((await as.anonymous.delete(`/api/zones/${zone.id}/pin`)).status).toBe(401);
    const theirFloor = await buildFloor(b.site);
    const theirZone = await buildZone(await buildPanel(b.site), { number: 9 });
    await theirZone.update({ pinFloorId: theirFloor.id, pinX: 0.5, pinY: 0.5 });
    expect((await as.owner.delete(`/api/zones/${theirZone.id}/pin`)).status).toBe(404);
    const bad = await as.owner.delete('/api/zones/not-an-id/pin');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['zoneId']);
    expect((await zoneNow(zone)).pinFloorId).toBe(floor.id);
    expect((await zoneNow(theirZone)).pinFloorId).toBe(theirFloor.id);
  });
});
