/**
 * Premises of a site: floors (by level), rooms, openings, the whole tree in one call, and the
 * zones' links to rooms and openings. Owners, coordinators and technicians read and change
 * them; a client reads none of these staff routes (404); the operator has no firm (403);
 * signed out is 401; another firm's ids answer 404. Deleting a floor or room deletes what is
 * inside and unlinks the zones that pointed there, in one transaction, audited.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Floor } from '@server/models/Floor';
import { Opening } from '@server/models/Opening';
import { Room } from '@server/models/Room';
import type { User } from '@server/models/User';
import { Zone } from '@server/models/Zone';
import { ZoneChange } from '@server/models/ZoneChange';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFloor, buildOpening, buildPanel, buildRoom, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

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

type Call = (v: Visitor) => ReturnType<Visitor['get']>;

/** A client 404 (not_found), the operator 403, a signed-out visitor 401. */
async function refusesOthers(call: Call): Promise<void> {
  const client = await call(as.client);
  expect(client.status, 'client').toBe(404);
  expect(client.body.error.code).toBe('not_found');
  const operator = await call(as.operator);
  expect(operator.status, 'operator').toBe(403);
  const anonymous = await call(as.anonymous);
  expect(anonymous.status, 'signed out').toBe(401);
}

/** A record read again, scoped to its firm (reload() would be refused by the tenant guard). */
async function zoneNow(zone: Zone): Promise<Zone> {
  return (await Zone.findOne({ where: { tenantId: zone.tenantId, id: zone.id } }))!;
}
async function openingNow(opening: Opening): Promise<Opening> {
  return (await Opening.findOne({ where: { tenantId: opening.tenantId, id: opening.id } }))!;
}

