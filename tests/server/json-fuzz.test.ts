/**
 * Fuzzing every JSON route: each POST, PUT and PATCH route found by walking the app's router
 * (multipart uploads and the Stripe webhook aside) gets arbitrary JSON — any JSON value, any
 * object, and the route's real field names (from its zod schema in src/domain/schemas and its
 * valid body) with values of the wrong type, dropped or kept — from a signed-in caller of the
 * firm with the CSRF token. Input never causes a 5xx, and a 4xx changes nothing: every table
 * but the session store has the same rows before and after.
 *
 * The caller is the firm's owner; the portal's routes are called by the firm's household and
 * the operator console's by the operator, so the input reaches the route's validation and work
 * rather than stopping at a 403. The seed is fixed: a failure names the body and reproduces.
 */
import crypto from 'node:crypto';
import fc from 'fast-check';
import type { Test } from 'supertest';
import { QueryTypes } from 'sequelize';
import type { z } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { acceptInvitationSchema, passwordResetRequestSchema, passwordResetSchema, signInSchema, signUpSchema } from '@domain/schemas/auth';
import { clientPatchSchema, clientSchema } from '@domain/schemas/client';
import { contactListSchema, contactPatchSchema, contactSchema } from '@domain/schemas/contact';
import { documentPatchSchema } from '@domain/schemas/document';
import { firmSettingsPatchSchema, operatorActionSchema } from '@domain/schemas/firm';
import { jobCreateSchema, jobPatchSchema, jobTransitionSchema } from '@domain/schemas/job';
import { panelPatchSchema, panelSchema } from '@domain/schemas/panel';
import { serviceRequestSchema } from '@domain/schemas/portal';
import { floorPatchSchema, floorSchema, openingPatchSchema, openingSchema, pinSchema, roomPatchSchema, roomSchema } from '@domain/schemas/premises';
import { sitePatchSchema, siteSchema } from '@domain/schemas/site';
import { staffInvitationSchema, staffUpdateSchema } from '@domain/schemas/staff';
import { upkeepSettingsSchema } from '@domain/schemas/upkeep';
import { zoneCreateSchema, zonePatchSchema } from '@domain/schemas/zone';
import { createBillingTestApp, type BillingTestApp } from '../support/stripe';
import { buildWorld, type Caller, type World } from '../support/route-world';
import { paramsOf, ROUTE_REQUESTS } from '../support/route-requests';
import { listRoutes } from '../support/route-walk';
import type { Visitor } from '../support/test-app';

const SEED = 20_261_205;
const RUNS = Number(process.env.FUZZ_RUNS ?? 20);

/** The schema each route validates its body with, for its real field names. */
const SCHEMAS: Record<string, z.ZodType> = {
  'POST /api/session': signInSchema,
  'POST /api/signup': signUpSchema,
  'POST /api/password-resets': passwordResetRequestSchema,
  'POST /api/password-resets/:token': passwordResetSchema,
  'POST /api/invitations/:token/accept': acceptInvitationSchema,
  'POST /api/staff/invitations': staffInvitationSchema,
  'PATCH /api/staff/:userId': staffUpdateSchema,
  'PATCH /api/firm': firmSettingsPatchSchema,
  'PUT /api/firm/upkeep-settings': upkeepSettingsSchema,
  'POST /api/operator/tenants/:tenantId/suspend': operatorActionSchema,
  'POST /api/operator/tenants/:tenantId/restore': operatorActionSchema,
  'POST /api/clients': clientSchema,
  'PATCH /api/clients/:clientId': clientPatchSchema,
  'POST /api/sites': siteSchema,
  'PATCH /api/sites/:siteId': sitePatchSchema,
  'POST /api/sites/:siteId/contacts': contactSchema,
  'PUT /api/sites/:siteId/contacts': contactListSchema,
  'PATCH /api/contacts/:contactId': contactPatchSchema,
  'PATCH /api/documents/:documentId': documentPatchSchema,
  'POST /api/sites/:siteId/panels': panelSchema,
  'PATCH /api/panels/:panelId': panelPatchSchema,
  'POST /api/panels/:panelId/zones': zoneCreateSchema,
  'PATCH /api/zones/:zoneId': zonePatchSchema,
  'PUT /api/zones/:zoneId/pin': pinSchema,
  'POST /api/sites/:siteId/floors': floorSchema,
  'PATCH /api/floors/:floorId': floorPatchSchema,
  'POST /api/floors/:floorId/rooms': roomSchema,
  'PATCH /api/rooms/:roomId': roomPatchSchema,
  'POST /api/rooms/:roomId/openings': openingSchema,
  'PATCH /api/openings/:openingId': openingPatchSchema,
  'POST /api/jobs': jobCreateSchema,
  'PATCH /api/jobs/:jobId': jobPatchSchema,
  'POST /api/jobs/:jobId/transitions': jobTransitionSchema,
  'POST /api/portal/sites/:siteId/service-requests': serviceRequestSchema,
  'PUT /api/portal/sites/:siteId/contacts': contactListSchema,
};

