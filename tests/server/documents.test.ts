import fs from 'node:fs';
import path from 'node:path';
import { DOCUMENT_MAX_BYTES } from '@domain/schemas/document';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Document } from '@server/models/Document';
import type { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { sniffImage, sniffPdf } from '@server/storage/tenant-files';
import { safeFileName } from '@server/services/documents';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';
import { jpegClaiming, webpClaiming } from '../support/images';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let bDocumentId: string;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1');
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
const JPEG = jpegClaiming(1200, 900);
const WEBP = webpClaiming(640, 480);
const TEXT = Buffer.from('This is a plain text note, not a PDF at all.\n');

interface UploadFields {
  kind?: string;
  title?: string;
  sharedWithClient?: string;
}

function upload(v: Visitor, siteId: string, data: Buffer | null, filename = 'permit.pdf', fields: UploadFields = { kind: 'permit' }) {
  let req = v.agent.post(`/api/sites/${siteId}/documents`).set('X-CSRF-Token', v.csrfToken);
  for (const [key, value] of Object.entries(fields)) if (value !== undefined) req = req.field(key, value);
  if (data) req = req.attach('file', data, { filename, contentType: 'application/octet-stream' });
  return req;
}

type StreamParser = Exclude<Parameters<ReturnType<Visitor['get']>['parse']>[0], (str: string) => unknown>;
const binary: StreamParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

function filesOf(tenantId: string): string[] {
  const dir = path.join(t.tenantsDir, tenantId);
  return fs.existsSync(dir) ? fs.readdirSync(dir).sort() : [];
}

async function documentOn(site: Site, data = PDF, filename = 'permit.pdf', fields: UploadFields = { kind: 'permit' }): Promise<string> {
  const res = await upload(as.owner, site.id, data, filename, fields);
  expect(res.status).toBe(201);
  return res.body.data.id as string;
}

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anon = await visitor(t.app);
  const bOwner = await signedIn(b.owner);
  const res = await upload(bOwner, b.site.id, PDF, 'firm-b-contract.pdf', { kind: 'contract', title: 'Firm B contract' });
  expect(res.status).toBe(201);
  bDocumentId = res.body.data.id as string;
});
afterAll(async () => {
  await t.close();
});

const FIRM_ROLES = ['owner', 'coordinator', 'technician', 'client'] as const;

describe('content sniffing and file names', () => {
  it('recognises PDF, PNG, JPEG and WebP by their first bytes only', () => {
    expect(sniffPdf(PDF)).toEqual({ contentType: 'application/pdf', extension: 'pdf' });
    expect(sniffPdf(TEXT)).toBeNull();
    expect(sniffPdf(Buffer.from(' %PDF-1.4'))).toBeNull();
    expect(sniffImage(PNG)?.contentType).toBe('image/png');
    expect(sniffImage(JPEG)?.contentType).toBe('image/jpeg');
    expect(sniffImage(WEBP)?.contentType).toBe('image/webp');
  });

  it('sanitises download names: last path segment, no quotes or control characters, the detected extension', () => {
    expect(safeFileName('../../etc/"permit".pdf', 'pdf')).toBe('permit.pdf');
    expect(safeFileName('C:\\scans\\Permit 2026.PDF', 'pdf')).toBe('Permit 2026.PDF');
    expect(safeFileName('invoice.exe', 'pdf')).toBe('invoice.exe.pdf');
    expect(safeFileName('photo\u202Egpj.pdf', 'png')).toBe('photogpj.pdf.png');
    expect(safeFileName('line\r\nbreak;.jpeg', 'jpg')).toBe('line break.jpeg');
    expect(safeFileName('', 'pdf')).toBe('document.pdf');
    expect(safeFileName('....pdf', 'pdf')).toBe('document.pdf');
    expect(safeFileName(`${'x'.repeat(300)}.pdf`, 'pdf')).toHaveLength(114);
  });
});

