import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invitation } from '@server/models/Invitation';
import { User } from '@server/models/User';
import { createTestApp, linkFromMail, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

/** The API address of an invitation from the portal link in the e-mail (/p/<firm>/invitations/<token>). */
const apiPathOf = (link: string) => `/api/invitations/${link.split('/').pop()!}`;

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const NEW_PASSWORD = 'a homeowner password';
const newEmail = () => `home-${crypto.randomUUID().slice(0, 8)}@clients.example`;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

describe('client invitations', () => {
  it('a coordinator invites a homeowner; the e-mail names the firm and links to its portal address', async () => {
    const f = await buildFirmWithSite();
    const email = newEmail();
    const coord = await signedIn(f.coordinator);
    const res = await coord.post(`/api/clients/${f.client.id}/invitations`, { email });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ email, role: 'client', state: 'pending', clientId: f.client.id });
    const mail = [...t.outbox].reverse().find((m) => m.to === email)!;
    expect(mail.subject).toContain(f.firm.name);
    expect(mail.text).toContain(f.firm.name);
    expect(linkFromMail(t.outbox, email, '/invitations/')).toMatch(new RegExp(`^/p/${f.firm.shortName}/invitations/[A-Za-z0-9_-]+$`));

    const list = await coord.get(`/api/clients/${f.client.id}/invitations`);
    expect(list.status).toBe(200);
    expect((list.body.data as { id: string }[]).map((i) => i.id)).toEqual([res.body.data.id]);
    // the staff list does not show client invitations
    const owner = await signedIn(f.owner);
    const staffList = await owner.get('/api/staff/invitations');
    expect((staffList.body.data as { id: string }[]).map((i) => i.id)).not.toContain(res.body.data.id);
  });

  it('accepting signs in a client linked to the client record', async () => {
    const f = await buildFirmWithSite();
    const email = newEmail();
    const owner = await signedIn(f.owner);
    await owner.post(`/api/clients/${f.client.id}/invitations`, { email }).expect(201);
    const path = apiPathOf(linkFromMail(t.outbox, email, '/invitations/'));
    const v = await visitor(t.app);
    const res = await v.post(`${path}/accept`, { name: 'Hana Homeowner', password: NEW_PASSWORD });
    expect(res.status).toBe(201);
    expect(res.body.data.user).toMatchObject({ email, role: 'client', tenantId: f.firm.id });
    const session = await v.session();
    expect(session.body.user).toMatchObject({ email, role: 'client' });
    const user = await User.findOne({ where: { tenantId: f.firm.id, email } });
    expect(user!.role).toBe('client');
    expect(user!.clientId).toBe(f.client.id);
    // and reaches the client's sites in the portal
    const portal = await v.get('/api/portal/sites');
    expect(portal.status).toBe(200);
    expect((portal.body.data as { id: string }[]).map((s) => s.id)).toEqual([f.site.id]);
    // it is no longer pending
    const list = await owner.get(`/api/clients/${f.client.id}/invitations`);
    expect(list.body.data).toEqual([]);
  });

  it('a revoked invitation cannot be accepted; a resent one replaces the old link', async () => {
    const f = await buildFirmWithSite();
    const email = newEmail();
    const coord = await signedIn(f.coordinator);
    const created = await coord.post(`/api/clients/${f.client.id}/invitations`, { email });
    const firstPath = apiPathOf(linkFromMail(t.outbox, email, '/invitations/'));
    const id = created.body.data.id as string;

    const resent = await coord.post(`/api/clients/${f.client.id}/invitations/${id}/resend`);
    expect(resent.status).toBe(200);
    const secondPath = apiPathOf(linkFromMail(t.outbox, email, '/invitations/'));
    expect(secondPath).not.toBe(firstPath);
    expect((await (await visitor(t.app)).get(firstPath)).status).toBe(404);

    expect((await coord.delete(`/api/clients/${f.client.id}/invitations/${id}`)).status).toBe(204);
    const v = await visitor(t.app);
    const res = await v.post(`${secondPath}/accept`, { name: 'Late', password: NEW_PASSWORD });
    expect(res.status).toBe(404);
    expect(await User.count({ where: { email }, crossTenant: true })).toBe(0);
    const inv = await Invitation.findOne({ where: { tenantId: f.firm.id, id } });
    expect(inv!.revokedAt).not.toBeNull();
  });

  it('an e-mail with a sign-in at this firm → 409 email_taken naming the field', async () => {
    const f = await buildFirmWithSite();
    const coord = await signedIn(f.coordinator);
    const res = await coord.post(`/api/clients/${f.client.id}/invitations`, { email: f.technician.email });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.fields).toHaveProperty('email');
  });

  it('an e-mail with a sign-in at another firm is invited like any other (201, the portal invitation e-mail)', async () => {
    const f = await buildFirmWithSite();
    const other = await buildFirmWithStaff();
    const coord = await signedIn(f.coordinator);
    const res = await coord.post(`/api/clients/${f.client.id}/invitations`, { email: other.owner.email });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ email: other.owner.email, clientId: f.client.id });
    expect(t.outbox.filter((m) => m.to === other.owner.email)).toHaveLength(1);
  });

  it('bad e-mail → 400 naming email; another firm’s client or an unknown id → 404', async () => {
    const f = await buildFirmWithSite();
    const other = await buildFirmWithStaff();
    const otherClient = await buildClient(other.firm);
    const coord = await signedIn(f.coordinator);
    const bad = await coord.post(`/api/clients/${f.client.id}/invitations`, { email: 'not-an-email' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('email');
    expect((await coord.post(`/api/clients/${otherClient.id}/invitations`, { email: newEmail() })).status).toBe(404);
    expect((await coord.get(`/api/clients/${otherClient.id}/invitations`)).status).toBe(404);
    expect((await coord.post(`/api/clients/${crypto.randomUUID()}/invitations`, { email: newEmail() })).status).toBe(404);

    // an invitation of another client of the same firm is not reachable through this client
    const sibling = await buildClient(f.firm);
    const inv = await coord.post(`/api/clients/${sibling.id}/invitations`, { email: newEmail() });
    expect((await coord.delete(`/api/clients/${f.client.id}/invitations/${inv.body.data.id}`)).status).toBe(404);
  });

  it('technician → 403, client sign-in → 404, signed out → 401', async () => {
    const f = await buildFirmWithSite();
    const tech = await signedIn(f.technician);
    expect((await tech.post(`/api/clients/${f.client.id}/invitations`, { email: newEmail() })).status).toBe(403);
    const client = await signedIn(f.clientUser);
    expect((await client.post(`/api/clients/${f.client.id}/invitations`, { email: newEmail() })).status).toBe(403);
    expect((await client.get(`/api/clients/${f.client.id}/invitations`)).status).toBe(404);
    const anon = await visitor(t.app);
    expect((await anon.post(`/api/clients/${f.client.id}/invitations`, { email: newEmail() })).status).toBe(401);
    const operator = await signedIn(await buildUser(null, 'operator'));
    expect((await operator.get(`/api/clients/${f.client.id}/invitations`)).status).toBe(403);
  });
});
