/**
 * GET /api/sites/:siteId/coverage: the site's floors, rooms and openings with every zone of
 * every panel of the site, through the coverage computation (src/domain/coverage.ts), in the
 * shape api-resources.md fixes, with the life-safety caution word for word. Staff roles only:
 * a client 404 (the portal has its own route), the operator 403, signed out 401, another firm 404.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { abilityFor } from '@domain/abilities';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import type { Floor } from '@server/models/Floor';
import type { Opening } from '@server/models/Opening';
import type { Room } from '@server/models/Room';
import type { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { coverageForSite } from '@server/services/coverage';
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

interface House {
  site: Site;
  ground: Floor;
  hall: Room;
  bedroom: Room;
  living: Room;
  frontDoor: Opening;
  bedroomWindow: Opening;
  livingWindow: Opening;
  patioDoor: Opening;
}

/**
 * One storey: hall (front door, smoke alarm), bedroom (window, no smoke alarm), living room
 * (window, patio door). The front door's contact is on a second panel; the bedroom window's
 * contact is bypassed.
 */
async function buildHouse(): Promise<House & { bypassedId: string }> {
  const site = await buildSite(a.firm, a.client);
  const ground = await buildFloor(site, { name: 'Ground floor', level: 0 });
  const hall = await buildRoom(ground, { name: 'Hall', kind: 'hall' });
  const bedroom = await buildRoom(ground, { name: 'Bedroom', kind: 'bedroom' });
  const living = await buildRoom(ground, { name: 'Living room', kind: 'living' });
  const frontDoor = await buildOpening(hall, { kind: 'door', label: 'Front door' });
  const bedroomWindow = await buildOpening(bedroom, { kind: 'window', label: 'Bedroom window' });
  const livingWindow = await buildOpening(living, { kind: 'window', label: 'Bay window' });
  const patioDoor = await buildOpening(living, { kind: 'sliding_door', label: 'Patio door' });
  const main = await buildPanel(site, { label: 'Main panel' });
  const garage = await buildPanel(site, { label: 'Garage panel' });
  const door = await buildZone(garage, { number: 9, description: 'Front door', deviceType: 'door_contact' });
  await door.update({ roomId: hall.id, openingId: frontDoor.id });
  const bypassed = await buildZone(main, { number: 10, description: 'Bedroom window', deviceType: 'window_contact', status: 'bypassed' });
  await bypassed.update({ roomId: bedroom.id, openingId: bedroomWindow.id });
  const smoke = await buildZone(main, { number: 11, description: 'Hall smoke', deviceType: 'smoke' });
  await smoke.update({ roomId: hall.id });
  return { site, ground, hall, bedroom, living, frontDoor, bedroomWindow, livingWindow, patioDoor, bypassedId: bypassed.id };
}

type Finding = { code: string; severity: string; roomId: string | null; floorId: string | null; lifeSafety: boolean };
type CoverageOpening = { id: string; protected: boolean; zoneDescription: string | null };
const openingIn = (data: { floors: { rooms: { openings: CoverageOpening[] }[] }[] }, id: string) =>
  data.floors.flatMap((f) => f.rooms.flatMap((r) => r.openings)).find((o) => o.id === id)!;

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

