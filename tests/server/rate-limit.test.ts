import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithStaff, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({
    rateLimits: { signIn: { limit: 3, windowMs: 60_000 }, passwordReset: { limit: 2, windowMs: 60_000 } },
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
