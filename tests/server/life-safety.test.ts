/**
 * The life-safety rules through the API:
 *
 * - room links: a bedroom names the hall serving its sleeping area (a room of the same site that
 *   can serve one, see canServeSleepingArea), a bathroom the bedroom it is attached to; each
 *   refusal is a 400 naming the field, the same answer for a room of another site or another
 *   firm; deleting a room or changing its kind clears the links other rooms hold to it. Staff
 *   roles edit premises; a client 404, the operator 403, signed out 401, another firm 404.
 * - coverage judges smoke alarms as programmed: the same house with the hall smoke zone on
 *   fire_24h or on monitor_only gives different findings; only the hall the bedroom names counts
 *   as outside the sleeping area.
 * - panels: the standby battery worked out from the recorded currents, and fire reporting over a
 *   single path.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Panel } from '@server/models/Panel';
import { Room } from '@server/models/Room';
import type { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFloor, buildPanel, buildRoom, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

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

type Res = Awaited<ReturnType<Visitor['get']>>;

function expect400(res: Res, field: string): void {
  expect(res.status, field).toBe(400);
  expect(res.body.error.code).toBe('validation_failed');
  expect(res.body.error.fields, field).toHaveProperty([field]);
}

/** A room read again, scoped to its firm. */
async function roomNow(room: { id: string; tenantId: string }): Promise<Room> {
  return (await Room.findOne({ where: { tenantId: room.tenantId, id: room.id } }))!;
}

type Finding = {
  code: string;
  severity: string;
  roomId: string | null;
  floorId: string | null;
  zoneId: string | null;
  message: string;
  lifeSafety: boolean;
};
const codesOf = (data: { findings: Finding[] }) => data.findings.map((f) => f.code);

// ---------------------------------------------------------------------------------------------
// Room links
// ---------------------------------------------------------------------------------------------

/** A floor of a new site of firm A with a hall, a bedroom, a kitchen and a bathroom. */
async function rooms(site?: Site) {
  const s = site ?? (await buildSite(a.firm, a.client));
  const floor = await buildFloor(s, { name: 'Upstairs', level: 1 });
  const hall = await buildRoom(floor, { name: 'Landing', kind: 'hall' });
  const bedroom = await buildRoom(floor, { name: 'Main bedroom', kind: 'bedroom' });
  const kitchen = await buildRoom(floor, { name: 'Kitchenette', kind: 'kitchen' });
  const bath = await buildRoom(floor, { name: 'En-suite', kind: 'bath' });
  return { site: s, floor, hall, bedroom, kitchen, bath };
}

