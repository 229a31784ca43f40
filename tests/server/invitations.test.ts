import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Invitation } from '@server/models/Invitation';
import { User } from '@server/models/User';
import { createTestApp, linkFromMail, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let realNow: Date;
beforeAll(async () => {
  t = await createTestApp();
  realNow = t.clock.now;
});
afterEach(() => {
  t.clock.now = realNow;
});
afterAll(async () => {
  await t.close();
});

const NEW_PASSWORD = 'an invitee password';
const DAY_MS = 24 * 60 * 60 * 1000;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

/** A firm whose owner has invited `email` as `role`; returns the token path under /api. */
async function invited(role: 'technician' | 'coordinator' = 'technician') {
  const staff = await buildFirmWithStaff();
  const email = `invitee-${crypto.randomUUID().slice(0, 8)}@test.example`;
  const owner = await signedIn(staff.owner);
  const res = await owner.post('/api/staff/invitations', { email, role });
  expect(res.status).toBe(201);
  const path = `/api${linkFromMail(t.outbox, email, '/invitations/')}`;
  return { ...staff, ownerVisitor: owner, email, path, invitationId: res.body.data.id as string };
}

describe('GET /api/invitations/:token (public preview)', () => {
  it('shows the firm name, role and e-mail to a signed-out visitor', async () => {
    const { firm, email, path } = await invited('coordinator');
    const anon = await visitor(t.app);
    const res = await anon.get(path);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      firm: { name: firm.name },
      email,
      role: 'coordinator',
      roleLabel: 'Coordinator',
    });
    expect(new Date(res.body.data.expiresAt as string).getTime()).toBeGreaterThan(Date.now() + 6 * DAY_MS);
    // a preview says nothing more about the firm than its public portal branding
    expect(Object.keys(res.body.data.firm as object).sort()).toEqual(['accentColor', 'accentColorReadable', 'logoUrl', 'monitoringCenterPhone', 'name', 'phone', 'shortName']);
  });

  it('answers 404 for a well-formed token that was never issued', async () => {
    const anon = await visitor(t.app);
    const res = await anon.get(`/api/invitations/${'A'.repeat(43)}`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.error.message).toMatch(/no longer valid/);
  });

  it('answers 400 for a malformed token', async () => {
    const anon = await visitor(t.app);
    for (const bad of ['short', 'has.dots.and.more.characters.than.twenty', `${'x'.repeat(101)}`]) {
      const res = await anon.get(`/api/invitations/${bad}`);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields).toHaveProperty('token');
    }
    const accept = await anon.post('/api/invitations/bad!token/accept', { name: 'X', password: NEW_PASSWORD });
    expect(accept.status).toBe(400);
    expect(accept.body.error.fields).toHaveProperty('token');
  });
});

