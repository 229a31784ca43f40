/**
 * `npm run bench`: starts the app on a loopback port with a fresh database and an in-memory
 * mailer, puts a bounded load on the hottest read endpoints, prints requests per second and
 * p99 latency, and fails when any p99 is above the target or any request failed.
 * Not part of `npm test`: numbers depend on the machine.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { readEnv } from '../../server/config/env';
import { createMemoryMailer } from '../../server/emails/mailer';
import { startServer } from '../../server/index';
import { createSecretBox } from '../../server/crypto/secret-box';
import { DEMO_PASSWORD, seedDemo } from '../../server/db/seeders/demo';
import { TenantFiles } from '../../server/storage/tenant-files';

/** The slowest acceptable 99th-percentile latency for these reads on loopback. */
const P99_TARGET_MS = 200;
/** How long each endpoint is loaded. */
const DURATION_SECONDS = 5;
/** Concurrent connections: a busy morning for a small firm's staff and clients together. */
const CONNECTIONS = 10;
const HOST = '127.0.0.1';
/** Pause after the load before shutting down (see main). */
const SETTLE_MS = 1_000;

interface Scenario {
  name: string;
  path: string;
  headers?: Record<string, string>;
}

interface Outcome {
  name: string;
  requestsPerSecond: number;
  p50Ms: number;
  p99Ms: number;
  failed: number;
}

/** Cookies a browser would send back after its first GET /api/session. */
async function returningVisitorCookies(baseUrl: string): Promise<string> {
  const res = await fetch(`${baseUrl}/api/session`);
  if (!res.ok) throw new Error(`GET /api/session answered ${res.status}`);
  const cookies = res.headers.getSetCookie().map((c) => c.split(';')[0]);
  if (cookies.length === 0) throw new Error('GET /api/session set no cookie.');
  return cookies.join('; ');
}

/** Cookies of a signed-in visitor: first visit, then sign-in with the CSRF token, as a browser does. */
async function signedInCookies(baseUrl: string, email: string): Promise<string> {
  const first = await fetch(`${baseUrl}/api/session`);
  const { csrfToken } = (await first.json()) as { csrfToken: string };
  const jar = new Map(first.headers.getSetCookie().map((c) => c.split(';')[0]!.split('=') as [string, string]));
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const res = await fetch(`${baseUrl}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': csrfToken, cookie: cookie() },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (!res.ok) throw new Error(`Signing in as ${email} answered ${res.status}`);
  for (const c of res.headers.getSetCookie()) {
    const [k, v] = c.split(';')[0]!.split('=') as [string, string];
    jar.set(k, v);
  }
  return cookie();
}

async function load(baseUrl: string, scenario: Scenario): Promise<Outcome> {
  // A short warm-up so the first measured requests do not pay for lazy initialisation.
  for (let i = 0; i < 20; i++) await (await fetch(`${baseUrl}${scenario.path}`, { headers: scenario.headers })).arrayBuffer();
  const result = await autocannon({
    url: `${baseUrl}${scenario.path}`,
    connections: CONNECTIONS,
    duration: DURATION_SECONDS,
    headers: scenario.headers,
    timeout: 10,
  });
  return {
    name: scenario.name,
    requestsPerSecond: result.requests.average,
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    failed: result.errors + result.timeouts + result.non2xx,
  };
}

async function main(): Promise<number> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-bench-'));
  const env = readEnv({
    NODE_ENV: 'test',
    PORT: '0',
    APP_URL: `http://${HOST}`,
    DATABASE_URL: `sqlite:${path.join(dir, 'bench.sqlite')}`,
    TENANTS_DIR: path.join(dir, 'tenants'),
    LOG_LEVEL: 'error',
  });
  const running = await startServer(env, { mailer: createMemoryMailer(), host: HOST });
  const baseUrl = `http://${HOST}:${running.port}`;
  try {
    // The invented demo scenario, so the household's portal reads real-sized data.
    await seedDemo(running.sequelize, { secrets: createSecretBox(env.dataEncryptionKey), files: new TenantFiles(path.resolve(env.tenantsDir)) });
    const household = { cookie: await signedInCookies(baseUrl, 'dario.pike@homes.example') };
    const sites = (await (await fetch(`${baseUrl}/api/portal/sites`, { headers: household })).json()) as { data: { id: string }[] };
    const home = `/api/portal/sites/${sites.data[0]!.id}`;
    const owner = { cookie: await signedInCookies(baseUrl, 'ada@lanternfield.example') };
    const scenarios: Scenario[] = [
      { name: 'GET /api/health', path: '/api/health' },
      { name: 'GET /api/session (first visit: new session)', path: '/api/session' },
      { name: 'GET /api/session (returning visitor)', path: '/api/session', headers: { cookie: await returningVisitorCookies(baseUrl) } },
      { name: 'GET portal home of a household', path: home, headers: household },
      { name: 'GET portal doors and windows', path: `${home}/coverage`, headers: household },
      { name: 'GET portal devices', path: `${home}/devices`, headers: household },
      { name: 'GET portal visits', path: `${home}/service`, headers: household },
      { name: 'GET /api/billing (owner: plan and usage)', path: '/api/billing', headers: owner },
      { name: 'GET /api/firm/business (owner)', path: '/api/firm/business', headers: owner },
    ];
    console.log(`Mullion bench: ${CONNECTIONS} connections, ${DURATION_SECONDS} s per endpoint, ${baseUrl}; p99 target ${P99_TARGET_MS} ms\n`);
    const outcomes: Outcome[] = [];
    for (const scenario of scenarios) {
      const outcome = await load(baseUrl, scenario);
      outcomes.push(outcome);
      console.log(
        `${outcome.name.padEnd(48)} ${outcome.requestsPerSecond.toFixed(0).padStart(7)} req/s   p50 ${String(outcome.p50Ms).padStart(4)} ms   p99 ${String(outcome.p99Ms).padStart(4)} ms   failed ${outcome.failed}`,
      );
    }
    const slow = outcomes.filter((o) => o.p99Ms > P99_TARGET_MS);
    const failing = outcomes.filter((o) => o.failed > 0);
    for (const o of slow) console.error(`\nToo slow: ${o.name} p99 ${o.p99Ms} ms > ${P99_TARGET_MS} ms`);
    for (const o of failing) console.error(`\nFailed requests: ${o.name} had ${o.failed} errors, timeouts or non-2xx answers`);
    if (slow.length === 0 && failing.length === 0) console.log(`\nAll p99 latencies within ${P99_TARGET_MS} ms.`);
    return slow.length > 0 || failing.length > 0 ? 1 : 0;
  } finally {
    // The load generator hangs up on requests still in flight when its time is up; their
    // handlers finish on the server anyway. Let them settle before the database closes.
    await new Promise((resolve) => setTimeout(resolve, SETTLE_MS));
    await running.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  },
);
