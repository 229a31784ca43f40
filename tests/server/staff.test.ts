import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Invitation } from '@server/models/Invitation';
import { User } from '@server/models/User';
import { createTestApp, linkFromMail, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirm, buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  const res = await v.signIn(user.email, TEST_PASSWORD);
  expect(res.status).toBe(200);
  return v;
}

interface ListBody {
  data: { id: string; email: string; name: string; role: string; tenantId: string; active: boolean }[];
  page: { number: number; size: number; total: number };
}

function mailsTo(email: string) {
  return t.outbox.filter((m) => m.to === email);
}

/** The invitation token path (/api/invitations/<token>) from the last e-mail to this address. */
function invitationApiPath(email: string): string {
  return `/api${linkFromMail(t.outbox, email, '/invitations/')}`;
}

describe('GET /api/staff', () => {
  it('answers the list wrapper with the firm’s staff only', async () => {
    const a = await buildFirmWithStaff();
    const b = await buildFirmWithStaff();
    const v = await signedIn(a.owner);
    const res = await v.get('/api/staff');
    expect(res.status).toBe(200);
    const body = res.body as ListBody;
    expect(Object.keys(body).sort()).toEqual(['data', 'page']);
    expect(body.page).toEqual({ number: 1, size: 25, total: 3 });
    expect(body.data.map((u) => u.id).sort()).toEqual([a.owner.id, a.coordinator.id, a.technician.id].sort());
    expect(body.data.every((u) => u.tenantId === a.firm.id)).toBe(true);
    const bIds = [b.owner.id, b.coordinator.id, b.technician.id];
    expect(body.data.some((u) => bIds.includes(u.id))).toBe(false);
    // presented fields only: never the password hash
    expect(JSON.stringify(body)).not.toContain('scrypt');
    expect(body.data[0]).not.toHaveProperty('passwordHash');
  });

  it('lists deactivated staff as inactive, and never lists clients or operators', async () => {
    const a = await buildFirmWithStaff();
    const gone = await buildUser(a.firm, 'technician', { deactivatedAt: new Date() });
    const client = await buildUser(a.firm, 'client');
    await buildUser(null, 'operator');
    const v = await signedIn(a.owner);
    const body = (await v.get('/api/staff')).body as ListBody;
    expect(body.page.total).toBe(4);
    expect(body.data.find((u) => u.id === gone.id)?.active).toBe(false);
    expect(body.data.find((u) => u.id === a.technician.id)?.active).toBe(true);
    expect(body.data.some((u) => u.id === client.id)).toBe(false);
    expect(body.data.every((u) => ['owner', 'coordinator', 'technician'].includes(u.role))).toBe(true);
  });

  it('pages with page and pageSize, reporting the full total', async () => {
    const firm = await buildFirm();
    const owner = await buildUser(firm, 'owner', { name: 'Ada Owner' });
    await buildUser(firm, 'technician', { name: 'Bea Tech' });
    await buildUser(firm, 'technician', { name: 'Cal Tech' });
    await buildUser(firm, 'coordinator', { name: 'Dee Coord' });
    await buildUser(firm, 'technician', { name: 'Eve Tech' });
    const v = await signedIn(owner);

    const p1 = (await v.get('/api/staff?pageSize=2&page=1')).body as ListBody;
    const p2 = (await v.get('/api/staff?pageSize=2&page=2')).body as ListBody;
    const p3 = (await v.get('/api/staff?pageSize=2&page=3')).body as ListBody;
    const p4 = (await v.get('/api/staff?pageSize=2&page=4')).body as ListBody;
    expect(p1.page).toEqual({ number: 1, size: 2, total: 5 });
    expect(p3.page).toEqual({ number: 3, size: 2, total: 5 });
    expect(p1.data.map((u) => u.name)).toEqual(['Ada Owner', 'Bea Tech']);
    expect(p2.data.map((u) => u.name)).toEqual(['Cal Tech', 'Dee Coord']);
    expect(p3.data.map((u) => u.name)).toEqual(['Eve Tech']);
    expect(p4.data).toEqual([]);
    expect(p4.page.total).toBe(5);
  });

  it('sorts by name ascending by default, by -name descending, and by other fields', async () => {
    const firm = await buildFirm();
    const owner = await buildUser(firm, 'owner', { name: 'Mia Owner', email: `z-owner-${firm.id.slice(0, 8)}@test.example` });
    await buildUser(firm, 'technician', { name: 'Abe Tech', email: `m-tech-${firm.id.slice(0, 8)}@test.example` });
    await buildUser(firm, 'coordinator', { name: 'Zoe Coord', email: `a-coord-${firm.id.slice(0, 8)}@test.example` });
    const v = await signedIn(owner);

    const byName = (await v.get('/api/staff')).body as ListBody;
    expect(byName.data.map((u) => u.name)).toEqual(['Abe Tech', 'Mia Owner', 'Zoe Coord']);
    const byNameDesc = (await v.get('/api/staff?sort=-name')).body as ListBody;
    expect(byNameDesc.data.map((u) => u.name)).toEqual(['Zoe Coord', 'Mia Owner', 'Abe Tech']);
    const byEmail = (await v.get('/api/staff?sort=email')).body as ListBody;
    expect(byEmail.data.map((u) => u.name)).toEqual(['Zoe Coord', 'Abe Tech', 'Mia Owner']);
    const byRole = (await v.get('/api/staff?sort=role')).body as ListBody;
    expect(byRole.data.map((u) => u.role)).toEqual(['coordinator', 'owner', 'technician']);
  });

  it('answers 400 naming the field for an unknown sort or a bad page', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const badSort = await v.get('/api/staff?sort=passwordHash');
    expect(badSort.status).toBe(400);
    expect(badSort.body.error.code).toBe('validation_failed');
    expect(badSort.body.error.fields).toHaveProperty('sort');
    const badPage = await v.get('/api/staff?page=0');
    expect(badPage.status).toBe(400);
    expect(badPage.body.error.fields).toHaveProperty('page');
    const hugePage = await v.get('/api/staff?pageSize=1000');
    expect(hugePage.status).toBe(400);
    expect(hugePage.body.error.fields).toHaveProperty('pageSize');
  });

  it('searches name and e-mail with q, within the firm only', async () => {
    const a = await buildFirm();
    const b = await buildFirm();
    const owner = await buildUser(a, 'owner', { name: 'Olive Owner' });
    const marlow = await buildUser(a, 'technician', { name: 'Jonas Marlowe' });
    const byEmail = await buildUser(a, 'coordinator', { name: 'Kit Coord', email: `kit.marlowe.${a.id.slice(0, 8)}@test.example` });
    await buildUser(a, 'technician', { name: 'Nobody Else' });
    const otherFirm = await buildUser(b, 'technician', { name: 'Marlowe From Elsewhere' });
    const v = await signedIn(owner);

    const res = await v.get('/api/staff?q=marlowe');
    expect(res.status).toBe(200);
    const body = res.body as ListBody;
    expect(body.data.map((u) => u.id).sort()).toEqual([marlow.id, byEmail.id].sort());
    expect(body.page.total).toBe(2);
    expect(body.data.some((u) => u.id === otherFirm.id)).toBe(false);

    const none = (await v.get('/api/staff?q=zzz-no-match')).body as ListBody;
    expect(none.data).toEqual([]);
    expect(none.page.total).toBe(0);
  });

  it('treats q as text, not as a pattern or SQL', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await v.get(`/api/staff?q=${encodeURIComponent("' OR 1=1 --")}`);
    expect(res.status).toBe(200);
    expect((res.body as ListBody).data).toEqual([]);
  });

  it('lets coordinators and technicians read the staff list', async () => {
    const a = await buildFirmWithStaff();
    for (const who of [a.coordinator, a.technician]) {
      const v = await signedIn(who);
      const res = await v.get('/api/staff');
      expect(res.status).toBe(200);
      expect((res.body as ListBody).data.map((u) => u.id).sort()).toEqual([a.owner.id, a.coordinator.id, a.technician.id].sort());
    }
  });

  it('shows a client no staff at all', async () => {
    const a = await buildFirmWithStaff();
    const client = await buildUser(a.firm, 'client');
    const v = await signedIn(client);
    const res = await v.get('/api/staff');
    expect(res.status).toBe(200);
    expect((res.body as ListBody).data).toEqual([]);
    expect((res.body as ListBody).page.total).toBe(0);
  });

  it('answers 403 to the operator and 401 when signed out', async () => {
    const operator = await buildUser(null, 'operator');
    const op = await signedIn(operator);
    const res = await op.get('/api/staff');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');

    const anon = await visitor(t.app);
    const out = await anon.get('/api/staff');
    expect(out.status).toBe(401);
    expect(out.body.error.code).toBe('unauthenticated');
  });
});