function expect400(res: Awaited<ReturnType<Call>>, field: string): void {
  expect(res.status, field).toBe(400);
  expect(res.body.error.code).toBe('validation_failed');
  expect(res.body.error.fields, field).toHaveProperty([field]);
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

// ---------------------------------------------------------------------------------------------
// Floors
// ---------------------------------------------------------------------------------------------

describe('POST /api/sites/:siteId/floors', () => {
  it('adds a floor (201) with the api-resources fields and an audit event', async () => {
    const site = await buildSite(a.firm, a.client);
    const res = await as.owner.post(`/api/sites/${site.id}/floors`, { name: 'Basement', level: -1, belowGrade: true });
    expect(res.status).toBe(201);
    expect(res.body.data).toEqual({
      id: expect.any(String),
      siteId: site.id,
      name: 'Basement',
      level: -1,
      belowGrade: true,
      planImageId: null,
      planImageUrl: null,
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'floor.created', subjectId: res.body.data.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.actorId).toBe(a.owner.id);
  });

  it('lets every staff role add floors; below grade defaults to no', async () => {
    const site = await buildSite(a.firm, a.client);
    for (const role of STAFF) {
      const res = await as[role].post(`/api/sites/${site.id}/floors`, { name: `Floor by ${role}`, level: 1 });
      expect(res.status, role).toBe(201);
      expect(res.body.data.belowGrade).toBe(false);
    }
  });

  it('answers 400 naming each bad field, and adds nothing', async () => {
    const site = await buildSite(a.firm, a.client);
    const cases: [Record<string, unknown>, string][] = [
      [{ level: 0 }, 'name'],
      [{ name: '   ', level: 0 }, 'name'],
      [{ name: 'x'.repeat(61), level: 0 }, 'name'],
      [{ name: 'Ground floor' }, 'level'],
      [{ name: 'Ground floor', level: 0.5 }, 'level'],
      [{ name: 'Ground floor', level: '0' }, 'level'],
      [{ name: 'Ground floor', level: 0, belowGrade: 'yes' }, 'belowGrade'],
    ];
    for (const [body, field] of cases) expect400(await as.owner.post(`/api/sites/${site.id}/floors`, body), field);
    expect400(await as.owner.post('/api/sites/not-a-uuid/floors', { name: 'Ground floor', level: 0 }), 'siteId');
    expect(await Floor.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
  });

  it('refuses a client (404), the operator (403), a signed-out visitor (401), and another firm’s site (404)', async () => {
    const body = { name: 'Ground floor', level: 0 };
    await refusesOthers((v) => v.post(`/api/sites/${a.site.id}/floors`, body));
    const other = await as.owner.post(`/api/sites/${b.site.id}/floors`, body);
    expect(other.status).toBe(404);
    expect(await Floor.count({ where: { tenantId: b.firm.id } })).toBe(0);
  });
});

describe('GET /api/sites/:siteId/floors', () => {
  it('lists the site’s floors ordered by level, to every staff role', async () => {
    const site = await buildSite(a.firm, a.client);
    await buildFloor(site, { name: 'Upstairs', level: 1 });
    await buildFloor(site, { name: 'Basement', level: -1, belowGrade: true });
    await buildFloor(site, { name: 'Ground floor', level: 0 });
    await buildFloor(await buildSite(a.firm, a.client), { name: 'Elsewhere', level: 0 });
    for (const role of STAFF) {
      const res = await as[role].get(`/api/sites/${site.id}/floors`);
      expect(res.status, role).toBe(200);
      expect((res.body.data as { name: string }[]).map((f) => f.name)).toEqual(['Basement', 'Ground floor', 'Upstairs']);
      expect(res.body.page).toEqual({ number: 1, size: 100, total: 3 });
    }
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s site (404), a bad id (400)', async () => {
    await buildFloor(a.site);
    await refusesOthers((v) => v.get(`/api/sites/${a.site.id}/floors`));
    expect((await as.owner.get(`/api/sites/${b.site.id}/floors`)).status).toBe(404);
    expect400(await as.owner.get('/api/sites/nope/floors'), 'siteId');
    expect400(await as.owner.get(`/api/sites/${a.site.id}/floors?pageSize=0`), 'pageSize');
  });
});

describe('PATCH /api/floors/:floorId', () => {
  it('changes only the fields sent, audited', async () => {
    const floor = await buildFloor(a.site, { name: 'Ground', level: 0 });
    for (const role of STAFF) {
      const res = await as[role].patch(`/api/floors/${floor.id}`, { name: `Ground (${role})` });
      expect(res.status, role).toBe(200);
      expect(res.body.data).toMatchObject({ id: floor.id, name: `Ground (${role})`, level: 0, belowGrade: false });
    }
    const res = await as.owner.patch(`/api/floors/${floor.id}`, { level: -1, belowGrade: true });
    expect(res.body.data).toMatchObject({ level: -1, belowGrade: true });
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'floor.updated', subjectId: floor.id } });
    expect(audit).toHaveLength(4);
    expect(audit.at(-1)!.details).toMatchObject({ changed: ['level', 'belowGrade'] });
  });

  it('answers 400 naming the field, and changes nothing', async () => {
    const floor = await buildFloor(a.site, { name: 'Ground', level: 0 });
    expect400(await as.owner.patch(`/api/floors/${floor.id}`, { level: 101 }), 'level');
    expect400(await as.owner.patch(`/api/floors/${floor.id}`, { name: '' }), 'name');
    expect400(await as.owner.patch('/api/floors/123', { name: 'x' }), 'floorId');
    expect((await Floor.findOne({ where: { tenantId: a.firm.id, id: floor.id } }))!.level).toBe(0);
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s floor (404)', async () => {
    const floor = await buildFloor(a.site);
    await refusesOthers((v) => v.patch(`/api/floors/${floor.id}`, { name: 'Renamed' }));
    const theirs = await buildFloor(b.site, { name: 'Theirs' });
    expect((await as.owner.patch(`/api/floors/${theirs.id}`, { name: 'Mine now' })).status).toBe(404);
    expect((await Floor.findOne({ where: { tenantId: b.firm.id, id: theirs.id } }))!.name).toBe('Theirs');
  });
});