describe('POST /api/sites/:siteId/documents', () => {
  it('stores an allowed file under the firm’s folder, detected by content, audited', async () => {
    const site = await buildSite(a.firm, a.client);
    const before = filesOf(a.firm.id);
    const res = await upload(as.owner, site.id, PDF, 'Alarm permit 2026.pdf', { kind: 'permit', title: 'Alarm permit', sharedWithClient: 'true' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      siteId: site.id,
      kind: 'permit',
      title: 'Alarm permit',
      contentType: 'application/pdf',
      sizeBytes: PDF.length,
      originalName: 'Alarm permit 2026.pdf',
      sharedWithClient: true,
      uploadedById: a.owner.id,
    });
    expect(res.body.data).not.toHaveProperty('fileId');
    const after = filesOf(a.firm.id);
    expect(after.length).toBe(before.length + 1);
    const stored = await Document.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } });
    expect(after).toContain(stored!.fileId);
    expect(fs.readFileSync(path.join(t.tenantsDir, a.firm.id, stored!.fileId)).equals(PDF)).toBe(true);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'document.uploaded', subjectId: stored!.id } })).toBe(1);
  });

  it('accepts PNG, JPEG and WebP whatever their names say; the title defaults to the file name', async () => {
    const site = await buildSite(a.firm, a.client);
    for (const [data, name, type, originalName, title] of [
      [PNG, 'front-door.png', 'image/png', 'front-door.png', 'front-door'],
      [JPEG, 'panel-photo.bin', 'image/jpeg', 'panel-photo.bin.jpg', 'panel-photo.bin'],
      [WEBP, 'floor.webp', 'image/webp', 'floor.webp', 'floor'],
    ] as const) {
      const res = await upload(as.coordinator, site.id, data, name, { kind: 'photo' });
      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({ contentType: type, originalName, title, sharedWithClient: false });
    }
  });

  it('lets a technician upload (create) documents', async () => {
    const res = await upload(as.technician, a.site.id, JPEG, 'install.jpg', { kind: 'photo', title: 'Panel after install' });
    expect(res.status).toBe(201);
    expect(res.body.data.uploadedById).toBe(a.technician.id);
  });

  it('refuses a disguised type (text named .pdf) with 415: no file under tenants/, no row', async () => {
    const site = await buildSite(a.firm, a.client);
    const before = filesOf(a.firm.id);
    const res = await upload(as.owner, site.id, TEXT, 'contract.pdf', { kind: 'contract' });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(await Document.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
    const html = await upload(as.owner, site.id, Buffer.from('<html><script>alert(1)</script></html>'), 'photo.png', { kind: 'photo' });
    expect(html.status).toBe(415);
    expect(filesOf(a.firm.id)).toEqual(before);
  });

  it('refuses a file over DOCUMENT_MAX_BYTES with 413 too_large: nothing stored', async () => {
    const site = await buildSite(a.firm, a.client);
    const before = filesOf(a.firm.id);
    const big = Buffer.alloc(DOCUMENT_MAX_BYTES + 1, 0x20);
    PDF.copy(big, 0, 0, 8);
    const res = await upload(as.owner, site.id, big, 'huge.pdf', { kind: 'other' });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(await Document.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
    // exactly at the limit is fine
    const edge = Buffer.alloc(DOCUMENT_MAX_BYTES, 0x20);
    PDF.copy(edge, 0, 0, 8);
    expect((await upload(as.owner, site.id, edge, 'edge.pdf', { kind: 'other' })).status).toBe(201);
  });

  it('answers 400 naming the field for a missing file, a bad kind or sharedWithClient; nothing stored', async () => {
    const site = await buildSite(a.firm, a.client);
    const before = filesOf(a.firm.id);
    const noFile = await upload(as.owner, site.id, null, '', { kind: 'permit' });
    expect(noFile.status).toBe(400);
    expect(Object.keys(noFile.body.error.fields)).toEqual(['file']);
    const badKind = await upload(as.owner, site.id, PDF, 'x.pdf', { kind: 'receipt' });
    expect(badKind.status).toBe(400);
    expect(Object.keys(badKind.body.error.fields)).toEqual(['kind']);
    const noKind = await upload(as.owner, site.id, PDF, 'x.pdf', {});
    expect(Object.keys(noKind.body.error.fields)).toEqual(['kind']);
    const badShare = await upload(as.owner, site.id, PDF, 'x.pdf', { kind: 'permit', sharedWithClient: 'perhaps' });
    expect(Object.keys(badShare.body.error.fields)).toEqual(['sharedWithClient']);
    const empty = await upload(as.owner, site.id, Buffer.alloc(0), 'empty.pdf', { kind: 'permit' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toHaveProperty('file');
    const otherField = await as.owner.agent
      .post(`/api/sites/${site.id}/documents`)
      .set('X-CSRF-Token', as.owner.csrfToken)
      .field('kind', 'permit')
      .attach('attachment', PDF, 'x.pdf');
    expect(otherField.status).toBe(400);
    const malformed = await as.owner.agent
      .post(`/api/sites/${site.id}/documents`)
      .set('X-CSRF-Token', as.owner.csrfToken)
      .set('Content-Type', 'multipart/form-data; boundary=----mullion')
      .send('------mullion\r\nContent-Disposition: form-data; name="file"; filename="x.pdf"\r\n\r\n%PDF-1.4 cut off here');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toHaveProperty('file');
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(await Document.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
  });

  it('answers 403 to the client (own site) and the operator, 401 signed out, 404 for another firm’s or client’s site; nothing stored', async () => {
    const before = filesOf(a.firm.id);
    expect((await upload(as.client, a.site.id, PDF)).status).toBe(403);
    expect((await upload(as.operator, a.site.id, PDF)).status).toBe(403);
    expect((await upload(as.anon, a.site.id, PDF)).status).toBe(401);
    const neighbourSite = await buildSite(a.firm, await buildClient(a.firm));
    expect((await upload(as.client, neighbourSite.id, PDF)).status).toBe(404);
    const bBefore = filesOf(b.firm.id);
    for (const role of FIRM_ROLES) expect((await upload(as[role], b.site.id, PDF)).status, role).toBe(404);
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(filesOf(b.firm.id)).toEqual(bBefore);
    expect(await Document.count({ where: { tenantId: b.firm.id } })).toBe(1);
    const bad = await upload(as.owner, 'not-a-site', PDF);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('siteId');
  });
});

describe('GET /api/sites/:siteId/documents', () => {
  it('lists the site’s documents for every staff role, newest first, with search, sort and paging', async () => {
    const site = await buildSite(a.firm, a.client);
    await documentOn(site, PDF, 'a.pdf', { kind: 'permit', title: 'Alarm permit' });
    await new Promise((r) => setTimeout(r, 5));
    await documentOn(site, PNG, 'b.png', { kind: 'photo', title: 'Keypad photo' });
    await new Promise((r) => setTimeout(r, 5));
    await documentOn(site, PDF, 'c.pdf', { kind: 'contract', title: 'Monitoring contract' });
    await documentOn(a.site, PDF, 'elsewhere.pdf', { kind: 'other', title: 'Another site' });
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/sites/${site.id}/documents`);
      expect(res.status).toBe(200);
      expect((res.body.data as { title: string }[]).map((d) => d.title)).toEqual(['Monitoring contract', 'Keypad photo', 'Alarm permit']);
      expect(res.body.page).toEqual({ number: 1, size: 25, total: 3 });
    }
    const titles = async (qs: string) => ((await as.owner.get(`/api/sites/${site.id}/documents${qs}`)).body.data as { title: string }[]).map((d) => d.title);
    expect(await titles('?sort=title')).toEqual(['Alarm permit', 'Keypad photo', 'Monitoring contract']);
    expect(await titles('?sort=kind')).toEqual(['Monitoring contract', 'Alarm permit', 'Keypad photo']);
    expect(await titles('?q=keypad')).toEqual(['Keypad photo']);
    expect(await titles('?pageSize=1&page=3')).toEqual(['Alarm permit']);
    const bad = await as.owner.get(`/api/sites/${site.id}/documents?sort=fileId`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('sort');
  });

  it('answers 403 to the client on their own site, 404 on another client’s site', async () => {
    expect((await as.client.get(`/api/sites/${a.site.id}/documents`)).status).toBe(403);
    const neighbourSite = await buildSite(a.firm, await buildClient(a.firm));
    expect((await as.client.get(`/api/sites/${neighbourSite.id}/documents`)).status).toBe(404);
  });

  it('answers 404 for another firm’s site to every role, 403 to the operator, 401 signed out', async () => {
    for (const role of FIRM_ROLES) {
      const res = await as[role].get(`/api/sites/${b.site.id}/documents`);
      expect(res.status, role).toBe(404);
      expect(res.text).not.toContain('Firm B contract');
    }
    expect((await as.operator.get(`/api/sites/${a.site.id}/documents`)).status).toBe(403);
    expect((await as.anon.get(`/api/sites/${a.site.id}/documents`)).status).toBe(401);
  });
});

describe('GET /api/documents/:documentId/file', () => {
  it('downloads the bytes as an attachment with the sanitised original name, to every staff role', async () => {
    const site = await buildSite(a.firm, a.client);
    const id = await documentOn(site, PDF, '../../"Permit"\r\n 2026.pdf', { kind: 'permit' });
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/documents/${id}/file`).buffer(true).parse(binary);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['content-disposition']).toBe('attachment; filename="Permit 2026.pdf"');
      expect((res.body as Buffer).equals(PDF)).toBe(true);
    }
  });

  it('answers 404 to the client, 404 for another firm’s document to every role, 403 to the operator, 401 signed out', async () => {
    const id = await documentOn(a.site, PDF, 'internal.pdf', { kind: 'contract', sharedWithClient: 'true' });
    expect((await as.client.get(`/api/documents/${id}/file`)).status).toBe(404);
    for (const role of FIRM_ROLES) {
      const res = await as[role].get(`/api/documents/${bDocumentId}/file`);
      expect(res.status, role).toBe(404);
      expect(res.headers['content-disposition']).toBeUndefined();
    }
    expect((await as.operator.get(`/api/documents/${id}/file`)).status).toBe(403);
    expect((await as.anon.get(`/api/documents/${id}/file`)).status).toBe(401);
    const bad = await as.owner.get('/api/documents/../file');
    expect(bad.status).not.toBe(200);
    const badId = await as.owner.get('/api/documents/xyz/file');
    expect(badId.status).toBe(400);
    expect(badId.body.error.fields).toHaveProperty('documentId');
  });
});

