/**
 * Sign-in limits across addresses and across network addresses, and the sign-up limit per
 * e-mail address. The app trusts one proxy here, so X-Forwarded-For stands for the visitor's
 * network address and one test can come from many.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, linkFromMail, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithStaff, TEST_PASSWORD } from '../support/factories';

let proxied: TestApp;
beforeAll(async () => {
  proxied = await createTestApp({
    trustProxy: 1,
    rateLimits: {
      signIn: { limit: 3, windowMs: 60_000 },
      signInPerIp: { limit: 5, windowMs: 60_000 },
      signInPerAccount: { limit: 4, windowMs: 60_000 },
      signUpPerAddress: { limit: 2, windowMs: 60_000 },
    },
  });
});
afterAll(async () => {
  await proxied.close();
});

describe('sign-in across addresses and across networks', () => {
  it('stops one password tried against many addresses from one network address, with RateLimit and Retry-After headers', async () => {
    const v = await visitor(proxied.app);
    const statuses: number[] = [];
    for (let i = 0; i < 7; i++) {
      statuses.push((await v.post('/api/session', { email: `spray-${i}@test.example`, password: 'Summer2026!!' }).set('X-Forwarded-For', '203.0.113.250')).status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429]);
    const res = await v.post('/api/session', { email: 'spray-99@test.example', password: 'Summer2026!!' }).set('X-Forwarded-For', '203.0.113.250');
    expect(res.status).toBe(429);
    expect(res.body.error.code).toBe('rate_limited');
    expect(res.body.error.message).toMatch(/^Too many attempts to sign in from your network\. Wait 1 minute and try again/);
    expect(res.headers.ratelimit).toMatch(/"sign-in-network"; r=0; t=\d+/);
    expect(res.headers['ratelimit-policy']).toMatch(/"sign-in-network"; q=5; w=60/);
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
  });

  it('does not count successful sign-ins against the network address', async () => {
    // 7 people signing in from one office network: more than the limit of 5, none refused.
    for (let i = 0; i < 7; i++) {
      const { technician } = await buildFirmWithStaff();
      const v = await visitor(proxied.app);
      const res = await v.post('/api/session', { email: technician.email, password: TEST_PASSWORD }).set('X-Forwarded-For', '203.0.113.251');
      expect(res.status, `sign-in ${i}`).toBe(200);
    }
  });

  it('stops a guess at one address spread over many network addresses, known address or not, and tells how to get in', async () => {
    const { coordinator } = await buildFirmWithStaff();
    for (const email of [coordinator.email, 'nobody-here@test.example']) {
      const statuses: number[] = [];
      for (let i = 0; i < 6; i++) {
        const v = await visitor(proxied.app);
        const res = await v.post('/api/session', { email, password: `guess ${i}` }).set('X-Forwarded-For', `203.0.113.${10 + i}`);
        statuses.push(res.status);
      }
      expect(statuses, email).toEqual([401, 401, 401, 401, 429, 429]);
    }
    const v = await visitor(proxied.app);
    const right = await v.post('/api/session', { email: coordinator.email, password: TEST_PASSWORD }).set('X-Forwarded-For', '198.51.100.7');
    expect(right.status).toBe(429);
    expect(right.body.error.message).toMatch(/^Too many wrong passwords for this address\. Wait 1 minute, or reset your password to sign in now\.$/);
    expect(right.headers.ratelimit).toMatch(/"sign-in-address"; r=0/);
    expect(right.headers).toHaveProperty('retry-after');
  });

  it('clears the failures counted against an address at the right password', async () => {
    const { technician } = await buildFirmWithStaff();
    const from = (n: number) => `192.0.2.${n}`;
    for (let i = 0; i < 3; i++) {
      const v = await visitor(proxied.app);
      expect((await v.post('/api/session', { email: technician.email, password: 'nope nope' }).set('X-Forwarded-For', from(i))).status).toBe(401);
    }
    const v = await visitor(proxied.app);
    expect((await v.post('/api/session', { email: technician.email, password: TEST_PASSWORD }).set('X-Forwarded-For', from(50))).status).toBe(200);
    for (let i = 0; i < 3; i++) {
      const w = await visitor(proxied.app);
      expect((await w.post('/api/session', { email: technician.email, password: 'nope nope' }).set('X-Forwarded-For', from(60 + i))).status, `after ${i}`).toBe(401);
    }
  });

  it('clears them after a password reset, so the owner of the address can sign in at once', async () => {
    const { owner } = await buildFirmWithStaff();
    for (let i = 0; i < 5; i++) {
      const v = await visitor(proxied.app);
      await v.post('/api/session', { email: owner.email, password: 'nope nope' }).set('X-Forwarded-For', `198.18.0.${i}`);
    }
    const blocked = await visitor(proxied.app);
    expect((await blocked.post('/api/session', { email: owner.email, password: TEST_PASSWORD }).set('X-Forwarded-For', '198.18.1.1')).status).toBe(429);
    const v = await visitor(proxied.app);
    expect((await v.post('/api/password-resets', { email: owner.email }).set('X-Forwarded-For', '198.18.1.2')).status).toBe(202);
    await proxied.flushMail();
    const link = linkFromMail(proxied.outbox, owner.email, '/reset-password/');
    const done = await v.post(`/api${link.replace('/reset-password/', '/password-resets/')}`, { password: 'a brand new password' }).set('X-Forwarded-For', '198.18.1.2');
    expect(done.status).toBe(200);
    const after = await visitor(proxied.app);
    expect((await after.post('/api/session', { email: owner.email, password: 'a brand new password' }).set('X-Forwarded-For', '198.18.1.3')).status).toBe(200);
  });
});

describe('sign-up requests to one address', () => {
  const body = (email: string) => ({ firmName: 'Lantern Ridge Security', name: 'Pia Lantern', email, password: 'a long enough password' });

  it('sends at most 2 e-mails to one address, whether or not it has a sign-in, then 429', async () => {
    const { owner } = await buildFirmWithStaff();
    for (const email of [owner.email, 'new-lantern@test.example']) {
      // From a different network address each time: the limit follows the e-mail address.
      const v = await visitor(proxied.app);
      expect((await v.post('/api/signup', body(email)).set('X-Forwarded-For', '198.51.100.1')).status).toBe(202);
      await proxied.flushMail();
      expect((await v.post('/api/signup', body(email)).set('X-Forwarded-For', '198.51.100.2')).status).toBe(202);
      await proxied.flushMail();
      const third = await v.post('/api/signup', body(email)).set('X-Forwarded-For', '198.51.100.3');
      await proxied.flushMail();
      expect(third.status).toBe(429);
      expect(third.body.error.message).toMatch(/^We have already sent several e-mails to this address/);
      expect(third.headers['retry-after']).toBeDefined();
      expect(proxied.outbox.filter((m) => m.to === email)).toHaveLength(2);
    }
  });
});
