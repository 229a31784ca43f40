/**
 * Every route that accepts an image (firm logo, floor plan, site document, job photo) refuses an
 * image over the pixel limit from its header, before anything decodes it, and one whose header
 * cannot be read; and a job photo's thumbnail is made in a worker thread, so the server keeps
 * answering (`/api/health`) while a large photo is being decoded.
 */
import { once } from 'node:events';
import fs from 'node:fs';
import path from 'node:path';
import { Jimp } from 'jimp';
import { Op } from 'sequelize';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LIMITS } from '@domain/limits';
import { Document } from '@server/models/Document';
import { Floor } from '@server/models/Floor';
import { Tenant } from '@server/models/Tenant';
import type { User } from '@server/models/User';
import { createThumbnailPool, ThumbnailUnavailableError, type Thumbnailer } from '@server/services/thumbnails';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, buildFloor, buildJob, TEST_PASSWORD } from '../support/factories';
import { jpegClaiming, pngClaiming, solidPng } from '../support/images';

let t: TestApp;
let pool: Thumbnailer;
let a: Awaited<ReturnType<typeof buildFirmWithSite>>;
let owner: Visitor;
/** thumbnail jobs started, running now, and the most running at once */
const jobs = { started: 0, active: 0, mostAtOnce: 0 };

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

function filesOf(tenantId: string): string[] {
  const dir = path.join(t.tenantsDir, tenantId);
  return fs.existsSync(dir) ? fs.readdirSync(dir).sort() : [];
}

type Route = 'logo' | 'floor plan' | 'document' | 'job photo';
const ROUTES: Route[] = ['logo', 'floor plan', 'document', 'job photo'];

/** Posts `data` as the route's file, as the owner. */
async function uploadTo(route: Route, data: Buffer, filename = 'image.png') {
  const post = (url: string) => owner.agent.post(url).set('X-CSRF-Token', owner.csrfToken);
  const attach = { filename, contentType: 'application/octet-stream' };
  switch (route) {
    case 'logo':
      return post('/api/firm/logo').attach('file', data, attach);
    case 'floor plan':
      return post(`/api/floors/${(await buildFloor(a.site)).id}/plan`).attach('file', data, attach);
    case 'document':
      return post(`/api/sites/${a.site.id}/documents`).field('kind', 'photo').attach('file', data, attach);
    case 'job photo': {
      const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: new Date() });
      return post(`/api/jobs/${job.id}/files`).attach('file', data, attach);
    }
  }
}

/** What the firm has saved: files, document rows, logo and floor plans. */
async function savedState() {
  const tenantId = a.firm.id;
  const tenant = await Tenant.findOne({ where: { id: tenantId } });
  const plans = await Floor.count({ where: { tenantId, planImageId: { [Op.ne]: null } } });
  return { files: filesOf(tenantId), documents: await Document.count({ where: { tenantId } }), logo: tenant!.logoFileId, plans };
}

beforeAll(async () => {
  pool = createThumbnailPool({ workers: 1 });
  pool.events.on('started', () => {
    jobs.started += 1;
    jobs.active += 1;
    jobs.mostAtOnce = Math.max(jobs.mostAtOnce, jobs.active);
  });
  pool.events.on('finished', () => {
    jobs.active -= 1;
  });
  t = await createTestApp({ thumbnails: pool });
  a = await buildFirmWithSite();
  owner = await signedIn(a.owner);
});
afterAll(async () => {
  await t.close(); // terminates the pool's workers too
});