describe('GET /api/sites/:siteId/coverage', () => {
  it('answers the api-resources shape: counts, summary, findings, caution, floor by floor', async () => {
    const house = await buildHouse();
    const res = await as.owner.get(`/api/sites/${house.site.id}/coverage`);
    expect(res.status).toBe(200);
    const data = res.body.data;
    expect(data.openings).toEqual({ total: 4, protected: 1, unprotectedGroundReachable: 3 });
    expect(data.summary).toBe('1 of 4 openings protected; 2 windows and 1 sliding door reachable from the ground have no sensor');
    expect(data.caution).toBe(LIFE_SAFETY_CAUTION);
    for (const finding of data.findings) {
      expect(finding).toEqual({
        code: expect.any(String),
        severity: expect.stringMatching(/^(error|warning|info)$/),
        rule: expect.any(String),
        // staff see where each rule comes from and how it is known (public text, memory, trade practice)
        source: expect.any(String),
        evidence: expect.stringMatching(/^(public|memory|practice)$/),
        message: expect.any(String),
        floorId: finding.floorId === null ? null : expect.any(String),
        roomId: finding.roomId === null ? null : expect.any(String),
        // the zone a finding is about (the life-safety zone check, a smoke alarm in a garage), else null
        zoneId: finding.zoneId === null ? null : expect.any(String),
        lifeSafety: expect.any(Boolean),
      });
    }
    expect(data.floors).toHaveLength(1);
    expect(data.floors[0]).toMatchObject({ id: house.ground.id, name: 'Ground floor' });
    const rooms = data.floors[0].rooms as { id: string; name: string; openings: unknown[] }[];
    expect(rooms.map((r) => r.name).sort()).toEqual(['Bedroom', 'Hall', 'Living room']);
    const hall = rooms.find((r) => r.id === house.hall.id)!;
    expect(hall.openings).toEqual([{ id: house.frontDoor.id, kind: 'door', label: 'Front door', groundReachable: true, protected: true, zoneDescription: 'Front door' }]);
    // each room device says whether it counts: the hall smoke alarm is on a fire zone, reported and supervised
    expect((hall as unknown as { devices: unknown[] }).devices).toEqual([{ zoneId: expect.any(String), description: 'Hall smoke', deviceType: 'smoke', counts: true }]);
  });

  it('counts an opening protected only by a bypassed zone as unprotected', async () => {
    const house = await buildHouse();
    const data = (await as.owner.get(`/api/sites/${house.site.id}/coverage`)).body.data;
    expect(openingIn(data, house.bedroomWindow.id)).toMatchObject({ protected: false, zoneDescription: null });
    expect(data.findings).toContainEqual(expect.objectContaining({ code: 'opening_unprotected_ground', roomId: house.bedroom.id }));
  });

  it('names the life-safety finding (no smoke alarm in the sleeping room) with its rule and source, and the caution', async () => {
    const house = await buildHouse();
    const data = (await as.technician.get(`/api/sites/${house.site.id}/coverage`)).body.data;
    const finding = (data.findings as Finding[]).find((f) => f.code === 'smoke_missing_sleeping_room');
    expect(finding).toMatchObject({
      severity: 'error',
      rule: expect.stringContaining('NFPA 72'),
      source: expect.stringContaining('references.md'),
      floorId: house.ground.id,
      roomId: house.bedroom.id,
      lifeSafety: true,
    });
    expect(data.caution).toBe(LIFE_SAFETY_CAUTION);
    // the hall's smoke alarm counts on the level
    const codes = (data.findings as Finding[]).map((f) => f.code);
    expect(codes).not.toContain('smoke_missing_level');
    // The bedroom names no hall serving it, so "outside the sleeping area" cannot be judged: the
    // hall's alarm is no longer taken as serving it (it used to be, by being on the same floor).
    expect(data.findings).toContainEqual(expect.objectContaining({ code: 'sleeping_area_unknown', roomId: house.bedroom.id, severity: 'warning', lifeSafety: true }));
    expect(codes).not.toContain('smoke_missing_outside_sleeping_area');
  });

  it('takes the hall the bedroom names as its sleeping area: the hall alarm counts, the 21 ft distance is to be confirmed', async () => {
    const house = await buildHouse();
    const url = `/api/sites/${house.site.id}/coverage`;
    await as.technician.patch(`/api/rooms/${house.bedroom.id}`, { servedByHallId: house.hall.id }).expect(200);
    const linked = (await as.technician.get(url)).body.data;
    const codes = (linked.findings as Finding[]).map((f) => f.code);
    expect(codes).not.toContain('sleeping_area_unknown');
    expect(codes).not.toContain('smoke_missing_outside_sleeping_area');
    expect(linked.findings).toContainEqual(expect.objectContaining({ code: 'sleeping_area_distance_unconfirmed', roomId: house.bedroom.id, severity: 'warning' }));
    await as.technician.patch(`/api/rooms/${house.bedroom.id}`, { hallWithin21FtConfirmed: true }).expect(200);
    const confirmed = (await as.technician.get(url)).body.data;
    expect((confirmed.findings as Finding[]).map((f) => f.code)).not.toContain('sleeping_area_distance_unconfirmed');
  });

  it('changes the counts after a zone is linked to an opening (and again when it is bypassed)', async () => {
    const house = await buildHouse();
    const url = `/api/sites/${house.site.id}/coverage`;
    const before = (await as.coordinator.get(url)).body.data;
    expect(before.openings).toEqual({ total: 4, protected: 1, unprotectedGroundReachable: 3 });

    const panel = await buildPanel(house.site, { label: 'Extra panel' });
    const created = await as.coordinator.post(`/api/panels/${panel.id}/zones`, { description: 'Bay window', deviceType: 'window_contact' });
    expect(created.status).toBe(201);
    const linked = await as.coordinator.patch(`/api/zones/${created.body.data.id}`, { openingId: house.livingWindow.id });
    expect(linked.status).toBe(200);
    expect(linked.body.data.roomId).toBe(house.living.id);

    const after = (await as.coordinator.get(url)).body.data;
    expect(after.openings).toEqual({ total: 4, protected: 2, unprotectedGroundReachable: 2 });
    expect(after.summary).toBe('2 of 4 openings protected; 1 window and 1 sliding door reachable from the ground have no sensor');
    expect(openingIn(after, house.livingWindow.id)).toMatchObject({ protected: true, zoneDescription: 'Bay window' });

    // putting the bypassed contact back in service protects the bedroom window too
    await as.coordinator.patch(`/api/zones/${house.bypassedId}`, { status: 'active' }).expect(200);
    expect((await as.coordinator.get(url)).body.data.openings).toEqual({ total: 4, protected: 3, unprotectedGroundReachable: 1 });
  });

  it('counts only this site’s zones', async () => {
    const house = await buildHouse();
    // a contact on another site of the firm that (wrongly) points at this site's opening
    const elsewhere = await buildZone(await buildPanel(await buildSite(a.firm, a.client)), { number: 9, description: 'Elsewhere', deviceType: 'sliding_door_contact' });
    await elsewhere.update({ openingId: house.patioDoor.id });
    const data = (await as.owner.get(`/api/sites/${house.site.id}/coverage`)).body.data;
    expect(openingIn(data, house.patioDoor.id)).toMatchObject({ protected: false, zoneDescription: null });
  });

  it('answers an empty coverage without the caution for a site without premises', async () => {
    const site = await buildSite(a.firm, a.client);
    const res = await as.owner.get(`/api/sites/${site.id}/coverage`);
    expect(res.body.data).toEqual({
      openings: { total: 0, protected: 0, unprotectedGroundReachable: 0 },
      summary: 'No openings recorded yet',
      findings: [],
      caution: null,
      floors: [],
    });
  });

  it('answers every staff role; refuses a client (404), the operator (403), signed out (401), another firm’s site (404), a bad id (400)', async () => {
    const house = await buildHouse();
    for (const role of STAFF) expect((await as[role].get(`/api/sites/${house.site.id}/coverage`)).status, role).toBe(200);
    // the client's own site: the staff route is not theirs (the portal has its own)
    const client = await as.client.get(`/api/sites/${house.site.id}/coverage`);
    expect(client.status).toBe(404);
    expect(client.body.error.code).toBe('not_found');
    expect((await as.operator.get(`/api/sites/${house.site.id}/coverage`)).status).toBe(403);
    expect((await as.anonymous.get(`/api/sites/${house.site.id}/coverage`)).status).toBe(401);
    expect((await as.owner.get(`/api/sites/${b.site.id}/coverage`)).status).toBe(404);
    const bad = await as.owner.get('/api/sites/12/coverage');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['siteId']);
  });
});

describe('coverageForSite(ctx, siteId)', () => {
  it('computes the same coverage as the route, scoped to the acting firm', async () => {
    const house = await buildHouse();
    const ctx = { user: a.owner, tenant: a.firm, tenantId: a.firm.id, ability: abilityFor(a.owner) };
    const coverage = await coverageForSite(ctx, house.site.id);
    expect(coverage.openings).toEqual({ total: 4, protected: 1, unprotectedGroundReachable: 3 });
    expect(coverage.caution).toBe(LIFE_SAFETY_CAUTION);
    // another firm's context sees nothing of this site
    const other = await coverageForSite({ user: b.owner, tenant: b.firm, tenantId: b.firm.id, ability: abilityFor(b.owner) }, house.site.id);
    expect(other.openings.total).toBe(0);
    expect(other.floors).toEqual([]);
  });
});
