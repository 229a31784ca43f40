/**
 * Completing a job: the completion report (PDF) is built, kept as a document of the job shared
 * with the client, downloadable at /api/jobs/:jobId/report.pdf and e-mailed to the client with
 * the PDF attached; battery changes and service calls set the ticked zones' battery dates.
 */
import fs from 'node:fs';
import path from 'node:path';
import { Jimp } from 'jimp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { abilityFor } from '@domain/abilities';
import { DEFAULT_CHECKLISTS, JOB_KIND_LABELS } from '@domain/jobs';
import { Document } from '@server/models/Document';
import { Job } from '@server/models/Job';
import type { User } from '@server/models/User';
import { Zone } from '@server/models/Zone';
import { ZoneChange } from '@server/models/ZoneChange';
import { buildCompletionReport, partsTotalCents, produceCompletionReport } from '@server/services/job-report';
import { TenantFiles } from '@server/storage/tenant-files';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildFirmWithSite, buildJob, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let otherTech: User;
let PNG: Buffer;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

type StreamParser = Exclude<Parameters<ReturnType<Visitor['get']>['parse']>[0], (str: string) => unknown>;
const binary: StreamParser = (res, cb) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

function upload(v: Visitor, jobId: string, data: Buffer, filename: string, fields: Record<string, string> = {}) {
  let req = v.agent.post(`/api/jobs/${jobId}/files`).set('X-CSRF-Token', v.csrfToken);
  for (const [key, value] of Object.entries(fields)) req = req.field(key, value);
  return req.attach('file', data, { filename, contentType: 'application/octet-stream' });
}

const START = new Date('2027-02-10T15:00:00Z');

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  otherTech = await buildUser(a.firm, 'technician');
  PNG = await new Jimp({ width: 640, height: 480, color: 0x2f6f4fff }).getBuffer('image/png');
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

describe('completing a job', () => {
  it('keeps the report as a shared document of the job and e-mails it to the client with the PDF attached', async () => {
    const panel = await buildPanel(a.site);
    const zone = await buildZone(panel, { number: 9, description: 'Front door' });
    const job = await buildJob(a.site, {
      kind: 'install',
      state: 'in_progress',
      technicianId: a.technician.id,
      scheduledStart: START,
      startedAt: START,
      touchedZoneIds: [zone.id],
      parts: [{ description: 'Door contact', quantity: 2, unitPriceCents: 1999 }],
    });
    await as.technician.put(`/api/jobs/${job.id}/walk-test`, [{ zoneId: zone.id, result: 'passed', monitoringConfirmed: true }]);
    await upload(as.technician, job.id, PNG, 'door.png', { sharedWithClient: 'true', title: 'Front door contact' });
    t.outbox.length = 0;
    t.clock.now = new Date('2027-02-10T17:15:00Z');

    const res = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ state: 'completed', completedAt: '2027-02-10T17:15:00.000Z', reportUrl: `/api/jobs/${job.id}/report.pdf` });
    // the report is offered as the report, not among the job's photos and files
    expect((res.body.data.files as { title: string }[]).map((f) => f.title)).toEqual(['Front door contact']);

    const saved = (await Job.findOne({ where: { tenantId: a.firm.id, id: job.id } }))!;
    const doc = (await Document.findOne({ where: { tenantId: a.firm.id, jobId: job.id, fileId: saved.reportFileId! } }))!;
    expect(doc).toMatchObject({ siteId: a.site.id, kind: 'other', contentType: 'application/pdf', sharedWithClient: true });
    expect(doc.title).toMatch(/^Completion report 2027-02-10/);
    const stored = fs.readFileSync(path.join(t.tenantsDir, a.firm.id, saved.reportFileId!));
    expect(stored.subarray(0, 5).toString('latin1')).toBe('%PDF-');

    expect(t.outbox).toHaveLength(1);
    const mail = t.outbox[0]!;
    expect(mail.to).toBe(a.client.email);
    expect(mail.subject).toBe(`Install at ${a.site.name} is complete`);
    expect(mail.text).toContain(a.firm.name);
    expect(mail.text).toContain('2027-02-10');
    expect(mail.attachments).toHaveLength(1);
    const attachment = mail.attachments![0]!;
    expect(attachment.contentType).toBe('application/pdf');
    expect(attachment.filename).toMatch(/\.pdf$/);
    expect(attachment.content.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(attachment.content.equals(stored)).toBe(true);
  });

  it('completes without an e-mail when the client record has none', async () => {
    const client = await buildClient(a.firm, { email: '' });
    const site = await buildSite(a.firm, client);
    const job = await buildJob(site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    t.outbox.length = 0;
    const res = await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(res.status).toBe(200);
    expect(res.body.data.reportUrl).not.toBeNull();
    expect(t.outbox).toHaveLength(0);
  });

  it('refuses completion without walk-test results for touched zones: no report, no e-mail', async () => {
    const zone = await buildZone(await buildPanel(a.site), { number: 30 });
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START, touchedZoneIds: [zone.id] });
    t.outbox.length = 0;
    const res = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('walkTest');
    expect(t.outbox).toHaveLength(0);
    expect(await Document.count({ where: { tenantId: a.firm.id, jobId: job.id } })).toBe(0);
    expect((await as.technician.get(`/api/jobs/${job.id}/report.pdf`)).status).toBe(404);
  });
});