describe('room links: the hall serving a bedroom', () => {
  it('records the hall a bedroom names (create and change), echoed in the room JSON and the premises tree', async () => {
    const r = await rooms();
    const created = await as.technician.post(`/api/floors/${r.floor.id}/rooms`, {
      name: 'Second bedroom',
      kind: 'bedroom',
      servedByHallId: r.hall.id,
      hallWithin21FtConfirmed: true,
    });
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ kind: 'bedroom', servedByHallId: r.hall.id, hallWithin21FtConfirmed: true, attachedToBedroomId: null });

    const res = await as.coordinator.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: r.hall.id });
    expect(res.status).toBe(200);
    // a hall set without the 21 ft confirmation is not confirmed
    expect(res.body.data).toMatchObject({ id: r.bedroom.id, servedByHallId: r.hall.id, hallWithin21FtConfirmed: false });
    expect((await roomNow(r.bedroom)).servedByHallId).toBe(r.hall.id);
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'room.updated', subjectId: r.bedroom.id } });
    expect(audit.at(-1)!.details).toMatchObject({ changed: ['servedByHallId'] });

    const tree = await as.owner.get(`/api/sites/${r.site.id}/premises`);
    const inTree = (tree.body.data.floors[0].rooms as { id: string; servedByHallId: string | null }[]).find((x) => x.id === r.bedroom.id);
    expect(inTree).toMatchObject({ servedByHallId: r.hall.id });
  });

  it('lets every staff role set the hall (a living room can serve as one too)', async () => {
    const r = await rooms();
    const living = await buildRoom(r.floor, { name: 'Family room', kind: 'living' });
    for (const role of STAFF) {
      const hallId = role === 'coordinator' ? living.id : r.hall.id;
      const res = await as[role].patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: hallId });
      expect(res.status, role).toBe(200);
      expect(res.body.data.servedByHallId, role).toBe(hallId);
    }
  });

  it('answers 400 naming servedByHallId for a kitchen (not a hall), and changes nothing', async () => {
    const r = await rooms();
    const res = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: r.kitchen.id });
    expect400(res, 'servedByHallId');
    // the message names the room chosen and says why it cannot stand in
    expect(res.body.error.fields.servedByHallId).toContain('Kitchenette');
    expect((await roomNow(r.bedroom)).servedByHallId).toBeNull();
    // nor a bathroom, a garage, another bedroom
    const garage = await buildRoom(r.floor, { name: 'Garage', kind: 'garage' });
    const other = await buildRoom(r.floor, { name: 'Nursery', kind: 'bedroom' });
    for (const room of [r.bath, garage, other])
      expect400(await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: room.id }), 'servedByHallId');
    // on create too, and nothing is added
    const before = await Room.count({ where: { tenantId: a.firm.id, floorId: r.floor.id } });
    expect400(
      await as.owner.post(`/api/floors/${r.floor.id}/rooms`, { name: 'Guest room', kind: 'bedroom', servedByHallId: r.kitchen.id }),
      'servedByHallId',
    );
    expect(await Room.count({ where: { tenantId: a.firm.id, floorId: r.floor.id } })).toBe(before);
  });

  it('answers the same 400 for a room of another site, of another firm, or no room at all (nothing leaks)', async () => {
    const r = await rooms();
    const otherSite = await rooms();
    const otherFirm = await rooms(b.site);
    const here = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: otherSite.hall.id });
    expect400(here, 'servedByHallId');
    const there = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: otherFirm.hall.id });
    expect400(there, 'servedByHallId');
    expect(there.body.error).toEqual(here.body.error);
    const missing = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: '00000000-0000-4000-8000-000000000000' });
    expect(missing.body.error).toEqual(here.body.error);
    // the other firm's room is not described (its name never appears)
    expect(JSON.stringify(there.body)).not.toContain(otherFirm.hall.name);
    expect(JSON.stringify(there.body)).not.toContain(b.firm.id);
    // another firm's kitchen gives the same answer as its hall: its kind is not revealed either
    expect((await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: otherFirm.kitchen.id })).body.error).toEqual(here.body.error);
    expect((await roomNow(r.bedroom)).servedByHallId).toBeNull();
    // on create too
    expect(
      (await as.owner.post(`/api/floors/${r.floor.id}/rooms`, { name: 'Guest room', kind: 'bedroom', servedByHallId: otherFirm.hall.id })).body.error,
    ).toEqual(here.body.error);
  });

  it('answers 400 naming servedByHallId when the room is not a bedroom, when it names itself, or for a malformed id', async () => {
    const r = await rooms();
    expect400(await as.owner.patch(`/api/rooms/${r.kitchen.id}`, { servedByHallId: r.hall.id }), 'servedByHallId');
    expect400(
      await as.owner.post(`/api/floors/${r.floor.id}/rooms`, { name: 'Kitchen', kind: 'kitchen', servedByHallId: r.hall.id }),
      'servedByHallId',
    );
    expect400(await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: r.bedroom.id }), 'servedByHallId');
    expect400(await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: 'the landing' }), 'servedByHallId');
    expect400(await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { hallWithin21FtConfirmed: 'yes' }), 'hallWithin21FtConfirmed');
    expect((await roomNow(r.kitchen)).servedByHallId).toBeNull();
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s room (404); nothing changes', async () => {
    const r = await rooms();
    const body = { servedByHallId: r.hall.id };
    const client = await as.client.patch(`/api/rooms/${r.bedroom.id}`, body);
    expect(client.status).toBe(404);
    expect(client.body.error.code).toBe('not_found');
    expect((await as.operator.patch(`/api/rooms/${r.bedroom.id}`, body)).status).toBe(403);
    expect((await as.anonymous.patch(`/api/rooms/${r.bedroom.id}`, body)).status).toBe(401);
    expect((await as.client.post(`/api/floors/${r.floor.id}/rooms`, { name: 'Guest room', kind: 'bedroom', servedByHallId: r.hall.id })).status).toBe(
      404,
    );
    expect((await roomNow(r.bedroom)).servedByHallId).toBeNull();
    const theirs = await rooms(b.site);
    expect((await as.owner.patch(`/api/rooms/${theirs.bedroom.id}`, { servedByHallId: theirs.hall.id })).status).toBe(404);
    expect((await roomNow(theirs.bedroom)).servedByHallId).toBeNull();
  });
});

