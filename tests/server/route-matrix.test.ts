/**
 * The route × role × firm matrix: every API route the app mounts is called by ten callers
 * (signed out, operator, the three staff roles of the firm, the same roles of another firm,
 * the firm's household and another firm's household) and each answer is held to the line of
 * route-matrix.table.ts. The list of routes comes from the router itself, so a new route
 * without a line fails here until someone decides who may call it.
 *
 * Beyond the status: no 5xx for anyone; a 2xx to another firm's caller never carries firm A's
 * ids, names or e-mail addresses; a 2xx to the operator never carries the firm's client
 * records; a 2xx to the household never carries staff-only words.
 */
import express from 'express';
import type { Test } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createBillingTestApp, type BillingTestApp } from '../support/stripe';
import { buildClient, buildSite } from '../support/factories';
import { buildWorld, CALLERS, type Caller, type World } from '../support/route-world';
import { paramsOf, ROUTE_REQUESTS } from '../support/route-requests';
import { listRoutes, tableProblems } from '../support/route-walk';
import type { Visitor } from '../support/test-app';
import { EXCLUDED_ROUTES, ROUTE_TABLE } from './route-matrix.table';

type Answer = 'ok' | '401' | '403' | '404';
const ANSWERS = new Set<string>(['ok', '401', '403', '404']);

/** "401 403 | ok ok ok | 404 404 404 | 404 404" → one answer per caller. */
export function parseLine(line: string): Answer[] {
  const tokens = line.split(/\s+/).filter((s) => s && s !== '|');
  if (tokens.length !== CALLERS.length || tokens.some((s) => !ANSWERS.has(s)))
    throw new Error(`"${line}": write ${CALLERS.length} answers (ok, 401, 403 or 404), grouped with |`);
  return tokens as Answer[];
}

function answerOf(status: number): Answer | `${number}` {
  if (status >= 500) return `${status}`;
  if (status === 401 || status === 403 || status === 404) return `${status}` as Answer;
  return 'ok';
}

function formatLine(answers: string[]): string {
  const g = (from: number, to: number) => answers.slice(from, to).join(' ');
  return `${g(0, 2)} | ${g(2, 5)} | ${g(5, 8)} | ${g(8, 10)}`;
}

const OTHER_FIRM: Caller[] = ['otherOwner', 'otherCoordinator', 'otherTechnician', 'otherClient'];

let b: BillingTestApp;
let w: World;
const visitors = {} as Record<Caller, Visitor>;
/** words only the firm's staff may read: the household must never get them */
let staffOnly: string[];

beforeAll(async () => {
  b = await createBillingTestApp();
  w = await buildWorld(b.t.app, b.t.outbox, () => b.t.flushMail());
  for (const caller of CALLERS) visitors[caller] = await w.signedIn(caller);
  await w.a.client.update({ notes: 'Staff note: the household is slow to pay.' });
  await w.a.site.update({ accessNotes: 'Staff note: key safe code 4471.' });
  await w.a.job.update({ internalNotes: 'Staff note: dog in the yard.' });
  await w.a.zone.update({ serial: 'SERIAL0099123' });
  staffOnly = ['Staff note:', 'SERIAL0099123'];
}, 120_000);
afterAll(async () => {
  await b?.close();
});

/** the firm's client records: the operator never reads them */
const householdOfA = () => [w.a.client.id, w.a.client.name, w.a.site.id, w.a.site.name, w.a.clientUser.email, w.a.zone.id, w.a.job.id];

async function call(key: string, caller: Caller): Promise<{ status: number; text: string }> {
  const [method, routePath] = key.split(' ') as [string, string];
  const spec = ROUTE_REQUESTS[key] ?? {};
  const params = paramsOf(routePath);
  let url = routePath;
  for (const [i, param] of params.entries()) {
    // a change or delete works on a record of its own; earlier params are the shared parents
    const fresh = method !== 'GET' && i === params.length - 1;
    const id = fresh ? await w.freshIdFor(param, routePath) : w.idFor(param, routePath);
    url = url.replace(`:${param}`, encodeURIComponent(id));
  }
  await spec.prepare?.(w);
  const v = spec.changesSession ? await w.signedIn(caller) : visitors[caller];
  const agent = v.agent as unknown as Record<string, (url: string) => Test>;
  let req = agent[method.toLowerCase()]!(url);
  if (method !== 'GET') req = req.set('X-CSRF-Token', v.csrfToken);
  if (spec.upload) {
    for (const [k, val] of Object.entries(spec.upload.fields ?? {})) req = req.field(k, val);
    req = req.attach('file', spec.upload.file, { filename: spec.upload.filename, contentType: spec.upload.contentType });
  } else if (method !== 'GET' && method !== 'DELETE') {
    req = req.send(spec.body?.(w) ?? {});
  }
  const res = await req;
  await w.tidy();
  const text = typeof res.text === 'string' ? res.text : JSON.stringify(res.body ?? '');
  return { status: res.status, text };
}

