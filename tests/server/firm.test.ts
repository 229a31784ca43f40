import fs from 'node:fs';
import path from 'node:path';
import { Jimp } from 'jimp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Tenant } from '@server/models/Tenant';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

/** A real 1×1 PNG. */
const PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
  'base64',
);
/** The 1×1 PNG followed by padding up to `size` bytes. */
function pngOfSize(size: number): Buffer {
  const out = Buffer.alloc(size, 0x20);
  PNG.copy(out, 0);
  return out;
}

function uploadLogo(v: Visitor, data: Buffer, filename = 'logo.png', contentType = 'image/png') {
  return v.agent.post('/api/firm/logo').set('X-CSRF-Token', v.csrfToken).attach('file', data, { filename, contentType });
}

type StreamParser = Exclude<Parameters<ReturnType<Visitor['get']>['parse']>[0], (str: string) => unknown>;
/** Reads a binary response body as a Buffer. */
const binary: StreamParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

function filesOf(tenantId: string): string[] {
  const dir = path.join(t.tenantsDir, tenantId);
  return fs.existsSync(dir) ? fs.readdirSync(dir) : [];
}

describe('GET /api/firm', () => {
  it('answers the own firm to every staff role', async () => {
    const { firm, owner, coordinator, technician } = await buildFirmWithStaff();
    const fixedNow = t.clock.now;
    try {
      // the factory starts the 14-day trial now; read the firm one day later
      t.clock.now = new Date(firm.trialEndsAt!.getTime() - 13 * 24 * 60 * 60 * 1000);
      for (const who of [owner, coordinator, technician]) {
        const v = await signedIn(who);
        const res = await v.get('/api/firm');
        expect(res.status).toBe(200);
        expect(res.body.data).toMatchObject({ id: firm.id, name: firm.name, shortName: firm.shortName, state: 'trialing', timeZone: 'America/Chicago' });
        expect(res.body.data.trialDaysLeft).toBe(13);
      }
    } finally {
      t.clock.now = fixedNow;
    }
  });

  it('answers a client only the branding, without the firm’s internal fields', async () => {
    const { firm } = await buildFirmWithStaff();
    const client = await buildUser(firm, 'client');
    const v = await signedIn(client);
    const res = await v.get('/api/firm');
    expect(res.status).toBe(200);
    expect(res.body.data.id).toBe(firm.id);
    expect(res.body.data).not.toHaveProperty('licenceNumber');
    expect(res.body.data).not.toHaveProperty('state');
    expect(res.body.data).not.toHaveProperty('planKey');
  });

  it('answers 403 to the operator and 401 when signed out', async () => {
    const op = await signedIn(await buildUser(null, 'operator'));
    const res = await op.get('/api/firm');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    const anon = await visitor(t.app);
    expect((await anon.get('/api/firm')).status).toBe(401);
  });
});