describe('room links: the bedroom a bathroom is attached to', () => {
  it('records it for a bathroom (create and change)', async () => {
    const r = await rooms();
    const res = await as.technician.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: r.bedroom.id });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ attachedToBedroomId: r.bedroom.id, servedByHallId: null });
    const created = await as.owner.post(`/api/floors/${r.floor.id}/rooms`, { name: 'Shower room', kind: 'bath', attachedToBedroomId: r.bedroom.id });
    expect(created.status).toBe(201);
    expect(created.body.data.attachedToBedroomId).toBe(r.bedroom.id);
  });

  it('answers 400 naming attachedToBedroomId on a room that is not a bathroom, or pointing at a room that is not a bedroom', async () => {
    const r = await rooms();
    const other = await buildRoom(r.floor, { name: 'Nursery', kind: 'bedroom' });
    // a bedroom is not attached to a bedroom
    expect400(await as.owner.patch(`/api/rooms/${other.id}`, { attachedToBedroomId: r.bedroom.id }), 'attachedToBedroomId');
    expect400(
      await as.owner.post(`/api/floors/${r.floor.id}/rooms`, { name: 'Box room', kind: 'bedroom', attachedToBedroomId: r.bedroom.id }),
      'attachedToBedroomId',
    );
    // a bathroom attached to a kitchen or a hall
    const kitchen = await as.owner.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: r.kitchen.id });
    expect400(kitchen, 'attachedToBedroomId');
    expect(kitchen.body.error.fields.attachedToBedroomId).toContain('Kitchenette');
    expect400(await as.owner.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: r.hall.id }), 'attachedToBedroomId');
    // a bedroom of another firm: the same answer as no room at all
    const theirs = await rooms(b.site);
    const foreign = await as.owner.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: theirs.bedroom.id });
    expect400(foreign, 'attachedToBedroomId');
    expect((await as.owner.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: '00000000-0000-4000-8000-000000000000' })).body.error).toEqual(
      foreign.body.error,
    );
    expect((await roomNow(r.bath)).attachedToBedroomId).toBeNull();
    expect((await roomNow(other)).attachedToBedroomId).toBeNull();
  });
});

describe('room links: cleared when the room they point at goes', () => {
  it('deleting the hall clears the bedroom’s hall and its 21 ft confirmation', async () => {
    const r = await rooms();
    await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: r.hall.id, hallWithin21FtConfirmed: true }).expect(200);
    expect((await roomNow(r.bedroom)).hallWithin21FtConfirmed).toBe(true);
    expect((await as.technician.delete(`/api/rooms/${r.hall.id}`)).status).toBe(204);
    const bedroom = await roomNow(r.bedroom);
    expect([bedroom.servedByHallId, bedroom.hallWithin21FtConfirmed]).toEqual([null, false]);
    const tree = await as.owner.get(`/api/sites/${r.site.id}/premises`);
    expect(
      (tree.body.data.floors[0].rooms as { id: string; servedByHallId: string | null }[]).find((x) => x.id === r.bedroom.id)!.servedByHallId,
    ).toBeNull();
  });

  it('deleting the bedroom clears the bathroom’s link; deleting a floor clears links to its rooms from other floors', async () => {
    const r = await rooms();
    await as.owner.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: r.bedroom.id }).expect(200);
    expect((await as.owner.delete(`/api/rooms/${r.bedroom.id}`)).status).toBe(204);
    expect((await roomNow(r.bath)).attachedToBedroomId).toBeNull();

    const landingFloor = await buildFloor(r.site, { name: 'Landing floor', level: 2 });
    const landing = await buildRoom(landingFloor, { name: 'Top landing', kind: 'hall' });
    const attic = await buildRoom(r.floor, { name: 'Attic bedroom', kind: 'bedroom' });
    await as.owner.patch(`/api/rooms/${attic.id}`, { servedByHallId: landing.id }).expect(200);
    expect((await as.owner.delete(`/api/floors/${landingFloor.id}`)).status).toBe(204);
    expect((await roomNow(attic)).servedByHallId).toBeNull();
  });

  it('a hall that becomes a kitchen stops serving; a bedroom that becomes an office loses its hall and its bathrooms', async () => {
    const r = await rooms();
    await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: r.hall.id, hallWithin21FtConfirmed: true }).expect(200);
    await as.owner.patch(`/api/rooms/${r.bath.id}`, { attachedToBedroomId: r.bedroom.id }).expect(200);
    const kitchen = await as.owner.patch(`/api/rooms/${r.hall.id}`, { kind: 'kitchen' });
    expect(kitchen.status).toBe(200);
    expect((await roomNow(r.bedroom)).servedByHallId).toBeNull();
    expect((await roomNow(r.bedroom)).hallWithin21FtConfirmed).toBe(false);

    const hall = await buildRoom(r.floor, { name: 'Hall', kind: 'hall' });
    await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: hall.id }).expect(200);
    const office = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { kind: 'office' });
    expect(office.status).toBe(200);
    expect(office.body.data).toMatchObject({ kind: 'office', servedByHallId: null, hallWithin21FtConfirmed: false });
    expect((await roomNow(r.bath)).attachedToBedroomId).toBeNull();
  });

  it('a new hall needs its own 21 ft confirmation', async () => {
    const r = await rooms();
    const other = await buildRoom(r.floor, { name: 'Back hall', kind: 'hall' });
    await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: r.hall.id, hallWithin21FtConfirmed: true }).expect(200);
    const moved = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { servedByHallId: other.id });
    expect(moved.body.data).toMatchObject({ servedByHallId: other.id, hallWithin21FtConfirmed: false });
    // renaming the bedroom keeps the hall and its confirmation
    await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { hallWithin21FtConfirmed: true }).expect(200);
    const renamed = await as.owner.patch(`/api/rooms/${r.bedroom.id}`, { name: 'Big bedroom' });
    expect(renamed.body.data).toMatchObject({ servedByHallId: other.id, hallWithin21FtConfirmed: true });
  });
});