describe('the pixel limit, read from the header', () => {
  it('is 40 megapixels', () => {
    expect(LIMITS.imageMaxPixels).toBe(40_000_000);
  });

  it.each(ROUTES)('refuses a %s whose header claims 16000 × 16000 pixels: 400 naming file, nothing decoded or stored', async (route) => {
    const bomb = pngClaiming(16000, 16000);
    expect(bomb.length).toBeLessThan(200);
    const before = await savedState();
    const startedBefore = jobs.started;
    const res = await uploadTo(route, bomb);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.fields.file).toBe('The image is 16,000 × 16,000 pixels; the largest accepted is 40 megapixels (for example 8,000 × 5,000). Scale it down and retry.');
    expect(jobs.started).toBe(startedBefore); // never handed to a decoder
    expect(await savedState()).toEqual(before);
  });

  it('counts pixels, not sides: a 9000 × 5000 JPEG (45 MP) is refused, an 8000 × 5000 one (40 MP) is accepted', async () => {
    const over = await uploadTo('document', jpegClaiming(9000, 5000), 'wide.jpg');
    expect(over.status).toBe(400);
    expect(over.body.error.fields.file).toMatch(/9,000 × 5,000 pixels/);
    const at = await uploadTo('document', jpegClaiming(8000, 5000), 'limit.jpg');
    expect(at.status).toBe(201);
    expect(at.body.data.contentType).toBe('image/jpeg');
  });

  it.each(ROUTES)('refuses a %s that starts like a PNG but whose header cannot be read: 415 naming file, nothing stored', async (route) => {
    const broken = Buffer.concat([pngClaiming(10, 10).subarray(0, 8), Buffer.alloc(120, 0)]);
    const before = await savedState();
    const startedBefore = jobs.started;
    const res = await uploadTo(route, broken);
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_type');
    expect(res.body.error.message).toMatch(/header cannot be read/);
    expect(res.body.error.fields.file).toBe('The PNG header cannot be read.');
    expect(jobs.started).toBe(startedBefore);
    expect(await savedState()).toEqual(before);
  });
});

describe('job-photo thumbnails in a worker thread', () => {
  it('answers /api/health while a large photo’s thumbnail is being made, before that thumbnail is finished', async () => {
    const large = solidPng(4000, 3000); // 12 MP: real decoding work, well under the limit
    const order: string[] = [];
    const onFinished = () => order.push('thumbnail finished');
    pool.events.on('finished', onFinished);
    const started = once(pool.events, 'started');
    const uploading = uploadTo('job photo', large, 'site-survey.png').then((res) => {
      order.push('upload answered');
      return res;
    });
    await started; // the decode is under way
    const health = await request(t.app).get('/api/health');
    order.push('health answered');
    expect(health.status).toBe(200);
    expect(health.body).toEqual({ ok: true });

    const res = await uploading;
    pool.events.off('finished', onFinished);
    expect(res.status).toBe(201);
    expect(order).toEqual(['health answered', 'thumbnail finished', 'upload answered']);
    const doc = (await Document.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } }))!;
    const thumb = await Jimp.read(fs.readFileSync(path.join(t.tenantsDir, a.firm.id, doc.thumbnailFileId!)));
    expect([thumb.width, thumb.height]).toEqual([320, 240]);
  });

  it('makes one thumbnail at a time with one worker: three photos at once all succeed', async () => {
    jobs.mostAtOnce = 0;
    const photos = [solidPng(800, 600), solidPng(640, 480), solidPng(1024, 768)];
    const results = await Promise.all(photos.map((p, i) => uploadTo('job photo', p, `photo-${i}.png`)));
    expect(results.map((r) => r.status)).toEqual([201, 201, 201]);
    expect(results.every((r) => typeof r.body.data.thumbnailUrl === 'string')).toBe(true);
    expect(jobs.mostAtOnce).toBe(1);
  });

  it('a closed pool refuses new work instead of starting a worker', async () => {
    const own = createThumbnailPool();
    const jpeg = await own.make(solidPng(50, 40), { width: 320, quality: 78 });
    expect((await Jimp.read(jpeg)).width).toBe(50);
    await own.close();
    await expect(own.make(solidPng(50, 40), { width: 320, quality: 78 })).rejects.toBeInstanceOf(ThumbnailUnavailableError);
  });
});
