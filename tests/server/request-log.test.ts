/**
 * Request ids and the request log: every response carries X-Request-Id (the caller's when
 * sane, otherwise a new one), every request writes one line, no secret reaches a line, and
 * a 500 names the same id in its body, its header and the log.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createLogger } from '@server/logger';
import type { MailOutbox } from '@server/emails/outbox';
import { loggablePath, requestIdFrom } from '@server/middlewares/request-log';
import { createTestApp, linkFromMail, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithSite, buildUser, TEST_PASSWORD } from '../support/factories';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

interface LogLine {
  level: string;
  msg: string;
  requestId?: string;
  method?: string;
  path?: string;
  status?: number;
  durationMs?: number;
  userId?: string;
  tenantId?: string;
  [key: string]: unknown;
}

/** A log destination that keeps each line, raw (to search for secrets) and parsed. */
function captureLog() {
  const raw: string[] = [];
  const destination = { write: (line: string) => void raw.push(line) };
  return {
    raw,
    logger: createLogger('debug', { destination }),
    lines: () => raw.map((l) => JSON.parse(l) as LogLine),
    requestLines: (requestId: string | undefined) => raw.map((l) => JSON.parse(l) as LogLine).filter((l) => l.msg === 'request' && l.requestId === requestId),
    clear: () => void raw.splice(0),
  };
}

let t: TestApp;
const log = captureLog();

beforeAll(async () => {
  t = await createTestApp({ logger: log.logger });
});
afterAll(async () => {
  await t.close();
});
beforeEach(() => log.clear());

describe('request ids', () => {
  it('generates an id, answers it in X-Request-Id and logs it', async () => {
    const res = await request(t.app).get('/api/session');
    expect(res.status).toBe(200);
    const id = res.headers['x-request-id'];
    expect(id).toMatch(UUID);
    expect(log.requestLines(id)).toHaveLength(1);
  });

  it('gives each request its own id', async () => {
    const one = await request(t.app).get('/api/health');
    const two = await request(t.app).get('/api/health');
    expect(one.headers['x-request-id']).not.toBe(two.headers['x-request-id']);
  });

  it('echoes a sane incoming id', async () => {
    const res = await request(t.app).get('/api/health').set('X-Request-Id', 'lb-7f3a.91:edge_2');
    expect(res.headers['x-request-id']).toBe('lb-7f3a.91:edge_2');
    expect(log.requestLines('lb-7f3a.91:edge_2')).toHaveLength(1);
  });

  it.each([
    ['too long', 'a'.repeat(129)],
    ['spaces and markup', 'abc <script>'],
    ['a forged log field', 'x","level":"error'],
    ['two ids joined', 'one, two'],
  ])('replaces an incoming id that is %s', async (_what, bad) => {
    const res = await request(t.app).get('/api/health').set('X-Request-Id', bad);
    const id = res.headers['x-request-id'];
    expect(id).toMatch(UUID);
    expect(log.requestLines(id)).toHaveLength(1);
    expect(log.lines().some((l) => l.requestId === bad)).toBe(false);
  });

  it('accepts an id of exactly 128 characters', () => {
    expect(requestIdFrom('b'.repeat(128))).toBe('b'.repeat(128));
    expect(requestIdFrom('b'.repeat(129))).toMatch(UUID);
    expect(requestIdFrom(undefined)).toMatch(UUID);
    expect(requestIdFrom('')).toMatch(UUID);
  });

  it('puts the id on 4xx answers too', async () => {
    const notFound = await request(t.app).get('/api/no-such-thing');
    expect(notFound.status).toBe(404);
    expect(notFound.headers['x-request-id']).toMatch(UUID);
    const noCsrf = await request(t.app).post('/api/session').send({ email: 'a@b.test', password: 'x' });
    expect(noCsrf.status).toBe(403);
    expect(noCsrf.headers['x-request-id']).toMatch(UUID);
    expect(log.requestLines(noCsrf.headers['x-request-id'])[0]?.status).toBe(403);
    // 4xx bodies keep the usual shape
    expect(noCsrf.body.error).not.toHaveProperty('requestId');
  });
});