describe('POST /api/staff/invitations', () => {
  it('lets the owner invite: 201, a pending invitation and an e-mail with the link', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = `new-tech-${firm.id.slice(0, 8)}@test.example`;
    const res = await v.post('/api/staff/invitations', { email: email.toUpperCase(), role: 'technician' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ email, role: 'technician', state: 'pending' });
    expect(res.body.data).not.toHaveProperty('tokenHash');

    const mails = mailsTo(email);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toContain(firm.name);
    expect(mails[0]!.text).toMatch(/http:\/\/mullion\.test\/invitations\/[A-Za-z0-9_-]{20,}/);
    const path = invitationApiPath(email);
    const preview = await (await visitor(t.app)).get(path);
    expect(preview.status).toBe(200);
    expect(preview.body.data).toMatchObject({ email, role: 'technician', firm: { name: firm.name } });

    const row = await Invitation.findOne({ where: { tenantId: firm.id, id: res.body.data.id } });
    expect(row).not.toBeNull();
    expect(row!.invitedById).toBe(owner.id);
    // only the hash is stored
    expect(path).not.toContain(row!.tokenHash);
    const audit = await AuditEvent.findAll({ where: { tenantId: firm.id, action: 'invitation.sent' } });
    expect(audit.map((e) => e.subjectId)).toContain(row!.id);
  });

  it('refuses coordinators and technicians with 403 and sends nothing', async () => {
    const { firm, coordinator, technician } = await buildFirmWithStaff();
    for (const who of [coordinator, technician]) {
      const v = await signedIn(who);
      const email = `by-${who.role}-${firm.id.slice(0, 8)}@test.example`;
      const res = await v.post('/api/staff/invitations', { email, role: 'technician' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      expect(mailsTo(email)).toHaveLength(0);
    }
    expect(await Invitation.count({ where: { tenantId: firm.id } })).toBe(0);
  });

  it('refuses the operator (403) and a signed-out visitor (401)', async () => {
    const operator = await buildUser(null, 'operator');
    const op = await signedIn(operator);
    const res = await op.post('/api/staff/invitations', { email: 'from-operator@test.example', role: 'technician' });
    expect(res.status).toBe(403);
    const anon = await visitor(t.app);
    const out = await anon.post('/api/staff/invitations', { email: 'from-anon@test.example', role: 'technician' });
    expect(out.status).toBe(401);
    expect(mailsTo('from-operator@test.example')).toHaveLength(0);
    expect(mailsTo('from-anon@test.example')).toHaveLength(0);
  });

  it('answers 400 naming the field for a bad role or e-mail', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    for (const role of ['owner', 'operator', 'client', 'boss']) {
      const res = await v.post('/api/staff/invitations', { email: 'x-role@test.example', role });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields)).toEqual(['role']);
    }
    const badEmail = await v.post('/api/staff/invitations', { email: 'not-an-address', role: 'technician' });
    expect(badEmail.status).toBe(400);
    expect(Object.keys(badEmail.body.error.fields)).toEqual(['email']);
    const missing = await v.post('/api/staff/invitations', {});
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['email', 'role']);
    expect(mailsTo('x-role@test.example')).toHaveLength(0);
  });

  it('answers 409 email_taken naming the field for someone already at the inviter’s own firm', async () => {
    const a = await buildFirmWithStaff();
    const v = await signedIn(a.owner);
    const res = await v.post('/api/staff/invitations', { email: a.technician.email.toUpperCase(), role: 'coordinator' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.message).toBe(`${a.technician.email} is already on your staff. Invite another address, or change their role on the staff page.`);
    expect(res.body.error.fields).toEqual({ email: 'This address is already on your staff.' });
    expect(await Invitation.count({ where: { tenantId: a.firm.id } })).toBe(0);
  });

  it('invites an address with a sign-in at another firm exactly like a new address (nothing about the other firm shows)', async () => {
    const a = await buildFirmWithStaff();
    const b = await buildFirmWithStaff();
    const v = await signedIn(a.owner);
    const elsewhere = await v.post('/api/staff/invitations', { email: b.coordinator.email.toUpperCase(), role: 'technician' });
    const fresh = await v.post('/api/staff/invitations', { email: `fresh-${a.firm.id.slice(0, 8)}@test.example`, role: 'technician' });
    expect(elsewhere.status).toBe(201);
    expect(fresh.status).toBe(201);
    expect(Object.keys(elsewhere.body.data).sort()).toEqual(Object.keys(fresh.body.data).sort());
    expect(elsewhere.body.data).toMatchObject({ email: b.coordinator.email, role: 'technician', state: fresh.body.data.state });
    // The same invitation e-mail goes out; what happens at acceptance is told to the invitee at the link.
    const mail = mailsTo(b.coordinator.email).at(-1)!;
    expect(mail.subject).toBe(`${a.firm.name} invited you to Mullion`);
    const list = await v.get('/api/staff/invitations');
    expect((list.body as { data: { email: string }[] }).data.map((i) => i.email)).toContain(b.coordinator.email);
    // The other firm's person is untouched.
    expect(await User.count({ where: { tenantId: b.firm.id, id: b.coordinator.id, email: b.coordinator.email } })).toBe(1);
  });

  it('replaces a pending invitation to the same address: only the newest link works', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = `twice-${firm.id.slice(0, 8)}@test.example`;
    await v.post('/api/staff/invitations', { email, role: 'technician' }).expect(201);
    const first = invitationApiPath(email);
    await v.post('/api/staff/invitations', { email, role: 'coordinator' }).expect(201);
    const second = invitationApiPath(email);
    expect(second).not.toBe(first);
    const anon = await visitor(t.app);
    expect((await anon.get(first)).status).toBe(404);
    const ok = await anon.get(second);
    expect(ok.status).toBe(200);
    expect(ok.body.data.role).toBe('coordinator');
    const list = (await v.get('/api/staff/invitations')).body.data as { email: string }[];
    expect(list.filter((i) => i.email === email)).toHaveLength(1);
  });
});