// ---------------------------------------------------------------------------------------------
// Coverage: smoke alarms judged as programmed, and the hall that serves the bedrooms
// ---------------------------------------------------------------------------------------------

/**
 * One storey: a hall serving the bedroom (21 ft confirmed), the bedroom with its own smoke alarm
 * (zone 9), and a kitchen. The other smoke alarm (zone 10, "Hall smoke") is in `smokeIn`.
 * No fuel-burning appliance and no garage, so no CO alarm is required.
 */
async function house(smokeIn: 'hall' | 'kitchen') {
  const site = await buildSite(a.firm, a.client);
  const floor = await buildFloor(site, { name: 'Ground floor', level: 0 });
  const hall = await buildRoom(floor, { name: 'Hall', kind: 'hall' });
  const bedroom = await buildRoom(floor, { name: 'Bedroom', kind: 'bedroom', servedByHallId: hall.id, hallWithin21FtConfirmed: true });
  const kitchen = await buildRoom(floor, { name: 'Kitchen', kind: 'kitchen' });
  const panel = await buildPanel(site);
  await buildZone(panel, { number: 9, description: 'Bedroom smoke', deviceType: 'smoke', roomId: bedroom.id });
  const smoke = await buildZone(panel, {
    number: 10,
    description: 'Hall smoke',
    deviceType: 'smoke',
    roomId: smokeIn === 'hall' ? hall.id : kitchen.id,
  });
  return { site, floor, hall, bedroom, kitchen, panel, smoke };
}

const LIFE_SAFETY_GAPS = [
  'life_safety_zone_programming',
  'smoke_missing_sleeping_room',
  'smoke_missing_outside_sleeping_area',
  'smoke_missing_level',
  'sleeping_area_unknown',
  'sleeping_area_distance_unconfirmed',
];

