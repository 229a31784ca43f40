/**
 * POST /api/jobs/:jobId/files and GET /api/documents/:documentId/thumbnail: photos and PDFs of a
 * job, recognised by content (a disguised executable is refused), size-limited, nothing stored
 * on error, images with a JPEG thumbnail about 320 px wide; downloads checked by ability.
 */
import fs from 'node:fs';
import path from 'node:path';
import { Jimp } from 'jimp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DOCUMENT_MAX_BYTES } from '@domain/schemas/document';
import { Document } from '@server/models/Document';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildJob, buildUser, TEST_PASSWORD } from '../support/factories';
import { webpClaiming } from '../support/images';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let otherTech: User;
let PNG: Buffer;
let JPEG: Buffer;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const START = new Date('2027-02-10T15:00:00Z');
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1');
const WEBP = webpClaiming(640, 480);
/** The start of a Windows executable, named like a photo. */
const EXE = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(58, 0x90), Buffer.from('This program cannot be run in DOS mode.\r\n'), Buffer.alloc(200, 0)]);
/** JPEG's first bytes, then nothing a decoder can read. */
const BROKEN_JPEG = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]), Buffer.from('JFIF\0'), Buffer.alloc(64, 0x00), Buffer.from([0xff, 0xd9])]);

type StreamParser = Exclude<Parameters<ReturnType<Visitor['get']>['parse']>[0], (str: string) => unknown>;
const binary: StreamParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

function upload(v: Visitor, jobId: string, data: Buffer | null, filename = 'photo.png', fields: Record<string, string> = {}) {
  let req = v.agent.post(`/api/jobs/${jobId}/files`).set('X-CSRF-Token', v.csrfToken);
  for (const [key, value] of Object.entries(fields)) req = req.field(key, value);
  if (data) req = req.attach('file', data, { filename, contentType: 'application/octet-stream' });
  return req;
}

function filesOf(tenantId: string): string[] {
  const dir = path.join(t.tenantsDir, tenantId);
  return fs.existsSync(dir) ? fs.readdirSync(dir).sort() : [];
}

const openJob = (technicianId: string = a.technician.id) => buildJob(a.site, { state: 'in_progress', technicianId, scheduledStart: START });

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  otherTech = await buildUser(a.firm, 'technician');
  PNG = await new Jimp({ width: 800, height: 600, color: 0x4a7a96ff }).getBuffer('image/png');
  JPEG = await new Jimp({ width: 200, height: 100, color: 0xc0a060ff }).getBuffer('image/jpeg');
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.anon = await visitor(t.app);
});
afterAll(async () => {
  await t.close();
});

