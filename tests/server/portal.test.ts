import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Document } from '@server/models/Document';
import { Job } from '@server/models/Job';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import {
  buildClient,
  buildClientUser,
  buildFirmWithSite,
  buildFloor,
  buildJob,
  buildPanel,
  buildRoom,
  buildSite,
  buildUser,
  buildZone,
  buildContact,
  TEST_PASSWORD,
} from '../support/factories';

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

const SERIALS = ['SN-PORTAL-7781234', 'SN-PORTAL-7785678'];
const PASSCODE_CIPHER = 'cipher-portal-never-shown';
const ACCESS_NOTES = 'Spare key taped under the third flowerpot.';
const INTERNAL_NOTES = 'Internal: client disputes last invoice, be polite.';
const CLIENT_RECORD_NOTES = 'Office only: slow payer, check credit first.';
const FORBIDDEN_KEYS = ['serial', 'input', 'passcode', 'passcodeCipher', 'accessNotes', 'internalNotes', 'notes'];

/** A firm with one client whose site has zones, a job with internal notes and a contact. */
async function portalFixture() {
  const f = await buildFirmWithSite();
  const client = await buildClient(f.firm, { notes: CLIENT_RECORD_NOTES });
  const site = await buildSite(f.firm, client, { accessNotes: ACCESS_NOTES, passcodeCipher: PASSCODE_CIPHER, name: 'Lark House' });
  const clientUser = await buildClientUser(f.firm, client);
  const panel = await buildPanel(site);
  await buildZone(panel, { number: 1, description: 'Front door', serial: SERIALS[0] });
  await buildZone(panel, { number: 2, description: 'Hall smoke', serial: SERIALS[1], deviceType: 'smoke', zoneType: 'fire_24h', manufacturedOn: '2010-03-01' });
  const tech = await buildUser(f.firm, 'technician', { name: 'Rowan Fielding' });
  await buildJob(site, {
    state: 'scheduled',
    technicianId: tech.id,
    scheduledStart: new Date(Date.now() + 3 * 24 * 60 * 60 * 1000),
    internalNotes: INTERNAL_NOTES,
    clientNotes: 'We will test every sensor.',
  });
  const done = await buildJob(site, {
    kind: 'inspection',
    state: 'completed',
    completedAt: new Date(Date.now() - 10 * 24 * 60 * 60 * 1000),
    internalNotes: INTERNAL_NOTES,
    clientNotes: 'Replaced the hall smoke battery.',
  });
  await Document.create({
    tenantId: f.firm.id, siteId: site.id, kind: 'photo', title: 'Shared photo', fileId: 'shared-file-1', contentType: 'image/jpeg',
    sizeBytes: 10, sharedWithClient: true, uploadedById: null, jobId: done.id,
  });
  await Document.create({
    tenantId: f.firm.id, siteId: site.id, kind: 'photo', title: 'Staff-only photo', fileId: 'staff-file-1', contentType: 'image/jpeg',
    sizeBytes: 10, sharedWithClient: false, uploadedById: null, jobId: done.id,
  });
  await buildContact(site, 1, { name: 'Ora Neighbour' });
  return { ...f, client, site, clientUser, panel, done };
}

function keysOf(value: unknown, into: Set<string> = new Set()): Set<string> {
  if (Array.isArray(value)) value.forEach((v) => keysOf(v, into));
  else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      into.add(k);
      keysOf(v, into);
    }
  }
  return into;
}

function expectNoLeaks(body: unknown) {
  const text = JSON.stringify(body);
  for (const secret of [...SERIALS, PASSCODE_CIPHER, ACCESS_NOTES, INTERNAL_NOTES, CLIENT_RECORD_NOTES]) expect(text).not.toContain(secret);
  const keys = keysOf(body);
  for (const key of FORBIDDEN_KEYS) expect(keys.has(key)).toBe(false);
}

const routesOf = (siteId: string) => [
  `/api/portal/sites/${siteId}`,
  `/api/portal/sites/${siteId}/coverage`,
  `/api/portal/sites/${siteId}/devices`,
  `/api/portal/sites/${siteId}/service`,
  `/api/portal/sites/${siteId}/contacts`,
];