describe('GET /api/staff/invitations', () => {
  it('lists the firm’s pending staff invitations for the owner, never another firm’s', async () => {
    const a = await buildFirmWithStaff();
    const b = await buildFirmWithStaff();
    const va = await signedIn(a.owner);
    const vb = await signedIn(b.owner);
    await va.post('/api/staff/invitations', { email: `pending-a-${a.firm.id.slice(0, 8)}@test.example`, role: 'technician' }).expect(201);
    await vb.post('/api/staff/invitations', { email: `pending-b-${b.firm.id.slice(0, 8)}@test.example`, role: 'coordinator' }).expect(201);

    const res = await va.get('/api/staff/invitations');
    expect(res.status).toBe(200);
    expect(res.body.page).toEqual({ number: 1, size: 200, total: 1 });
    expect(res.body.data).toHaveLength(1);
    expect(res.body.data[0]).toMatchObject({ email: `pending-a-${a.firm.id.slice(0, 8)}@test.example`, role: 'technician', state: 'pending' });
  });

  it('drops accepted and revoked invitations from the list', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const accepted = `accepted-${firm.id.slice(0, 8)}@test.example`;
    const revoked = `revoked-${firm.id.slice(0, 8)}@test.example`;
    const pending = `pending-${firm.id.slice(0, 8)}@test.example`;
    await v.post('/api/staff/invitations', { email: accepted, role: 'technician' }).expect(201);
    const r = await v.post('/api/staff/invitations', { email: revoked, role: 'technician' }).expect(201);
    await v.post('/api/staff/invitations', { email: pending, role: 'coordinator' }).expect(201);
    const invitee = await visitor(t.app);
    await invitee.post(`${invitationApiPath(accepted)}/accept`, { name: 'Accepted Person', password: 'a long enough password' }).expect(201);
    await v.delete(`/api/staff/invitations/${r.body.data.id as string}`).expect(204);

    const list = (await v.get('/api/staff/invitations')).body.data as { email: string }[];
    expect(list.map((i) => i.email)).toEqual([pending]);
  });

  it('answers 403 to a technician and shows a coordinator no staff invitations', async () => {
    const { firm, owner, coordinator, technician } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    await vo.post('/api/staff/invitations', { email: `hidden-${firm.id.slice(0, 8)}@test.example`, role: 'technician' }).expect(201);
    const vt = await signedIn(technician);
    const tech = await vt.get('/api/staff/invitations');
    expect(tech.status).toBe(403);
    const vc = await signedIn(coordinator);
    const coord = await vc.get('/api/staff/invitations');
    expect(coord.status).toBe(200);
    expect(coord.body.data).toEqual([]);
  });
});