describe('PATCH /api/firm', () => {
  it('lets the owner update the profile, stored and audited', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const shortName = `new-short-${firm.id.slice(0, 8)}`;
    const res = await v.patch('/api/firm', {
      name: '  Lanternfield Alarm Co.  ',
      shortName: shortName.toUpperCase(),
      timeZone: 'America/Denver',
      licenceNumber: 'LIC-0042',
      monitoringCenterName: 'Hollow Ridge Monitoring',
      monitoringCenterPhone: '+1 (555) 010-2000',
      accentColor: '#1d6b52',
    });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      id: firm.id,
      name: 'Lanternfield Alarm Co.',
      shortName,
      timeZone: 'America/Denver',
      licenceNumber: 'LIC-0042',
      monitoringCenterName: 'Hollow Ridge Monitoring',
      monitoringCenterPhone: '+1 (555) 010-2000',
      accentColor: '#1d6b52',
    });
    const stored = await Tenant.findOne({ where: { id: firm.id } });
    expect(stored!.name).toBe('Lanternfield Alarm Co.');
    expect(stored!.shortName).toBe(shortName);
    expect(stored!.timeZone).toBe('America/Denver');
    expect((await v.get('/api/firm')).body.data.accentColor).toBe('#1d6b52');
    const audit = await AuditEvent.findAll({ where: { tenantId: firm.id, action: 'firm.updated' } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.actorId).toBe(owner.id);
    expect((audit[0]!.details as { changed: string[] }).changed.sort()).toEqual(
      ['accentColor', 'licenceNumber', 'monitoringCenterName', 'monitoringCenterPhone', 'name', 'shortName', 'timeZone'].sort(),
    );
  });

  it('changes only the fields sent', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await v.patch('/api/firm', { licenceNumber: 'ONLY-THIS' });
    expect(res.status).toBe(200);
    const stored = await Tenant.findOne({ where: { id: firm.id } });
    expect(stored!.licenceNumber).toBe('ONLY-THIS');
    expect(stored!.name).toBe(firm.name);
    expect(stored!.shortName).toBe(firm.shortName);
  });

  it('refuses coordinators and technicians with 403 and changes nothing', async () => {
    const { firm, coordinator, technician } = await buildFirmWithStaff();
    for (const who of [coordinator, technician]) {
      const v = await signedIn(who);
      const res = await v.patch('/api/firm', { name: 'Taken Over' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const client = await signedIn(await buildUser(firm, 'client'));
    expect((await client.patch('/api/firm', { name: 'Taken Over' })).status).toBe(403);
    expect((await Tenant.findOne({ where: { id: firm.id } }))!.name).toBe(firm.name);
  });

  it('refuses the operator (403) and a signed-out visitor (401)', async () => {
    const op = await signedIn(await buildUser(null, 'operator'));
    expect((await op.patch('/api/firm', { name: 'Operator Firm' })).status).toBe(403);
    const anon = await visitor(t.app);
    expect((await anon.patch('/api/firm', { name: 'Anon Firm' })).status).toBe(401);
  });

  it('answers 400 naming the field for a bad time zone, colour or short name', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const cases: [Record<string, unknown>, string][] = [
      [{ timeZone: 'Mars/Olympus_Mons' }, 'timeZone'],
      [{ timeZone: '' }, 'timeZone'],
      [{ accentColor: 'red' }, 'accentColor'],
      [{ accentColor: '#12345' }, 'accentColor'],
      [{ shortName: 'has spaces' }, 'shortName'],
      [{ shortName: 'ab' }, 'shortName'],
      [{ shortName: 'double--hyphen' }, 'shortName'],
      [{ shortName: '-leading' }, 'shortName'],
      [{ name: 'x' }, 'name'],
      [{ monitoringCenterPhone: 'call me' }, 'monitoringCenterPhone'],
    ];
    for (const [body, field] of cases) {
      const res = await v.patch('/api/firm', body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields), JSON.stringify(body)).toEqual([field]);
    }
    const stored = await Tenant.findOne({ where: { id: firm.id } });
    expect(stored!.shortName).toBe(firm.shortName);
    expect(stored!.timeZone).toBe('America/Chicago');
    expect(stored!.accentColor).toBe('#8f5c17');
  });

  it('answers 409 naming shortName when another firm has it, and accepts the firm’s own', async () => {
    const a = await buildFirmWithStaff();
    const b = await buildFirmWithStaff();
    const v = await signedIn(a.owner);
    const res = await v.patch('/api/firm', { shortName: b.firm.shortName });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(res.body.error.fields).toHaveProperty('shortName');
    expect((await Tenant.findOne({ where: { id: a.firm.id } }))!.shortName).toBe(a.firm.shortName);
    const own = await v.patch('/api/firm', { shortName: a.firm.shortName });
    expect(own.status).toBe(200);
  });
});