describe('one line per request', () => {
  it('names method, path, status and duration, and no query', async () => {
    const res = await request(t.app).get('/api/health?probe=lb-1');
    const [line, ...more] = log.requestLines(res.headers['x-request-id']);
    expect(more).toHaveLength(0);
    expect(line).toMatchObject({ level: 'info', method: 'GET', path: '/api/health', status: 200 });
    expect(typeof line?.durationMs).toBe('number');
    expect(line?.durationMs).toBeGreaterThanOrEqual(0);
    expect(log.raw.join('')).not.toContain('probe');
    expect(line).not.toHaveProperty('userId');
  });

  it('names the user and the firm when signed in', async () => {
    const { firm, owner } = await buildFirmWithSite();
    const v = await visitor(t.app);
    expect((await v.signIn(owner.email, TEST_PASSWORD)).status).toBe(200);
    log.clear();
    const res = await v.get('/api/sites');
    expect(res.status).toBe(200);
    expect(log.requestLines(res.headers['x-request-id'])).toEqual([
      expect.objectContaining({ method: 'GET', path: '/api/sites', status: 200, userId: owner.id, tenantId: firm.id }),
    ]);
    expect(log.lines().filter((l) => l.msg === 'request')).toHaveLength(1);
  });
});

describe('secrets never reach a line', () => {
  it('a sign-in: password, session cookie and CSRF token', async () => {
    const user = await buildUser((await buildFirmWithSite()).firm, 'coordinator');
    const v = await visitor(t.app);
    const wrong = await v.post('/api/session', { email: user.email, password: 'Wrong-Password-Quokka-51' });
    expect(wrong.status).toBe(401);
    const res = await v.signIn(user.email, TEST_PASSWORD);
    expect(res.status).toBe(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('mullion.sid='));
    const cookieValue = cookie?.split(';')[0]?.slice('mullion.sid='.length) ?? '';
    expect(cookieValue.length).toBeGreaterThan(10);
    await v.get('/api/sites');

    const all = log.raw.join('');
    expect(log.lines().filter((l) => l.msg === 'request').length).toBeGreaterThanOrEqual(4);
    expect(all).not.toContain(TEST_PASSWORD);
    expect(all).not.toContain('Wrong-Password-Quokka-51');
    expect(all).not.toContain(cookieValue);
    expect(all).not.toContain(decodeURIComponent(cookieValue));
    expect(all).not.toContain(v.csrfToken);
  });

  it('a password reset: the token in the path and the query, and the new password', async () => {
    const user = await buildUser((await buildFirmWithSite()).firm, 'technician');
    const v = await visitor(t.app);
    expect((await v.post('/api/password-resets', { email: user.email })).status).toBe(202);
    await t.flushMail();
    const link = linkFromMail(t.outbox, user.email, 'reset-password');
    const token = link.split('/').pop() ?? '';
    expect(token.length).toBeGreaterThan(30);

    // the client page the e-mail links to, with the token also in a query
    await v.get(`${link}?token=${token}`);
    const res = await v.post(`/api/password-resets/${token}?token=${token}`, { password: 'Fresh-Password-Wombat-88' });
    expect(res.status).toBe(200);

    const all = log.raw.join('');
    expect(all).not.toContain(token);
    expect(all).not.toContain('Fresh-Password-Wombat-88');
    expect(log.requestLines(res.headers['x-request-id'])[0]?.path).toBe('/api/password-resets/:token');
  });

  it("a site's verbal passcode, set and revealed", async () => {
    const { site, owner } = await buildFirmWithSite();
    const v = await visitor(t.app);
    await v.signIn(owner.email, TEST_PASSWORD);
    expect((await v.patch(`/api/sites/${site.id}`, { passcode: 'Heron-Lantern-Quilt-63' })).status).toBe(200);
    const reveal = await v.post(`/api/sites/${site.id}/passcode/reveal`);
    expect(reveal.body.data.passcode).toBe('Heron-Lantern-Quilt-63');

    expect(log.raw.join('')).not.toContain('Heron-Lantern-Quilt-63');
    expect(log.requestLines(reveal.headers['x-request-id'])[0]?.path).toBe(`/api/sites/${site.id}/passcode/reveal`);
  });

  it('details passed to the logger are redacted by field name', () => {
    log.logger.warn('details with secrets', {
      password: 'p-1',
      body: { passcode: 'p-2', site: { verbalPasscode: 'p-3' } },
      headers: { cookie: 'p-4', authorization: 'p-5', 'set-cookie': 'p-6', 'x-csrf-token': 'p-7' },
      token: 'p-8',
      mail: { text: 'p-9', html: 'p-10' },
    });
    const all = log.raw.join('');
    for (let i = 1; i <= 10; i++) expect(all).not.toContain(`"p-${i}"`);
    expect(all).toContain('[redacted]');
  });
});

