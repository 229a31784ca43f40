import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

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

describe('POST /api/signup', () => {
  it('creates exactly one firm on a 14-day trial and its owner, signed in', async () => {
    const v = await visitor(t.app);
    const tenantsBefore = await Tenant.count();
    const res = await v.post('/api/signup', {
      firmName: 'Quarry Hill Alarms',
      name: 'Rosa Quarry',
      email: 'Rosa@Quarryhill.example',
      password: 'a long enough password',
    });
    expect(res.status).toBe(201);
    expect(await Tenant.count()).toBe(tenantsBefore + 1);
    expect(res.body.data.user).toMatchObject({ email: 'rosa@quarryhill.example', role: 'owner', name: 'Rosa Quarry' });
    expect(res.body.data.tenant).toMatchObject({ name: 'Quarry Hill Alarms', shortName: 'quarry-hill-alarms', state: 'trialing', trialDaysLeft: 14 });
    const owners = await User.findAll({ where: { tenantId: res.body.data.tenant.id } });
    expect(owners.map((u) => u.role)).toEqual(['owner']);
    expect(owners[0]!.passwordHash).toMatch(/^scrypt\$/);
    expect(owners[0]!.passwordHash).not.toContain('a long enough password');

    await v.session();
    const session = await v.get('/api/session');
    expect(session.body.user.email).toBe('rosa@quarryhill.example');
  });

  it('refuses a duplicate e-mail with 409 naming the field, and creates no firm', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const before = await Tenant.count();
    const res = await v.post('/api/signup', { firmName: 'Another Firm', name: 'Dup', email: owner.email.toUpperCase(), password: 'a long enough password' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
    expect(res.body.error.fields.email).toMatch(/already in use/);
    expect(await Tenant.count()).toBe(before);
  });

  it('gives each firm a distinct short name', async () => {
    const a = await visitor(t.app);
    const b = await visitor(t.app);
    const r1 = await a.post('/api/signup', { firmName: 'Same Name Security', name: 'A', email: 'a@same.example', password: 'a long enough password' });
    const r2 = await b.post('/api/signup', { firmName: 'Same Name Security', name: 'B', email: 'b@same.example', password: 'a long enough password' });
    expect(r1.body.data.tenant.shortName).toBe('same-name-security');
    expect(r2.body.data.tenant.shortName).toBe('same-name-security-2');
  });

  it('answers 400 naming each bad field', async () => {
    const v = await visitor(t.app);
    const res = await v.post('/api/signup', { firmName: '', name: 'X', email: 'not-an-email', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'firmName', 'password']);
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
