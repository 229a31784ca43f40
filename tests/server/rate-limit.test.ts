import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readEnv } from '@server/config/env';
import { createTestApp, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithSite, buildFirmWithStaff, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({
    rateLimits: {
      signIn: { limit: 3, windowMs: 60_000 },
      passwordReset: { limit: 2, windowMs: 60_000 },
      signUpPerIp: { limit: 3, windowMs: 60_000 },
      invitationsPerUser: { limit: 3, windowMs: 60_000 },
    },
  });
});
afterAll(async () => {
  await t.close();
});

describe('sign-in attempts', () => {
  it('answers the 4th wrong sign-in for one e-mail with 429 rate_limited, even with the right password', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    for (let i = 1; i <= 3; i++) {
      const res = await v.post('/api/session', { email: owner.email, password: `wrong password ${i}` });
      expect(res.status, `attempt ${i}`).toBe(401);
    }
    const fourth = await v.post('/api/session', { email: owner.email, password: 'wrong password 4' });
    expect(fourth.status).toBe(429);
    expect(fourth.body.error.code).toBe('rate_limited');
    expect(fourth.body.error.message).toMatch(/Too many attempts/);
    expect(fourth.headers).toHaveProperty('ratelimit');

    const right = await v.post('/api/session', { email: owner.email, password: TEST_PASSWORD });
    expect(right.status).toBe(429);
    await v.session();
    expect((await v.get('/api/session')).body.user).toBeNull();
  });

  it('counts the address however it is written', async () => {
    const { technician } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    const spellings = [technician.email, technician.email.toUpperCase(), `  ${technician.email}  `];
    for (const email of spellings) expect((await v.post('/api/session', { email, password: 'wrong password' })).status).toBe(401);
    const res = await v.post('/api/session', { email: technician.email.toUpperCase(), password: 'wrong password' });
    expect(res.status).toBe(429);
  });

  it('limits per e-mail: another address is still answered normally', async () => {
    const a = await buildFirmWithStaff();
    const b = await buildFirmWithStaff();
    const v = await visitor(t.app);
    for (let i = 0; i < 4; i++) await v.post('/api/session', { email: a.coordinator.email, password: 'wrong password' });
    expect((await v.post('/api/session', { email: a.coordinator.email, password: TEST_PASSWORD })).status).toBe(429);
    const other = await v.signIn(b.coordinator.email, TEST_PASSWORD);
    expect(other.status).toBe(200);
  });
});

describe('password reset requests', () => {
  it('answers the 3rd request for one e-mail with 429 rate_limited and sends no more mail', async () => {
    const { technician } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    expect((await v.post('/api/password-resets', { email: technician.email })).status).toBe(202);
    expect((await v.post('/api/password-resets', { email: technician.email })).status).toBe(202);
    const third = await v.post('/api/password-resets', { email: technician.email });
    expect(third.status).toBe(429);
    expect(third.body.error.code).toBe('rate_limited');
    await t.flushMail();
    expect(t.outbox.filter((m) => m.to === technician.email)).toHaveLength(2);
  });

  it('limits unknown addresses the same way (no enumeration through the limiter)', async () => {
    const v = await visitor(t.app);
    expect((await v.post('/api/password-resets', { email: 'ghost@test.example' })).status).toBe(202);
    expect((await v.post('/api/password-resets', { email: 'ghost@test.example' })).status).toBe(202);
    expect((await v.post('/api/password-resets', { email: 'ghost@test.example' })).status).toBe(429);
  });

  it('limits guessing reset tokens too', async () => {
    const v = await visitor(t.app);
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) {
      const res = await v.post(`/api/password-resets/${String(i).repeat(40)}`, { password: 'a long enough password' });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([404, 404, 429]);
  });
});