describe('coverage: a smoke alarm counts as programmed', () => {
  it('the same house: hall smoke on fire_24h is protection; on monitor_only it is a finding naming the zone, and the hall is uncovered', async () => {
    const h = await house('hall');
    const url = `/api/sites/${h.site.id}/coverage`;
    const fire = (await as.technician.get(url)).body.data;
    // fully covered as programmed: no life-safety gap at all
    expect(codesOf(fire).filter((c) => LIFE_SAFETY_GAPS.includes(c))).toEqual([]);

    const patched = await as.technician.patch(`/api/zones/${h.smoke.id}`, { zoneType: 'monitor_only' });
    expect(patched.status).toBe(200);
    // the zone itself says what is wrong and what to change
    expect(patched.body.data.lifeSafetyProblems).toEqual([expect.objectContaining({ code: 'wrong_zone_type', field: 'zoneType' })]);

    const chime = (await as.technician.get(url)).body.data;
    const zoneFinding = (chime.findings as Finding[]).filter((f) => f.code === 'life_safety_zone_programming');
    expect(zoneFinding).toEqual([
      expect.objectContaining({
        severity: 'error',
        zoneId: h.smoke.id,
        roomId: h.hall.id,
        floorId: h.floor.id,
        lifeSafety: true,
        evidence: 'public',
      }),
    ]);
    expect(zoneFinding[0]!.message).toContain('Zone 10 “Hall smoke”');
    expect(zoneFinding[0]!.message).toContain('set its zone type to Fire, always armed');
    // with the hall alarm not counting, the bedroom's sleeping area has no alarm outside it
    expect(chime.findings).toContainEqual(
      expect.objectContaining({ code: 'smoke_missing_outside_sleeping_area', roomId: h.hall.id, severity: 'error' }),
    );
    const outside = (chime.findings as Finding[]).find((f) => f.code === 'smoke_missing_outside_sleeping_area')!;
    expect(outside.message).toContain('not programmed to protect');
    // the bedroom's own alarm still covers the level and the sleeping room
    expect(codesOf(chime)).not.toContain('smoke_missing_level');
    expect(codesOf(chime)).not.toContain('smoke_missing_sleeping_room');
    // the room device is shown as not counting
    const hallRoom = (chime.floors[0].rooms as { id: string; devices: { zoneId: string; counts: boolean }[] }[]).find((r) => r.id === h.hall.id)!;
    expect(hallRoom.devices).toEqual([expect.objectContaining({ zoneId: h.smoke.id, counts: false })]);

    // the panel's audit names the same zone (CP-01: fire exempt from the abort window and swinger shutdown)
    const panel = await as.technician.get(`/api/panels/${h.panel.id}`);
    expect(panel.body.data.audit).toContainEqual(
      expect.objectContaining({ code: 'life_safety_device_on_wrong_zone', topic: 'cp01', lifeSafety: true }),
    );

    // back on a fire zone: the findings go again
    await as.technician.patch(`/api/zones/${h.smoke.id}`, { zoneType: 'fire_24h' }).expect(200);
    expect(codesOf((await as.technician.get(url)).body.data).filter((c) => LIFE_SAFETY_GAPS.includes(c))).toEqual([]);
  });

  it('a smoke alarm that is not reported or not supervised does not count either', async () => {
    const h = await house('hall');
    const url = `/api/sites/${h.site.id}/coverage`;
    await as.owner.patch(`/api/zones/${h.smoke.id}`, { reportsToMonitoring: false }).expect(200);
    const unreported = (await as.owner.get(url)).body.data;
    const finding = (unreported.findings as Finding[]).find((f) => f.code === 'life_safety_zone_programming')!;
    expect(finding).toMatchObject({ zoneId: h.smoke.id });
    expect(finding.message).toContain('monitoring center');
    expect(codesOf(unreported)).toContain('smoke_missing_outside_sleeping_area');

    await as.owner.patch(`/api/zones/${h.smoke.id}`, { reportsToMonitoring: true, supervised: false }).expect(200);
    const unsupervised = (await as.owner.get(url)).body.data;
    expect((unsupervised.findings as Finding[]).find((f) => f.code === 'life_safety_zone_programming')!.message).toContain('not supervised');
    expect(codesOf(unsupervised)).toContain('smoke_missing_outside_sleeping_area');
  });

  it('an alarm in the hall serves the sleeping area; the same alarm only in the kitchen does not', async () => {
    const inHall = await house('hall');
    const inKitchen = await house('kitchen');
    const hallData = (await as.owner.get(`/api/sites/${inHall.site.id}/coverage`)).body.data;
    const kitchenData = (await as.owner.get(`/api/sites/${inKitchen.site.id}/coverage`)).body.data;
    expect(codesOf(hallData)).not.toContain('smoke_missing_outside_sleeping_area');
    const missing = (kitchenData.findings as Finding[]).filter((f) => f.code === 'smoke_missing_outside_sleeping_area');
    expect(missing).toEqual([expect.objectContaining({ roomId: inKitchen.hall.id, severity: 'error', lifeSafety: true })]);
    // the message says why the kitchen alarm does not stand in
    expect(missing[0]!.message).toContain('Kitchen');
    // and the kitchen cannot be recorded as the hall serving the bedroom
    expect400(await as.owner.patch(`/api/rooms/${inKitchen.bedroom.id}`, { servedByHallId: inKitchen.kitchen.id }), 'servedByHallId');
  });

  it('a bedroom with no hall recorded is not taken as served: sleeping_area_unknown', async () => {
    const h = await house('hall');
    await as.owner.patch(`/api/rooms/${h.bedroom.id}`, { servedByHallId: null }).expect(200);
    const data = (await as.owner.get(`/api/sites/${h.site.id}/coverage`)).body.data;
    expect(data.findings).toContainEqual(
      expect.objectContaining({ code: 'sleeping_area_unknown', roomId: h.bedroom.id, severity: 'warning', lifeSafety: true }),
    );
    expect(codesOf(data)).not.toContain('smoke_missing_outside_sleeping_area');
  });

  it('a fuel-burning appliance in the bathroom attached to a bedroom needs a CO alarm in that bedroom', async () => {
    const h = await house('hall');
    const bath = await buildRoom(h.floor, { name: 'En-suite', kind: 'bath', fuelBurningAppliance: true });
    const url = `/api/sites/${h.site.id}/coverage`;
    // not attached to any bedroom: no bedroom finding (the house-wide CO findings apply)
    expect(codesOf((await as.owner.get(url)).body.data)).not.toContain('co_missing_in_bedroom_with_appliance');
    await as.owner.patch(`/api/rooms/${bath.id}`, { attachedToBedroomId: h.bedroom.id }).expect(200);
    const attached = (await as.owner.get(url)).body.data;
    const finding = (attached.findings as Finding[]).find((f) => f.code === 'co_missing_in_bedroom_with_appliance');
    expect(finding).toMatchObject({ roomId: h.bedroom.id, severity: 'error', lifeSafety: true });
    expect(finding!.message).toContain('En-suite');
    // a CO alarm in the bedroom, on a CO zone: covered
    await buildZone(h.panel, { number: 11, description: 'Bedroom CO', deviceType: 'co', roomId: h.bedroom.id });
    expect(codesOf((await as.owner.get(url)).body.data)).not.toContain('co_missing_in_bedroom_with_appliance');
  });

  it('a smoke alarm in a garage is a note naming the zone and does not count for its level', async () => {
    const site = await buildSite(a.firm, a.client);
    const floor = await buildFloor(site, { name: 'Ground floor', level: 0 });
    await buildRoom(floor, { name: 'Den', kind: 'office' });
    const garage = await buildRoom(floor, { name: 'Garage', kind: 'garage', attachedGarage: true });
    const zone = await buildZone(await buildPanel(site), { number: 9, description: 'Garage smoke', deviceType: 'smoke', roomId: garage.id });
    const data = (await as.owner.get(`/api/sites/${site.id}/coverage`)).body.data;
    expect(data.findings).toContainEqual(
      expect.objectContaining({ code: 'smoke_in_garage', zoneId: zone.id, roomId: garage.id, severity: 'info', evidence: 'memory' }),
    );
    expect(data.findings).toContainEqual(expect.objectContaining({ code: 'smoke_missing_level', floorId: floor.id }));
  });
});

