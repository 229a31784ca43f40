/**
 * Floor-plan images: one per floor, stored under tenants/<firm>/ through the storage module,
 * recognised by their content (PNG, JPEG, WebP), at most 5 MB; nothing stored on any error
 * (no file, no change to the floor). Served back only after the ability check. Removing or
 * replacing the image keeps the pins (they are fractions of the image).
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Floor } from '@server/models/Floor';
import type { User } from '@server/models/User';
import { Zone } from '@server/models/Zone';
import { FLOOR_PLAN_MAX_BYTES } from '@server/services/premises';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFloor, buildPanel, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';
import { jpegClaiming, webpClaiming } from '../support/images';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let b: Awaited<ReturnType<typeof buildFirmWithSite>>;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anonymous', Visitor> = {} as never;
const STAFF = ['owner', 'coordinator', 'technician'] as const;

/** A real 1×1 PNG. */
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
/** The 1×1 PNG followed by padding up to `size` bytes. */
function pngOfSize(size: number): Buffer {
  const out = Buffer.alloc(size, 0x20);
  PNG.copy(out, 0);
  return out;
}
const JPEG = jpegClaiming(1600, 1200);
const WEBP = webpClaiming(1600, 1200);

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

function uploadPlan(v: Visitor, floorId: string, data: Buffer, filename = 'plan.png', contentType = 'image/png') {
  return v.agent.post(`/api/floors/${floorId}/plan`).set('X-CSRF-Token', v.csrfToken).attach('file', data, { filename, contentType });
}

type StreamParser = Exclude<Parameters<ReturnType<Visitor['get']>['parse']>[0], (str: string) => unknown>;
/** Reads a binary response body as a Buffer. */
const binary: StreamParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

function filesOf(tenantId: string): string[] {
  const dir = path.join(t.tenantsDir, tenantId);
  return fs.existsSync(dir) ? fs.readdirSync(dir).sort() : [];
}

async function floorNow(floor: Floor): Promise<Floor> {
  return (await Floor.findOne({ where: { tenantId: floor.tenantId, id: floor.id } }))!;
}

/** The floor's row as stored, to compare before and after a refused upload. */
async function rowOf(floor: Floor) {
  return (await floorNow(floor)).get({ plain: true });
}