describe('DELETE /api/floors/:floorId', () => {
  it('deletes the floor with its rooms and openings, and unlinks the zones (rooms, openings, pins) in one go', async () => {
    const site = await buildSite(a.firm, a.client);
    const floor = await buildFloor(site, { name: 'Upstairs', level: 1 });
    const keep = await buildFloor(site, { name: 'Ground floor', level: 0 });
    const bedroom = await buildRoom(floor, { name: 'Main bedroom', kind: 'bedroom' });
    const window = await buildOpening(bedroom, { label: 'Bedroom window' });
    const hall = await buildRoom(keep, { name: 'Hall', kind: 'hall' });
    const door = await buildOpening(hall, { kind: 'door', label: 'Front door' });
    const panel = await buildPanel(site);
    let contact = await buildZone(panel, { number: 9, description: 'Bedroom window' });
    await contact.update({ roomId: bedroom.id, openingId: window.id, pinFloorId: floor.id, pinX: 0.25, pinY: 0.5 });
    let smoke = await buildZone(panel, { number: 10, description: 'Bedroom smoke', deviceType: 'smoke' });
    await smoke.update({ roomId: bedroom.id });
    let front = await buildZone(panel, { number: 11, description: 'Front door', deviceType: 'door_contact' });
    await front.update({ roomId: hall.id, openingId: door.id, pinFloorId: keep.id, pinX: 0.1, pinY: 0.9 });

    const res = await as.technician.delete(`/api/floors/${floor.id}`);
    expect(res.status).toBe(204);
    expect(await Floor.count({ where: { tenantId: a.firm.id, id: floor.id } })).toBe(0);
    expect(await Room.count({ where: { tenantId: a.firm.id, id: bedroom.id } })).toBe(0);
    expect(await Opening.count({ where: { tenantId: a.firm.id, id: window.id } })).toBe(0);

    contact = await zoneNow(contact);
    expect([contact.roomId, contact.openingId, contact.pinFloorId, contact.pinX, contact.pinY]).toEqual([null, null, null, null, null]);
    smoke = await zoneNow(smoke);
    expect(smoke.roomId).toBeNull();
    // what was not on the floor stays as it was
    front = await zoneNow(front);
    expect([front.roomId, front.openingId, front.pinFloorId, front.pinX, front.pinY]).toEqual([hall.id, door.id, keep.id, 0.1, 0.9]);
    expect(await Room.count({ where: { tenantId: a.firm.id, id: hall.id } })).toBe(1);

    const log = await ZoneChange.findOne({ where: { tenantId: a.firm.id, zoneId: contact.id } });
    expect(log!.changes).toEqual({ roomId: [bedroom.id, null], openingId: [window.id, null] });
    const audit = await AuditEvent.findOne({ where: { tenantId: a.firm.id, action: 'floor.deleted', subjectId: floor.id } });
    expect(audit!.details).toMatchObject({ rooms: 1, openings: 1, zonesUnlinked: 2 });
    expect(audit!.actorId).toBe(a.technician.id);
  });

  it('lets every staff role delete a floor', async () => {
    for (const role of STAFF) {
      const floor = await buildFloor(a.site, { name: `For ${role}` });
      expect((await as[role].delete(`/api/floors/${floor.id}`)).status, role).toBe(204);
    }
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s floor (404); nothing deleted', async () => {
    const floor = await buildFloor(a.site);
    await buildRoom(floor);
    await refusesOthers((v) => v.delete(`/api/floors/${floor.id}`));
    const theirs = await buildFloor(b.site);
    const theirRoom = await buildRoom(theirs);
    expect((await as.owner.delete(`/api/floors/${theirs.id}`)).status).toBe(404);
    expect(await Floor.count({ where: { tenantId: a.firm.id, id: floor.id } })).toBe(1);
    expect(await Room.count({ where: { tenantId: b.firm.id, id: theirRoom.id } })).toBe(1);
  });
});

// ---------------------------------------------------------------------------------------------
// Rooms
// ---------------------------------------------------------------------------------------------

describe('POST /api/floors/:floorId/rooms', () => {
  it('adds a room (201) with the api-resources fields and an audit event', async () => {
    const floor = await buildFloor(a.site);
    const res = await as.coordinator.post(`/api/floors/${floor.id}/rooms`, { name: 'Main bedroom', kind: 'bedroom', fuelBurningAppliance: true });
    expect(res.status).toBe(201);
    expect(res.body.data).toEqual({
      id: expect.any(String),
      floorId: floor.id,
      siteId: a.site.id,
      name: 'Main bedroom',
      kind: 'bedroom',
      fuelBurningAppliance: true,
      attachedGarage: false,
      // the room links (life-safety rules): none given, so none recorded
      servedByHallId: null,
      hallWithin21FtConfirmed: false,
      attachedToBedroomId: null,
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'room.created', subjectId: res.body.data.id } })).toBe(1);
  });

  it('lets every staff role add rooms; an attached garage is a garage', async () => {
    const floor = await buildFloor(a.site);
    for (const role of STAFF) expect((await as[role].post(`/api/floors/${floor.id}/rooms`, { name: 'Hall', kind: 'hall' })).status, role).toBe(201);
    const garage = await as.owner.post(`/api/floors/${floor.id}/rooms`, { name: 'Garage', kind: 'garage', attachedGarage: true });
    expect(garage.status).toBe(201);
    expect(garage.body.data.attachedGarage).toBe(true);
  });

  it('answers 400 naming each bad field, and adds nothing', async () => {
    const floor = await buildFloor(a.site);
    const cases: [Record<string, unknown>, string][] = [
      [{ kind: 'bedroom' }, 'name'],
      [{ name: 'Den' }, 'kind'],
      [{ name: 'Den', kind: 'ballroom' }, 'kind'],
      [{ name: 'Den', kind: 'office', fuelBurningAppliance: 'no' }, 'fuelBurningAppliance'],
      [{ name: 'Kitchen', kind: 'kitchen', attachedGarage: true }, 'attachedGarage'],
    ];
    for (const [body, field] of cases) expect400(await as.owner.post(`/api/floors/${floor.id}/rooms`, body), field);
    expect400(await as.owner.post('/api/floors/x/rooms', { name: 'Den', kind: 'office' }), 'floorId');
    expect(await Room.count({ where: { tenantId: a.firm.id, floorId: floor.id } })).toBe(0);
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s floor (404)', async () => {
    const floor = await buildFloor(a.site);
    await refusesOthers((v) => v.post(`/api/floors/${floor.id}/rooms`, { name: 'Den', kind: 'office' }));
    const theirs = await buildFloor(b.site);
    expect((await as.owner.post(`/api/floors/${theirs.id}/rooms`, { name: 'Den', kind: 'office' })).status).toBe(404);
    expect(await Room.count({ where: { tenantId: a.firm.id, floorId: floor.id } })).toBe(0);
    expect(await Room.count({ where: { tenantId: b.firm.id, floorId: theirs.id } })).toBe(0);
  });
});

