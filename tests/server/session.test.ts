import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import { SignupRequest } from '@server/models/SignupRequest';
import { createTestApp, linkFromMail, visitor, type TestApp } from '../support/test-app';
import { buildClient, buildClientUser, buildFirm, buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/health', () => {
  it('answers ok once the database answers', async () => {
    const v = await visitor(t.app);
    const res = await v.get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true });
  });
});

describe('GET /api/session', () => {
  it('hands a signed-out visitor a CSRF token and no user', async () => {
    const v = await visitor(t.app);
    const res = await v.get('/api/session');
    expect(res.status).toBe(200);
    expect(res.body.user).toBeNull();
    expect(res.body.tenant).toBeNull();
    expect(res.body.rules).toEqual([]);
    expect(typeof res.body.csrfToken).toBe('string');
    expect(res.body.csrfToken.length).toBeGreaterThan(20);
  });
});

const SIGN_UP = { firmName: 'Quarry Hill Alarms', name: 'Rosa Quarry', email: 'Rosa@Quarryhill.example', password: 'a long enough password' };

/** The confirmation link in the last e-mail to this address, as an API path. */
function confirmationToken(to: string): string {
  return linkFromMail(t.outbox, to, '/sign-up/confirm/').split('/').pop()!;
}

describe('POST /api/signup', () => {
  it('answers 202 "check your inbox", creates no firm yet, and e-mails a confirmation link to a new address', async () => {
    const v = await visitor(t.app);
    const tenantsBefore = await Tenant.count();
    const res = await v.post('/api/signup', SIGN_UP);
    await t.flushMail();
    expect(res.status).toBe(202);
    expect(res.body.data).toEqual({
      email: 'rosa@quarryhill.example',
      message: 'Check your inbox at rosa@quarryhill.example for a link to finish setting up your firm.',
    });
    expect(await Tenant.count()).toBe(tenantsBefore);
    expect(await User.count({ where: { email: 'rosa@quarryhill.example' }, crossTenant: true })).toBe(0);
    await v.session();
    expect((await v.get('/api/session')).body.user).toBeNull();

    const mail = t.outbox.at(-1)!;
    expect(mail.to).toBe('rosa@quarryhill.example');
    expect(mail.subject).toBe('Finish setting up Quarry Hill Alarms on Mullion');
    expect(mail.text).toMatch(/14-day trial/);
    const request = await SignupRequest.findOne({ where: { email: 'rosa@quarryhill.example' } });
    expect(request!.passwordHash).toMatch(/^scrypt\$/);
    expect(request!.tokenHash).not.toBe(confirmationToken('rosa@quarryhill.example'));
  });

  it('answers an address that already has a sign-in exactly the same, and e-mails its owner sign-in and reset links instead', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const before = await Tenant.count();
    const requestsBefore = await SignupRequest.count();
    const res = await v.post('/api/signup', { firmName: 'Another Firm', name: 'Dup', email: owner.email.toUpperCase(), password: 'a long enough password' });
    await t.flushMail();
    const fresh = await v.post('/api/signup', { firmName: 'Another Firm', name: 'Dup', email: 'nobody-yet@another.example', password: 'a long enough password' });
    await t.flushMail();
    expect(res.status).toBe(202);
    expect(fresh.status).toBe(202);
    // Same shape, same words; only the address differs.
    const said = (res.body as { data: { message: string } }).data.message;
    const saidFresh = (fresh.body as { data: { message: string } }).data.message;
    expect(said.replace(owner.email, 'X')).toBe(saidFresh.replace('nobody-yet@another.example', 'X'));
    expect(Object.keys(res.body.data)).toEqual(Object.keys(fresh.body.data));
    expect(res.body).not.toHaveProperty('error');
    expect(await Tenant.count()).toBe(before);
    expect(await SignupRequest.count()).toBe(requestsBefore + 1);

    const mail = [...t.outbox].reverse().find((m) => m.to === owner.email)!;
    expect(mail.subject).toBe('You already have a Mullion sign-in');
    expect(mail.text).toContain('http://mullion.test/sign-in');
    expect(mail.text).toContain('http://mullion.test/forgot-password');
    expect(mail.text).not.toMatch(/sign-up\/confirm/);
  });

  it('points a household that already has a sign-in at its firm’s portal', async () => {
    const tenant = await buildFirm({ name: 'Portal Check Alarms' });
    const client = await buildClient(tenant);
    const household = await buildClientUser(tenant, client);
    const v = await visitor(t.app);
    expect((await v.post('/api/signup', { ...SIGN_UP, email: household.email })).status).toBe(202);
    await t.flushMail();
    const mail = [...t.outbox].reverse().find((m) => m.to === household.email)!;
    expect(mail.text).toContain(`http://mullion.test/p/${tenant.shortName}`);
    expect(mail.text).toContain(`http://mullion.test/p/${tenant.shortName}/forgot-password`);
  });

  it('answers 400 naming each bad field', async () => {
    const v = await visitor(t.app);
    const res = await v.post('/api/signup', { firmName: '', name: 'X', email: 'not-an-email', password: 'short' });
    await t.flushMail();
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'firmName', 'password']);
  });
});