/** The top-level field names of an object schema (zod 4 keeps `shape` through refinements). */
function fieldsOf(schema: z.ZodType | undefined): string[] {
  const shape = (schema as { shape?: Record<string, unknown> } | undefined)?.shape;
  return shape ? Object.keys(shape) : [];
}

/** Values of the wrong type, or of the right type but out of every range. */
const wrongValue = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom(null, '', ' ', 0, -1, 1.5, 1e308, -1e308, true, false, [], {}, 'x'.repeat(5000), '<script>alert(1)</script>', '../../etc/passwd'),
  fc.constantFrom('2026-02-30', '9999-99-99T99:99:99Z', '00000000-0000-0000-0000-000000000000', 'not-a-uuid', '+', 'a@b', '#zzzzzz', 'Mars/Olympus'),
);

const KEEP = Symbol('keep');
const DROP = Symbol('drop');

/** The valid body with each real field kept, dropped or given a wrong value. */
function mutated(valid: Record<string, unknown>, fields: string[]): fc.Arbitrary<Record<string, unknown>> {
  const keys = [...new Set([...Object.keys(valid), ...fields])];
  if (keys.length === 0) return fc.constant({});
  const choice = fc.oneof(fc.constant<typeof KEEP>(KEEP), fc.constant<typeof DROP>(DROP), wrongValue);
  return fc.record(Object.fromEntries(keys.map((k) => [k, choice]))).map((picked) => {
    const body: Record<string, unknown> = {};
    for (const k of keys) {
      const c = (picked as Record<string, unknown>)[k];
      if (c === KEEP) {
        if (k in valid) body[k] = valid[k];
      } else if (c !== DROP) body[k] = c;
    }
    return body;
  });
}

function bodies(key: string, w: World): fc.Arbitrary<unknown> {
  const valid = ROUTE_REQUESTS[key]?.body?.(w);
  const fields = fieldsOf(SCHEMAS[key]);
  const shaped: fc.Arbitrary<unknown>[] = [];
  if (Array.isArray(valid)) {
    const first = (valid[0] ?? {}) as Record<string, unknown>;
    shaped.push(fc.array(mutated(first, Object.keys(first)), { maxLength: 3 }));
  } else {
    shaped.push(mutated((valid ?? {}) as Record<string, unknown>, fields));
  }
  return fc.oneof(fc.jsonValue(), fc.object(), ...shaped);
}

/** Who calls a route: the portal's household, the console's operator, the firm's owner for the rest. */
function callerOf(key: string): Caller {
  if (key.includes(' /api/portal/')) return 'client';
  if (key.includes(' /api/operator/')) return 'operator';
  return 'owner';
}

let b: BillingTestApp;
let w: World;
const visitors: Partial<Record<Caller, Visitor>> = {};

beforeAll(async () => {
  b = await createBillingTestApp();
  w = await buildWorld(b.t.app, b.t.outbox, () => b.t.flushMail());
  for (const caller of ['owner', 'client', 'operator'] as const) visitors[caller] = await w.signedIn(caller);
}, 120_000);
afterAll(async () => {
  await b?.close();
});

let dumpSql: string | undefined;

/**
 * Every table's rows (the session store aside: every request touches it), as one hash per
 * table. SQLite writes each table out as one string (every column quoted, row by row), all
 * tables in one query.
 */