describe('PATCH /api/rooms/:roomId', () => {
  it('changes the fields sent and moves the room (with its openings) to another floor of the same site', async () => {
    const site = await buildSite(a.firm, a.client);
    const ground = await buildFloor(site, { name: 'Ground floor', level: 0 });
    const upstairs = await buildFloor(site, { name: 'Upstairs', level: 1 });
    const room = await buildRoom(ground, { name: 'Spare room', kind: 'office' });
    let window = await buildOpening(room, { label: 'Spare room window' });
    for (const role of STAFF) expect((await as[role].patch(`/api/rooms/${room.id}`, { name: `Spare (${role})` })).status, role).toBe(200);
    const res = await as.owner.patch(`/api/rooms/${room.id}`, { floorId: upstairs.id, kind: 'bedroom' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: room.id, floorId: upstairs.id, siteId: site.id, kind: 'bedroom', name: 'Spare (technician)' });
    window = await openingNow(window);
    expect(window.roomId).toBe(room.id);
    const tree = await as.owner.get(`/api/sites/${site.id}/premises`);
    expect(tree.body.data.floors[1].rooms[0].openings[0].id).toBe(window.id);
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'room.updated', subjectId: room.id } });
    expect(audit.at(-1)!.details).toMatchObject({ changed: ['kind', 'floorId'] });
  });

  it('answers 400 naming floorId for a floor of another site or another firm (the same answer for both)', async () => {
    const room = await buildRoom(await buildFloor(a.site));
    const otherSite = await buildFloor(await buildSite(a.firm, a.client));
    const otherFirm = await buildFloor(b.site);
    const here = await as.owner.patch(`/api/rooms/${room.id}`, { floorId: otherSite.id });
    expect400(here, 'floorId');
    const there = await as.owner.patch(`/api/rooms/${room.id}`, { floorId: otherFirm.id });
    expect400(there, 'floorId');
    expect(there.body.error).toEqual(here.body.error);
    const missing = await as.owner.patch(`/api/rooms/${room.id}`, { floorId: '00000000-0000-4000-8000-000000000000' });
    expect(missing.body.error).toEqual(here.body.error);
    expect((await Room.findOne({ where: { tenantId: a.firm.id, id: room.id } }))!.floorId).toBe(room.floorId);
  });

  it('answers 400 naming each bad field; a room that stops being a garage stops being an attached garage', async () => {
    const floor = await buildFloor(a.site);
    const room = await buildRoom(floor, { name: 'Garage', kind: 'garage', attachedGarage: true });
    expect400(await as.owner.patch(`/api/rooms/${room.id}`, { kind: 'cellar' }), 'kind');
    expect400(await as.owner.patch(`/api/rooms/${room.id}`, { name: '' }), 'name');
    expect400(await as.owner.patch(`/api/rooms/${room.id}`, { floorId: 'nope' }), 'floorId');
    expect400(await as.owner.patch(`/api/rooms/${room.id}`, { kind: 'utility', attachedGarage: true }), 'attachedGarage');
    const res = await as.owner.patch(`/api/rooms/${room.id}`, { kind: 'utility' });
    expect(res.body.data).toMatchObject({ kind: 'utility', attachedGarage: false });
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s room (404)', async () => {
    const room = await buildRoom(await buildFloor(a.site));
    await refusesOthers((v) => v.patch(`/api/rooms/${room.id}`, { name: 'Renamed' }));
    const theirs = await buildRoom(await buildFloor(b.site), { name: 'Theirs' });
    expect((await as.owner.patch(`/api/rooms/${theirs.id}`, { name: 'Mine' })).status).toBe(404);
    expect((await Room.findOne({ where: { tenantId: b.firm.id, id: theirs.id } }))!.name).toBe('Theirs');
  });
});