describe('PATCH /api/documents/:documentId', () => {
  it('changes title, kind and sharing (owner and coordinator), audited', async () => {
    const id = await documentOn(a.site, PDF, 'scan.pdf', { kind: 'other' });
    const res = await as.coordinator.patch(`/api/documents/${id}`, { title: '  Protection certificate ', kind: 'certificate' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id, title: 'Protection certificate', kind: 'certificate', sharedWithClient: false });
    const shared = await as.owner.patch(`/api/documents/${id}`, { sharedWithClient: true });
    expect(shared.body.data.sharedWithClient).toBe(true);
    const stored = await Document.findOne({ where: { tenantId: a.firm.id, id } });
    expect(stored!.title).toBe('Protection certificate');
    expect(stored!.sharedWithClient).toBe(true);
    const actions = (await AuditEvent.findAll({ where: { tenantId: a.firm.id, subjectId: id }, order: [['createdAt', 'ASC']] })).map((e) => e.action);
    expect(actions).toEqual(['document.uploaded', 'document.updated', 'document.shared']);
  });

  it('answers 400 naming the field and changes nothing', async () => {
    const id = await documentOn(a.site, PDF, 'keep.pdf', { kind: 'permit', title: 'Keep me' });
    for (const [body, field] of [
      [{ title: '' }, 'title'],
      [{ kind: 'receipt' }, 'kind'],
      [{ sharedWithClient: 'maybe' }, 'sharedWithClient'],
    ] as const) {
      const res = await as.owner.patch(`/api/documents/${id}`, body);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    }
    const stored = await Document.findOne({ where: { tenantId: a.firm.id, id } });
    expect(stored!.title).toBe('Keep me');
  });

  it('answers 403 to a technician and the operator, 404 to the client, 401 signed out, 404 for another firm', async () => {
    const id = await documentOn(a.site, PDF, 'locked.pdf', { kind: 'permit', title: 'Locked' });
    expect((await as.technician.patch(`/api/documents/${id}`, { title: 'Tech' })).status).toBe(403);
    expect((await as.operator.patch(`/api/documents/${id}`, { title: 'Op' })).status).toBe(403);
    expect((await as.client.patch(`/api/documents/${id}`, { title: 'Client' })).status).toBe(404);
    expect((await as.anon.patch(`/api/documents/${id}`, { title: 'Anon' })).status).toBe(401);
    for (const role of FIRM_ROLES) expect((await as[role].patch(`/api/documents/${bDocumentId}`, { title: 'Taken' })).status, role).toBe(404);
    expect((await Document.findOne({ where: { tenantId: a.firm.id, id } }))!.title).toBe('Locked');
    expect((await Document.findOne({ where: { tenantId: b.firm.id, id: bDocumentId } }))!.title).toBe('Firm B contract');
  });
});