describe('the table names every route of the router, and only those', () => {
  it('lists the routes found by walking the app', () => {
    const routes = listRoutes(b.t.app);
    expect(routes.length).toBeGreaterThan(100);
    expect(routes).toContain('GET /api/sites/:siteId');
    expect(routes).toContain('POST /api/webhooks/stripe');
    expect(tableProblems(routes, ROUTE_TABLE, EXCLUDED_ROUTES)).toEqual([]);
  });

  it('every line has ten answers', () => {
    for (const line of Object.values(ROUTE_TABLE)) expect(() => parseLine(line)).not.toThrow();
  });

  it('the gate fails for a route mounted without a line, and for a line without a route', () => {
    const app = express();
    const api = express.Router();
    api.get('/sites/:siteId', (_req, res) => void res.end());
    api.post('/sites/:siteId/sheds', (_req, res) => void res.end());
    const nested = express.Router();
    nested.delete('/sheds/:shedId', (_req, res) => void res.end());
    api.use('/yard', nested);
    app.use('/api', api);
    app.get('/api/health', (_req, res) => void res.end());
    const routes = listRoutes(app);
    expect(routes).toEqual(['DELETE /api/yard/sheds/:shedId', 'GET /api/health', 'GET /api/sites/:siteId', 'POST /api/sites/:siteId/sheds']);
    const table = { 'GET /api/sites/:siteId': 'x', 'GET /api/sites': 'x' };
    expect(tableProblems(routes, table, { 'GET /api/health': 'reason' })).toEqual([
      'DELETE /api/yard/sheds/:shedId: in the router, but has no entry in the table',
      'POST /api/sites/:siteId/sheds: in the router, but has no entry in the table',
      'GET /api/sites: in the table, but no such route in the router',
    ]);
    expect(tableProblems(routes, { ...table, 'DELETE /api/yard/sheds/:shedId': 'x', 'POST /api/sites/:siteId/sheds': 'x' }, { 'GET /api/health': 'r' })).toEqual([
      'GET /api/sites: in the table, but no such route in the router',
    ]);
  });

  it('a line that does not say who may call fails to parse', () => {
    expect(() => parseLine('401 403 | ok ok ok | 404 404 404 | 404')).toThrow(/ten|10/);
    expect(() => parseLine('401 403 | ok ok ok | 404 404 404 | 404 500')).toThrow();
    expect(parseLine('401 403 | ok ok 403 | 404 404 404 | ok 404')).toEqual(['401', '403', 'ok', 'ok', '403', '404', '404', '404', 'ok', '404']);
  });
});

describe('every route answers each caller as the table says', () => {
  // one test per line of the table; the first describe proves the lines and the router agree
  const keys = Object.keys(ROUTE_TABLE).sort();
  for (const key of keys) {
    it(key, async () => {
      const expected = parseLine(ROUTE_TABLE[key]!);
      const anonExpected = expected[0];
      const got: string[] = [];
      const problems: string[] = [];
      for (const [i, caller] of CALLERS.entries()) {
        const { status, text } = await call(key, caller);
        const answer = answerOf(status);
        got.push(answer);
        if (answer !== expected[i]) problems.push(`${caller}: expected ${expected[i]}, got ${status} ${text.slice(0, 160)}`);
        const success = status >= 200 && status < 300;
        if (success && anonExpected === '401' && OTHER_FIRM.includes(caller)) {
          const leaked = w.secretsOfA().filter((s) => text.includes(s));
          if (leaked.length > 0) problems.push(`${caller}: the answer carries firm A’s ${leaked.join(', ')}`);
        }
        if (success && caller === 'operator') {
          const leaked = householdOfA().filter((s) => text.includes(s));
          if (leaked.length > 0) problems.push(`operator: the answer carries the firm’s client records: ${leaked.join(', ')}`);
        }
        if (success && caller === 'client') {
          const leaked = staffOnly.filter((s) => text.includes(s));
          if (leaked.length > 0) problems.push(`client: the answer carries staff-only ${leaked.join(', ')}`);
        }
      }
      expect(problems, `observed: '${key}': '${formatLine(got)}',`).toEqual([]);
    });
  }
});

describe('a household never reaches another household of its own firm', () => {
  it('answers 404 for the neighbour’s client record, site and portal pages, and lists only its own', async () => {
    const neighbour = await buildClient(w.a.firm, { name: 'Neighbour household' });
    const site = await buildSite(w.a.firm, neighbour, { name: 'Neighbour home' });
    const v = visitors.client;
    for (const url of [
      `/api/clients/${neighbour.id}`,
      `/api/sites/${site.id}`,
      `/api/portal/sites/${site.id}`,
      `/api/portal/sites/${site.id}/coverage`,
      `/api/portal/sites/${site.id}/devices`,
      `/api/portal/sites/${site.id}/service`,
      `/api/portal/sites/${site.id}/documents`,
      `/api/portal/sites/${site.id}/contacts`,
    ]) {
      expect((await v.get(url)).status, url).toBe(404);
    }
    expect((await v.post(`/api/portal/sites/${site.id}/service-requests`, { description: 'Beeping', preferredTimes: 'Any' })).status).toBe(404);
    expect((await v.put(`/api/portal/sites/${site.id}/contacts`, { contacts: [] })).status).toBe(404);
    const clients = (await v.get('/api/clients')).body as { data: { id: string }[] };
    expect(clients.data.map((c) => c.id)).toEqual([w.a.client.id]);
    for (const url of ['/api/sites?pageSize=100', '/api/portal/sites']) {
      const text = (await v.get(url)).text;
      expect(text, url).not.toContain(site.id);
      expect(text, url).not.toContain(neighbour.id);
    }
  });
});