describe('DELETE /api/rooms/:roomId', () => {
  it('deletes the room with its openings and unlinks the zones that pointed there', async () => {
    const floor = await buildFloor(a.site);
    const room = await buildRoom(floor, { name: 'Den', kind: 'office' });
    const window = await buildOpening(room, { label: 'Den window' });
    const panel = await buildPanel(a.site);
    let contact = await buildZone(panel, { number: 9 });
    await contact.update({ roomId: room.id, openingId: window.id, pinFloorId: floor.id, pinX: 0.5, pinY: 0.5 });
    expect((await as.coordinator.delete(`/api/rooms/${room.id}`)).status).toBe(204);
    expect(await Opening.count({ where: { tenantId: a.firm.id, id: window.id } })).toBe(0);
    contact = await zoneNow(contact);
    expect([contact.roomId, contact.openingId]).toEqual([null, null]);
    // the floor stays, and so does the pin on it
    expect([contact.pinFloorId, contact.pinX, contact.pinY]).toEqual([floor.id, 0.5, 0.5]);
    const audit = await AuditEvent.findOne({ where: { tenantId: a.firm.id, action: 'room.deleted', subjectId: room.id } });
    expect(audit!.details).toMatchObject({ openings: 1, zonesUnlinked: 1 });
  });

  it('lets every staff role delete; refuses a client (404), the operator (403), signed out (401), another firm’s room (404)', async () => {
    const floor = await buildFloor(a.site);
    for (const role of STAFF) expect((await as[role].delete(`/api/rooms/${(await buildRoom(floor)).id}`)).status, role).toBe(204);
    const room = await buildRoom(floor);
    await refusesOthers((v) => v.delete(`/api/rooms/${room.id}`));
    const theirs = await buildRoom(await buildFloor(b.site));
    expect((await as.owner.delete(`/api/rooms/${theirs.id}`)).status).toBe(404);
    expect(await Room.count({ where: { tenantId: a.firm.id, id: room.id } })).toBe(1);
    expect(await Room.count({ where: { tenantId: b.firm.id, id: theirs.id } })).toBe(1);
  });
});

// ---------------------------------------------------------------------------------------------
// Openings
// ---------------------------------------------------------------------------------------------

describe('POST /api/rooms/:roomId/openings', () => {
  it('adds an opening (201) with the api-resources fields and an audit event', async () => {
    const room = await buildRoom(await buildFloor(a.site));
    const res = await as.technician.post(`/api/rooms/${room.id}/openings`, { kind: 'sliding_door', label: 'Patio door', groundReachable: true });
    expect(res.status).toBe(201);
    expect(res.body.data).toEqual({
      id: expect.any(String),
      roomId: room.id,
      siteId: a.site.id,
      kind: 'sliding_door',
      label: 'Patio door',
      groundReachable: true,
      createdAt: expect.any(String),
      updatedAt: expect.any(String),
    });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'opening.created', subjectId: res.body.data.id } })).toBe(1);
    for (const role of STAFF) expect((await as[role].post(`/api/rooms/${room.id}/openings`, { kind: 'window', label: `Window ${role}` })).status, role).toBe(201);
  });

  it('answers 400 naming each bad field, and adds nothing', async () => {
    const room = await buildRoom(await buildFloor(a.site));
    const cases: [Record<string, unknown>, string][] = [
      [{ label: 'Hatch' }, 'kind'],
      [{ kind: 'porthole', label: 'Hatch' }, 'kind'],
      [{ kind: 'window' }, 'label'],
      [{ kind: 'window', label: 'x'.repeat(61) }, 'label'],
      [{ kind: 'window', label: 'Hatch', groundReachable: 1 }, 'groundReachable'],
    ];
    for (const [body, field] of cases) expect400(await as.owner.post(`/api/rooms/${room.id}/openings`, body), field);
    expect400(await as.owner.post('/api/rooms/zzz/openings', { kind: 'window', label: 'Hatch' }), 'roomId');
    expect(await Opening.count({ where: { tenantId: a.firm.id, roomId: room.id } })).toBe(0);
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s room (404)', async () => {
    const room = await buildRoom(await buildFloor(a.site));
    await refusesOthers((v) => v.post(`/api/rooms/${room.id}/openings`, { kind: 'window', label: 'Hatch' }));
    const theirs = await buildRoom(await buildFloor(b.site));
    expect((await as.owner.post(`/api/rooms/${theirs.id}/openings`, { kind: 'window', label: 'Hatch' })).status).toBe(404);
    expect(await Opening.count({ where: { tenantId: b.firm.id, roomId: theirs.id } })).toBe(0);
  });
});