describe('POST /api/invitations/:token/accept', () => {
  it('creates the sign-in with the invited role and signs the invitee in', async () => {
    const { firm, email, path, invitationId } = await invited('coordinator');
    const v = await visitor(t.app);
    const res = await v.post(`${path}/accept`, { name: '  Nell Invitee  ', password: NEW_PASSWORD });
    expect(res.status).toBe(201);
    expect(res.body.data.user).toMatchObject({ email, name: 'Nell Invitee', role: 'coordinator', tenantId: firm.id });
    expect(res.body.data.tenant).toMatchObject({ id: firm.id, name: firm.name });

    const session = await v.session();
    expect(session.body.user).toMatchObject({ email, role: 'coordinator', tenantId: firm.id });
    expect(session.body.tenant.id).toBe(firm.id);
    // the invitee now works in the firm with the invited role
    expect((await v.get('/api/staff')).status).toBe(200);
    expect((await v.get('/api/staff/invitations')).status).toBe(200);

    const user = await User.findOne({ where: { tenantId: firm.id, email } });
    expect(user).not.toBeNull();
    expect(user!.passwordHash).toMatch(/^scrypt\$/);
    const invitation = await Invitation.findOne({ where: { tenantId: firm.id, id: invitationId } });
    expect(invitation!.acceptedAt).not.toBeNull();
    expect(invitation!.acceptedUserId).toBe(user!.id);
    const audit = await AuditEvent.findAll({ where: { tenantId: firm.id, action: 'invitation.accepted' } });
    expect(audit.map((a) => a.subjectId)).toContain(user!.id);

    // and can sign in again later with the chosen password
    await v.delete('/api/session').expect(204);
    const again = await visitor(t.app);
    expect((await again.signIn(email, NEW_PASSWORD)).status).toBe(200);
  });

  it('a technician invitee gets the technician’s rights, no more', async () => {
    const { path } = await invited('technician');
    const v = await visitor(t.app);
    await v.post(`${path}/accept`, { name: 'Tess Tech', password: NEW_PASSWORD }).expect(201);
    await v.session();
    expect((await v.get('/api/session')).body.user.role).toBe('technician');
    expect((await v.get('/api/staff/invitations')).status).toBe(403);
    expect((await v.post('/api/staff/invitations', { email: 'x-tess@test.example', role: 'technician' })).status).toBe(403);
  });

  it('refuses the same token a second time (404, no longer valid) and creates no second user', async () => {
    const { firm, email, path } = await invited();
    const first = await visitor(t.app);
    await first.post(`${path}/accept`, { name: 'First', password: NEW_PASSWORD }).expect(201);
    const second = await visitor(t.app);
    const preview = await second.get(path);
    expect(preview.status).toBe(404);
    expect(preview.body.error.message).toMatch(/no longer valid/);
    const res = await second.post(`${path}/accept`, { name: 'Second', password: 'another password 123' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.body.error.message).toMatch(/no longer valid/);
    expect(await User.count({ where: { tenantId: firm.id, email } })).toBe(1);
    // the second visitor is not signed in
    await second.session();
    expect((await second.get('/api/session')).body.user).toBeNull();
    // the password set first still stands
    expect((await (await visitor(t.app)).signIn(email, 'another password 123')).status).toBe(401);
  });

  it('refuses two accepts racing on one token: exactly one wins', async () => {
    const { firm, email, path } = await invited();
    const [a, b] = [await visitor(t.app), await visitor(t.app)];
    const results = await Promise.all([
      a.post(`${path}/accept`, { name: 'Racer A', password: NEW_PASSWORD }),
      b.post(`${path}/accept`, { name: 'Racer B', password: NEW_PASSWORD }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 404]);
    expect(await User.count({ where: { tenantId: firm.id, email } })).toBe(1);
  });

  it('refuses an expired token (older than 7 days)', async () => {
    const { firm, email, path } = await invited();
    t.clock.now = new Date(realNow.getTime() + 7 * DAY_MS - 60_000);
    const v = await visitor(t.app);
    expect((await v.get(path)).status).toBe(200);

    t.clock.now = new Date(realNow.getTime() + 7 * DAY_MS + 60_000);
    const preview = await v.get(path);
    expect(preview.status).toBe(404);
    expect(preview.body.error.message).toMatch(/no longer valid/);
    const res = await v.post(`${path}/accept`, { name: 'Late', password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/no longer valid/);
    expect(await User.count({ where: { tenantId: firm.id, email } })).toBe(0);
  });

  it('refuses a revoked token', async () => {
    const { firm, email, path, ownerVisitor, invitationId } = await invited();
    await ownerVisitor.delete(`/api/staff/invitations/${invitationId}`).expect(204);
    const v = await visitor(t.app);
    expect((await v.get(path)).status).toBe(404);
    const res = await v.post(`${path}/accept`, { name: 'Revoked', password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/no longer valid/);
    expect(await User.count({ where: { tenantId: firm.id, email } })).toBe(0);
  });

  it('refuses an invitation of a suspended firm (403 firm_suspended)', async () => {
    const { firm, email, path } = await invited();
    await firm.update({ state: 'suspended' });
    const v = await visitor(t.app);
    const res = await v.post(`${path}/accept`, { name: 'Suspended', password: NEW_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('firm_suspended');
    expect(await User.count({ where: { tenantId: firm.id, email } })).toBe(0);
  });

  it('explains to the invitee, at the link, that an address with a sign-in at another firm cannot join; nothing is created', async () => {
    const other = await buildFirmWithStaff();
    const staff = await buildFirmWithStaff();
    const owner = await signedIn(staff.owner);
    expect((await owner.post('/api/staff/invitations', { email: other.technician.email, role: 'coordinator' })).status).toBe(201);
    const path = `/api${linkFromMail(t.outbox, other.technician.email, '/invitations/')}`;
    const v = await visitor(t.app);
    const preview = await v.get(path);
    expect(preview.status).toBe(200);
    expect(preview.body.data.hasSignIn).toBe(true);
    expect(preview.body.data.notice).toBe(
      `${other.technician.email} already has a Mullion sign-in, and one address is one sign-in, so ${staff.firm.name} cannot add it as well. Sign in with it as usual, or ask ${staff.firm.name} to invite another of your addresses.`,
    );
    const res = await v.post(`${path}/accept`, { name: 'Clash', password: NEW_PASSWORD });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.message).toBe(preview.body.data.notice);
    expect(await User.count({ where: { email: other.technician.email }, crossTenant: true })).toBe(1);
    expect(await User.count({ where: { tenantId: other.firm.id, id: other.technician.id, email: other.technician.email } })).toBe(1);
  });

  it('a new address’s preview says it has no sign-in yet', async () => {
    const { path } = await invited();
    const preview = await (await visitor(t.app)).get(path);
    expect(preview.body.data.hasSignIn).toBe(false);
    expect(preview.body.data).not.toHaveProperty('notice');
  });

  it('answers 409 email_taken when the address got a sign-in elsewhere meanwhile, and keeps the link unused', async () => {
    const { firm, email, path, invitationId } = await invited();
    const other = await buildFirmWithStaff();
    await buildUser(other.firm, 'technician', { email });
    const v = await visitor(t.app);
    const res = await v.post(`${path}/accept`, { name: 'Clash', password: NEW_PASSWORD });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.message).toMatch(/already has a Mullion sign-in/);
    const invitation = await Invitation.findOne({ where: { tenantId: firm.id, id: invitationId } });
    expect(invitation!.acceptedAt).toBeNull();
  });

  it('answers 400 naming password for a short password, and name for a missing name', async () => {
    const { firm, email, path } = await invited();
    const v = await visitor(t.app);
    const short = await v.post(`${path}/accept`, { name: 'Shorty', password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.code).toBe('validation_failed');
    expect(Object.keys(short.body.error.fields)).toEqual(['password']);
    const noName = await v.post(`${path}/accept`, { name: '   ', password: NEW_PASSWORD });
    expect(noName.status).toBe(400);
    expect(Object.keys(noName.body.error.fields)).toEqual(['name']);
    expect(await User.count({ where: { tenantId: firm.id, email } })).toBe(0);
    // the link still works after bad input
    expect((await v.post(`${path}/accept`, { name: 'Fixed', password: NEW_PASSWORD })).status).toBe(201);
  });
});
