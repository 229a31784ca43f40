import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { EmergencyContact } from '@server/models/EmergencyContact';
import { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildContact, buildFirm, buildFirmWithSite, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
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
});
afterAll(async () => {
  await t.close();
});

const STAFF = ['owner', 'coordinator', 'technician'] as const;
const FIRM_ROLES = ['owner', 'coordinator', 'technician', 'client'] as const;
const STAFF_ONLY_FIELDS = ['accessNotes', 'contract', 'monitoringAccount'];

interface SiteRow {
  id: string;
  clientId: string;
  clientName: string;
  name: string;
  address: { city: string };
  [key: string]: unknown;
}
interface ListBody {
  data: SiteRow[];
  page: { number: number; size: number; total: number };
}

function newSite(clientId: string, overrides: Record<string, unknown> = {}) {
  return {
    clientId,
    name: 'Lake house',
    address: { line1: '7 Heronsgate Road', line2: 'Unit B', city: 'Millbrook Falls', region: 'NE', postalCode: '68010', country: 'us' },
    timeZone: 'America/Chicago',
    latitude: 41.25,
    longitude: -96.01,
    monitoringAccount: 'ab-1234',
    accessNotes: 'Lockbox on the porch rail.',
    permit: { number: 'P-2026-118', authority: 'Millbrook Falls Police Department', expiresOn: '2027-03-31' },
    contract: { startsOn: '2026-01-01', termMonths: 36, monthlyFeeCents: 3499, cancelledOn: null, cancelReason: '' },
    ...overrides,
  };
}

describe('GET /api/sites', () => {
  it('answers 401 signed out and 403 to the operator', async () => {
    expect((await as.anon.get('/api/sites')).status).toBe(401);
    const op = await as.operator.get('/api/sites');
    expect(op.status).toBe(403);
    expect(op.body.error.code).toBe('forbidden');
  });

  it('lists the firm’s sites for every staff role, with the client’s name, never another firm’s', async () => {
    for (const role of STAFF) {
      const res = await as[role].get('/api/sites?pageSize=100');
      expect(res.status).toBe(200);
      const body = res.body as ListBody;
      expect(Object.keys(body).sort()).toEqual(['data', 'page']);
      const ids = body.data.map((s) => s.id);
      expect(ids).toContain(a.site.id);
      expect(ids).not.toContain(b.site.id);
      expect(body.data.every((s) => s.clientId !== b.client.id)).toBe(true);
      const row = body.data.find((s) => s.id === a.site.id)!;
      expect(row.clientName).toBe(a.client.name);
      expect(row).toHaveProperty('accessNotes', 'Key safe behind the shed.');
      expect(row).toHaveProperty('monitoringAccount', a.site.monitoringAccount);
      expect(row).toHaveProperty('hasPasscode', false);
    }
  });

  it('shows a client only their own sites, without access notes, contract or monitoring account', async () => {
    const neighbour = await buildClient(a.firm);
    const neighbourSite = await buildSite(a.firm, neighbour);
    const second = await buildSite(a.firm, a.client, { name: 'Cabin' });
    const res = await as.client.get('/api/sites');
    expect(res.status).toBe(200);
    const body = res.body as ListBody;
    expect(body.data.map((s) => s.id).sort()).toEqual([a.site.id, second.id].sort());
    expect(body.data.map((s) => s.id)).not.toContain(neighbourSite.id);
    for (const row of body.data) for (const field of STAFF_ONLY_FIELDS) expect(row).not.toHaveProperty(field);
    expect(JSON.stringify(body)).not.toContain('Key safe');
    // asking for the neighbour's sites by clientId shows nothing
    const sneaky = (await as.client.get(`/api/sites?clientId=${neighbour.id}`)).body as ListBody;
    expect(sneaky.data).toEqual([]);
  });

  it('filters by clientId, searches name, address, city and monitoring account, sorts and pages', async () => {
    const firm = await buildFirm();
    const owner = await buildUser(firm, 'owner');
    const c1 = await buildClient(firm);
    const c2 = await buildClient(firm);
    const s1 = await buildSite(firm, c1, { name: 'Orchard Cottage', city: 'Cresswell', addressLine1: '3 Linden Row', monitoringAccount: 'ZX-0001' });
    const s2 = await buildSite(firm, c1, { name: 'Mill Office', city: 'Avonmere', addressLine1: '88 Wharf Street', monitoringAccount: 'ZX-0002' });
    const s3 = await buildSite(firm, c2, { name: 'Barn Loft', city: 'Bellhaven', addressLine1: '1 Linden Row', monitoringAccount: 'QQ-7777' });
    const v = await signedIn(owner);
    const ids = async (qs: string) => ((await v.get(`/api/sites${qs}`)).body as ListBody).data.map((s) => s.id);

    expect(await ids('')).toEqual([s3.id, s2.id, s1.id]); // by name
    expect(await ids('?sort=city')).toEqual([s2.id, s3.id, s1.id]);
    expect(await ids('?sort=-city')).toEqual([s1.id, s3.id, s2.id]);
    expect(await ids('?sort=-createdAt')).toHaveLength(3);
    expect((await ids(`?clientId=${c1.id}`)).sort()).toEqual([s1.id, s2.id].sort());
    expect((await ids('?q=linden')).sort()).toEqual([s1.id, s3.id].sort());
    expect(await ids('?q=avonmere')).toEqual([s2.id]);
    expect(await ids('?q=orchard')).toEqual([s1.id]);
    expect(await ids('?q=QQ-77')).toEqual([s3.id]);
    expect(await ids(`?clientId=${b.client.id}`)).toEqual([]);
    const p = (await v.get('/api/sites?pageSize=2&page=2')).body as ListBody;
    expect(p.page).toEqual({ number: 2, size: 2, total: 3 });
    expect(p.data.map((s) => s.id)).toEqual([s1.id]);
  });

  it('answers 400 naming the field for a bad sort or clientId', async () => {
    const sort = await as.owner.get('/api/sites?sort=accessNotes');
    expect(sort.status).toBe(400);
    expect(sort.body.error.fields).toHaveProperty('sort');
    const client = await as.owner.get('/api/sites?clientId=nope');
    expect(client.status).toBe(400);
    expect(client.body.error.fields).toHaveProperty('clientId');
  });
});