describe('portal: access', () => {
  it('signed out → 401; staff and operator → 403', async () => {
    const f = await portalFixture();
    const anon = await visitor(t.app);
    expect((await anon.get('/api/portal/sites')).status).toBe(401);
    for (const user of [f.owner, f.coordinator, f.technician, await buildUser(null, 'operator')]) {
      const v = await signedIn(user);
      expect((await v.get('/api/portal/sites')).status).toBe(403);
      expect((await v.get(`/api/portal/sites/${f.site.id}`)).status).toBe(403);
    }
  });

  it('lists only the client’s own sites', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get('/api/portal/sites');
    expect(res.status).toBe(200);
    expect((res.body.data as { id: string }[]).map((s) => s.id)).toEqual([f.site.id]);
    expect(res.body.data[0]).toMatchObject({ name: 'Lark House', timeZone: 'America/Chicago', firm: { name: f.firm.name } });
    expectNoLeaks(res.body);
  });

  it('another client of the same firm, or of another firm → 404 on every route', async () => {
    const a = await portalFixture();
    const sameFirmSite = a.site; // client B of the same firm is the factory's default client
    const b = await signedIn(a.clientUser); // sanity: A reaches its own
    expect((await b.get(`/api/portal/sites/${a.site.id}`)).status).toBe(200);
    const clientB = await buildClient(a.firm);
    const userB = await buildClientUser(a.firm, clientB);
    const vB = await signedIn(userB);
    const other = await portalFixture();
    for (const url of [...routesOf(sameFirmSite.id), ...routesOf(other.site.id)]) {
      expect((await vB.get(url)).status).toBe(404);
    }
    expect((await vB.put(`/api/portal/sites/${a.site.id}/contacts`, { contacts: [] })).status).toBe(404);
    const vA = await signedIn(a.clientUser);
    expect((await vA.put(`/api/portal/sites/${other.site.id}/contacts`, { contacts: [] })).status).toBe(404);
    expect((await vA.get(`/api/portal/sites/${other.site.id}/coverage`)).status).toBe(404);
  });

  it('a client cannot change zones or jobs through staff routes', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    const zones = await f.panel.sequelize.models.Zone!.findAll({ where: { tenantId: f.firm.id, siteId: f.site.id } });
    const jobs = await f.panel.sequelize.models.Job!.findAll({ where: { tenantId: f.firm.id, siteId: f.site.id } });
    const zoneRes = await v.patch(`/api/zones/${zones[0]!.get('id') as string}`, { description: 'Hacked' });
    expect(zoneRes.status).toBe(404);
    const jobRes = await v.patch(`/api/jobs/${jobs[0]!.get('id') as string}`, { summary: 'Hacked' });
    expect(jobRes.status).toBe(404);
  });
});

