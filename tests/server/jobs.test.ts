/**
 * Jobs: the list with its filters and sorts, create (state and checklist defaults, site and
 * technician checked), read (the staff JSON with overlaps) and change (technicians only their
 * own job's checklist, parts, notes and touched zones; closed jobs refuse edits).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_CHECKLISTS } from '@domain/jobs';
import { AuditEvent } from '@server/models/AuditEvent';
import { Job } from '@server/models/Job';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildJob, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let otherTech: User;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const at = (iso: string) => new Date(iso);

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  otherTech = await buildUser(a.firm, 'technician', { name: 'Other Tech' });
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

const JOB_KEYS = [
  'id',
  'siteId',
  'siteName',
  'siteTimeZone',
  'kind',
  'state',
  'scheduledStart',
  'scheduledEnd',
  'technicianId',
  'technicianName',
  'summary',
  'clientNotes',
  'internalNotes',
  'parts',
  'checklist',
  'touchedZoneIds',
  'cancelReason',
  'requestedByClient',
  'startedAt',
  'completedAt',
  'completedById',
  'reportUrl',
  'walkTest',
  'files',
  'overlaps',
  'createdAt',
  'updatedAt',
].sort();

describe('who may use /api/jobs', () => {
  it('answers 401 signed out on every route', async () => {
    const job = await buildJob(a.site);
    expect((await as.anon.get('/api/jobs')).status).toBe(401);
    expect((await as.anon.post('/api/jobs', { siteId: a.site.id, kind: 'install', summary: 'x' })).status).toBe(401);
    expect((await as.anon.get(`/api/jobs/${job.id}`)).status).toBe(401);
    expect((await as.anon.patch(`/api/jobs/${job.id}`, { summary: 'x' })).status).toBe(401);
  });

  it('answers 403 to the operator: they have no firm', async () => {
    const job = await buildJob(a.site);
    expect((await as.operator.get('/api/jobs')).status).toBe(403);
    expect((await as.operator.post('/api/jobs', { siteId: a.site.id, kind: 'install', summary: 'x' })).status).toBe(403);
    expect((await as.operator.get(`/api/jobs/${job.id}`)).status).toBe(403);
    expect((await as.operator.patch(`/api/jobs/${job.id}`, { summary: 'x' })).status).toBe(403);
  });

  it('gives a client nothing yet: the list and create are forbidden, a job answers 404', async () => {
    const job = await buildJob(a.site);
    expect((await as.client.get('/api/jobs')).status).toBe(403);
    expect((await as.client.post('/api/jobs', { siteId: a.site.id, kind: 'service_call', summary: 'Beeping' })).status).toBe(403);
    const read = await as.client.get(`/api/jobs/${job.id}`);
    expect(read.status).toBe(404);
    expect(read.body.error.code).toBe('not_found');
    expect((await as.client.patch(`/api/jobs/${job.id}`, { summary: 'x' })).status).toBe(404);
  });

  it('answers 404 for another firm’s job to every role, and never lists it', async () => {
    const theirs = await buildJob(b.site, { summary: 'Firm B job' });
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      expect((await as[role].get(`/api/jobs/${theirs.id}`)).status).toBe(404);
      expect((await as[role].patch(`/api/jobs/${theirs.id}`, { clientNotes: 'x' })).status).toBe(404);
      const list = await as[role].get('/api/jobs?pageSize=100');
      expect((list.body.data as { id: string }[]).map((j) => j.id)).not.toContain(theirs.id);
    }
  });

  it('answers 400 for a malformed job id', async () => {
    const res = await as.owner.get('/api/jobs/not-a-uuid');
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('jobId');
  });
});

describe('POST /api/jobs', () => {
  it('creates a scheduled job when a technician and a start are given, with the default checklist, audited', async () => {
    const res = await as.coordinator.post('/api/jobs', {
      siteId: a.site.id,
      kind: 'install',
      summary: 'Install four window contacts',
      technicianId: a.technician.id,
      scheduledStart: '2026-12-03T15:00:00Z',
      scheduledEnd: '2026-12-03T17:00:00Z',
      clientNotes: 'Please keep the dog inside.',
      internalNotes: 'Client prefers mornings.',
      parts: [{ description: 'Window contact', quantity: 4, unitPriceCents: 2450 }],
    });
    expect(res.status).toBe(201);
    const job = res.body.data;
    expect(Object.keys(job).sort()).toEqual(JOB_KEYS);
    expect(job).toMatchObject({
      siteId: a.site.id,
      siteName: a.site.name,
      siteTimeZone: 'America/Chicago',
      kind: 'install',
      state: 'scheduled',
      scheduledStart: '2026-12-03T15:00:00.000Z',
      scheduledEnd: '2026-12-03T17:00:00.000Z',
      technicianId: a.technician.id,
      technicianName: a.technician.name,
      summary: 'Install four window contacts',
      clientNotes: 'Please keep the dog inside.',
      internalNotes: 'Client prefers mornings.',
      parts: [{ description: 'Window contact', quantity: 4, unitPriceCents: 2450 }],
      touchedZoneIds: [],
      cancelReason: '',
      requestedByClient: false,
      startedAt: null,
      completedAt: null,
      completedById: null,
      reportUrl: null,
      walkTest: [],
      files: [],
      overlaps: [],
    });
    expect(job.checklist).toEqual(DEFAULT_CHECKLISTS.install.map((label) => ({ label, done: false })));
    expect(job.checklist[0].label).toMatch(/mounting surface/);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'job.created', subjectId: job.id } })).toBe(1);
  });

  it('creates a requested job without a technician or a start; the owner may too', async () => {
    const res = await as.owner.post('/api/jobs', { siteId: a.site.id, kind: 'service_call', summary: 'Keypad beeping', scheduledStart: '2026-12-04T15:00:00Z' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ state: 'requested', technicianId: null, technicianName: null });
    const noStart = await as.owner.post('/api/jobs', { siteId: a.site.id, kind: 'service_call', summary: 'Keypad beeping', technicianId: a.technician.id });
    expect(noStart.body.data.state).toBe('requested');
  });

  it('starts from the firm’s checklist template for the kind, else ours; a checklist sent is kept', async () => {
    a.firm.checklistTemplates = { battery_round: ['Swap every battery due', 'Photo the panel'] };
    await a.firm.save();
    const res = await as.coordinator.post('/api/jobs', { siteId: a.site.id, kind: 'battery_round', summary: 'Batteries' });
    expect(res.body.data.checklist).toEqual([
      { label: 'Swap every battery due', done: false },
      { label: 'Photo the panel', done: false },
    ]);
    const other = await as.coordinator.post('/api/jobs', { siteId: a.site.id, kind: 'inspection', summary: 'Yearly' });
    expect(other.body.data.checklist).toEqual(DEFAULT_CHECKLISTS.inspection.map((label) => ({ label, done: false })));
    const given = await as.coordinator.post('/api/jobs', { siteId: a.site.id, kind: 'inspection', summary: 'Yearly', checklist: [{ label: 'Only this' }] });
    expect(given.body.data.checklist).toEqual([{ label: 'Only this', done: false }]);
    a.firm.checklistTemplates = null;
    await a.firm.save();
  });

  it('lets owners and coordinators assign a job to an active coordinator or owner too', async () => {
    const res = await as.owner.post('/api/jobs', {
      siteId: a.site.id,
      kind: 'takeover',
      summary: 'Take over the old system',
      technicianId: a.owner.id,
      scheduledStart: '2026-12-05T15:00:00Z',
    });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ state: 'scheduled', technicianName: a.owner.name });
  });

  it('refuses a technician (403): the office creates jobs', async () => {
    const res = await as.technician.post('/api/jobs', { siteId: a.site.id, kind: 'service_call', summary: 'Fix' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
  });

  it('answers 400 siteId for a site of another firm, and creates nothing', async () => {
    const before = await Job.count({ where: { tenantId: a.firm.id } });
    const res = await as.coordinator.post('/api/jobs', { siteId: b.site.id, kind: 'install', summary: 'Sneaky' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields)).toEqual(['siteId']);
    expect(await Job.count({ where: { tenantId: a.firm.id } })).toBe(before);
    expect(await Job.count({ where: { tenantId: b.firm.id, summary: 'Sneaky' } })).toBe(0);
  });

  it('answers 400 technicianId for someone who is not an active technician, owner or coordinator of the firm', async () => {
    const gone = await buildUser(a.firm, 'technician', { deactivatedAt: new Date() });
    for (const id of [gone.id, a.clientUser.id, b.technician.id, '7c1e5b0e-8a51-4c43-9d55-3b1b1d1f0a01']) {
      const res = await as.coordinator.post('/api/jobs', { siteId: a.site.id, kind: 'install', summary: 'x', technicianId: id, scheduledStart: '2026-12-03T15:00:00Z' });
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual(['technicianId']);
    }
  });

  it('answers 400 naming each bad field', async () => {
    const cases: [object, string][] = [
      [{ siteId: a.site.id, kind: 'repaint', summary: 'x' }, 'kind'],
      [{ siteId: a.site.id, kind: 'install', summary: '' }, 'summary'],
      [{ siteId: 'nope', kind: 'install', summary: 'x' }, 'siteId'],
      [{ siteId: a.site.id, kind: 'install', summary: 'x', scheduledStart: '2026-12-03T15:00:00Z', scheduledEnd: '2026-12-03T14:00:00Z' }, 'scheduledEnd'],
      [{ siteId: a.site.id, kind: 'install', summary: 'x', scheduledStart: 'tomorrow' }, 'scheduledStart'],
      [{ siteId: a.site.id, kind: 'install', summary: 'x', parts: [{ description: 'Contact', quantity: 0, unitPriceCents: 100 }] }, 'parts.0.quantity'],
      [{ siteId: a.site.id, kind: 'install', summary: 'x', parts: [{ description: 'Contact', quantity: 1, unitPriceCents: 1.5 }] }, 'parts.0.unitPriceCents'],
    ];
    for (const [body, field] of cases) {
      const res = await as.coordinator.post('/api/jobs', body);
      expect(res.status, field).toBe(400);
      expect(res.body.error.fields, field).toHaveProperty([field]);
    }
  });

  it('checks touched zones are zones of the job’s site (400 touchedZoneIds.<index>)', async () => {
    const panel = await buildPanel(a.site);
    const here = await buildZone(panel, { number: 9 });
    const otherSite = await buildSite(a.firm, await buildClient(a.firm));
    const there = await buildZone(await buildPanel(otherSite), { number: 9 });
    const bad = await as.coordinator.post('/api/jobs', { siteId: a.site.id, kind: 'service_call', summary: 'x', touchedZoneIds: [here.id, there.id] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toEqual(['touchedZoneIds.1']);
    const good = await as.coordinator.post('/api/jobs', { siteId: a.site.id, kind: 'service_call', summary: 'x', touchedZoneIds: [here.id, here.id] });
    expect(good.status).toBe(201);
    expect(good.body.data.touchedZoneIds).toEqual([here.id]);
  });
});

describe('GET /api/jobs', () => {
  let site: Awaited<ReturnType<typeof buildSite>>;
  let ids: Record<string, string>;

  beforeAll(async () => {
    site = await buildSite(a.firm, a.client, { name: 'Filter test home' });
    const mk = async (key: string, o: Parameters<typeof buildJob>[1]) => [key, (await buildJob(site, o)).id] as const;
    ids = Object.fromEntries(
      await Promise.all([
        mk('mon', { kind: 'install', technicianId: a.technician.id, scheduledStart: at('2027-03-01T15:00:00Z'), summary: 'Monday install' }),
        mk('tue', { kind: 'battery_round', technicianId: otherTech.id, scheduledStart: at('2027-03-02T15:00:00Z'), summary: 'Tuesday batteries' }),
        mk('wed', { kind: 'inspection', technicianId: a.technician.id, scheduledStart: at('2027-03-03T15:00:00Z'), summary: 'Wednesday inspection', state: 'in_progress' }),
        mk('req', { kind: 'service_call', summary: 'Requested keypad fix' }),
      ]),
    );
  });

  it('lists the firm’s jobs with paging, filtered by site', async () => {
    const res = await as.coordinator.get(`/api/jobs?siteId=${site.id}&pageSize=2`);
    expect(res.status).toBe(200);
    expect(res.body.page).toEqual({ number: 1, size: 2, total: 4 });
    expect(res.body.data).toHaveLength(2);
    expect(Object.keys(res.body.data[0]).sort()).toEqual(JOB_KEYS);
    const page2 = await as.coordinator.get(`/api/jobs?siteId=${site.id}&pageSize=2&page=2`);
    expect(page2.body.data).toHaveLength(2);
    const all = [...res.body.data, ...page2.body.data].map((j: { id: string }) => j.id).sort();
    expect(all).toEqual(Object.values(ids).sort());
  });

  it('shows a technician every job of the firm, not only their own', async () => {
    const res = await as.technician.get(`/api/jobs?siteId=${site.id}`);
    expect(res.status).toBe(200);
    expect(res.body.page.total).toBe(4);
  });

  it('filters by state, kind, technician, date range and text', async () => {
    const idsOf = async (qs: string) => ((await as.owner.get(`/api/jobs?siteId=${site.id}&${qs}`)).body.data as { id: string }[]).map((j) => j.id).sort();
    expect(await idsOf('state=in_progress')).toEqual([ids.wed]);
    expect(await idsOf('kind=battery_round')).toEqual([ids.tue]);
    expect(await idsOf(`technicianId=${a.technician.id}`)).toEqual([ids.mon, ids.wed].sort());
    expect(await idsOf('from=2027-03-02T00:00:00Z&to=2027-03-03T00:00:00Z')).toEqual([ids.tue]);
    expect(await idsOf('from=2027-03-02T00:00:00Z')).toEqual([ids.tue, ids.wed].sort());
    expect(await idsOf('q=keypad')).toEqual([ids.req]);
  });

  it('sorts by scheduledStart (default), createdAt, state and kind, either way', async () => {
    const order = async (sort: string) => ((await as.owner.get(`/api/jobs?siteId=${site.id}&sort=${sort}`)).body.data as { id: string }[]).map((j) => j.id);
    expect((await order('-scheduledStart')).slice(0, 3)).toEqual([ids.wed, ids.tue, ids.mon]);
    expect((await order('scheduledStart')).slice(1)).toEqual([ids.mon, ids.tue, ids.wed]);
    expect(await order('kind')).toEqual([ids.tue, ids.wed, ids.mon, ids.req]);
    expect((await order('-kind'))[0]).toBe(ids.req);
    expect((await order('state'))[0]).toBe(ids.wed);
    expect((await order('-createdAt')).length).toBe(4);
  });

  it('answers 400 naming the field for a bad filter or sort', async () => {
    const cases: [string, string][] = [
      ['sort=summary', 'sort'],
      ['state=done', 'state'],
      ['kind=repaint', 'kind'],
      ['technicianId=bob', 'technicianId'],
      ['from=monday', 'from'],
      ['from=2027-03-03T00:00:00Z&to=2027-03-02T00:00:00Z', 'to'],
      ['pageSize=1000', 'pageSize'],
    ];
    for (const [qs, field] of cases) {
      const res = await as.owner.get(`/api/jobs?${qs}`);
      expect(res.status, qs).toBe(400);
      expect(res.body.error.fields, qs).toHaveProperty([field]);
    }
  });
});

describe('GET /api/jobs/:jobId', () => {
  it('answers the staff JSON to owner, coordinator and any technician of the firm', async () => {
    const job = await buildJob(a.site, { technicianId: otherTech.id, scheduledStart: at('2027-04-01T15:00:00Z'), internalNotes: 'Dog bites.' });
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/jobs/${job.id}`);
      expect(res.status).toBe(200);
      expect(Object.keys(res.body.data).sort()).toEqual(JOB_KEYS);
      expect(res.body.data).toMatchObject({ id: job.id, internalNotes: 'Dog bites.', technicianName: 'Other Tech', state: 'scheduled' });
    }
  });

  it('flags overlapping open jobs of the same technician', async () => {
    const tech = await buildUser(a.firm, 'technician');
    const first = await buildJob(a.site, { technicianId: tech.id, scheduledStart: at('2027-05-01T14:00:00Z'), scheduledEnd: at('2027-05-01T16:00:00Z') });
    const second = await buildJob(a.site, { technicianId: tech.id, scheduledStart: at('2027-05-01T15:00:00Z'), scheduledEnd: at('2027-05-01T17:00:00Z') });
    // no end: a one-hour visit, 15:30–16:30
    const third = await buildJob(a.site, { technicianId: tech.id, scheduledStart: at('2027-05-01T15:30:00Z') });
    // touching, not overlapping
    const later = await buildJob(a.site, { technicianId: tech.id, scheduledStart: at('2027-05-01T17:00:00Z'), scheduledEnd: at('2027-05-01T18:00:00Z') });
    // closed jobs and other technicians do not count
    await buildJob(a.site, { technicianId: tech.id, scheduledStart: at('2027-05-01T15:00:00Z'), state: 'cancelled', cancelReason: 'Client away' });
    await buildJob(a.site, { technicianId: a.technician.id, scheduledStart: at('2027-05-01T15:00:00Z') });
    const overlapsOf = async (id: string) => ((await as.coordinator.get(`/api/jobs/${id}`)).body.data.overlaps as string[]).sort();
    expect(await overlapsOf(first.id)).toEqual([second.id, third.id].sort());
    expect(await overlapsOf(second.id)).toEqual([first.id, third.id].sort());
    expect(await overlapsOf(third.id)).toEqual([first.id, second.id].sort());
    expect(await overlapsOf(later.id)).toEqual([]);
    const list = await as.coordinator.get(`/api/jobs?technicianId=${tech.id}&sort=scheduledStart`);
    const listed = (list.body.data as { id: string; overlaps: string[] }[]).find((j) => j.id === first.id);
    expect(listed?.overlaps.sort()).toEqual([second.id, third.id].sort());
  });
});

describe('PATCH /api/jobs/:jobId', () => {
  it('lets the office reschedule and reassign; a requested job with a technician and a start becomes scheduled', async () => {
    const job = await buildJob(a.site);
    const res = await as.coordinator.patch(`/api/jobs/${job.id}`, { technicianId: otherTech.id, scheduledStart: '2027-06-01T15:00:00Z', scheduledEnd: '2027-06-01T16:00:00Z' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ state: 'scheduled', technicianId: otherTech.id, scheduledStart: '2027-06-01T15:00:00.000Z' });
    const moved = await as.owner.patch(`/api/jobs/${job.id}`, { scheduledStart: '2027-06-02T15:00:00Z', scheduledEnd: '2027-06-02T16:30:00Z', summary: 'Moved a day' });
    expect(moved.body.data).toMatchObject({ scheduledEnd: '2027-06-02T16:30:00.000Z', summary: 'Moved a day', state: 'scheduled' });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'job.updated', subjectId: job.id } })).toBe(2);
  });

  it('checks the merged schedule and the technician (400 naming the field)', async () => {
    const job = await buildJob(a.site, { technicianId: a.technician.id, scheduledStart: at('2027-06-01T15:00:00Z'), scheduledEnd: at('2027-06-01T16:00:00Z') });
    const endBefore = await as.coordinator.patch(`/api/jobs/${job.id}`, { scheduledEnd: '2027-06-01T14:00:00Z' });
    expect(endBefore.status).toBe(400);
    expect(Object.keys(endBefore.body.error.fields)).toEqual(['scheduledEnd']);
    const startAfter = await as.coordinator.patch(`/api/jobs/${job.id}`, { scheduledStart: '2027-06-01T17:00:00Z' });
    expect(Object.keys(startAfter.body.error.fields)).toEqual(['scheduledStart']);
    const clientTech = await as.coordinator.patch(`/api/jobs/${job.id}`, { technicianId: a.clientUser.id });
    expect(Object.keys(clientTech.body.error.fields)).toEqual(['technicianId']);
    const unassign = await as.coordinator.patch(`/api/jobs/${job.id}`, { technicianId: null });
    expect(unassign.status).toBe(400);
    expect(unassign.body.error.fields).toHaveProperty('technicianId');
    const badPart = await as.coordinator.patch(`/api/jobs/${job.id}`, { parts: [{ description: '', quantity: 1, unitPriceCents: 100 }] });
    expect(Object.keys(badPart.body.error.fields)).toEqual(['parts.0.description']);
    expect((await Job.findOne({ where: { tenantId: a.firm.id, id: job.id } }))!.technicianId).toBe(a.technician.id);
  });

  it('lets a technician change the checklist, parts, notes and touched zones of their own job', async () => {
    const zone = await buildZone(await buildPanel(a.site), { number: 20 });
    const job = await buildJob(a.site, { technicianId: a.technician.id, scheduledStart: at('2027-06-03T15:00:00Z'), checklist: [{ label: 'Test', done: false }] });
    const res = await as.technician.patch(`/api/jobs/${job.id}`, {
      checklist: [{ label: 'Test', done: true }],
      parts: [{ description: 'CR123A battery', quantity: 2, unitPriceCents: 650 }],
      clientNotes: 'Replaced both batteries.',
      internalNotes: 'Side gate sticks.',
      touchedZoneIds: [zone.id],
    });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      checklist: [{ label: 'Test', done: true }],
      parts: [{ description: 'CR123A battery', quantity: 2, unitPriceCents: 650 }],
      clientNotes: 'Replaced both batteries.',
      internalNotes: 'Side gate sticks.',
      touchedZoneIds: [zone.id],
    });
  });

  it('refuses a technician anything else on their own job (403 naming the fields), and every change on another’s job', async () => {
    const own = await buildJob(a.site, { technicianId: a.technician.id, scheduledStart: at('2027-06-04T15:00:00Z') });
    const res = await as.technician.patch(`/api/jobs/${own.id}`, { scheduledStart: '2027-06-05T15:00:00Z', clientNotes: 'ok' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/scheduledStart/);
    expect(res.body.error.message).toMatch(/office/);
    const theirs = await buildJob(a.site, { technicianId: otherTech.id, scheduledStart: at('2027-06-04T15:00:00Z') });
    const other = await as.technician.patch(`/api/jobs/${theirs.id}`, { clientNotes: 'Mine now' });
    expect(other.status).toBe(403);
    expect(other.body.error.message).toMatch(/another technician/);
    const unassigned = await buildJob(a.site);
    expect((await as.technician.patch(`/api/jobs/${unassigned.id}`, { clientNotes: 'x' })).status).toBe(403);
    expect((await Job.findOne({ where: { tenantId: a.firm.id, id: theirs.id } }))!.clientNotes).toBe('');
  });

  it('refuses edits to completed and cancelled jobs with 409', async () => {
    for (const state of ['completed', 'cancelled'] as const) {
      const job = await buildJob(a.site, { technicianId: a.technician.id, scheduledStart: at('2027-06-04T15:00:00Z'), state });
      const res = await as.coordinator.patch(`/api/jobs/${job.id}`, { summary: 'Changed later' });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
      expect(res.body.error.message).toMatch(state);
      expect((await as.technician.patch(`/api/jobs/${job.id}`, { clientNotes: 'late note' })).status).toBe(409);
    }
  });
});