describe('POST /api/staff/invitations/:id/resend and DELETE /api/staff/invitations/:id', () => {
  it('resend: sends a fresh link; the old one stops working and the new one works', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = `resend-${firm.id.slice(0, 8)}@test.example`;
    const created = await v.post('/api/staff/invitations', { email, role: 'technician' }).expect(201);
    const oldPath = invitationApiPath(email);

    const res = await v.post(`/api/staff/invitations/${created.body.data.id as string}/resend`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: created.body.data.id, state: 'pending' });
    expect(mailsTo(email)).toHaveLength(2);
    const newPath = invitationApiPath(email);
    expect(newPath).not.toBe(oldPath);

    const anon = await visitor(t.app);
    const old = await anon.get(oldPath);
    expect(old.status).toBe(404);
    expect(old.body.error.message).toMatch(/no longer valid/);
    const oldAccept = await anon.post(`${oldPath}/accept`, { name: 'Old Link', password: 'a long enough password' });
    expect(oldAccept.status).toBe(404);
    expect((await anon.get(newPath)).status).toBe(200);
    const accept = await anon.post(`${newPath}/accept`, { name: 'New Link', password: 'a long enough password' });
    expect(accept.status).toBe(201);
  });

  it('resend renews an expired invitation’s expiry', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = `renew-${firm.id.slice(0, 8)}@test.example`;
    const created = await v.post('/api/staff/invitations', { email, role: 'technician' }).expect(201);
    const start = t.clock.now;
    try {
      t.clock.now = new Date(start.getTime() + 8 * 24 * 60 * 60 * 1000);
      const anon = await visitor(t.app);
      expect((await anon.get(invitationApiPath(email))).status).toBe(404);
      const res = await v.post(`/api/staff/invitations/${created.body.data.id as string}/resend`);
      expect(res.status).toBe(200);
      expect(new Date(res.body.data.expiresAt as string).getTime()).toBeGreaterThan(t.clock.now.getTime());
      expect((await anon.get(invitationApiPath(email))).status).toBe(200);
    } finally {
      t.clock.now = start;
    }
  });

  it('revoke: 204, the link stops working and cannot be accepted', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = `revoke-${firm.id.slice(0, 8)}@test.example`;
    const created = await v.post('/api/staff/invitations', { email, role: 'coordinator' }).expect(201);
    const path = invitationApiPath(email);
    const anon = await visitor(t.app);
    expect((await anon.get(path)).status).toBe(200);

    const res = await v.delete(`/api/staff/invitations/${created.body.data.id as string}`);
    expect(res.status).toBe(204);
    expect((await anon.get(path)).status).toBe(404);
    const accept = await anon.post(`${path}/accept`, { name: 'Too Late', password: 'a long enough password' });
    expect(accept.status).toBe(404);
    expect(await User.count({ where: { email }, crossTenant: true })).toBe(0);
    const row = await Invitation.findOne({ where: { tenantId: firm.id, id: created.body.data.id as string } });
    expect(row!.revokedAt).not.toBeNull();
  });

  it('refuses resend and revoke of an accepted invitation with 409', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const email = `used-${firm.id.slice(0, 8)}@test.example`;
    const created = await v.post('/api/staff/invitations', { email, role: 'technician' }).expect(201);
    await (await visitor(t.app)).post(`${invitationApiPath(email)}/accept`, { name: 'Used', password: 'a long enough password' }).expect(201);
    const id = created.body.data.id as string;
    expect((await v.post(`/api/staff/invitations/${id}/resend`)).status).toBe(409);
    expect((await v.delete(`/api/staff/invitations/${id}`)).status).toBe(409);
    expect(mailsTo(email)).toHaveLength(1);
  });

  it('answers coordinators and technicians 404 (staff invitations are not theirs to read) and leaves the invitation working', async () => {
    const { firm, owner, coordinator, technician } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    const email = `guarded-${firm.id.slice(0, 8)}@test.example`;
    const created = await vo.post('/api/staff/invitations', { email, role: 'technician' }).expect(201);
    const id = created.body.data.id as string;
    const path = invitationApiPath(email);
    for (const who of [coordinator, technician]) {
      const v = await signedIn(who);
      const resend = await v.post(`/api/staff/invitations/${id}/resend`);
      const revoke = await v.delete(`/api/staff/invitations/${id}`);
      // neither role may read staff invitations, so the record is not there for them: 404
      expect(resend.status).toBe(404);
      expect(revoke.status).toBe(404);
    }
    expect(mailsTo(email)).toHaveLength(1);
    expect((await (await visitor(t.app)).get(path)).status).toBe(200);
  });

  it('answers 404 for an unknown invitation id and 400 for a malformed one', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const unknown = await v.post('/api/staff/invitations/00000000-0000-4000-8000-000000000000/resend');
    expect(unknown.status).toBe(404);
    const malformed = await v.delete('/api/staff/invitations/not-a-uuid');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toHaveProperty('invitationId');
  });
});