describe('portal: content', () => {
  it('every route answers client-safe JSON only', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    for (const url of ['/api/portal/sites', ...routesOf(f.site.id)]) {
      const res = await v.get(url);
      expect(res.status, url).toBe(200);
      expectNoLeaks(res.body);
    }
    const put = await v.put(`/api/portal/sites/${f.site.id}/contacts`, { contacts: [{ name: 'Ivo Brother', relation: 'Brother', phone: '+15550104471' }] });
    expect(put.status).toBe(200);
    expectNoLeaks(put.body);
  });

  it('the summary gives coverage counts, the next visit and the firm', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}`);
    expect(res.status).toBe(200);
    expect(res.body.data.coverage.openings).toHaveProperty('total');
    expect(typeof res.body.data.coverage.summary).toBe('string');
    expect(res.body.data.lifeSafety).toHaveProperty('findings');
    expect(res.body.data.nextVisit).toMatchObject({ kind: 'service_call' });
    expect((res.body.data.devicesDueSoon as { description: string; life: { state: string } }[]).map((d) => [d.description, d.life.state])).toEqual([['Hall smoke', 'due']]);
    expect(res.body.data.firm.name).toBe(f.firm.name);
  });

  it('PUT contacts replaces the ordered list, validates phones and audits the client as actor', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    const bad = await v.put(`/api/portal/sites/${f.site.id}/contacts`, { contacts: [{ name: 'X', relation: 'Friend', phone: 'call me' }] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields as object).join(' ')).toMatch(/phone/);
    const res = await v.put(`/api/portal/sites/${f.site.id}/contacts`, {
      contacts: [
        { name: 'Ivo Brother', relation: 'Brother', phone: '+15550104471' },
        { name: 'Ada Aunt', relation: 'Aunt', phone: '+15550104472' },
      ],
    });
    expect(res.status).toBe(200);
    expect((res.body.data as { name: string; position: number }[]).map((c) => [c.position, c.name])).toEqual([
      [1, 'Ivo Brother'],
      [2, 'Ada Aunt'],
    ]);
    const list = await v.get(`/api/portal/sites/${f.site.id}/contacts`);
    expect((list.body.data as { name: string }[]).map((c) => c.name)).toEqual(['Ivo Brother', 'Ada Aunt']);
    const audit = await AuditEvent.findAll({ where: { tenantId: f.firm.id, action: 'contacts.replaced', subjectId: f.site.id } });
    expect(audit).toHaveLength(1);
    expect(audit[0]!.get('actorId')).toBe(f.clientUser.id);
  });
});

describe('portal: devices, service and service requests', () => {
  it('devices are described in client terms with their life', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}/devices`);
    expect(res.status).toBe(200);
    expect((res.body.data as { description: string }[]).map((d) => d.description).sort()).toEqual(['Front door', 'Hall smoke']);
    for (const d of res.body.data as Record<string, unknown>[]) {
      // lifeSafety marks smoke/heat/CO devices, protects says whether one is programmed to protect
      expect(Object.keys(d).sort()).toEqual(['chime', 'description', 'id', 'kind', 'life', 'lifeSafety', 'protects', 'whenArmed']);
      expect(typeof d.whenArmed).toBe('string');
      // endOfLifeBasis says where the end-of-life date comes from (label, installation, unknown)
      expect(Object.keys(d.life as object).sort()).toEqual(['batteryDueOn', 'endOfLifeBasis', 'endOfLifeOn', 'state']);
    }
    const byName = new Map((res.body.data as { description: string }[]).map((d) => [d.description, d]));
    expect(byName.get('Hall smoke')).toMatchObject({ lifeSafety: true, protects: true, life: { endOfLifeBasis: 'manufactured', state: 'due' } });
    expect(byName.get('Front door')).toMatchObject({ lifeSafety: false, protects: true, life: { endOfLifeBasis: null } });
  });

  it('service shows upcoming and past visits, shared files only, never internal notes', async () => {
    const f = await portalFixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}/service`);
    expect(res.status).toBe(200);
    expect(res.body.data.upcoming).toHaveLength(1);
    expect(res.body.data.upcoming[0]).toMatchObject({ kind: 'service_call', technicianFirstName: 'Rowan' });
    expect(res.body.data.past).toHaveLength(1);
    const past = res.body.data.past[0];
    expect(past).toMatchObject({ id: f.done.id, state: 'completed', clientNotes: 'Replaced the hall smoke battery.' });
    expect((past.files as { title: string }[]).map((x) => x.title)).toEqual(['Shared photo']);
    expect(past.files[0].fileUrl).toBe(`/api/portal/sites/${f.site.id}/documents/${past.files[0].id}/file`);
    expect(JSON.stringify(res.body)).not.toContain('Staff-only photo');
  });

  it('a service request becomes a requested job and e-mails each active coordinator', async () => {
    const f = await portalFixture();
    const second = await buildUser(f.firm, 'coordinator');
    const gone = await buildUser(f.firm, 'coordinator', { deactivatedAt: new Date() });
    const v = await signedIn(f.clientUser);
    const zones = await f.panel.sequelize.models.Zone!.findAll({ where: { tenantId: f.firm.id, siteId: f.site.id } });
    const bad = await v.post(`/api/portal/sites/${f.site.id}/service-requests`, { description: '', preferredTimes: '' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('description');
    const res = await v.post(`/api/portal/sites/${f.site.id}/service-requests`, {
      description: 'The back door sensor beeps twice.',
      preferredTimes: 'Weekday mornings',
      zoneId: zones[0]!.get('id'),
    });
    expect(res.status).toBe(201);
    expectNoLeaks(res.body);
    const job = await Job.findOne({ where: { tenantId: f.firm.id, id: res.body.data.id } });
    expect(job).toMatchObject({ state: 'requested', requestedByClient: true, summary: 'The back door sensor beeps twice.' });
    expect(job!.clientNotes).toContain('Weekday mornings');
    for (const c of [f.coordinator, second]) {
      expect(t.outbox.some((m) => m.to === c.email && m.text.includes('The back door sensor beeps twice.'))).toBe(true);
    }
    expect(t.outbox.some((m) => m.to === gone.email)).toBe(false);
    expect(t.outbox.some((m) => m.to === f.technician.email)).toBe(false);
    expect(t.outbox.some((m) => m.to === f.owner.email)).toBe(false);
    // the e-mail links to the job in the firm's workspace
    expect(t.outbox.find((m) => m.to === f.coordinator.email)!.text).toContain(`http://mullion.test/app/jobs/${job!.id}`);
    // another client's site → 404
    const other = await portalFixture();
    expect((await v.post(`/api/portal/sites/${other.site.id}/service-requests`, { description: 'x', preferredTimes: 'y' })).status).toBe(404);
  });

  it('reaches the owner when the firm has no active coordinator', async () => {
    const f = await portalFixture();
    await f.coordinator.update({ deactivatedAt: new Date() });
    const v = await signedIn(f.clientUser);
    const res = await v.post(`/api/portal/sites/${f.site.id}/service-requests`, { description: 'The keypad is dark.', preferredTimes: 'Any afternoon' });
    expect(res.status).toBe(201);
    const toOwner = t.outbox.filter((m) => m.to === f.owner.email && m.text.includes('The keypad is dark.'));
    expect(toOwner).toHaveLength(1);
    expect(toOwner[0]!.text).toContain(`http://mullion.test/app/jobs/${res.body.data.id}`);
    expect(t.outbox.some((m) => m.to === f.coordinator.email && m.text.includes('The keypad is dark.'))).toBe(false);
  });
});