describe('POST /api/jobs/:jobId/files', () => {
  it('stores a photo as a document of the job’s site with a 320 px JPEG thumbnail', async () => {
    const job = await openJob();
    const before = filesOf(a.firm.id);
    const res = await upload(as.technician, job.id, PNG, 'back-door.png', { title: 'Back door after', sharedWithClient: 'true' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      siteId: a.site.id,
      jobId: job.id,
      kind: 'photo',
      title: 'Back door after',
      contentType: 'image/png',
      sizeBytes: PNG.length,
      originalName: 'back-door.png',
      sharedWithClient: true,
      uploadedById: a.technician.id,
      fileUrl: `/api/documents/${res.body.data.id}/file`,
      thumbnailUrl: `/api/documents/${res.body.data.id}/thumbnail`,
    });
    const doc = (await Document.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } }))!;
    expect(filesOf(a.firm.id)).toEqual([...before, doc.fileId, doc.thumbnailFileId!].sort());

    const thumb = await as.technician.get(res.body.data.thumbnailUrl).buffer(true).parse(binary);
    expect(thumb.status).toBe(200);
    expect(thumb.headers['content-type']).toBe('image/jpeg');
    const image = await Jimp.read(thumb.body as Buffer);
    expect(image.width).toBe(320);
    expect(image.height).toBe(240);

    const read = await as.coordinator.get(`/api/jobs/${job.id}`);
    expect((read.body.data.files as { id: string }[]).map((f) => f.id)).toEqual([doc.id]);
  });

  it('keeps a small photo’s size, files a PDF as “other” without a thumbnail, and a WebP without one', async () => {
    const job = await openJob();
    const small = await upload(as.coordinator, job.id, JPEG, 'meter.jpg');
    expect(small.status).toBe(201);
    expect(small.body.data).toMatchObject({ kind: 'photo', contentType: 'image/jpeg', title: 'meter', sharedWithClient: false });
    const thumb = await as.coordinator.get(small.body.data.thumbnailUrl).buffer(true).parse(binary);
    expect((await Jimp.read(thumb.body as Buffer)).width).toBe(200);

    const pdf = await upload(as.coordinator, job.id, PDF, 'invoice.pdf', { title: 'Supplier invoice' });
    expect(pdf.status).toBe(201);
    expect(pdf.body.data).toMatchObject({ kind: 'other', contentType: 'application/pdf', thumbnailUrl: null });
    expect((await as.coordinator.get(`/api/documents/${pdf.body.data.id}/thumbnail`)).status).toBe(404);

    const webp = await upload(as.coordinator, job.id, WEBP, 'shot.webp');
    expect(webp.status).toBe(201);
    expect(webp.body.data).toMatchObject({ kind: 'photo', contentType: 'image/webp', thumbnailUrl: null });
  });

  it('refuses an executable named photo.jpg with 415 naming what is allowed: no file, no row', async () => {
    const job = await openJob();
    const before = filesOf(a.firm.id);
    const rows = await Document.count({ where: { tenantId: a.firm.id } });
    const res = await upload(as.technician, job.id, EXE, 'photo.jpg', { title: 'Totally a photo' });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect(res.body.error.message).toMatch(/PNG, JPEG or WebP/);
    expect(res.body.error.message).toMatch(/PDF/);
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(await Document.count({ where: { tenantId: a.firm.id } })).toBe(rows);
  });

  it('refuses a file that starts like a JPEG but is not one (415), storing nothing', async () => {
    const job = await openJob();
    const before = filesOf(a.firm.id);
    const res = await upload(as.technician, job.id, BROKEN_JPEG, 'photo.jpg');
    expect(res.status).toBe(415);
    expect(res.body.error.message).toMatch(/cannot be read/);
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(await Document.count({ where: { tenantId: a.firm.id, jobId: job.id } })).toBe(0);
  });

  it('refuses a file over 10 MB with 413 too_large: nothing stored', async () => {
    const job = await openJob();
    const before = filesOf(a.firm.id);
    const big = Buffer.alloc(DOCUMENT_MAX_BYTES + 1, 0x20);
    PDF.copy(big, 0, 0, 8);
    const res = await upload(as.technician, job.id, big, 'scan.pdf');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(res.body.error.message).toMatch(/10 MB/);
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(await Document.count({ where: { tenantId: a.firm.id, jobId: job.id } })).toBe(0);
  });

  it('answers 400 naming the field: no file, an empty file, a bad sharedWithClient', async () => {
    const job = await openJob();
    const before = filesOf(a.firm.id);
    const none = await upload(as.technician, job.id, null, '', { title: 'x' });
    expect(none.status).toBe(400);
    expect(Object.keys(none.body.error.fields)).toEqual(['file']);
    const empty = await upload(as.technician, job.id, Buffer.alloc(0), 'x.png');
    expect(empty.body.error.fields).toHaveProperty('file');
    const share = await upload(as.technician, job.id, PNG, 'x.png', { sharedWithClient: 'perhaps' });
    expect(share.status).toBe(400);
    expect(Object.keys(share.body.error.fields)).toEqual(['sharedWithClient']);
    expect(filesOf(a.firm.id)).toEqual(before);
  });

  it('refuses a closed job (409), another technician’s job (403), a client and another firm (404), the operator (403), signed out (401)', async () => {
    const before = filesOf(a.firm.id);
    const done = await buildJob(a.site, { state: 'completed', technicianId: a.technician.id, scheduledStart: START });
    expect((await upload(as.technician, done.id, PNG)).status).toBe(409);
    const theirs = await openJob(otherTech.id);
    const forbidden = await upload(as.technician, theirs.id, PNG);
    expect(forbidden.status).toBe(403);
    expect((await upload(as.client, theirs.id, PNG)).status).toBe(404);
    expect((await upload(as.operator, theirs.id, PNG)).status).toBe(403);
    expect((await upload(as.anon, theirs.id, PNG)).status).toBe(401);
    const bJob = await buildJob(b.site, { state: 'in_progress', technicianId: b.technician.id, scheduledStart: START });
    expect((await upload(as.owner, bJob.id, PNG)).status).toBe(404);
    expect(filesOf(a.firm.id)).toEqual(before);
    expect(filesOf(b.firm.id)).toEqual([]);
    // the office may add to any open job
    expect((await upload(as.owner, theirs.id, PNG)).status).toBe(201);
  });
});

describe('downloads of job files', () => {
  let docId: string;
  let bDocId: string;

  beforeAll(async () => {
    const job = await openJob();
    const res = await upload(as.technician, job.id, PNG, 'panel.png');
    docId = res.body.data.id as string;
    const bJob = await buildJob(b.site, { state: 'in_progress', technicianId: b.technician.id, scheduledStart: START });
    const bOwner = await signedIn(b.owner);
    const bRes = await upload(bOwner, bJob.id, PNG, 'theirs.png');
    expect(bRes.status).toBe(201);
    bDocId = bRes.body.data.id as string;
  });

  it('serves the file through GET /api/documents/:id/file to staff of the firm', async () => {
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/documents/${docId}/file`).buffer(true).parse(binary);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('image/png');
      expect((res.body as Buffer).equals(PNG)).toBe(true);
    }
  });

  it('answers 404 for another firm’s file and thumbnail, and to a client; 401 signed out; 403 to the operator', async () => {
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      expect((await as[role].get(`/api/documents/${bDocId}/file`)).status).toBe(404);
      expect((await as[role].get(`/api/documents/${bDocId}/thumbnail`)).status).toBe(404);
    }
    expect((await as.client.get(`/api/documents/${docId}/file`)).status).toBe(404);
    expect((await as.client.get(`/api/documents/${docId}/thumbnail`)).status).toBe(404);
    expect((await as.anon.get(`/api/documents/${docId}/thumbnail`)).status).toBe(401);
    expect((await as.operator.get(`/api/documents/${docId}/thumbnail`)).status).toBe(403);
    expect((await as.owner.get('/api/documents/not-an-id/thumbnail')).status).toBe(400);
  });
});