describe('PATCH and DELETE /api/openings/:openingId', () => {
  it('changes the fields sent (400 naming a bad one), audited', async () => {
    const opening = await buildOpening(await buildRoom(await buildFloor(a.site)), { label: 'Window', groundReachable: false });
    for (const role of STAFF) expect((await as[role].patch(`/api/openings/${opening.id}`, { label: `Window (${role})` })).status, role).toBe(200);
    const res = await as.owner.patch(`/api/openings/${opening.id}`, { groundReachable: true, kind: 'skylight' });
    expect(res.body.data).toMatchObject({ id: opening.id, label: 'Window (technician)', groundReachable: true, kind: 'skylight' });
    expect400(await as.owner.patch(`/api/openings/${opening.id}`, { kind: 'hatch' }), 'kind');
    expect400(await as.owner.patch(`/api/openings/${opening.id}`, { label: '' }), 'label');
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'opening.updated', subjectId: opening.id } })).toBe(4);
  });

  it('deletes an opening and unlinks its contact, which keeps its room', async () => {
    const room = await buildRoom(await buildFloor(a.site));
    const opening = await buildOpening(room);
    let zone = await buildZone(await buildPanel(a.site), { number: 9 });
    await zone.update({ roomId: room.id, openingId: opening.id });
    expect((await as.technician.delete(`/api/openings/${opening.id}`)).status).toBe(204);
    zone = await zoneNow(zone);
    expect([zone.roomId, zone.openingId]).toEqual([room.id, null]);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'opening.deleted', subjectId: opening.id } })).toBe(1);
    for (const role of STAFF) expect((await as[role].delete(`/api/openings/${(await buildOpening(room)).id}`)).status, role).toBe(204);
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s opening (404)', async () => {
    const opening = await buildOpening(await buildRoom(await buildFloor(a.site)));
    await refusesOthers((v) => v.patch(`/api/openings/${opening.id}`, { label: 'Renamed' }));
    await refusesOthers((v) => v.delete(`/api/openings/${opening.id}`));
    const theirs = await buildOpening(await buildRoom(await buildFloor(b.site)), { label: 'Theirs' });
    expect((await as.owner.patch(`/api/openings/${theirs.id}`, { label: 'Mine' })).status).toBe(404);
    expect((await as.owner.delete(`/api/openings/${theirs.id}`)).status).toBe(404);
    expect((await Opening.findOne({ where: { tenantId: b.firm.id, id: theirs.id } }))!.label).toBe('Theirs');
    expect(await Opening.count({ where: { tenantId: a.firm.id, id: opening.id } })).toBe(1);
  });
});

// ---------------------------------------------------------------------------------------------
// The whole tree
// ---------------------------------------------------------------------------------------------