beforeAll(async () => {
  t = await createTestApp();
  // a firm of its own per test that counts files: tenants/<firm>/ then holds only its files
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

describe('POST /api/floors/:floorId/plan and GET /api/floors/:floorId/plan', () => {
  it('accepts a PNG (201), stores it under the firm’s folder, and serves it back byte-identical', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.coordinator);
    const floor = await buildFloor(own.site);
    const res = await uploadPlan(v, floor.id, PNG);
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ id: floor.id, siteId: own.site.id, planImageId: expect.any(String) });
    const planImageId = res.body.data.planImageId as string;
    expect(res.body.data.planImageUrl).toBe(`/api/floors/${floor.id}/plan?v=${planImageId.slice(0, 8)}`);

    const files = filesOf(own.firm.id);
    expect(files).toHaveLength(1);
    expect(files[0]).toMatch(/^[0-9a-f-]{36}\.png$/);
    expect(fs.readFileSync(path.join(t.tenantsDir, own.firm.id, files[0]!)).equals(PNG)).toBe(true);
    const stored = await floorNow(floor);
    expect(stored.planImageContentType).toBe('image/png');

    const plan = await v.get(res.body.data.planImageUrl).buffer(true).parse(binary);
    expect(plan.status).toBe(200);
    expect(plan.headers['content-type']).toMatch(/^image\/png/);
    expect(plan.headers['x-content-type-options']).toBe('nosniff');
    expect(plan.headers['cache-control']).toMatch(/^private/);
    expect((plan.body as Buffer).equals(PNG)).toBe(true);

    const audit = await AuditEvent.findAll({ where: { tenantId: own.firm.id, action: 'floor.plan_added', subjectId: floor.id } });
    expect(audit).toHaveLength(1);
    // the premises tree shows the image too
    const tree = await v.get(`/api/sites/${own.site.id}/premises`);
    expect(tree.body.data.floors[0]).toMatchObject({ planImageId: res.body.data.planImageId, planImageUrl: res.body.data.planImageUrl });
  });

  it('accepts JPEG and WebP by their content, whatever the name says, from every staff role', async () => {
    const floor = await buildFloor(a.site);
    const uploads = [
      ['owner', JPEG, 'scan.png', 'image/png', 'image/jpeg'],
      ['coordinator', WEBP, 'plan.bin', 'application/octet-stream', 'image/webp'],
      ['technician', PNG, 'photo.jpg', 'image/jpeg', 'image/png'],
    ] as const;
    for (const [role, data, name, declared, detected] of uploads) {
      expect((await uploadPlan(as[role], floor.id, data, name, declared)).status, role).toBe(201);
      const plan = await as.technician.get(`/api/floors/${floor.id}/plan`).buffer(true).parse(binary);
      expect(plan.headers['content-type'], role).toMatch(new RegExp(`^${detected}`));
      expect((plan.body as Buffer).equals(data), role).toBe(true);
    }
  });

  it('refuses a disguised type (text named plan.png) with 415: no file under tenants/, the floor unchanged', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.owner);
    const floor = await buildFloor(own.site);
    const before = await rowOf(floor);
    const res = await uploadPlan(v, floor.id, Buffer.from('just some text, not a picture\n'), 'plan.png', 'image/png');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    const svg = await uploadPlan(v, floor.id, Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>'), 'plan.svg', 'image/svg+xml');
    expect(svg.status).toBe(415);
    expect(filesOf(own.firm.id)).toEqual([]);
    expect(await rowOf(floor)).toEqual(before);
    expect(await AuditEvent.count({ where: { tenantId: own.firm.id, subjectId: floor.id } })).toBe(0);
  });

  it('refuses a file over 5 MB with 413 too_large: nothing stored; exactly 5 MB is accepted', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.owner);
    const floor = await buildFloor(own.site);
    const before = await rowOf(floor);
    const res = await uploadPlan(v, floor.id, pngOfSize(FLOOR_PLAN_MAX_BYTES + 1));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(filesOf(own.firm.id)).toEqual([]);
    expect(await rowOf(floor)).toEqual(before);
    expect((await uploadPlan(v, floor.id, pngOfSize(FLOOR_PLAN_MAX_BYTES))).status).toBe(201);
    expect(filesOf(own.firm.id)).toHaveLength(1);
  });

  it('keeps the current image when a replacement is refused', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.owner);
    const floor = await buildFloor(own.site);
    await uploadPlan(v, floor.id, PNG).expect(201);
    const before = await rowOf(floor);
    const files = filesOf(own.firm.id);
    expect((await uploadPlan(v, floor.id, Buffer.from('GIF89a not allowed'), 'plan.gif', 'image/gif')).status).toBe(415);
    expect((await uploadPlan(v, floor.id, pngOfSize(FLOOR_PLAN_MAX_BYTES + 10))).status).toBe(413);
    expect(filesOf(own.firm.id)).toEqual(files);
    expect(await rowOf(floor)).toEqual(before);
  });

  it('answers 400 naming file when no file is sent', async () => {
    const floor = await buildFloor(a.site);
    const res = await as.owner.post(`/api/floors/${floor.id}/plan`, {});
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty(['file']);
    const empty = await uploadPlan(as.owner, floor.id, Buffer.alloc(0));
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty(['file']);
    expect((await floorNow(floor)).planImageId).toBeNull();
  });

  it('answers 404 for a floor without an image', async () => {
    const floor = await buildFloor(a.site);
    const res = await as.owner.get(`/api/floors/${floor.id}/plan`);
    expect(res.status).toBe(404);
  });

  it('refuses a client (404), the operator (403), signed out (401), another firm’s floor (404): nothing stored, nothing served', async () => {
    const own = await buildFirmWithSite();
    const owner = await signedIn(own.owner);
    const client = await signedIn(own.clientUser);
    const floor = await buildFloor(own.site);
    for (const [who, status] of [
      [client, 404],
      [as.operator, 403],
      [as.anonymous, 401],
      [as.owner, 404],
    ] as const) {
      expect((await uploadPlan(who, floor.id, PNG)).status).toBe(status);
    }
    expect(filesOf(own.firm.id)).toEqual([]);
    expect((await floorNow(floor)).planImageId).toBeNull();

    await uploadPlan(owner, floor.id, PNG).expect(201);
    for (const [who, status] of [
      [client, 404],
      [as.operator, 403],
      [as.anonymous, 401],
      [as.owner, 404],
    ] as const) {
      const res = await who.get(`/api/floors/${floor.id}/plan`);
      expect(res.status).toBe(status);
      expect(res.headers['content-type']).toMatch(/json/);
    }
  });
});