describe('GET and POST /api/signups/:token (confirming a sign-up)', () => {
  it('previews the waiting sign-up to anyone holding the link, signed out', async () => {
    const v = await visitor(t.app);
    await v.post('/api/signup', { ...SIGN_UP, email: 'preview@quarryhill.example' });
    await t.flushMail();
    const token = confirmationToken('preview@quarryhill.example');
    const other = await visitor(t.app);
    const res = await other.get(`/api/signups/${token}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ firmName: 'Quarry Hill Alarms', name: 'Rosa Quarry', email: 'preview@quarryhill.example' });
    expect(res.body.data).not.toHaveProperty('passwordHash');
  });

  it('creates exactly one firm on a 14-day trial and its owner, signed in with the password chosen at sign-up; the link works once', async () => {
    const v = await visitor(t.app);
    await v.post('/api/signup', { ...SIGN_UP, email: 'confirm@quarryhill.example' });
    await t.flushMail();
    const token = confirmationToken('confirm@quarryhill.example');
    const tenantsBefore = await Tenant.count();
    const res = await v.post(`/api/signups/${token}`);
    expect(res.status).toBe(201);
    expect(await Tenant.count()).toBe(tenantsBefore + 1);
    expect(res.body.data.user).toMatchObject({ email: 'confirm@quarryhill.example', role: 'owner', name: 'Rosa Quarry' });
    expect(res.body.data.tenant).toMatchObject({ name: 'Quarry Hill Alarms', state: 'trialing', trialDaysLeft: 14 });
    const owners = await User.findAll({ where: { tenantId: res.body.data.tenant.id } });
    expect(owners.map((u) => u.role)).toEqual(['owner']);
    await v.session();
    expect((await v.get('/api/session')).body.user.email).toBe('confirm@quarryhill.example');

    const again = await v.post(`/api/signups/${token}`);
    expect(again.status).toBe(404);
    expect(again.body.error.message).toMatch(/no longer valid/);
    expect((await v.get(`/api/signups/${token}`)).status).toBe(404);
    expect(await Tenant.count()).toBe(tenantsBefore + 1);

    const signedIn = await (await visitor(t.app)).signIn('confirm@quarryhill.example', SIGN_UP.password);
    expect(signedIn.status).toBe(200);
  });

  it('gives each firm a distinct short name', async () => {
    const a = await visitor(t.app);
    await a.post('/api/signup', { firmName: 'Same Name Security', name: 'A', email: 'a@same.example', password: 'a long enough password' });
    await t.flushMail();
    await a.post('/api/signup', { firmName: 'Same Name Security', name: 'B', email: 'b@same.example', password: 'a long enough password' });
    await t.flushMail();
    const r1 = await (await visitor(t.app)).post(`/api/signups/${confirmationToken('a@same.example')}`);
    const r2 = await (await visitor(t.app)).post(`/api/signups/${confirmationToken('b@same.example')}`);
    expect(r1.body.data.tenant.shortName).toBe('same-name-security');
    expect(r2.body.data.tenant.shortName).toBe('same-name-security-2');
  });

  it('refuses an expired link', async () => {
    const v = await visitor(t.app);
    await v.post('/api/signup', { ...SIGN_UP, email: 'late@quarryhill.example' });
    await t.flushMail();
    const token = confirmationToken('late@quarryhill.example');
    t.clock.now = new Date(Date.now() + 25 * 60 * 60 * 1000);
    try {
      const res = await v.post(`/api/signups/${token}`);
      expect(res.status).toBe(404);
      expect(await User.count({ where: { email: 'late@quarryhill.example' }, crossTenant: true })).toBe(0);
    } finally {
      t.clock.now = new Date();
    }
  });

  it('tells the address’s owner (only they hold the link) when the address gained a sign-in meanwhile, and creates no second firm', async () => {
    const v = await visitor(t.app);
    await v.post('/api/signup', { ...SIGN_UP, email: 'twice@quarryhill.example' });
    await t.flushMail();
    const first = confirmationToken('twice@quarryhill.example');
    await v.post('/api/signup', { ...SIGN_UP, email: 'twice@quarryhill.example' });
    await t.flushMail();
    const second = confirmationToken('twice@quarryhill.example');
    expect((await v.post(`/api/signups/${first}`)).status).toBe(201);
    const before = await Tenant.count();
    const res = await (await visitor(t.app)).post(`/api/signups/${second}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/already has a Mullion sign-in/);
    expect(await Tenant.count()).toBe(before);
  });

  it('answers 404 to an unknown token and 400 naming a malformed one', async () => {
    const v = await visitor(t.app);
    expect((await v.post(`/api/signups/${'x'.repeat(43)}`)).status).toBe(404);
    const bad = await v.post('/api/signups/not*a*token');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('token');
  });

  it('needs the CSRF token to confirm', async () => {
    const v = await visitor(t.app);
    const res = await v.agent.post(`/api/signups/${'y'.repeat(43)}`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_failed');
  });
});

describe('POST /api/session (sign in) and DELETE /api/session', () => {
  it('signs in with the right password and out again', async () => {
    const { technician } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const res = await v.signIn(technician.email, TEST_PASSWORD);
    expect(res.status).toBe(200);
    expect(res.body.data.user).toMatchObject({ id: technician.id, role: 'technician' });
    expect((await v.get('/api/session')).body.user.id).toBe(technician.id);

    const out = await v.delete('/api/session');
    expect(out.status).toBe(204);
    await v.session();
    expect((await v.get('/api/session')).body.user).toBeNull();
  });

  it('answers a wrong password and an unknown e-mail with the same 401 message', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const wrongPassword = await v.post('/api/session', { email: owner.email, password: 'not the password' });
    const unknownEmail = await v.post('/api/session', { email: 'nobody@nowhere.example', password: 'not the password' });
    expect(wrongPassword.status).toBe(401);
    expect(unknownEmail.status).toBe(401);
    expect(wrongPassword.body.error.code).toBe('unauthenticated');
    expect(wrongPassword.body.error.message).toBe(unknownEmail.body.error.message);
    expect(wrongPassword.body.error.fields).toBeUndefined();
  });

  it('changes the session id at sign-in, so the old CSRF token stops working', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const oldToken = v.csrfToken;
    await v.post('/api/session', { email: owner.email, password: TEST_PASSWORD }).expect(200);
    const stale = await v.agent.delete('/api/session').set('X-CSRF-Token', oldToken);
    expect(stale.status).toBe(403);
    expect(stale.body.error.code).toBe('csrf_failed');
  });

  it('refuses a deactivated user at sign-in', async () => {
    const { firm } = await buildFirmWithStaff();
    const gone = await buildUser(firm, 'technician', { deactivatedAt: new Date() });
    const v = await visitor(t.app);
    const res = await v.post('/api/session', { email: gone.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('user_deactivated');
  });
});

describe('CSRF', () => {
  it('refuses a state-changing request without the token, before authentication', async () => {
    const v = await visitor(t.app);
    const noToken = await v.agent.post('/api/session').send({ email: 'x@y.example', password: 'whatever123' });
    expect(noToken.status).toBe(403);
    expect(noToken.body.error.code).toBe('csrf_failed');
    const wrongToken = await v.agent.post('/api/staff/invitations').set('X-CSRF-Token', 'forged').send({});
    expect(wrongToken.status).toBe(403);
    expect(wrongToken.body.error.code).toBe('csrf_failed');
  });

  it('lets GET through without a token', async () => {
    const v = await visitor(t.app);
    expect((await v.agent.get('/api/health')).status).toBe(200);
  });
});

describe('unknown API routes', () => {
  it('answers 404 in the error shape', async () => {
    const v = await visitor(t.app);
    const res = await v.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
