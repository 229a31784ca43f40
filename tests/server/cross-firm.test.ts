/**
 * A firm never sees another firm: every route that takes an id answers 404 for another
 * firm's record (whatever the caller's role), changes nothing, and no list shows another
 * firm's rows.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation } from '@server/models/Invitation';
import { User } from '@server/models/User';
import { createTestApp, linkFromMail, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithStaff>>;
let b: Awaited<ReturnType<typeof buildFirmWithStaff>>;
let bClient: User;
let bInvitationId: string;
let bInvitationPath: string;
const bInvitee = 'b-invitee@test.example';
const visitorsOfA: Record<string, Visitor> = {};

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithStaff();
  b = await buildFirmWithStaff();
  bClient = await buildUser(b.firm, 'client');
  const bOwner = await signedIn(b.owner);
  const inv = await bOwner.post('/api/staff/invitations', { email: bInvitee, role: 'technician' });
  expect(inv.status).toBe(201);
  bInvitationId = inv.body.data.id as string;
  bInvitationPath = `/api${linkFromMail(t.outbox, bInvitee, '/invitations/')}`;
  const aOwner = await signedIn(a.owner);
  await aOwner.post('/api/staff/invitations', { email: 'a-invitee@test.example', role: 'coordinator' }).expect(201);
  visitorsOfA.owner = aOwner;
  visitorsOfA.coordinator = await signedIn(a.coordinator);
  visitorsOfA.technician = await signedIn(a.technician);
  visitorsOfA.client = await signedIn(await buildUser(a.firm, 'client'));
});
afterAll(async () => {
  await t.close();
});

describe('routes that take an id answer 404 for firm B’s records', () => {
  const routes: { name: string; call: (v: Visitor) => ReturnType<Visitor['get']> }[] = [
    { name: 'PATCH /api/staff/:userId (role)', call: (v) => v.patch(`/api/staff/${b.technician.id}`, { role: 'coordinator' }) },
    { name: 'PATCH /api/staff/:userId (active)', call: (v) => v.patch(`/api/staff/${b.coordinator.id}`, { active: false }) },
    { name: 'PATCH /api/staff/:userId (owner)', call: (v) => v.patch(`/api/staff/${b.owner.id}`, { active: false }) },
    { name: 'PATCH /api/staff/:userId (client)', call: (v) => v.patch(`/api/staff/${bClient.id}`, { active: false }) },
    { name: 'DELETE /api/staff/:userId', call: (v) => v.delete(`/api/staff/${b.technician.id}`) },
    { name: 'DELETE /api/staff/:userId (owner)', call: (v) => v.delete(`/api/staff/${b.owner.id}`) },
    { name: 'POST /api/staff/invitations/:id/resend', call: (v) => v.post(`/api/staff/invitations/${bInvitationId}/resend`) },
    { name: 'DELETE /api/staff/invitations/:id', call: (v) => v.delete(`/api/staff/invitations/${bInvitationId}`) },
  ];

  for (const role of ['owner', 'coordinator', 'technician', 'client'] as const) {
    for (const route of routes) {
      it(`${route.name} as firm A’s ${role}`, async () => {
        const res = await route.call(visitorsOfA[role]!);
        expect(res.status).toBe(404);
        expect(res.body.error.code).toBe('not_found');
        // the answer does not leak anything about the record
        expect(JSON.stringify(res.body)).not.toContain(b.firm.id);
        expect(JSON.stringify(res.body)).not.toContain('@test.example');
      });
    }
  }

  it('left firm B’s records exactly as they were', async () => {
    const people = await User.findAll({ where: { tenantId: b.firm.id } });
    const byId = new Map(people.map((p) => [p.id, p]));
    expect(byId.get(b.technician.id)!.role).toBe('technician');
    expect(byId.get(b.coordinator.id)!.deactivatedAt).toBeNull();
    expect(byId.get(b.owner.id)!.deactivatedAt).toBeNull();
    expect(byId.get(bClient.id)!.deactivatedAt).toBeNull();
    const inv = await Invitation.findOne({ where: { tenantId: b.firm.id, id: bInvitationId } });
    expect(inv!.revokedAt).toBeNull();
    // no resend happened: still one e-mail, and the first link still works
    expect(t.outbox.filter((m) => m.to === bInvitee)).toHaveLength(1);
    expect((await (await visitor(t.app)).get(bInvitationPath)).status).toBe(200);
    // and B's people still work
    const bTech = await signedIn(b.technician);
    expect((await bTech.get('/api/session')).body.user.role).toBe('technician');
  });
});

describe('lists never show firm B’s rows', () => {
  const bIds = () => [b.owner.id, b.coordinator.id, b.technician.id, bClient.id, bInvitationId, b.firm.id];

  it('GET /api/staff, for every role of firm A, even when searching for firm B’s people', async () => {
    for (const role of ['owner', 'coordinator', 'technician', 'client'] as const) {
      for (const q of ['', `?q=${encodeURIComponent(b.technician.name)}`, `?q=${encodeURIComponent(b.owner.email)}`, '?pageSize=100']) {
        const res = await visitorsOfA[role]!.get(`/api/staff${q}`);
        expect(res.status).toBe(200);
        const ids = (res.body.data as { id: string; tenantId: string }[]).map((u) => u.id);
        expect(ids.filter((id) => bIds().includes(id))).toEqual([]);
        expect((res.body.data as { tenantId: string }[]).every((u) => u.tenantId === a.firm.id)).toBe(true);
      }
    }
    const found = await visitorsOfA.owner!.get(`/api/staff?q=${encodeURIComponent(b.technician.name)}`);
    expect(found.body.page.total).toBe(0);
  });

  it('GET /api/staff/invitations shows only firm A’s invitations', async () => {
    const res = await visitorsOfA.owner!.get('/api/staff/invitations');
    expect(res.status).toBe(200);
    const rows = res.body.data as { id: string; email: string }[];
    expect(rows.map((r) => r.email)).toEqual(['a-invitee@test.example']);
    expect(rows.some((r) => r.id === bInvitationId)).toBe(false);
  });

  it('GET /api/firm answers firm A, never firm B', async () => {
    for (const role of ['owner', 'coordinator', 'technician', 'client'] as const) {
      const res = await visitorsOfA[role]!.get('/api/firm');
      expect(res.body.data.id).toBe(a.firm.id);
      expect(JSON.stringify(res.body)).not.toContain(b.firm.id);
    }
  });

  it('GET /api/session names only firm A', async () => {
    const res = await visitorsOfA.owner!.get('/api/session');
    expect(res.body.tenant.id).toBe(a.firm.id);
    expect(JSON.stringify(res.body.rules)).not.toContain(b.firm.id);
  });
});
