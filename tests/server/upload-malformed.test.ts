/**
 * Every upload route answers a malformed multipart body the same way: 400 `validation_failed`
 * naming `file`, no stack trace in the body, nothing logged as an error, nothing saved. (The
 * firm logo and the zone-list import used to pass the parser's error on as a 500.)
 */
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Logger } from '@server/logger';
import { Document } from '@server/models/Document';
import { Tenant } from '@server/models/Tenant';
import type { User } from '@server/models/User';
import { Zone } from '@server/models/Zone';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFloor, buildJob, buildPanel, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let owner: Visitor;
const logged: { level: string; message: string }[] = [];
const logger: Logger = {
  debug: () => undefined,
  info: () => undefined,
  warn: (message) => logged.push({ level: 'warn', message }),
  error: (message) => logged.push({ level: 'error', message }),
};

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const ROUTES: Record<string, () => Promise<string>> = {
  'POST /api/firm/logo': () => Promise.resolve('/api/firm/logo'),
  'POST /api/panels/:panelId/zones/import': async () => `/api/panels/${(await buildPanel(a.site)).id}/zones/import`,
  'POST /api/floors/:floorId/plan': async () => `/api/floors/${(await buildFloor(a.site)).id}/plan`,
  'POST /api/sites/:siteId/documents': () => Promise.resolve(`/api/sites/${a.site.id}/documents`),
  'POST /api/jobs/:jobId/files': async () =>
    `/api/jobs/${(await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: new Date() })).id}/files`,
};

const BOUNDARY = '----mullion-test-boundary';
const BODIES: Record<string, { contentType: string; body: Buffer }> = {
  // a part that starts and is cut off before its closing boundary
  truncated: {
    contentType: `multipart/form-data; boundary=${BOUNDARY}`,
    body: Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="a.png"\r\nContent-Type: image/png\r\n\r\n\x89PNG\r\n\x1a\nhalf a fi`, 'latin1'),
  },
  // a part header that is not a header
  'garbled part header': {
    contentType: `multipart/form-data; boundary=${BOUNDARY}`,
    body: Buffer.from(`--${BOUNDARY}\r\n${'\u0000'.repeat(20)}no colon here\r\n\r\ndata\r\n--${BOUNDARY}--\r\n`, 'latin1'),
  },
  // multipart declared, but no boundary to split it by
  'no boundary': {
    contentType: 'multipart/form-data',
    body: Buffer.from('just some bytes, no parts at all'),
  },
};

async function savedState() {
  const tenantId = a.firm.id;
  const dir = path.join(t.tenantsDir, tenantId);
  return {
    files: fs.existsSync(dir) ? fs.readdirSync(dir).sort() : [],
    documents: await Document.count({ where: { tenantId } }),
    zones: await Zone.count({ where: { tenantId } }),
    logo: (await Tenant.findOne({ where: { id: tenantId } }))!.logoFileId,
  };
}

beforeAll(async () => {
  t = await createTestApp({ logger });
  a = await buildFirmWithSite();
  owner = await signedIn(a.owner);
});
afterAll(async () => {
  await t.close();
});

describe('a malformed multipart body', () => {
  for (const [route, urlOf] of Object.entries(ROUTES)) {
    for (const [kind, { contentType, body }] of Object.entries(BODIES)) {
      it(`${route}, ${kind}: 400 naming file, no stack trace, no error logged, nothing saved`, async () => {
        const url = await urlOf();
        const before = await savedState();
        logged.length = 0;
        const res = await owner.agent.post(url).set('X-CSRF-Token', owner.csrfToken).set('Content-Type', contentType).send(body);
        expect(res.status).toBe(400);
        expect(res.body.error.code).toBe('validation_failed');
        expect(res.body.error.fields).toEqual({ file: 'The upload was incomplete or malformed.' });
        expect(res.body.error.message).toMatch(/^file: The upload could not be read\./);
        expect(res.text).not.toMatch(/\bat .*\.(js|ts):\d+|stack|Unexpected end of form|Malformed part header|Boundary not found/);
        expect(logged.filter((l) => l.level === 'error')).toEqual([]);
        expect(await savedState()).toEqual(before);
      });
    }
  }
});