describe('battery changes on completion', () => {
  it('sets the ticked zones’ battery date to the completion date at the site, with a change-log row each', async () => {
    const panel = await buildPanel(a.site);
    const z1 = await buildZone(panel, { number: 40, description: 'Hall smoke', deviceType: 'smoke', batteryChangedOn: '2024-01-15' });
    const z2 = await buildZone(panel, { number: 41, description: 'Den window' });
    const untouched = await buildZone(panel, { number: 42, description: 'Kitchen window', batteryChangedOn: '2024-01-15' });
    const job = await buildJob(a.site, { kind: 'battery_round', state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    // 03:00 UTC on the 11th is still the 10th in America/Chicago
    t.clock.now = new Date('2027-02-11T03:00:00Z');
    const res = await as.technician.post(`/api/jobs/${job.id}/transitions`, { to: 'completed', batteryChangedZoneIds: [z1.id, z2.id] });
    expect(res.status).toBe(200);
    const zoneOf = async (id: string) => (await Zone.findOne({ where: { tenantId: a.firm.id, id } }))!;
    expect((await zoneOf(z1.id)).batteryChangedOn).toBe('2027-02-10');
    expect((await zoneOf(z2.id)).batteryChangedOn).toBe('2027-02-10');
    expect((await zoneOf(untouched.id)).batteryChangedOn).toBe('2024-01-15');
    const log = await ZoneChange.findAll({ where: { tenantId: a.firm.id, panelId: panel.id, zoneId: z1.id } });
    expect(log).toHaveLength(1);
    expect(log[0]!.changes).toEqual({ batteryChangedOn: ['2024-01-15', '2027-02-10'] });
    expect(log[0]!.actorId).toBe(a.technician.id);
  });

  it('answers 400 batteryChangedZoneIds for the wrong kind of job, before completion, or a zone elsewhere; nothing changes', async () => {
    const panel = await buildPanel(a.site);
    const zone = await buildZone(panel, { number: 50, batteryChangedOn: '2024-01-15' });
    const install = await buildJob(a.site, { kind: 'install', state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    const wrongKind = await as.coordinator.post(`/api/jobs/${install.id}/transitions`, { to: 'completed', batteryChangedZoneIds: [zone.id] });
    expect(wrongKind.status).toBe(400);
    expect(Object.keys(wrongKind.body.error.fields)).toEqual(['batteryChangedZoneIds']);

    const service = await buildJob(a.site, { kind: 'service_call', state: 'scheduled', technicianId: a.technician.id, scheduledStart: START });
    const early = await as.coordinator.post(`/api/jobs/${service.id}/transitions`, { to: 'in_progress', batteryChangedZoneIds: [zone.id] });
    expect(early.status).toBe(400);
    expect(Object.keys(early.body.error.fields)).toEqual(['batteryChangedZoneIds']);

    const foreign = await buildZone(await buildPanel(b.site), { number: 50 });
    const started = await buildJob(a.site, { kind: 'service_call', state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    const elsewhere = await as.coordinator.post(`/api/jobs/${started.id}/transitions`, { to: 'completed', batteryChangedZoneIds: [zone.id, foreign.id] });
    expect(elsewhere.status).toBe(400);
    expect(Object.keys(elsewhere.body.error.fields)).toEqual(['batteryChangedZoneIds.1']);
    const bad = await as.coordinator.post(`/api/jobs/${started.id}/transitions`, { to: 'completed', batteryChangedZoneIds: ['zone-50'] });
    expect(Object.keys(bad.body.error.fields)).toEqual(['batteryChangedZoneIds.0']);

    expect((await Zone.findOne({ where: { tenantId: a.firm.id, id: zone.id } }))!.batteryChangedOn).toBe('2024-01-15');
    expect((await Job.findOne({ where: { tenantId: a.firm.id, id: started.id } }))!.state).toBe('in_progress');
    expect(await Document.count({ where: { tenantId: a.firm.id, jobId: started.id } })).toBe(0);
  });
});

describe('GET /api/jobs/:jobId/report.pdf', () => {
  let jobId: string;

  beforeAll(async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: otherTech.id, scheduledStart: START });
    const res = await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' });
    expect(res.status).toBe(200);
    jobId = job.id;
  });

  it('downloads the PDF for staff of the firm, any technician included', async () => {
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/jobs/${jobId}/report.pdf`).buffer(true).parse(binary);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('application/pdf');
      expect(res.headers['content-disposition']).toMatch(/attachment; filename="Completion report/);
      expect((res.body as Buffer).subarray(0, 5).toString('latin1')).toBe('%PDF-');
    }
  });

  it('answers 404 before completion, to a client and for another firm; 401 signed out; 403 to the operator', async () => {
    const open = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    expect((await as.owner.get(`/api/jobs/${open.id}/report.pdf`)).status).toBe(404);
    expect((await as.client.get(`/api/jobs/${jobId}/report.pdf`)).status).toBe(404);
    expect((await as.anon.get(`/api/jobs/${jobId}/report.pdf`)).status).toBe(401);
    expect((await as.operator.get(`/api/jobs/${jobId}/report.pdf`)).status).toBe(403);
    const bJob = await buildJob(b.site, { state: 'in_progress', technicianId: b.technician.id, scheduledStart: START });
    const bOwner = await signedIn(b.owner);
    expect((await bOwner.post(`/api/jobs/${bJob.id}/transitions`, { to: 'completed' })).status).toBe(200);
    for (const role of ['owner', 'coordinator', 'technician'] as const) expect((await as[role].get(`/api/jobs/${bJob.id}/report.pdf`)).status).toBe(404);
  });
});

describe('a report whose document was deleted', () => {
  it('answers 404, not a server error', async () => {
    const job = await buildJob(a.site, { state: 'in_progress', technicianId: a.technician.id, scheduledStart: START });
    expect((await as.coordinator.post(`/api/jobs/${job.id}/transitions`, { to: 'completed' })).status).toBe(200);
    const saved = (await Job.findOne({ where: { tenantId: a.firm.id, id: job.id } }))!;
    const doc = (await Document.findOne({ where: { tenantId: a.firm.id, fileId: saved.reportFileId! } }))!;
    expect((await as.owner.delete(`/api/documents/${doc.id}`)).status).toBe(204);
    const res = await as.owner.get(`/api/jobs/${job.id}/report.pdf`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('what the report says', () => {
  it('lays out firm, site, job, times in the site’s zone, notes, parts with totals, checklist, walk test and photos', async () => {
    const report = await buildCompletionReport({
      firmName: 'Lanternfield Alarm Co.',
      licenceNumber: 'LA-20417',
      site: { name: 'Quarry Lane home', addressLines: ['14 Quarry Lane', 'Ashby Vale, NE 68001'], timeZone: 'America/Chicago' },
      job: {
        kind: 'install',
        summary: 'Install four window contacts',
        technicianName: 'Rowan Pell',
        completedByName: 'Rowan Pell',
        startedAt: new Date('2027-02-10T15:05:00Z'),
        completedAt: new Date('2027-02-10T17:15:00Z'),
        clientNotes: 'All windows protected; please test monthly.',
      },
      parts: [
        { description: 'Window contact', quantity: 4, unitPriceCents: 2450 },
        { description: 'CR2032 battery', quantity: 3, unitPriceCents: 199 },
      ],
      checklist: DEFAULT_CHECKLISTS.install.map((label, i) => ({ label, done: i < 2 })),
      walkTests: [
        { zoneNumber: 9, description: 'Front door', result: 'passed', monitoringConfirmed: true, note: '' },
        { zoneNumber: 10, description: 'Den window', result: 'failed', monitoringConfirmed: false, note: 'Gap too wide' },
      ],
      batteryChanges: [],
      photos: [{ title: 'Front door contact', image: await new Jimp({ width: 320, height: 240, color: 0x336699ff }).getBuffer('image/jpeg') }],
      generatedAt: new Date('2027-02-10T17:15:00Z'),
    });
    expect(report.pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = report.lines.join('\n');
    for (const expected of [
      'Lanternfield Alarm Co.',
      'Licence LA-20417',
      'Job completion report',
      'Quarry Lane home',
      '14 Quarry Lane',
      JOB_KIND_LABELS.install,
      'Install four window contacts',
      'Rowan Pell',
      '2027-02-10 09:05 (America/Chicago)',
      '2027-02-10 11:15 (America/Chicago)',
      'All windows protected; please test monthly.',
      'Window contact',
      '$24.50',
      '$98',
      'Parts total: $103.97',
      DEFAULT_CHECKLISTS.install[0]!,
      'Not done',
      'Walk test',
      'Front door',
      'Gap too wide',
      'Failed',
      'Center confirmed',
      'Photos',
      'Front door contact',
    ])
      expect(text, expected).toContain(expected);
    expect(partsTotalCents([{ description: 'x', quantity: 3, unitPriceCents: 199 }])).toBe(597);
  });

  it('gathers a job’s facts: client notes but never internal notes, only photos shared with the client', async () => {
    const panel = await buildPanel(a.site);
    const zone = await buildZone(panel, { number: 60, description: 'Garage tilt', deviceType: 'garage_door_tilt' });
    const job = await buildJob(a.site, {
      state: 'in_progress',
      technicianId: a.technician.id,
      scheduledStart: START,
      startedAt: new Date('2027-02-10T15:05:00Z'),
      clientNotes: 'Garage sensor replaced.',
      internalNotes: 'SECRET-INTERNAL: client owes for last visit',
      touchedZoneIds: [zone.id],
    });
    await as.technician.put(`/api/jobs/${job.id}/walk-test`, [{ zoneId: zone.id, result: 'passed', monitoringConfirmed: true, note: 'Signal strong' }]);
    await upload(as.technician, job.id, PNG, 'shared.png', { sharedWithClient: 'true', title: 'Shared garage photo' });
    await upload(as.technician, job.id, PNG, 'internal.png', { sharedWithClient: 'false', title: 'Internal wiring photo' });
    await job.update({ state: 'completed', completedAt: new Date('2027-02-10T17:15:00Z'), completedById: a.technician.id });

    const user = a.technician;
    const ctx = { user, tenant: a.firm, tenantId: a.firm.id, ability: abilityFor({ id: user.id, role: user.role, tenantId: a.firm.id }) };
    const produced = await produceCompletionReport(ctx, new TenantFiles(t.tenantsDir), job, { batteryChanges: [], now: new Date('2027-02-10T17:15:00Z') }, []);
    const text = produced.lines.join('\n');
    expect(text).toContain('Garage sensor replaced.');
    expect(text).not.toContain('SECRET-INTERNAL');
    expect(text).toContain('Shared garage photo');
    expect(text).not.toContain('Internal wiring photo');
    expect(text).toContain('Garage tilt');
    expect(text).toContain('Signal strong');
    expect(text).toContain('2027-02-10 09:05 (America/Chicago)');
    expect(text).toContain(a.technician.name);
    expect(produced.clientEmail).toBe(a.client.email);
  });
});