describe('POST /api/sites', () => {
  it('lets the owner and coordinator create a site with the nested fields of api-resources.md', async () => {
    for (const role of ['owner', 'coordinator'] as const) {
      const res = await as[role].post('/api/sites', newSite(a.client.id));
      expect(res.status).toBe(201);
      const data = res.body.data;
      expect(data).toMatchObject({
        clientId: a.client.id,
        clientName: a.client.name,
        name: 'Lake house',
        address: { line1: '7 Heronsgate Road', line2: 'Unit B', city: 'Millbrook Falls', region: 'NE', postalCode: '68010', country: 'US' },
        timeZone: 'America/Chicago',
        latitude: 41.25,
        longitude: -96.01,
        monitoringAccount: 'AB-1234',
        accessNotes: 'Lockbox on the porch rail.',
        permit: { number: 'P-2026-118', authority: 'Millbrook Falls Police Department', expiresOn: '2027-03-31' },
        contract: { startsOn: '2026-01-01', termMonths: 36, monthlyFeeCents: 3499, cancelledOn: null, cancelReason: '' },
        hasPasscode: false,
      });
      const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: data.id } });
      expect(stored).not.toBeNull();
      const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'site.created', subjectId: data.id } });
      expect(audit).toHaveLength(1);
    }
  });

  it('fills defaults for the optional groups', async () => {
    const res = await as.owner.post('/api/sites', {
      clientId: a.client.id,
      name: 'Shop',
      address: { line1: '2 Tanner Yard', city: 'Ashby Vale' },
      timeZone: 'America/Denver',
    });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      address: { line2: '', region: '', postalCode: '', country: 'US' },
      latitude: null,
      longitude: null,
      monitoringAccount: '',
      permit: { number: '', authority: '', expiresOn: null },
      contract: { startsOn: null, termMonths: null, monthlyFeeCents: null, cancelledOn: null, cancelReason: '' },
    });
  });

  it('answers 400 naming clientId for a client of another firm, without echoing its id', async () => {
    const before = await Site.count({ where: { tenantId: a.firm.id } });
    const res = await as.owner.post('/api/sites', newSite(b.client.id));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(Object.keys(res.body.error.fields)).toEqual(['clientId']);
    expect(JSON.stringify(res.body)).not.toContain(b.client.id);
    expect(JSON.stringify(res.body)).not.toContain(b.client.name);
    const unknown = await as.owner.post('/api/sites', newSite('00000000-0000-4000-8000-000000000000'));
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields).toHaveProperty('clientId');
    expect(await Site.count({ where: { tenantId: a.firm.id } })).toBe(before);
    expect(await Site.count({ where: { tenantId: b.firm.id } })).toBe(1);
  });

  it('answers 400 naming each bad field, nested fields by their path', async () => {
    const res = await as.owner.post('/api/sites', {
      clientId: 'x',
      name: '',
      address: { line1: '', city: 'Ok', country: 'USA' },
      timeZone: 'Mars/Olympus',
      latitude: 123,
      contract: { startsOn: '2026-05-01', termMonths: 0, monthlyFeeCents: -5 },
      permit: { expiresOn: '2026-02-30' },
    });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(
      ['address.country', 'address.line1', 'clientId', 'contract.monthlyFeeCents', 'contract.termMonths', 'latitude', 'name', 'permit.expiresOn', 'timeZone'].sort(),
    );
    const cancelled = await as.owner.post('/api/sites', newSite(a.client.id, { contract: { startsOn: '2026-05-01', cancelledOn: '2026-04-01' } }));
    expect(cancelled.status).toBe(400);
    expect(Object.keys(cancelled.body.error.fields)).toEqual(['contract.cancelledOn']);
    const missing = await as.owner.post('/api/sites', {});
    expect(Object.keys(missing.body.error.fields).sort()).toEqual(['address', 'clientId', 'name', 'timeZone']);
  });

  it('refuses technicians, clients and the operator with 403, signed out with 401; nothing stored', async () => {
    const before = await Site.count({ where: { tenantId: a.firm.id } });
    for (const role of ['technician', 'client', 'operator'] as const) {
      const res = await as[role].post('/api/sites', newSite(a.client.id));
      expect(res.status, role).toBe(403);
    }
    expect((await as.anon.post('/api/sites', newSite(a.client.id))).status).toBe(401);
    expect(await Site.count({ where: { tenantId: a.firm.id } })).toBe(before);
  });
});