describe('PATCH /api/staff/:userId', () => {
  it('a role change takes effect on that person’s next request', async () => {
    const { owner, technician } = await buildFirmWithStaff();
    const vt = await signedIn(technician);
    const before = await vt.get('/api/session');
    expect(before.body.user.role).toBe('technician');
    const beforeRules = before.body.rules as { subject: string }[];
    expect(beforeRules.some((r) => r.subject === 'Invitation')).toBe(false);
    expect((await vt.get('/api/staff/invitations')).status).toBe(403);

    const vo = await signedIn(owner);
    const res = await vo.patch(`/api/staff/${technician.id}`, { role: 'coordinator' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: technician.id, role: 'coordinator', active: true });

    const after = await vt.get('/api/session');
    expect(after.status).toBe(200);
    expect(after.body.user.role).toBe('coordinator');
    const afterRules = after.body.rules as { subject: string; conditions?: Record<string, unknown> }[];
    expect(afterRules.some((r) => r.subject === 'Invitation' && r.conditions?.role === 'client')).toBe(true);
    expect((await vt.get('/api/staff/invitations')).status).toBe(200);

    const stored = await User.findOne({ where: { tenantId: technician.tenantId!, id: technician.id } });
    expect(stored!.role).toBe('coordinator');
    const audit = await AuditEvent.findAll({ where: { tenantId: technician.tenantId!, subjectId: technician.id } });
    expect(audit.map((e) => e.action)).toContain('staff.role_changed');
  });

  it('a coordinator demoted to technician loses invitation rights on the next request', async () => {
    const { owner, coordinator } = await buildFirmWithStaff();
    const vc = await signedIn(coordinator);
    expect((await vc.get('/api/staff/invitations')).status).toBe(200);
    const vo = await signedIn(owner);
    await vo.patch(`/api/staff/${coordinator.id}`, { role: 'technician' }).expect(200);
    expect((await vc.get('/api/staff/invitations')).status).toBe(403);
    expect((await vc.get('/api/session')).body.user.role).toBe('technician');
  });

  it('deactivation ends that person’s session on the next request (403 user_deactivated) and blocks sign-in', async () => {
    const { firm, owner, technician } = await buildFirmWithStaff();
    const vt = await signedIn(technician);
    expect((await vt.get('/api/staff')).status).toBe(200);

    const vo = await signedIn(owner);
    const res = await vo.patch(`/api/staff/${technician.id}`, { active: false });
    expect(res.status).toBe(200);
    expect(res.body.data.active).toBe(false);
    expect(res.body.data.deactivatedAt).not.toBeNull();

    const next = await vt.get('/api/staff');
    expect(next.status).toBe(403);
    expect(next.body.error.code).toBe('user_deactivated');
    // signed out by the refusal: the request after that is plainly unauthenticated
    expect((await vt.get('/api/staff')).status).toBe(401);

    const again = await visitor(t.app);
    const signIn = await again.post('/api/session', { email: technician.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(403);
    expect(signIn.body.error.code).toBe('user_deactivated');

    // records stay
    const stored = await User.findOne({ where: { tenantId: firm.id, id: technician.id } });
    expect(stored).not.toBeNull();
    expect(stored!.deactivatedAt).not.toBeNull();
  });

  it('reactivation lets the person sign in again', async () => {
    const { owner, technician } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    await vo.patch(`/api/staff/${technician.id}`, { active: false }).expect(200);
    const res = await vo.patch(`/api/staff/${technician.id}`, { active: true });
    expect(res.status).toBe(200);
    expect(res.body.data.active).toBe(true);
    const v = await visitor(t.app);
    expect((await v.signIn(technician.email, TEST_PASSWORD)).status).toBe(200);
  });

  it('the owner cannot change their own role or deactivate themselves (400)', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    const role = await vo.patch(`/api/staff/${owner.id}`, { role: 'technician' });
    expect(role.status).toBe(400);
    expect(role.body.error.code).toBe('validation_failed');
    expect(role.body.error.fields).toHaveProperty('role');
    const off = await vo.patch(`/api/staff/${owner.id}`, { active: false });
    expect(off.status).toBe(400);
    const stored = await User.findOne({ where: { tenantId: firm.id, id: owner.id } });
    expect(stored!.role).toBe('owner');
    expect(stored!.deactivatedAt).toBeNull();
    expect((await vo.get('/api/session')).body.user.role).toBe('owner');
  });

  it('answers 400 naming the field for a bad role, an empty body or a malformed id', async () => {
    const { owner, technician } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    const toOwner = await vo.patch(`/api/staff/${technician.id}`, { role: 'owner' });
    expect(toOwner.status).toBe(400);
    expect(toOwner.body.error.fields).toHaveProperty('role');
    const empty = await vo.patch(`/api/staff/${technician.id}`, {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty('role');
    const badActive = await vo.patch(`/api/staff/${technician.id}`, { active: 'no' });
    expect(badActive.status).toBe(400);
    expect(badActive.body.error.fields).toHaveProperty('active');
    const badId = await vo.patch('/api/staff/12345', { role: 'coordinator' });
    expect(badId.status).toBe(400);
    expect(badId.body.error.fields).toHaveProperty('userId');
  });

  it('refuses coordinators and technicians with 403 and changes nothing', async () => {
    const { firm, coordinator, technician } = await buildFirmWithStaff();
    const other = await buildUser(firm, 'technician');
    for (const who of [coordinator, technician]) {
      const v = await signedIn(who);
      const res = await v.patch(`/api/staff/${other.id}`, { role: 'coordinator' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      const off = await v.delete(`/api/staff/${other.id}`);
      expect(off.status).toBe(403);
    }
    const self = await signedIn(technician);
    expect((await self.patch(`/api/staff/${technician.id}`, { role: 'coordinator' })).status).toBe(403);
    const stored = await User.findOne({ where: { tenantId: firm.id, id: other.id } });
    expect(stored!.role).toBe('technician');
    expect(stored!.deactivatedAt).toBeNull();
  });

  it('answers 404 for another firm’s user id, and for a client of the own firm', async () => {
    const a = await buildFirmWithStaff();
    const b = await buildFirmWithStaff();
    const client = await buildUser(a.firm, 'client');
    const vo = await signedIn(a.owner);
    const res = await vo.patch(`/api/staff/${b.technician.id}`, { role: 'coordinator' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect((await vo.patch(`/api/staff/${client.id}`, { active: false })).status).toBe(404);
    expect((await vo.patch('/api/staff/00000000-0000-4000-8000-000000000000', { active: false })).status).toBe(404);
    const stored = await User.findOne({ where: { tenantId: b.firm.id, id: b.technician.id } });
    expect(stored!.role).toBe('technician');
  });

  it('answers 403 to the operator', async () => {
    const { technician } = await buildFirmWithStaff();
    const op = await signedIn(await buildUser(null, 'operator'));
    expect((await op.patch(`/api/staff/${technician.id}`, { active: false })).status).toBe(403);
    expect((await op.delete(`/api/staff/${technician.id}`)).status).toBe(403);
  });
});

describe('DELETE /api/staff/:userId', () => {
  it('deactivates the person (records stay) and they cannot sign in', async () => {
    const { firm, owner, coordinator } = await buildFirmWithStaff();
    const vc = await signedIn(coordinator);
    const vo = await signedIn(owner);
    const res = await vo.delete(`/api/staff/${coordinator.id}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: coordinator.id, active: false });

    const stored = await User.findOne({ where: { tenantId: firm.id, id: coordinator.id } });
    expect(stored).not.toBeNull();
    expect(stored!.deactivatedAt).not.toBeNull();
    const list = (await vo.get('/api/staff')).body as ListBody;
    expect(list.data.find((u) => u.id === coordinator.id)?.active).toBe(false);

    const next = await vc.get('/api/session');
    expect(next.status).toBe(403);
    expect(next.body.error.code).toBe('user_deactivated');
    const again = await visitor(t.app);
    const signIn = await again.post('/api/session', { email: coordinator.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(403);
    expect(signIn.body.error.code).toBe('user_deactivated');
    const audit = await AuditEvent.findAll({ where: { tenantId: firm.id, subjectId: coordinator.id } });
    expect(audit.map((e) => e.action)).toContain('staff.deactivated');
  });

  it('refuses the owner deactivating themselves (400)', async () => {
    const { owner } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    const res = await vo.delete(`/api/staff/${owner.id}`);
    expect(res.status).toBe(400);
    expect((await vo.get('/api/session')).body.user.id).toBe(owner.id);
  });
});
