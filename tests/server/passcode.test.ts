/**
 * The verbal passcode: written with PATCH /api/sites/:siteId { passcode }, stored sealed,
 * read only through the audited reveal route, present in no other response.
 */
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

/** A distinctive passcode, so its absence from a response text means something. */
const PASSCODE = 'Bluebell-Lantern-47';

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
  const set = await as.owner.patch(`/api/sites/${a.site.id}`, { passcode: PASSCODE });
  expect(set.status).toBe(200);
  const setB = await (await signedIn(b.owner)).patch(`/api/sites/${b.site.id}`, { passcode: 'Other-Firm-Code-9' });
  expect(setB.status).toBe(200);
});
afterAll(async () => {
  await t.close();
});

function reveals(siteId: string, tenantId = a.firm.id) {
  return AuditEvent.count({ where: { tenantId, action: 'site.passcode_revealed', subjectId: siteId } });
}

describe('setting the passcode', () => {
  it('PATCH { passcode } answers hasPasscode true and never the value; the change is audited without it', async () => {
    const site = await buildSite(a.firm, a.client);
    const res = await as.coordinator.patch(`/api/sites/${site.id}`, { passcode: '  Marigold-Keel-12  ' });
    expect(res.status).toBe(200);
    expect(res.body.data.hasPasscode).toBe(true);
    expect(res.text).not.toContain('Marigold-Keel-12');
    expect(res.body.data).not.toHaveProperty('passcode');
    expect(res.body.data).not.toHaveProperty('passcodeCipher');
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'site.passcode_changed', subjectId: site.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.details).toEqual({ change: 'set' });
    expect(JSON.stringify(audit.map((e) => e.get({ plain: true })))).not.toContain('Marigold');
    // trimmed before sealing
    const revealed = await as.owner.post(`/api/sites/${site.id}/passcode/reveal`);
    expect(revealed.body.data.passcode).toBe('Marigold-Keel-12');
  });

  it('stores ciphertext in the database column, never the plaintext', async () => {
    const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: a.site.id } });
    expect(stored!.passcodeCipher).toBeTruthy();
    expect(stored!.passcodeCipher).not.toContain(PASSCODE);
    expect(stored!.passcodeCipher!.startsWith('v1.')).toBe(true);
    const rows = await t.sequelize.query<{ passcodeCipher: string }>('SELECT passcodeCipher FROM sites WHERE id = ?', {
      replacements: [a.site.id],
      type: QueryTypes.SELECT,
    });
    expect(rows[0]!.passcodeCipher).not.toContain(PASSCODE);
    expect(rows[0]!.passcodeCipher).not.toContain(Buffer.from(PASSCODE).toString('base64url'));
    // the same passcode sealed twice gives different ciphertexts (random IV)
    const twin = await buildSite(a.firm, a.client);
    await as.owner.patch(`/api/sites/${twin.id}`, { passcode: PASSCODE }).expect(200);
    const twinStored = await Site.findOne({ where: { tenantId: a.firm.id, id: twin.id } });
    expect(twinStored!.passcodeCipher).not.toBe(stored!.passcodeCipher);
  });

  it('a POST that sets the passcode answers without it and stores it sealed', async () => {
    const res = await as.owner.post('/api/sites', {
      clientId: a.client.id,
      name: 'Boathouse',
      address: { line1: '1 Slipway', city: 'Ashby Vale' },
      timeZone: 'America/Chicago',
      passcode: 'Heron-Pebble-88',
    });
    expect(res.status).toBe(201);
    expect(res.text).not.toContain('Heron-Pebble-88');
    expect(res.body.data.hasPasscode).toBe(true);
    const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } });
    expect(stored!.passcodeCipher).not.toContain('Heron-Pebble-88');
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'site.passcode_changed', subjectId: stored!.id } })).toBe(1);
  });

  it('PATCH { passcode: null } clears it; reveal then answers 404', async () => {
    const site = await buildSite(a.firm, a.client);
    await as.owner.patch(`/api/sites/${site.id}`, { passcode: 'Thistle-3' }).expect(200);
    const cleared = await as.owner.patch(`/api/sites/${site.id}`, { passcode: null });
    expect(cleared.status).toBe(200);
    expect(cleared.body.data.hasPasscode).toBe(false);
    const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: site.id } });
    expect(stored!.passcodeCipher).toBeNull();
    const changes = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'site.passcode_changed', subjectId: site.id }, order: [['createdAt', 'ASC']] });
    expect(changes.map((e) => e.details)).toEqual([{ change: 'set' }, { change: 'cleared' }]);
    expect((await as.owner.post(`/api/sites/${site.id}/passcode/reveal`)).status).toBe(404);
  });

  it('answers 400 naming passcode for an empty or too long value, and keeps the stored one', async () => {
    for (const passcode of ['', '   ', 'x'.repeat(33), 1234]) {
      const res = await as.owner.patch(`/api/sites/${a.site.id}`, { passcode });
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['passcode']);
    }
    expect((await as.owner.post(`/api/sites/${a.site.id}/passcode/reveal`)).body.data.passcode).toBe(PASSCODE);
  });

  it('technicians and clients cannot set it (403); another firm’s site answers 404', async () => {
    expect((await as.technician.patch(`/api/sites/${a.site.id}`, { passcode: 'Tech-Set' })).status).toBe(403);
    expect((await as.client.patch(`/api/sites/${a.site.id}`, { passcode: 'Client-Set' })).status).toBe(403);
    expect((await as.owner.patch(`/api/sites/${b.site.id}`, { passcode: 'Cross-Firm' })).status).toBe(404);
    expect((await as.owner.post(`/api/sites/${a.site.id}/passcode/reveal`)).body.data.passcode).toBe(PASSCODE);
  });
});