describe('GET /api/sites/:siteId', () => {
  it('answers staff the whole site, with clientName and exactly the documented fields', async () => {
    for (const role of STAFF) {
      const res = await as[role].get(`/api/sites/${a.site.id}`);
      expect(res.status).toBe(200);
      const data = res.body.data;
      expect(Object.keys(data).sort()).toEqual(
        [
          'id',
          'clientId',
          'clientName',
          'name',
          'address',
          'timeZone',
          'latitude',
          'longitude',
          'monitoringAccount',
          'accessNotes',
          'permit',
          'contract',
          'hasPasscode',
          'createdAt',
          'updatedAt',
        ].sort(),
      );
      expect(Object.keys(data.address).sort()).toEqual(['city', 'country', 'line1', 'line2', 'postalCode', 'region']);
      expect(Object.keys(data.permit).sort()).toEqual(['authority', 'expiresOn', 'number']);
      expect(Object.keys(data.contract).sort()).toEqual(['cancelReason', 'cancelledOn', 'monthlyFeeCents', 'startsOn', 'termMonths']);
      expect(data).toMatchObject({ id: a.site.id, clientName: a.client.name, address: { line1: '14 Quarry Lane', city: 'Ashby Vale' } });
    }
  });

  it('answers the client their own site without staff fields, 404 for another client’s site', async () => {
    const own = await as.client.get(`/api/sites/${a.site.id}`);
    expect(own.status).toBe(200);
    for (const field of STAFF_ONLY_FIELDS) expect(own.body.data).not.toHaveProperty(field);
    expect(own.body.data).toMatchObject({ id: a.site.id, clientName: a.client.name, hasPasscode: false });
    const neighbourSite = await buildSite(a.firm, await buildClient(a.firm));
    const other = await as.client.get(`/api/sites/${neighbourSite.id}`);
    expect(other.status).toBe(404);
  });

  it('answers 404 for another firm’s site to every role, 403 to the operator, 401 signed out, 400 for a malformed id', async () => {
    for (const role of FIRM_ROLES) {
      const res = await as[role].get(`/api/sites/${b.site.id}`);
      expect(res.status, role).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect(JSON.stringify(res.body)).not.toContain(b.site.name);
    }
    expect((await as.operator.get(`/api/sites/${a.site.id}`)).status).toBe(403);
    expect((await as.anon.get(`/api/sites/${a.site.id}`)).status).toBe(401);
    const bad = await as.owner.get('/api/sites/12');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('siteId');
  });
});