async function snapshot(): Promise<Record<string, string>> {
  const sequelize = b.t.sequelize;
  if (!dumpSql) {
    const tables = await sequelize.query<{ name: string }>("SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name", {
      type: QueryTypes.SELECT,
    });
    const parts: string[] = [];
    for (const { name } of tables) {
      if (name.toLowerCase() === 'sessions') continue;
      const columns = await sequelize.query<{ name: string }>(`PRAGMA table_info("${name}")`, { type: QueryTypes.SELECT });
      const row = columns.map((c) => `quote("${c.name}")`).join(" || ',' || ");
      parts.push(`SELECT '${name}' AS t, count(*) AS n, group_concat(r, char(10)) AS dump FROM (SELECT ${row} AS r FROM "${name}" ORDER BY rowid)`);
    }
    dumpSql = parts.join(' UNION ALL ');
  }
  const rows = await sequelize.query<{ t: string; n: number; dump: string | null }>(dumpSql, { type: QueryTypes.SELECT });
  return Object.fromEntries(rows.map((r) => [r.t, `${r.n}:${crypto.createHash('sha1').update(r.dump ?? '').digest('hex')}`]));
}

function jsonRoutes(): string[] {
  return listRoutes(b.t.app).filter((key) => {
    const method = key.split(' ')[0]!;
    if (!['POST', 'PUT', 'PATCH'].includes(method)) return false;
    if (key === 'POST /api/webhooks/stripe') return false;
    return !ROUTE_REQUESTS[key]?.upload;
  });
}

describe('the JSON routes', () => {
  it('are found by walking the router: every POST, PUT and PATCH route but the uploads and the webhook', () => {
    const routes = jsonRoutes();
    expect(routes.length).toBeGreaterThan(40);
    expect(routes).toContain('PATCH /api/zones/:zoneId');
    expect(routes).not.toContain('POST /api/sites/:siteId/documents');
    // every route whose schema we name is one of them: a renamed route cannot slip out
    for (const key of Object.keys(SCHEMAS)) expect(routes).toContain(key);
  });
});

describe('arbitrary JSON never causes a 5xx, and a 4xx stores nothing', () => {
  // the route list comes from the app under test, known only after beforeAll: one test walks it
  it('for every JSON route', async () => {
    const failures: string[] = [];
    for (const key of jsonRoutes()) {
      const [method, routePath] = key.split(' ') as [string, string];
      const spec = ROUTE_REQUESTS[key] ?? {};
      const caller = callerOf(key);
      const started = Date.now();
      // a call that signs someone in or out spoils its visitor: the next run gets a new one
      let visitor = spec.changesSession ? await w.signedIn(caller) : visitors[caller]!;
      let url: string | undefined;
      let before: Record<string, string> | undefined;
      try {
        await fc.assert(
          fc.asyncProperty(bodies(key, w), async (body) => {
            // a new record and a new snapshot only after a call that may have changed something
            if (!url || !before) {
              url = routePath;
              const params = paramsOf(routePath);
              for (const [i, param] of params.entries()) {
                const id = i === params.length - 1 ? await w.freshIdFor(param, routePath) : w.idFor(param, routePath);
                url = url.replace(`:${param}`, encodeURIComponent(id));
              }
              await w.tidy();
              await b.t.flushMail();
              before = await snapshot();
            }
            const agent = visitor.agent as unknown as Record<string, (u: string) => Test>;
            const res = await agent[method.toLowerCase()]!(url)
              .set('X-CSRF-Token', visitor.csrfToken)
              .set('Content-Type', 'application/json')
              .send(JSON.stringify(body));
            if (res.status < 400 || res.status >= 500) {
              url = undefined;
              if (spec.changesSession) visitor = await w.signedIn(caller);
            }
            if (res.status >= 500) throw new Error(`${res.status} ${res.text.slice(0, 300)}`);
            if (res.status >= 400) {
              // work a route started after answering (a reset, a sign-up) lands before comparing
              await b.t.flushMail();
              const after = await snapshot();
              const changed = Object.keys(after).filter((t) => after[t] !== before![t]);
              if (changed.length > 0) {
                url = undefined;
                throw new Error(`${res.status} ${res.text.slice(0, 200)}, yet rows changed in ${changed.join(', ')}`);
              }
            }
          }),
          { numRuns: RUNS, seed: SEED, endOnFailure: true },
        );
        if (process.env.FUZZ_TIMES) console.log(`${key} ${Date.now() - started} ms`);
      } catch (e) {
        const cause = (e as Error & { cause?: unknown }).cause;
        const example = (e as Error).message.split('\n').find((l) => l.startsWith('Counterexample')) ?? '';
        failures.push(`${key}: ${cause instanceof Error ? cause.message : String(cause)} — ${example.slice(0, 600)}`);
      }
    }
    expect(failures).toEqual([]);
  }, 300_000);
});