describe('POST /api/firm/logo and GET /api/firm/logo', () => {
  it('accepts a PNG (201), stores it under the firm’s folder, and serves the bytes as image/png', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await uploadLogo(v, PNG);
    expect(res.status).toBe(201);
    expect(res.body.data.logoUrl).toMatch(/^\/api\/firm\/logo\?v=/);

    const files = filesOf(firm.id);
    expect(files).toHaveLength(1);
    expect(files[0]).toMatch(/^[0-9a-f-]{36}\.png$/);
    expect(fs.readFileSync(path.join(t.tenantsDir, firm.id, files[0]!)).equals(PNG)).toBe(true);

    const logo = await v.get('/api/firm/logo').buffer(true).parse(binary);
    expect(logo.status).toBe(200);
    expect(logo.headers['content-type']).toMatch(/^image\/png/);
    expect(logo.headers['x-content-type-options']).toBe('nosniff');
    expect(Buffer.isBuffer(logo.body)).toBe(true);
    expect((logo.body as Buffer).equals(PNG)).toBe(true);

    const stored = await Tenant.findOne({ where: { id: firm.id } });
    expect(stored!.logoContentType).toBe('image/png');
    const audit = await AuditEvent.findAll({ where: { tenantId: firm.id, action: 'firm.logo_changed' } });
    expect(audit).toHaveLength(1);
  });

  it('lets every firm member read the logo, and replaces the old file on a new upload', async () => {
    const { firm, owner, technician } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    await uploadLogo(vo, PNG).expect(201);
    const first = filesOf(firm.id);
    const jpeg = await new Jimp({ width: 4, height: 3, color: 0x204060ff }).getBuffer('image/jpeg');
    const res = await uploadLogo(vo, jpeg, 'logo.jpg', 'image/jpeg');
    expect(res.status).toBe(201);
    const second = filesOf(firm.id);
    expect(second).toHaveLength(1);
    expect(second[0]).not.toBe(first[0]);
    expect(second[0]).toMatch(/\.jpg$/);

    const vt = await signedIn(technician);
    const logo = await vt.get('/api/firm/logo').buffer(true).parse(binary);
    expect(logo.status).toBe(200);
    expect(logo.headers['content-type']).toMatch(/^image\/jpeg/);
    expect((logo.body as Buffer).equals(jpeg)).toBe(true);
  });

  it('answers 404 when the firm has no logo', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await v.get('/api/firm/logo');
    expect(res.status).toBe(404);
  });

  it('refuses a text file named .png with 415 unsupported_type and stores nothing', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await uploadLogo(v, Buffer.from('this is plain text, not a picture\n'), 'logo.png', 'image/png');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect(filesOf(firm.id)).toEqual([]);
    expect((await Tenant.findOne({ where: { id: firm.id } }))!.logoFileId).toBeNull();
  });

  it('refuses a file over 1 MB with 413 too_large and stores nothing', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const atLimit = await uploadLogo(v, pngOfSize(1024 * 1024));
    expect(atLimit.status).toBe(201);
    const before = filesOf(firm.id);
    const res = await uploadLogo(v, pngOfSize(1024 * 1024 + 1));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(filesOf(firm.id)).toEqual(before);
  });

  it('answers 400 naming file when no file is sent', async () => {
    const { owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await v.agent.post('/api/firm/logo').set('X-CSRF-Token', v.csrfToken).field('other', 'x');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('file');
  });

  it('refuses coordinators and technicians with 403 and stores nothing', async () => {
    const { firm, coordinator, technician } = await buildFirmWithStaff();
    for (const who of [coordinator, technician]) {
      const v = await signedIn(who);
      const res = await uploadLogo(v, PNG);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    expect(filesOf(firm.id)).toEqual([]);
  });

  it('refuses the operator (403) and a signed-out visitor (401)', async () => {
    const op = await signedIn(await buildUser(null, 'operator'));
    expect((await uploadLogo(op, PNG)).status).toBe(403);
    const anon = await visitor(t.app);
    expect((await uploadLogo(anon, PNG)).status).toBe(401);
  });

  it('DELETE /api/firm/logo removes the file (owner only)', async () => {
    const { firm, owner, coordinator } = await buildFirmWithStaff();
    const vo = await signedIn(owner);
    await uploadLogo(vo, PNG).expect(201);
    const vc = await signedIn(coordinator);
    expect((await vc.delete('/api/firm/logo')).status).toBe(403);
    expect(filesOf(firm.id)).toHaveLength(1);
    expect((await vo.delete('/api/firm/logo')).status).toBe(204);
    expect(filesOf(firm.id)).toEqual([]);
    expect((await vo.get('/api/firm/logo')).status).toBe(404);
  });
});