// ---------------------------------------------------------------------------------------------
// Panels: standby battery and the path to the monitoring center
// ---------------------------------------------------------------------------------------------

type AuditFinding = { code: string; topic: string; field: string | null; severity: string; lifeSafety: boolean };
const auditCodes = (res: Res) => (res.body.data.audit as AuditFinding[]).map((f) => f.code);

/** A panel of firm A's site with one smoke alarm on a fire zone, reported to the monitoring center. */
async function firePanel(overrides: Parameters<typeof buildPanel>[1] = {}) {
  const panel = await buildPanel(a.site, overrides);
  await buildZone(panel, { number: 9, description: 'Hall smoke', deviceType: 'smoke' });
  return panel;
}

describe('panels: standby battery', () => {
  it('works out the battery a household fire panel needs: 120 mA × 24 h + 900 mA × 4 min = 2.94 Ah, 3.528 Ah with 20% headroom', async () => {
    const panel = await firePanel();
    const res = await as.technician.patch(`/api/panels/${panel.id}`, { standbyCurrentMa: 120, alarmCurrentMa: 900, batteryAh: 2.3 });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ occupancy: 'household', standbyCurrentMa: 120, alarmCurrentMa: 900, batteryAh: 2.3 });
    // (120 × 24 + 900 × 4 ÷ 60) ÷ 1000 = (2880 + 60) ÷ 1000 = 2.94 Ah; × 1.2 = 3.528 Ah
    expect(res.body.data.standby).toEqual({
      duty: 'household_fire',
      standbyHours: 24,
      alarmMinutes: 4,
      neededAh: 2.94,
      requiredAh: 3.528,
      batteryDueOn: null,
    });
    // 2.3 Ah is short of 3.528 Ah: an error on the battery, life safety
    const short = (res.body.data.audit as AuditFinding[]).find((f) => f.code === 'standby_battery_short');
    expect(short).toMatchObject({ topic: 'power', field: 'batteryAh', severity: 'error', lifeSafety: true });
    expect((short as unknown as { message: string }).message).toContain('3.528 Ah');
    expect(auditCodes(res)).not.toContain('standby_battery_unknown');
    // the same worked out on a plain read
    expect((await as.owner.get(`/api/panels/${panel.id}`)).body.data.standby.requiredAh).toBe(3.528);

    const bigger = await as.technician.patch(`/api/panels/${panel.id}`, { batteryAh: 7 });
    expect(bigger.status).toBe(200);
    expect(auditCodes(bigger)).not.toContain('standby_battery_short');
    expect(bigger.body.data.standby.requiredAh).toBe(3.528);
  });

  it('sizes by duty: commercial fire needs 5 min of alarm; a panel without fire or CO devices is intrusion (4 h standby)', async () => {
    const commercial = await firePanel({ occupancy: 'commercial', standbyCurrentMa: 120, alarmCurrentMa: 900, batteryAh: 7 });
    const c = await as.owner.get(`/api/panels/${commercial.id}`);
    // (2880 + 900 × 5 ÷ 60) ÷ 1000 = 2.955 Ah; × 1.2 = 3.546 Ah
    expect(c.body.data.standby).toMatchObject({ duty: 'commercial_fire', standbyHours: 24, alarmMinutes: 5, neededAh: 2.955, requiredAh: 3.546 });
    const intrusion = await buildPanel(a.site, { standbyCurrentMa: 120, alarmCurrentMa: 900, batteryAh: 0.5 });
    await buildZone(intrusion, { number: 9, description: 'Front door', deviceType: 'door_contact' });
    const i = await as.owner.get(`/api/panels/${intrusion.id}`);
    // (120 × 4 + 60) ÷ 1000 = 0.54 Ah; × 1.2 = 0.648 Ah
    expect(i.body.data.standby).toMatchObject({ duty: 'intrusion', standbyHours: 4, alarmMinutes: 4, neededAh: 0.54, requiredAh: 0.648 });
    // short, but an intrusion panel: a warning, not life safety
    expect((i.body.data.audit as AuditFinding[]).find((f) => f.code === 'standby_battery_short')).toMatchObject({
      severity: 'warning',
      lifeSafety: false,
    });
  });

  it('dates the battery: due 5 years after the label date', async () => {
    const saved = t.clock.now;
    try {
      t.clock.now = new Date('2026-06-15T17:00:00Z');
      const panel = await firePanel();
      const old = await as.owner.patch(`/api/panels/${panel.id}`, { batteryManufacturedOn: '2021-03-01' });
      expect(old.status).toBe(200);
      expect(old.body.data.batteryManufacturedOn).toBe('2021-03-01');
      expect(old.body.data.standby.batteryDueOn).toBe('2026-03-01');
      expect((old.body.data.audit as AuditFinding[]).find((f) => f.code === 'standby_battery_old')).toMatchObject({
        field: 'batteryManufacturedOn',
        severity: 'error',
        lifeSafety: true,
      });
      const fresh = await as.owner.patch(`/api/panels/${panel.id}`, { batteryManufacturedOn: '2024-03-01' });
      expect(fresh.body.data.standby.batteryDueOn).toBe('2029-03-01');
      expect(auditCodes(fresh)).not.toContain('standby_battery_old');
      expect(auditCodes(fresh)).not.toContain('standby_battery_age_unknown');
    } finally {
      t.clock.now = saved;
    }
  });

  it('takes the power fields on create and keeps them when other fields change', async () => {
    const created = await as.owner.post(`/api/sites/${a.site.id}/panels`, {
      label: 'Main panel',
      makeModel: 'Test panel TP-64',
      zoneCapacity: 64,
      wirelessZoneFrom: 9,
      wirelessZoneTo: 64,
      commPath: 'combination',
      occupancy: 'commercial',
      standbyCurrentMa: 95.5,
      alarmCurrentMa: 650,
      batteryAh: 7,
      batteryManufacturedOn: '2025-01-20',
      pathFailureReportMin: 5,
    });
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({
      occupancy: 'commercial',
      standbyCurrentMa: 95.5,
      alarmCurrentMa: 650,
      batteryAh: 7,
      batteryManufacturedOn: '2025-01-20',
      pathFailureReportMin: 5,
    });
    const renamed = await as.owner.patch(`/api/panels/${created.body.data.id}`, { label: 'Shop panel' });
    expect(renamed.body.data).toMatchObject({
      label: 'Shop panel',
      occupancy: 'commercial',
      standbyCurrentMa: 95.5,
      alarmCurrentMa: 650,
      batteryAh: 7,
      pathFailureReportMin: 5,
    });
    // and clears one when sent null
    const cleared = await as.owner.patch(`/api/panels/${created.body.data.id}`, { batteryAh: null });
    expect(cleared.body.data.batteryAh).toBeNull();
    expect(auditCodes(cleared)).toContain('standby_battery_unknown');
  });

  it('answers 400 naming each bad power field, and changes nothing', async () => {
    const panel = await firePanel({ standbyCurrentMa: 120, alarmCurrentMa: 900, batteryAh: 7 });
    const cases: [Record<string, unknown>, string][] = [
      [{ standbyCurrentMa: -5 }, 'standbyCurrentMa'],
      [{ standbyCurrentMa: 'lots' }, 'standbyCurrentMa'],
      [{ alarmCurrentMa: -1 }, 'alarmCurrentMa'],
      [{ batteryAh: 0 }, 'batteryAh'],
      [{ batteryAh: -7 }, 'batteryAh'],
      [{ occupancy: 'castle' }, 'occupancy'],
      [{ pathFailureReportMin: 2.5 }, 'pathFailureReportMin'],
      [{ pathFailureReportMin: -1 }, 'pathFailureReportMin'],
      [{ batteryManufacturedOn: '2024-02-30' }, 'batteryManufacturedOn'],
    ];
    for (const [body, field] of cases) expect400(await as.owner.patch(`/api/panels/${panel.id}`, body), field);
    // on create too
    expect400(
      await as.owner.post(`/api/sites/${a.site.id}/panels`, {
        label: 'P',
        makeModel: 'M',
        zoneCapacity: 64,
        wirelessZoneFrom: 9,
        wirelessZoneTo: 64,
        commPath: 'cellular',
        standbyCurrentMa: -120,
      }),
      'standbyCurrentMa',
    );
    const stored = await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } });
    expect([stored!.standbyCurrentMa, stored!.alarmCurrentMa, stored!.batteryAh, stored!.occupancy]).toEqual([120, 900, 7, 'household']);
  });

  it('lets every staff role record the power; refuses a client (404), the operator (403), signed out (401), another firm (404)', async () => {
    const panel = await firePanel();
    for (const role of STAFF) expect((await as[role].patch(`/api/panels/${panel.id}`, { standbyCurrentMa: 100 })).status, role).toBe(200);
    expect((await as.client.patch(`/api/panels/${panel.id}`, { standbyCurrentMa: 1 })).status).toBe(404);
    expect((await as.operator.patch(`/api/panels/${panel.id}`, { standbyCurrentMa: 1 })).status).toBe(403);
    expect((await as.anonymous.patch(`/api/panels/${panel.id}`, { standbyCurrentMa: 1 })).status).toBe(401);
    const theirs = await buildPanel(b.site);
    expect((await as.owner.patch(`/api/panels/${theirs.id}`, { standbyCurrentMa: 1 })).status).toBe(404);
    expect((await Panel.findOne({ where: { tenantId: a.firm.id, id: panel.id } }))!.standbyCurrentMa).toBe(100);
    expect((await Panel.findOne({ where: { tenantId: b.firm.id, id: theirs.id } }))!.standbyCurrentMa).toBeNull();
  });
});