describe('X-Forwarded-For without TRUST_PROXY', () => {
  it('cannot reset the limit by default: a forged header is ignored', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await visitor(t.app);
    for (let i = 1; i <= 3; i++) {
      const res = await v.post('/api/session', { email: owner.email, password: `wrong ${i}` }).set('X-Forwarded-For', `203.0.113.${i}`);
      expect(res.status, `attempt ${i}`).toBe(401);
    }
    const forged = await v.post('/api/session', { email: owner.email, password: TEST_PASSWORD }).set('X-Forwarded-For', '198.51.100.200');
    expect(forged.status).toBe(429);
    expect(forged.body.error.code).toBe('rate_limited');
  });

  it('TRUST_PROXY is read from the environment: unset trusts nothing; hops or addresses; "true" and nonsense refused', () => {
    expect(readEnv({}).trustProxy).toBe(false);
    expect(readEnv({ TRUST_PROXY: '' }).trustProxy).toBe(false);
    expect(readEnv({ TRUST_PROXY: '1' }).trustProxy).toBe(1);
    expect(readEnv({ TRUST_PROXY: 'loopback, 10.0.0.0/8' }).trustProxy).toEqual(['loopback', '10.0.0.0/8']);
    expect(() => readEnv({ TRUST_PROXY: 'true' })).toThrow(/TRUST_PROXY=true would believe any X-Forwarded-For/);
    expect(() => readEnv({ TRUST_PROXY: 'my-proxy' })).toThrow(/TRUST_PROXY is a number of proxy hops.*not understood: my-proxy/);
  });
});

describe('invitations', () => {
  it('limits the invitations one person sends (staff, households and resends together), then 429 with no e-mail', async () => {
    const f = await buildFirmWithSite();
    const v = await visitor(t.app);
    expect((await v.signIn(f.owner.email, TEST_PASSWORD)).status).toBe(200);
    const first = await v.post('/api/staff/invitations', { email: 'spray-a@test.example', role: 'technician' });
    expect(first.status).toBe(201);
    expect((await v.post(`/api/clients/${f.client.id}/invitations`, { email: 'spray-b@test.example' })).status).toBe(201);
    expect((await v.post(`/api/staff/invitations/${first.body.data.id}/resend`)).status).toBe(200);
    const fourth = await v.post('/api/staff/invitations', { email: 'spray-c@test.example', role: 'technician' });
    expect(fourth.status).toBe(429);
    expect(fourth.body.error.code).toBe('rate_limited');
    expect(fourth.body.error.message).toMatch(/^You have sent a lot of invitations in a short time\. Wait 1 minute/);
    expect(t.outbox.filter((m) => m.to === 'spray-c@test.example')).toHaveLength(0);

    // Counted per person: a colleague at the same firm can still invite.
    const c = await visitor(t.app);
    expect((await c.signIn(f.coordinator.email, TEST_PASSWORD)).status).toBe(200);
    expect((await c.post(`/api/clients/${f.client.id}/invitations`, { email: 'spray-d@test.example' })).status).toBe(201);
  });

  it('still answers 401 to a signed-out caller and 403 to a technician before counting', async () => {
    const f = await buildFirmWithStaff();
    const anon = await visitor(t.app);
    expect((await anon.post('/api/staff/invitations', { email: 'x@test.example', role: 'technician' })).status).toBe(401);
    const tech = await visitor(t.app);
    expect((await tech.signIn(f.technician.email, TEST_PASSWORD)).status).toBe(200);
    expect((await tech.post('/api/staff/invitations', { email: 'x@test.example', role: 'technician' })).status).toBe(403);
  });
});

describe('sign-up requests from one network address', () => {
  it('limits sign-ups across addresses, then 429 and no more e-mail', async () => {
    const v = await visitor(t.app);
    const sent = t.outbox.length;
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      statuses.push((await v.post('/api/signup', { firmName: 'Lantern Ridge Security', name: 'Pia Lantern', email: `many-${i}@test.example`, password: 'a long enough password' })).status);
      await t.flushMail();
    }
    expect(statuses).toEqual([202, 202, 202, 429]);
    expect(t.outbox.length).toBe(sent + 3);
  });
});