// ---------------------------------------------------------------------------------------------
// Life safety in the portal
// ---------------------------------------------------------------------------------------------

type PortalDevice = { id: string; description: string; kind: string; whenArmed: string; lifeSafety: boolean; protects: boolean; life: { state: string; endOfLifeBasis: string | null; endOfLifeOn: string | null } };

/**
 * A household whose coverage raises the findings Mullion knows only from memory: a kitchen with a
 * fuel-burning appliance and no CO alarm anywhere (co_missing_level, NFPA 720 from memory) and a
 * smoke alarm in the attached garage (smoke_in_garage, from memory); with a shared document, a
 * past and an upcoming visit and a contact, so every portal route has something to say.
 */
async function memoryFindingsFixture() {
  const f = await buildFirmWithSite();
  const floor = await buildFloor(f.site, { name: 'Ground floor', level: 0 });
  const hall = await buildRoom(floor, { name: 'Hall', kind: 'hall' });
  const bedroom = await buildRoom(floor, { name: 'Bedroom', kind: 'bedroom', servedByHallId: hall.id });
  const kitchen = await buildRoom(floor, { name: 'Kitchen', kind: 'kitchen', fuelBurningAppliance: true });
  const garage = await buildRoom(floor, { name: 'Garage', kind: 'garage', attachedGarage: true });
  const panel = await buildPanel(f.site);
  await buildZone(panel, { number: 9, description: 'Bedroom smoke', deviceType: 'smoke', roomId: bedroom.id, manufacturedOn: '2024-01-10' });
  await buildZone(panel, { number: 10, description: 'Garage smoke', deviceType: 'smoke', roomId: garage.id, manufacturedOn: '2024-01-10' });
  await buildZone(panel, { number: 11, description: 'Kitchen window', deviceType: 'window_contact', roomId: kitchen.id });
  const done = await buildJob(f.site, { kind: 'inspection', state: 'completed', completedAt: new Date(Date.now() - 5 * 24 * 60 * 60 * 1000), clientNotes: 'Tested every alarm.' });
  await buildJob(f.site, { state: 'scheduled', technicianId: f.technician.id, scheduledStart: new Date(Date.now() + 3 * 24 * 60 * 60 * 1000) });
  await Document.create({
    tenantId: f.firm.id, siteId: f.site.id, kind: 'photo', title: 'Garage alarm photo', fileId: 'memory-fixture-file', contentType: 'image/jpeg',
    sizeBytes: 10, sharedWithClient: true, uploadedById: null, jobId: done.id,
  });
  await buildContact(f.site, 1, { name: 'Ora Neighbour' });
  return f;
}