describe('GET /api/sites/:siteId/premises', () => {
  it('answers floors by level, rooms and openings in the order they were added, and the site’s zones with links and pins', async () => {
    const site = await buildSite(a.firm, a.client);
    const f1 = await as.owner.post(`/api/sites/${site.id}/floors`, { name: 'Upstairs', level: 1 });
    const f0 = await as.owner.post(`/api/sites/${site.id}/floors`, { name: 'Ground floor', level: 0 });
    const kitchen = await as.owner.post(`/api/floors/${f0.body.data.id}/rooms`, { name: 'Kitchen', kind: 'kitchen', fuelBurningAppliance: true });
    const den = await as.owner.post(`/api/floors/${f0.body.data.id}/rooms`, { name: 'Den', kind: 'office' });
    const back = await as.owner.post(`/api/rooms/${kitchen.body.data.id}/openings`, { kind: 'door', label: 'Back door', groundReachable: true });
    await as.owner.post(`/api/rooms/${kitchen.body.data.id}/openings`, { kind: 'window', label: 'Above the sink' });
    const bedroom = await as.owner.post(`/api/floors/${f1.body.data.id}/rooms`, { name: 'Main bedroom', kind: 'bedroom' });
    await buildFloor(await buildSite(a.firm, a.client), { name: 'Another site' });
    const panel = await buildPanel(site, { label: 'Main panel' });
    const zone = await buildZone(panel, { number: 9, description: 'Back door', deviceType: 'door_contact' });
    await zone.update({ roomId: kitchen.body.data.id, openingId: back.body.data.id, pinFloorId: f0.body.data.id, pinX: 0.2, pinY: 0.7 });

    for (const role of STAFF) {
      const res = await as[role].get(`/api/sites/${site.id}/premises`);
      expect(res.status, role).toBe(200);
      type Tree = { name: string; rooms: { id: string; openings: { label: string }[] }[] }[];
      const { floors, zones } = res.body.data as { floors: Tree; zones: unknown[] };
      expect(floors.map((f) => f.name)).toEqual(['Ground floor', 'Upstairs']);
      expect(floors[0]).toMatchObject({ id: f0.body.data.id, siteId: site.id, level: 0, planImageId: null, planImageUrl: null });
      expect(floors[0]!.rooms.map((r) => r.id)).toEqual([kitchen.body.data.id, den.body.data.id]);
      expect(floors[0]!.rooms[0]).toMatchObject({ name: 'Kitchen', kind: 'kitchen', fuelBurningAppliance: true, attachedGarage: false, floorId: f0.body.data.id });
      expect(floors[0]!.rooms[0]!.openings.map((o) => o.label)).toEqual(['Back door', 'Above the sink']);
      expect(floors[0]!.rooms[0]!.openings[0]).toEqual(back.body.data);
      expect(floors[0]!.rooms[1]!.openings).toEqual([]);
      expect(floors[1]!.rooms).toEqual([{ ...bedroom.body.data, openings: [] }]);
      expect(zones).toEqual([
        {
          id: zone.id,
          panelId: panel.id,
          panelLabel: 'Main panel',
          number: 9,
          description: 'Back door',
          deviceType: 'door_contact',
          status: 'active',
          roomId: kitchen.body.data.id,
          openingId: back.body.data.id,
          pin: { floorId: f0.body.data.id, x: 0.2, y: 0.7 },
        },
      ]);
    }
  });

  it('answers an empty tree for a site without premises', async () => {
    const site = await buildSite(a.firm, a.client);
    const res = await as.owner.get(`/api/sites/${site.id}/premises`);
    expect(res.body).toEqual({ data: { floors: [], zones: [] } });
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s site (404), a bad id (400)', async () => {
    await refusesOthers((v) => v.get(`/api/sites/${a.site.id}/premises`));
    expect((await as.owner.get(`/api/sites/${b.site.id}/premises`)).status).toBe(404);
    expect400(await as.owner.get('/api/sites/1/premises'), 'siteId');
  });
});

// ---------------------------------------------------------------------------------------------
// Zone links to rooms and openings
// ---------------------------------------------------------------------------------------------