describe('DELETE /api/floors/:floorId/plan, replacing, and deleting the floor', () => {
  it('replacing the image removes the old file and keeps the pins', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.owner);
    const floor = await buildFloor(own.site);
    const zone = await buildZone(await buildPanel(own.site), { number: 9 });
    const first = await uploadPlan(v, floor.id, PNG);
    await v.put(`/api/zones/${zone.id}/pin`, { floorId: floor.id, x: 0.3, y: 0.4 }).expect(200);
    const second = await uploadPlan(v, floor.id, JPEG, 'plan.jpg', 'image/jpeg');
    expect(second.status).toBe(201);
    expect(second.body.data.planImageId).not.toBe(first.body.data.planImageId);
    expect(second.body.data.planImageUrl).not.toBe(first.body.data.planImageUrl);
    expect(filesOf(own.firm.id)).toEqual([second.body.data.planImageId]);
    expect((await v.get(`/api/zones/${zone.id}`)).body.data.pin).toEqual({ floorId: floor.id, x: 0.3, y: 0.4 });
    expect(await AuditEvent.count({ where: { tenantId: own.firm.id, action: 'floor.plan_replaced', subjectId: floor.id } })).toBe(1);
  });

  it('removing the image (204) removes the file and keeps the pins; the floor shows no image', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.technician);
    const floor = await buildFloor(own.site);
    const zone = await buildZone(await buildPanel(own.site), { number: 9 });
    await uploadPlan(v, floor.id, PNG).expect(201);
    await v.put(`/api/zones/${zone.id}/pin`, { floorId: floor.id, x: 0.6, y: 0.2 }).expect(200);
    expect((await v.delete(`/api/floors/${floor.id}/plan`)).status).toBe(204);
    expect(filesOf(own.firm.id)).toEqual([]);
    const stored = await floorNow(floor);
    expect([stored.planImageId, stored.planImageContentType]).toEqual([null, null]);
    expect((await v.get(`/api/floors/${floor.id}/plan`)).status).toBe(404);
    expect((await v.get(`/api/zones/${zone.id}`)).body.data.pin).toEqual({ floorId: floor.id, x: 0.6, y: 0.2 });
    const tree = await v.get(`/api/sites/${own.site.id}/premises`);
    expect(tree.body.data.floors[0]).toMatchObject({ planImageId: null, planImageUrl: null });
    expect(await AuditEvent.count({ where: { tenantId: own.firm.id, action: 'floor.plan_removed', subjectId: floor.id } })).toBe(1);
  });

  it('lets every staff role remove an image; refuses a client (404), the operator (403), signed out (401), another firm (404)', async () => {
    const floor = await buildFloor(a.site);
    for (const role of STAFF) {
      await uploadPlan(as.owner, floor.id, PNG).expect(201);
      expect((await as[role].delete(`/api/floors/${floor.id}/plan`)).status, role).toBe(204);
    }
    await uploadPlan(as.owner, floor.id, PNG).expect(201);
    expect((await as.client.delete(`/api/floors/${floor.id}/plan`)).status).toBe(404);
    expect((await as.operator.delete(`/api/floors/${floor.id}/plan`)).status).toBe(403);
    expect((await as.anonymous.delete(`/api/floors/${floor.id}/plan`)).status).toBe(401);
    const theirs = await buildFloor(b.site);
    const theirOwner = await signedIn(b.owner);
    await uploadPlan(theirOwner, theirs.id, PNG).expect(201);
    expect((await as.owner.delete(`/api/floors/${theirs.id}/plan`)).status).toBe(404);
    expect((await floorNow(floor)).planImageId).not.toBeNull();
    expect((await floorNow(theirs)).planImageId).not.toBeNull();
    expect(filesOf(b.firm.id)).toHaveLength(1);
  });

  it('deleting the floor removes its image file and the pins on it', async () => {
    const own = await buildFirmWithSite();
    const v = await signedIn(own.owner);
    const floor = await buildFloor(own.site);
    const zone = await buildZone(await buildPanel(own.site), { number: 9 });
    await uploadPlan(v, floor.id, PNG).expect(201);
    await v.put(`/api/zones/${zone.id}/pin`, { floorId: floor.id, x: 0.5, y: 0.5 }).expect(200);
    expect((await v.delete(`/api/floors/${floor.id}`)).status).toBe(204);
    expect(filesOf(own.firm.id)).toEqual([]);
    const stored = (await Zone.findOne({ where: { tenantId: own.firm.id, id: zone.id } }))!;
    expect(stored.pinFloorId).toBeNull();
  });
});

describe('deleting a site', () => {
  it('removes its floor-plan images from storage too', async () => {
    const firm = await buildFirmWithSite();
    const floor = await buildFloor(firm.site);
    const owner = await signedIn(firm.owner);
    expect((await uploadPlan(owner, floor.id, PNG)).status).toBe(201);
    expect(filesOf(firm.firm.id)).toHaveLength(1);
    expect((await owner.delete(`/api/sites/${firm.site.id}`)).status).toBe(204);
    expect(filesOf(firm.firm.id)).toEqual([]);
  });
});