describe('portal: life safety', () => {
  it('never shows the household a source known from memory or a references.md row, on any route', async () => {
    const f = await memoryFindingsFixture();
    // the staff coverage of this site does carry them: the fixture raises the memory-sourced findings
    const staff = await signedIn(f.owner);
    const staffCoverage = await staff.get(`/api/sites/${f.site.id}/coverage`);
    const staffCodes = (staffCoverage.body.data.findings as { code: string }[]).map((x) => x.code);
    expect(staffCodes).toEqual(expect.arrayContaining(['co_missing_level', 'smoke_in_garage']));
    expect(JSON.stringify(staffCoverage.body).toLowerCase()).toContain('memory');
    expect(JSON.stringify(staffCoverage.body)).toContain('references.md');

    const v = await signedIn(f.clientUser);
    const routes = ['/api/portal/sites', ...['', '/coverage', '/devices', '/service', '/documents', '/contacts'].map((r) => `/api/portal/sites/${f.site.id}${r}`)];
    for (const route of routes) {
      const res = await v.get(route);
      expect(res.status, route).toBe(200);
      const text = JSON.stringify(res.body);
      expect(text.toLowerCase(), route).not.toContain('memory');
      expect(text, route).not.toContain('references.md');
    }
    // the household still sees the findings themselves, in plain words, without source or evidence
    const coverage = (await v.get(`/api/portal/sites/${f.site.id}/coverage`)).body.data;
    const garage = (coverage.findings as Record<string, unknown>[]).find((x) => x.code === 'smoke_in_garage')!;
    expect(garage).toBeDefined();
    expect(garage).not.toHaveProperty('source');
    expect(garage).not.toHaveProperty('evidence');
    expect((coverage.findings as { code: string }[]).map((x) => x.code)).toContain('co_missing_level');
    const overview = (await v.get(`/api/portal/sites/${f.site.id}`)).body.data;
    expect((overview.lifeSafety.findings as { code: string }[]).map((x) => x.code)).toEqual(expect.arrayContaining(['co_missing_level', 'smoke_in_garage']));
  });

  it('a smoke alarm on a monitor-only zone is shown as not protecting, and says it is not set up to raise the alarm', async () => {
    const f = await buildFirmWithSite();
    const panel = await buildPanel(f.site);
    await buildZone(panel, { number: 9, description: 'Landing smoke', deviceType: 'smoke', zoneType: 'monitor_only', manufacturedOn: '2024-01-10' });
    await buildZone(panel, { number: 10, description: 'Hall smoke', deviceType: 'smoke', manufacturedOn: '2024-01-10' });
    const v = await signedIn(f.clientUser);
    const devices = (await v.get(`/api/portal/sites/${f.site.id}/devices`)).body.data as PortalDevice[];
    const chime = devices.find((d) => d.description === 'Landing smoke')!;
    expect(chime).toMatchObject({ lifeSafety: true, protects: false });
    expect(chime.whenArmed).toContain('not set up to raise the alarm');
    // the same device on a fire zone, reported: it protects and calls the monitoring center
    const fire = devices.find((d) => d.description === 'Hall smoke')!;
    expect(fire).toMatchObject({ lifeSafety: true, protects: true });
    expect(fire.whenArmed).toContain('fire alarm');
    expect(fire.whenArmed).toContain('monitoring center is called');
    expect(fire.whenArmed).not.toContain('not set up');
  });

  it('describes a siren, a keypad and a keyfob as equipment, never as something that “never” sounds the alarm', async () => {
    const f = await buildFirmWithSite();
    const panel = await buildPanel(f.site);
    await buildZone(panel, { number: 9, description: 'Hall siren', deviceType: 'siren' });
    await buildZone(panel, { number: 10, description: 'Front keypad', deviceType: 'keypad' });
    await buildZone(panel, { number: 11, description: 'Keyfob 1', deviceType: 'keyfob' });
    // enrolled on another zone type, with reporting on: still described as what it is
    await buildZone(panel, { number: 12, description: 'Back keypad', deviceType: 'keypad', zoneType: 'perimeter', reportsToMonitoring: true });
    const v = await signedIn(f.clientUser);
    const devices = (await v.get(`/api/portal/sites/${f.site.id}/devices`)).body.data as PortalDevice[];
    expect(devices).toHaveLength(4);
    for (const d of devices) {
      expect(d.whenArmed.toLowerCase(), d.description).not.toContain('never');
      expect(d, d.description).toMatchObject({ lifeSafety: false, protects: true });
    }
    const words = new Map(devices.map((d) => [d.description, d.whenArmed]));
    expect(words.get('Hall siren')).toContain('sounds when the alarm goes off');
    expect(words.get('Keyfob 1')).toContain('remote control');
    expect(words.get('Front keypad')).toContain('set and unset the alarm');
    expect(words.get('Back keypad')).toBe(words.get('Front keypad'));
  });

  it('judges a smoke alarm without a label date by its installation: due when even that has passed, else check (never ok); check devices are due soon', async () => {
    const saved = t.clock.now;
    try {
      t.clock.now = new Date('2026-06-15T17:00:00Z');
      const f = await buildFirmWithSite();
      const panel = await buildPanel(f.site);
      // installed 2014: made on or before then, so past 10 years by 2024 at the latest
      await buildZone(panel, { number: 9, description: 'Old smoke', deviceType: 'smoke', installedOn: '2014-05-01' });
      // installed 2024: its end of life cannot be known without the label date
      await buildZone(panel, { number: 10, description: 'Newer smoke', deviceType: 'smoke', installedOn: '2024-05-01' });
      // no dates at all
      await buildZone(panel, { number: 11, description: 'Unknown smoke', deviceType: 'smoke' });
      // with the label date and years to go: ok
      await buildZone(panel, { number: 12, description: 'Dated smoke', deviceType: 'smoke', manufacturedOn: '2024-01-10', installedOn: '2024-05-01' });
      const v = await signedIn(f.clientUser);
      const devices = (await v.get(`/api/portal/sites/${f.site.id}/devices`)).body.data as PortalDevice[];
      const byName = new Map(devices.map((d) => [d.description, d]));
      expect(byName.get('Old smoke')!.life).toMatchObject({ state: 'due', endOfLifeBasis: 'installed', endOfLifeOn: '2024-05-01' });
      expect(byName.get('Newer smoke')!.life).toMatchObject({ state: 'check', endOfLifeBasis: 'installed', endOfLifeOn: '2034-05-01' });
      expect(byName.get('Unknown smoke')!.life).toMatchObject({ state: 'check', endOfLifeBasis: 'unknown', endOfLifeOn: null });
      expect(byName.get('Dated smoke')!.life).toMatchObject({ state: 'ok', endOfLifeBasis: 'manufactured', endOfLifeOn: '2034-01-10' });

      const overview = (await v.get(`/api/portal/sites/${f.site.id}`)).body.data;
      const dueSoon = (overview.devicesDueSoon as PortalDevice[]).map((d) => `${d.description} ${d.life.state}`).sort();
      expect(dueSoon).toEqual(['Newer smoke check', 'Old smoke due', 'Unknown smoke check']);
    } finally {
      t.clock.now = saved;
    }
  });

  it('a bypassed smoke alarm is not presented as protecting or as calling for help', async () => {
    const f = await buildFirmWithSite();
    const panel = await buildPanel(f.site);
    await buildZone(panel, { number: 9, description: 'Hall smoke', deviceType: 'smoke', status: 'bypassed', manufacturedOn: '2024-01-10' });
    const v = await signedIn(f.clientUser);
    const [device] = (await v.get(`/api/portal/sites/${f.site.id}/devices`)).body.data as PortalDevice[];
    // coverage says a bypassed alarm protects no one (smoke_bypassed_only); the device list must agree
    expect(device).toMatchObject({ description: 'Hall smoke', lifeSafety: true, protects: false });
    expect(device!.whenArmed).not.toContain('monitoring center is called');
  });
});