describe('the passcode appears in no other response', () => {
  it('not in any read, list or write of sites and clients, for any role', async () => {
    const texts: string[] = [];
    for (const role of ['owner', 'coordinator', 'technician', 'client'] as const) {
      for (const url of ['/api/sites', `/api/sites/${a.site.id}`, `/api/sites?clientId=${a.client.id}`, `/api/sites?q=${encodeURIComponent(a.site.name)}`, '/api/clients', `/api/clients/${a.client.id}`, `/api/sites/${a.site.id}/contacts`, `/api/sites/${a.site.id}/documents`]) {
        const res = await as[role].get(url);
        texts.push(res.text);
      }
    }
    const patched = await as.owner.patch(`/api/sites/${a.site.id}`, { accessNotes: 'Side gate sticks.' });
    expect(patched.status).toBe(200);
    expect(patched.body.data.hasPasscode).toBe(true);
    texts.push(patched.text);
    const changesBefore = await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'site.passcode_changed', subjectId: a.site.id } });
    const samePasscode = await as.owner.patch(`/api/sites/${a.site.id}`, { passcode: PASSCODE });
    texts.push(samePasscode.text);
    // re-sending the same passcode changes nothing
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'site.passcode_changed', subjectId: a.site.id } })).toBe(changesBefore);
    const session = await as.owner.get('/api/session');
    texts.push(session.text);
    for (const text of texts) {
      expect(text).not.toContain(PASSCODE);
      expect(text).not.toContain('passcodeCipher');
    }
    const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: a.site.id } });
    for (const text of texts) expect(text).not.toContain(stored!.passcodeCipher!);
  });

  it('the list and detail say hasPasscode for staff and the client', async () => {
    const list = await as.owner.get('/api/sites?pageSize=100');
    expect((list.body.data as { id: string; hasPasscode: boolean }[]).find((s) => s.id === a.site.id)!.hasPasscode).toBe(true);
    expect((await as.client.get(`/api/sites/${a.site.id}`)).body.data.hasPasscode).toBe(true);
  });
});

describe('POST /api/sites/:siteId/passcode/reveal', () => {
  it('answers the passcode to owner, coordinator and technician, one audit event per reveal', async () => {
    let expected = await reveals(a.site.id);
    for (const [role, user] of [
      ['owner', a.owner],
      ['coordinator', a.coordinator],
      ['technician', a.technician],
    ] as const) {
      const res = await as[role].post(`/api/sites/${a.site.id}/passcode/reveal`);
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ data: { passcode: PASSCODE } });
      expect(res.headers['cache-control']).toContain('no-store');
      expected += 1;
      expect(await reveals(a.site.id)).toBe(expected);
      const last = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'site.passcode_revealed', subjectId: a.site.id, actorId: user.id } });
      expect(last.length).toBeGreaterThanOrEqual(1);
      expect(last.every((e) => e.actorRole === role)).toBe(true);
      expect(JSON.stringify(last.map((e) => e.details))).not.toContain(PASSCODE);
    }
    // twice in a row: two events
    await as.technician.post(`/api/sites/${a.site.id}/passcode/reveal`).expect(200);
    await as.technician.post(`/api/sites/${a.site.id}/passcode/reveal`).expect(200);
    expect(await reveals(a.site.id)).toBe(expected + 2);
  });

  it('answers 403 to the client on their own site and 404 on another client’s site; no reveal recorded', async () => {
    const before = await reveals(a.site.id);
    const own = await as.client.post(`/api/sites/${a.site.id}/passcode/reveal`);
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('forbidden');
    expect(own.text).not.toContain(PASSCODE);
    const neighbourSite = await buildSite(a.firm, await buildClient(a.firm));
    await as.owner.patch(`/api/sites/${neighbourSite.id}`, { passcode: 'Neighbour-1' }).expect(200);
    const other = await as.client.post(`/api/sites/${neighbourSite.id}/passcode/reveal`);
    expect(other.status).toBe(404);
    expect(other.text).not.toContain('Neighbour-1');
    expect(await reveals(a.site.id)).toBe(before);
    expect(await reveals(neighbourSite.id)).toBe(0);
  });

  it('answers 404 for another firm’s site to every role, 403 to the operator, 401 signed out', async () => {
    for (const role of ['owner', 'coordinator', 'technician', 'client'] as const) {
      const res = await as[role].post(`/api/sites/${b.site.id}/passcode/reveal`);
      expect(res.status, role).toBe(404);
      expect(res.text).not.toContain('Other-Firm-Code-9');
    }
    expect(await reveals(b.site.id, b.firm.id)).toBe(0);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'site.passcode_revealed', subjectId: b.site.id } })).toBe(0);
    const before = await reveals(a.site.id);
    expect((await as.operator.post(`/api/sites/${a.site.id}/passcode/reveal`)).status).toBe(403);
    expect((await as.anon.post(`/api/sites/${a.site.id}/passcode/reveal`)).status).toBe(401);
    expect(await reveals(a.site.id)).toBe(before);
  });

  it('answers 404 with a clear message for a site without a passcode, 400 for a malformed id', async () => {
    const site = await buildSite(a.firm, a.client);
    const res = await as.owner.post(`/api/sites/${site.id}/passcode/reveal`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.error.message).toMatch(/no passcode/i);
    expect(await reveals(site.id)).toBe(0);
    const bad = await as.owner.post('/api/sites/not-an-id/passcode/reveal');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('siteId');
  });

  it('needs the CSRF token like every state-changing request', async () => {
    const res = await as.owner.agent.post(`/api/sites/${a.site.id}/passcode/reveal`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_failed');
    expect(res.text).not.toContain(PASSCODE);
  });
});