describe('a 500', () => {
  let broken: TestApp;
  const brokenLog = captureLog();

  beforeAll(async () => {
    // an outbox whose table cannot be written: inviting staff throws inside the route
    const failingOutbox: MailOutbox = {
      enqueue: () => Promise.reject(new Error('outbox table refused the row')),
      drain: () => Promise.resolve(),
      start: () => undefined,
      stop: () => Promise.resolve(),
    };
    broken = await createTestApp({ logger: brokenLog.logger, outbox: failingOutbox });
  });
  afterAll(async () => {
    await broken.close();
  });

  it('answers, heads and logs the same request id', async () => {
    const user = await buildUser((await buildFirmWithSite()).firm, 'owner');
    const v = await visitor(broken.app);
    expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
    brokenLog.clear();
    const res = await v.post('/api/staff/invitations', { email: 'new.hand@firm.example', role: 'technician' });
    expect(res.status).toBe(500);
    const id = res.headers['x-request-id'];
    expect(id).toMatch(UUID);
    expect(res.body.error).toMatchObject({ code: 'internal', requestId: id });

    const lines = brokenLog.lines().filter((l) => l.requestId === id);
    const failure = lines.find((l) => l.msg === 'Unhandled error');
    expect(failure).toMatchObject({ level: 'error', path: '/api/staff/invitations' });
    expect(JSON.stringify(failure?.err)).toContain('outbox table refused the row');
    expect(lines.filter((l) => l.msg === 'request')).toEqual([expect.objectContaining({ level: 'error', status: 500 })]);
    expect(brokenLog.lines().filter((l) => l.level === 'error').every((l) => l.requestId === id)).toBe(true);
  });
});

describe('loggablePath', () => {
  it('drops the query, masks tokens and keeps record ids', () => {
    const token = 'hD3kq0v9W2lZrT8mX1cY5bN7pQ4sA6eF0gH2jK3lM9o';
    const id = '1b4e28ba-2fa1-11d2-883f-0c04fd30c9c8';
    expect(loggablePath(`/api/password-resets/${token}?token=${token}`)).toBe('/api/password-resets/:token');
    expect(loggablePath(`/api/invitations/short/accept`)).toBe('/api/invitations/:token/accept');
    expect(loggablePath(`/p/acme/reset-password/${token}`)).toBe('/p/acme/reset-password/:token');
    expect(loggablePath(`/api/anything/${token}`)).toBe('/api/anything/:token');
    expect(loggablePath(`/api/clients/${id}/invitations/${id}/resend`)).toBe(`/api/clients/${id}/invitations/${id}/resend`);
    expect(loggablePath('/assets/index-BmXq82Lp.js?v=1')).toBe('/assets/index-BmXq82Lp.js');
  });
});