describe('zone links (POST /api/panels/:panelId/zones, PATCH /api/zones/:zoneId)', () => {
  it('links a zone to a room and an opening of its own site', async () => {
    const room = await buildRoom(await buildFloor(a.site), { name: 'Hall', kind: 'hall' });
    const door = await buildOpening(room, { kind: 'door', label: 'Front door' });
    const panel = await buildPanel(a.site);
    const created = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Hall motion', deviceType: 'motion', roomId: room.id });
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ roomId: room.id, openingId: null, pin: null });
    const zone = await buildZone(panel, { number: 20, description: 'Front door', deviceType: 'door_contact' });
    const res = await as.technician.patch(`/api/zones/${zone.id}`, { roomId: room.id, openingId: door.id });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ roomId: room.id, openingId: door.id });
  });

  it('puts a zone given only an opening in that opening’s room (create and change)', async () => {
    const room = await buildRoom(await buildFloor(a.site), { name: 'Kitchen', kind: 'kitchen' });
    const door = await buildOpening(room, { kind: 'door', label: 'Back door' });
    const window = await buildOpening(room, { kind: 'window', label: 'Sink window' });
    const panel = await buildPanel(a.site);
    const created = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Back door', deviceType: 'door_contact', openingId: door.id });
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ roomId: room.id, openingId: door.id });
    const zone = await buildZone(panel, { number: 30, description: 'Sink window' });
    const res = await as.owner.patch(`/api/zones/${zone.id}`, { openingId: window.id });
    expect(res.body.data).toMatchObject({ roomId: room.id, openingId: window.id });
    const log = await ZoneChange.findOne({ where: { tenantId: a.firm.id, zoneId: zone.id } });
    expect(log!.changes).toEqual({ roomId: [null, room.id], openingId: [null, window.id] });
    // taking the opening off keeps the room
    const off = await as.owner.patch(`/api/zones/${zone.id}`, { openingId: null });
    expect(off.body.data).toMatchObject({ roomId: room.id, openingId: null });
  });

  it('answers 400 naming roomId / openingId for a room or opening of another site or another firm, the same way, and changes nothing', async () => {
    const panel = await buildPanel(a.site);
    let zone = await buildZone(panel, { number: 9 });
    const otherSiteRoom = await buildRoom(await buildFloor(await buildSite(a.firm, a.client)));
    const otherSiteOpening = await buildOpening(otherSiteRoom);
    const otherFirmRoom = await buildRoom(await buildFloor(b.site));
    const otherFirmOpening = await buildOpening(otherFirmRoom);

    const siteRoom = await as.owner.patch(`/api/zones/${zone.id}`, { roomId: otherSiteRoom.id });
    expect400(siteRoom, 'roomId');
    const firmRoom = await as.owner.patch(`/api/zones/${zone.id}`, { roomId: otherFirmRoom.id });
    expect400(firmRoom, 'roomId');
    expect(firmRoom.body.error).toEqual(siteRoom.body.error);

    const siteOpening = await as.owner.patch(`/api/zones/${zone.id}`, { openingId: otherSiteOpening.id });
    expect400(siteOpening, 'openingId');
    const firmOpening = await as.owner.patch(`/api/zones/${zone.id}`, { openingId: otherFirmOpening.id });
    expect400(firmOpening, 'openingId');
    expect(firmOpening.body.error).toEqual(siteOpening.body.error);

    const before = await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } });
    const create = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', roomId: otherSiteRoom.id });
    expect400(create, 'roomId');
    const createOpening = await as.owner.post(`/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', openingId: otherFirmOpening.id });
    expect400(createOpening, 'openingId');
    expect(await Zone.count({ where: { tenantId: a.firm.id, panelId: panel.id } })).toBe(before);
    zone = await zoneNow(zone);
    expect([zone.roomId, zone.openingId]).toEqual([null, null]);
    expect(await ZoneChange.count({ where: { tenantId: a.firm.id, zoneId: zone.id } })).toBe(0);
  });

  it('shows a zone’s pin in the zone JSON', async () => {
    const floor = await buildFloor(a.site);
    const zone = await buildZone(await buildPanel(a.site), { number: 9 });
    await zone.update({ pinFloorId: floor.id, pinX: 0.3, pinY: 0.6 });
    const res = await as.owner.get(`/api/zones/${zone.id}`);
    expect(res.body.data.pin).toEqual({ floorId: floor.id, x: 0.3, y: 0.6 });
  });
});

describe('zone locations (programming sheet)', () => {
  it('names each linked zone’s room and opening, firm-scoped', async () => {
    const { zoneLocations } = await import('@server/services/premises-links');
    const { abilityFor } = await import('@domain/abilities');
    const f = await buildFirmWithSite();
    const floor = await buildFloor(f.site);
    const room = await buildRoom(floor, { name: 'Den' });
    const opening = await buildOpening(room, { label: 'Den window' });
    const panel = await buildPanel(f.site);
    const linked = await buildZone(panel, { number: 9 });
    await linked.update({ roomId: room.id, openingId: opening.id });
    const roomOnly = await buildZone(panel, { number: 10, deviceType: 'motion' });
    await roomOnly.update({ roomId: room.id });
    const loose = await buildZone(panel, { number: 11 });
    const ctx = { user: null, tenant: null, tenantId: f.firm.id, ability: abilityFor(null) };
    const locations = await zoneLocations(ctx, [linked, roomOnly, loose]);
    expect(locations.get(linked.id)).toBe('Den · Den window');
    expect(locations.get(roomOnly.id)).toBe('Den');
    expect(locations.has(loose.id)).toBe(false);
    const otherFirm = { ...ctx, tenantId: (await buildFirmWithSite()).firm.id };
    expect((await zoneLocations(otherFirm, [linked])).size).toBe(0);
  });
});