describe('panels: fire reporting over a single path', () => {
  it('a reporting smoke zone over a phone line alone: fire_phone_line_only; a combination path: none', async () => {
    const panel = await firePanel({ commPath: 'phone_line' });
    const res = await as.owner.get(`/api/panels/${panel.id}`);
    expect((res.body.data.audit as AuditFinding[]).find((f) => f.code === 'fire_phone_line_only')).toMatchObject({
      topic: 'power',
      field: 'commPath',
      severity: 'error',
      lifeSafety: true,
    });
    const combined = await as.owner.patch(`/api/panels/${panel.id}`, { commPath: 'combination' });
    expect(auditCodes(combined)).not.toContain('fire_phone_line_only');
    // an intrusion-only panel on a phone line has nothing to say about fire reporting
    const intrusion = await buildPanel(a.site, { commPath: 'phone_line' });
    await buildZone(intrusion, { number: 9, description: 'Front door', deviceType: 'door_contact' });
    expect(auditCodes(await as.owner.get(`/api/panels/${intrusion.id}`))).not.toContain('fire_phone_line_only');
  });

  it('one cellular path: unknown failure reporting is a warning, over 5 minutes an error, 5 minutes is fine', async () => {
    const panel = await firePanel({ commPath: 'cellular' });
    expect(auditCodes(await as.owner.get(`/api/panels/${panel.id}`))).toContain('fire_single_path_unknown');
    const slow = await as.owner.patch(`/api/panels/${panel.id}`, { pathFailureReportMin: 10 });
    expect((slow.body.data.audit as AuditFinding[]).find((f) => f.code === 'fire_single_path_unsupervised')).toMatchObject({
      field: 'pathFailureReportMin',
      severity: 'error',
    });
    expect(auditCodes(slow)).not.toContain('fire_single_path_unknown');
    const fast = await as.owner.patch(`/api/panels/${panel.id}`, { pathFailureReportMin: 5 });
    expect(auditCodes(fast).filter((c) => c.startsWith('fire_'))).toEqual([]);
  });
});