describe('PATCH /api/sites/:siteId', () => {
  it('changes only the fields sent, nested groups field by field, and audits the changed paths', async () => {
    const site = await buildSite(a.firm, a.client, { name: 'Before' });
    const res = await as.coordinator.patch(`/api/sites/${site.id}`, {
      name: 'After',
      address: { city: 'Fernley Cross' },
      contract: { monthlyFeeCents: 4200, startsOn: '2026-02-01' },
      permit: { expiresOn: '2028-01-31' },
    });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      name: 'After',
      address: { line1: '14 Quarry Lane', city: 'Fernley Cross', postalCode: '68001' },
      contract: { monthlyFeeCents: 4200, startsOn: '2026-02-01', termMonths: null },
      permit: { expiresOn: '2028-01-31', number: '' },
      accessNotes: 'Key safe behind the shed.',
    });
    const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: site.id } });
    expect(stored!.city).toBe('Fernley Cross');
    expect(stored!.addressLine1).toBe('14 Quarry Lane');
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'site.updated', subjectId: site.id } });
    expect(audit).toHaveLength(1);
    expect((audit[0]!.details as { changed: string[] }).changed.sort()).toEqual(
      ['address.city', 'contract.monthlyFeeCents', 'contract.startsOn', 'name', 'permit.expiresOn'].sort(),
    );
    // a patch that changes nothing writes no audit
    await as.owner.patch(`/api/sites/${site.id}`, { name: 'After' }).expect(200);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'site.updated', subjectId: site.id } })).toBe(1);
  });

  it('answers 400 naming the field, including a cancellation before the stored start date', async () => {
    const site = await buildSite(a.firm, a.client);
    await as.owner.patch(`/api/sites/${site.id}`, { contract: { startsOn: '2026-06-01' } }).expect(200);
    for (const [body, field] of [
      [{ address: { city: '' } }, 'address.city'],
      [{ contract: { monthlyFeeCents: 12.5 } }, 'contract.monthlyFeeCents'],
      [{ contract: { cancelledOn: '2026-05-01' } }, 'contract.cancelledOn'],
      [{ timeZone: 'Nowhere' }, 'timeZone'],
      [{ monitoringAccount: 'has spaces!' }, 'monitoringAccount'],
    ] as const) {
      const res = await as.owner.patch(`/api/sites/${site.id}`, body);
      expect(res.status, field).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    }
    const stored = await Site.findOne({ where: { tenantId: a.firm.id, id: site.id } });
    expect(stored!.contractCancelledOn).toBeNull();
    expect(stored!.city).toBe('Ashby Vale');
  });

  it('answers 403 to a technician and to the client on their own site; 404 to the client for another client’s site', async () => {
    expect((await as.technician.patch(`/api/sites/${a.site.id}`, { name: 'Tech' })).status).toBe(403);
    const own = await as.client.patch(`/api/sites/${a.site.id}`, { name: 'Mine' });
    expect(own.status).toBe(403);
    const neighbourSite = await buildSite(a.firm, await buildClient(a.firm));
    expect((await as.client.patch(`/api/sites/${neighbourSite.id}`, { name: 'Theirs' })).status).toBe(404);
  });

  it('answers 404 for another firm’s site to every role, 403 to the operator, 401 signed out; nothing changes', async () => {
    for (const role of FIRM_ROLES) expect((await as[role].patch(`/api/sites/${b.site.id}`, { name: 'Taken' })).status, role).toBe(404);
    expect((await as.operator.patch(`/api/sites/${a.site.id}`, { name: 'Op' })).status).toBe(403);
    expect((await as.anon.patch(`/api/sites/${a.site.id}`, { name: 'Anon' })).status).toBe(401);
    const stored = await Site.findOne({ where: { tenantId: b.firm.id, id: b.site.id } });
    expect(stored!.name).toBe(b.site.name);
  });
});

describe('DELETE /api/sites/:siteId', () => {
  it('deletes the site with its emergency contacts (owner and coordinator), audited', async () => {
    for (const role of ['owner', 'coordinator'] as const) {
      const site = await buildSite(a.firm, a.client);
      await buildContact(site, 1);
      const res = await as[role].delete(`/api/sites/${site.id}`);
      expect(res.status).toBe(204);
      expect(await Site.count({ where: { tenantId: a.firm.id, id: site.id } })).toBe(0);
      expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
      expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'site.deleted', subjectId: site.id } })).toBe(1);
    }
  });

  it('answers 403 to a technician, the client (own site) and the operator, 401 signed out, 404 for another firm', async () => {
    expect((await as.technician.delete(`/api/sites/${a.site.id}`)).status).toBe(403);
    expect((await as.client.delete(`/api/sites/${a.site.id}`)).status).toBe(403);
    expect((await as.operator.delete(`/api/sites/${a.site.id}`)).status).toBe(403);
    expect((await as.anon.delete(`/api/sites/${a.site.id}`)).status).toBe(401);
    for (const role of FIRM_ROLES) expect((await as[role].delete(`/api/sites/${b.site.id}`)).status, role).toBe(404);
    expect(await Site.count({ where: { tenantId: a.firm.id, id: a.site.id } })).toBe(1);
    expect(await Site.count({ where: { tenantId: b.firm.id, id: b.site.id } })).toBe(1);
    const bad = await as.owner.delete('/api/sites/xyz');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('siteId');
  });
});