describe('DELETE /api/documents/:documentId', () => {
  it('removes the record and the stored file (owner and coordinator), audited', async () => {
    for (const role of ['owner', 'coordinator'] as const) {
      const id = await documentOn(a.site, PNG, 'old.png', { kind: 'photo' });
      const stored = await Document.findOne({ where: { tenantId: a.firm.id, id } });
      expect(filesOf(a.firm.id)).toContain(stored!.fileId);
      expect((await as[role].delete(`/api/documents/${id}`)).status).toBe(204);
      expect(await Document.count({ where: { tenantId: a.firm.id, id } })).toBe(0);
      expect(filesOf(a.firm.id)).not.toContain(stored!.fileId);
      expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'document.deleted', subjectId: id } })).toBe(1);
      expect((await as.owner.get(`/api/documents/${id}/file`)).status).toBe(404);
    }
  });

  it('answers 403 to a technician and the operator, 404 to the client, 401 signed out, 404 for another firm; nothing removed', async () => {
    const id = await documentOn(a.site, PDF, 'stays.pdf', { kind: 'permit' });
    expect((await as.technician.delete(`/api/documents/${id}`)).status).toBe(403);
    expect((await as.operator.delete(`/api/documents/${id}`)).status).toBe(403);
    expect((await as.client.delete(`/api/documents/${id}`)).status).toBe(404);
    expect((await as.anon.delete(`/api/documents/${id}`)).status).toBe(401);
    const bFiles = filesOf(b.firm.id);
    for (const role of FIRM_ROLES) expect((await as[role].delete(`/api/documents/${bDocumentId}`)).status, role).toBe(404);
    expect(await Document.count({ where: { tenantId: a.firm.id, id } })).toBe(1);
    expect(await Document.count({ where: { tenantId: b.firm.id, id: bDocumentId } })).toBe(1);
    expect(filesOf(b.firm.id)).toEqual(bFiles);
  });

  it('deleting a site removes its documents’ files too', async () => {
    const site = await buildSite(a.firm, a.client);
    const id = await documentOn(site, PDF, 'with-site.pdf', { kind: 'permit' });
    const stored = await Document.findOne({ where: { tenantId: a.firm.id, id } });
    expect((await as.owner.delete(`/api/sites/${site.id}`)).status).toBe(204);
    expect(await Document.count({ where: { tenantId: a.firm.id, id } })).toBe(0);
    expect(filesOf(a.firm.id)).not.toContain(stored!.fileId);
  });
});
