import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { Client } from '@server/models/Client';
import { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildClientUser, buildFirm, buildFirmWithSite, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
/** firm A's people, signed in once */
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

interface ClientRow {
  id: string;
  name: string;
  email: string;
  phone: string;
  notes?: string;
  status: string;
  siteCount: number;
}
interface ListBody {
  data: ClientRow[];
  page: { number: number; size: number; total: number };
}

const STAFF = ['owner', 'coordinator', 'technician'] as const;
const FIRM_ROLES = ['owner', 'coordinator', 'technician', 'client'] as const;

describe('GET /api/clients', () => {
  it('answers 401 signed out and 403 to the operator', async () => {
    const out = await as.anon.get('/api/clients');
    expect(out.status).toBe(401);
    expect(out.body.error.code).toBe('unauthenticated');
    const op = await as.operator.get('/api/clients');
    expect(op.status).toBe(403);
    expect(op.body.error.code).toBe('forbidden');
  });

  it('lists the firm’s clients for every staff role, with notes and site counts, never another firm’s', async () => {
    const second = await buildClient(a.firm, { name: 'Birchmoor Household' });
    for (const role of STAFF) {
      const res = await as[role].get('/api/clients?pageSize=100');
      expect(res.status).toBe(200);
      const body = res.body as ListBody;
      expect(Object.keys(body).sort()).toEqual(['data', 'page']);
      const ids = body.data.map((c) => c.id);
      expect(ids).toContain(a.client.id);
      expect(ids).toContain(second.id);
      expect(ids).not.toContain(b.client.id);
      expect(JSON.stringify(body)).not.toContain(b.firm.id);
      const row = body.data.find((c) => c.id === a.client.id)!;
      expect(row).toMatchObject({ name: a.client.name, email: a.client.email, phone: '+15550104400', status: 'active', siteCount: 1 });
      expect(row.notes).toBe('Gate code is with the office.');
      expect(body.data.find((c) => c.id === second.id)!.siteCount).toBe(0);
    }
  });

  it('shows a client (homeowner) only their own record, without internal notes', async () => {
    const res = await as.client.get('/api/clients');
    expect(res.status).toBe(200);
    const body = res.body as ListBody;
    expect(body.data.map((c) => c.id)).toEqual([a.client.id]);
    expect(body.page.total).toBe(1);
    expect(body.data[0]).not.toHaveProperty('notes');
    expect(JSON.stringify(body)).not.toContain('Gate code');
  });

  it('searches name, e-mail and phone with q (phones by their digits however written)', async () => {
    const firm = await buildFirm();
    const owner = await buildUser(firm, 'owner');
    const byName = await buildClient(firm, { name: 'Odalys Fenwright', email: 'one@clients.example', phone: '+15550100001' });
    const byEmail = await buildClient(firm, { name: 'Pim Arrowsmith', email: 'fenwright.family@clients.example', phone: '+15550100002' });
    const byPhone = await buildClient(firm, { name: 'Quill Harrow', email: 'three@clients.example', phone: '+15550107788' });
    await buildClient(b.firm, { name: 'Fenwright Elsewhere' });
    const v = await signedIn(owner);

    const names = (await v.get('/api/clients?q=fenwright')).body as ListBody;
    expect(names.data.map((c) => c.id).sort()).toEqual([byName.id, byEmail.id].sort());
    expect(names.page.total).toBe(2);
    const phone = (await v.get(`/api/clients?q=${encodeURIComponent('(555) 010-7788')}`)).body as ListBody;
    expect(phone.data.map((c) => c.id)).toEqual([byPhone.id]);
    const none = (await v.get('/api/clients?q=zzz-nobody')).body as ListBody;
    expect(none.data).toEqual([]);
    const sql = await v.get(`/api/clients?q=${encodeURIComponent("' OR 1=1 --")}`);
    expect(sql.status).toBe(200);
    expect((sql.body as ListBody).data).toEqual([]);
  });

  it('filters by status, sorts by name, -name, status and createdAt, and pages', async () => {
    const firm = await buildFirm();
    const owner = await buildUser(firm, 'owner');
    const made: Client[] = [];
    for (const [name, status] of [
      ['Cora Pell', 'active'],
      ['Abel Wynn', 'cancelled'],
      ['Bram Tull', 'active'],
    ] as const) {
      made.push(await buildClient(firm, { name, status }));
      await new Promise((r) => setTimeout(r, 5));
    }
    const v = await signedIn(owner);
    const names = async (qs: string) => ((await v.get(`/api/clients${qs}`)).body as ListBody).data.map((c) => c.name);

    expect(await names('')).toEqual(['Abel Wynn', 'Bram Tull', 'Cora Pell']);
    expect(await names('?sort=-name')).toEqual(['Cora Pell', 'Bram Tull', 'Abel Wynn']);
    expect(await names('?sort=createdAt')).toEqual(['Cora Pell', 'Abel Wynn', 'Bram Tull']);
    expect(await names('?sort=-createdAt')).toEqual(['Bram Tull', 'Abel Wynn', 'Cora Pell']);
    expect((await names('?sort=status'))[2]).toBe('Abel Wynn');
    expect(await names('?status=active')).toEqual(['Bram Tull', 'Cora Pell']);
    expect(await names('?status=cancelled')).toEqual(['Abel Wynn']);

    const p2 = (await v.get('/api/clients?pageSize=2&page=2')).body as ListBody;
    expect(p2.page).toEqual({ number: 2, size: 2, total: 3 });
    expect(p2.data.map((c) => c.name)).toEqual(['Cora Pell']);
  });

  it('answers 400 naming the field for a bad sort, status, page or pageSize', async () => {
    for (const [qs, field] of [
      ['?sort=notes', 'sort'],
      ['?sort=siteCount', 'sort'],
      ['?sort=na;me', 'sort'],
      ['?status=paused', 'status'],
      ['?page=0', 'page'],
      ['?pageSize=500', 'pageSize'],
    ] as const) {
      const res = await as.owner.get(`/api/clients${qs}`);
      expect(res.status, qs).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.fields).toHaveProperty(field);
    }
  });
});

describe('POST /api/clients', () => {
  it('lets the owner and the coordinator create a client: 201, stored in their firm, phones normalised, audited', async () => {
    for (const role of ['owner', 'coordinator'] as const) {
      const res = await as[role].post('/api/clients', {
        name: `  Marguerite Ashdown ${role} `,
        email: `Ashdown.${role}@Clients.Example`,
        phone: '(555) 010-2233',
        notes: 'Dog in the yard.',
      });
      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({
        name: `Marguerite Ashdown ${role}`,
        email: `ashdown.${role}@clients.example`,
        phone: '+15550102233',
        altPhone: '',
        notes: 'Dog in the yard.',
        status: 'active',
        siteCount: 0,
      });
      const stored = await Client.findOne({ where: { tenantId: a.firm.id, id: res.body.data.id } });
      expect(stored).not.toBeNull();
      expect(stored!.tenantId).toBe(a.firm.id);
      const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'client.created', subjectId: stored!.id } });
      expect(audit).toHaveLength(1);
      expect(audit[0]!.actorId).toBe(role === 'owner' ? a.owner.id : a.coordinator.id);
    }
  });

  it('refuses technicians and clients with 403, the operator with 403, signed out with 401; nothing stored', async () => {
    const before = await Client.count({ where: { tenantId: a.firm.id } });
    for (const role of ['technician', 'client', 'operator'] as const) {
      const res = await as[role].post('/api/clients', { name: `Refused ${role}` });
      expect(res.status, role).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
    const out = await as.anon.post('/api/clients', { name: 'Refused anon' });
    expect(out.status).toBe(401);
    expect(await Client.count({ where: { tenantId: a.firm.id } })).toBe(before);
  });

  it('answers 400 naming each bad field', async () => {
    const missing = await as.owner.post('/api/clients', {});
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields)).toEqual(['name']);
    const bad = await as.owner.post('/api/clients', { name: 'Ok Name', email: 'not-an-address', phone: '12', altPhone: 'call me', status: 'paused' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['altPhone', 'email', 'phone', 'status']);
    const long = await as.owner.post('/api/clients', { name: 'x'.repeat(121) });
    expect(long.body.error.fields).toHaveProperty('name');
  });
});

describe('GET /api/clients/:clientId', () => {
  it('answers staff the full record with notes and the site count', async () => {
    for (const role of STAFF) {
      const res = await as[role].get(`/api/clients/${a.client.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ id: a.client.id, name: a.client.name, notes: a.client.notes, siteCount: 1, status: 'active' });
    }
  });

  it('answers the client their own record without notes, and 404 for another client of the same firm', async () => {
    const own = await as.client.get(`/api/clients/${a.client.id}`);
    expect(own.status).toBe(200);
    expect(own.body.data.id).toBe(a.client.id);
    expect(own.body.data).not.toHaveProperty('notes');
    const neighbour = await buildClient(a.firm, { name: 'Neighbouring Household' });
    const other = await as.client.get(`/api/clients/${neighbour.id}`);
    expect(other.status).toBe(404);
    expect(other.body.error.code).toBe('not_found');
  });

  it('answers 404 for another firm’s client to every role, 403 to the operator, 401 signed out, 400 for a malformed id', async () => {
    for (const role of FIRM_ROLES) {
      const res = await as[role].get(`/api/clients/${b.client.id}`);
      expect(res.status, role).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain(b.client.name);
    }
    expect((await as.operator.get(`/api/clients/${a.client.id}`)).status).toBe(403);
    expect((await as.anon.get(`/api/clients/${a.client.id}`)).status).toBe(401);
    const bad = await as.owner.get('/api/clients/not-a-uuid');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('clientId');
    expect((await as.owner.get('/api/clients/00000000-0000-4000-8000-000000000000')).status).toBe(404);
  });
});

describe('PATCH /api/clients/:clientId', () => {
  it('lets the owner and coordinator change the fields sent, and audits which fields changed', async () => {
    const client = await buildClient(a.firm, { name: 'Tamsin Greaves', notes: 'Original note.' });
    const res = await as.coordinator.patch(`/api/clients/${client.id}`, { phone: '555-010-9911', status: 'cancelled' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: client.id, name: 'Tamsin Greaves', phone: '+15550109911', status: 'cancelled', notes: 'Original note.' });
    const again = await as.owner.patch(`/api/clients/${client.id}`, { notes: 'Updated note.' });
    expect(again.status).toBe(200);
    const stored = await Client.findOne({ where: { tenantId: a.firm.id, id: client.id } });
    expect(stored!.notes).toBe('Updated note.');
    expect(stored!.status).toBe('cancelled');
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'client.updated', subjectId: client.id }, order: [['createdAt', 'ASC']] });
    expect(audit.map((e) => (e.details as { changed: string[] }).changed.sort())).toEqual([['phone', 'status'], ['notes']]);
  });

  it('answers 400 naming the field for bad input and changes nothing', async () => {
    const client = await buildClient(a.firm, { name: 'Unchanged Household' });
    for (const [body, field] of [
      [{ name: '' }, 'name'],
      [{ email: 'nope' }, 'email'],
      [{ phone: '123' }, 'phone'],
      [{ status: 'gone' }, 'status'],
    ] as const) {
      const res = await as.owner.patch(`/api/clients/${client.id}`, body);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    }
    const stored = await Client.findOne({ where: { tenantId: a.firm.id, id: client.id } });
    expect(stored!.name).toBe('Unchanged Household');
  });

  it('answers 403 to a technician and to the client on their own record, 404 to the client for another client', async () => {
    expect((await as.technician.patch(`/api/clients/${a.client.id}`, { name: 'Tech Renamed' })).status).toBe(403);
    const own = await as.client.patch(`/api/clients/${a.client.id}`, { name: 'Self Renamed' });
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('forbidden');
    const neighbour = await buildClient(a.firm);
    expect((await as.client.patch(`/api/clients/${neighbour.id}`, { name: 'x' })).status).toBe(404);
    const stored = await Client.findOne({ where: { tenantId: a.firm.id, id: a.client.id } });
    expect(stored!.name).toBe(a.client.name);
  });

  it('answers 404 for another firm’s client to every role, 403 to the operator, 401 signed out', async () => {
    for (const role of FIRM_ROLES) {
      expect((await as[role].patch(`/api/clients/${b.client.id}`, { name: 'Taken Over' })).status, role).toBe(404);
    }
    expect((await as.operator.patch(`/api/clients/${a.client.id}`, { name: 'Op' })).status).toBe(403);
    expect((await as.anon.patch(`/api/clients/${a.client.id}`, { name: 'Anon' })).status).toBe(401);
    const stored = await Client.findOne({ where: { tenantId: b.firm.id, id: b.client.id } });
    expect(stored!.name).toBe(b.client.name);
  });
});

describe('DELETE /api/clients/:clientId', () => {
  it('refuses with 409 conflict while the client has sites, saying so', async () => {
    const client = await buildClient(a.firm, { name: 'Halloway Family' });
    await buildSite(a.firm, client);
    await buildSite(a.firm, client);
    const res = await as.owner.delete(`/api/clients/${client.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('conflict');
    expect(res.body.error.message).toMatch(/2 sites/);
    expect(await Client.count({ where: { tenantId: a.firm.id, id: client.id } })).toBe(1);
  });

  it('deletes a client without sites (owner and coordinator), audited; their portal sign-in is unlinked', async () => {
    for (const role of ['owner', 'coordinator'] as const) {
      const client = await buildClient(a.firm, { name: `Leaving ${role}` });
      const homeowner = await buildClientUser(a.firm, client);
      const res = await as[role].delete(`/api/clients/${client.id}`);
      expect(res.status).toBe(204);
      expect(await Client.count({ where: { tenantId: a.firm.id, id: client.id } })).toBe(0);
      const unlinked = await User.findOne({ where: { tenantId: a.firm.id, id: homeowner.id } });
      expect(unlinked!.clientId).toBeNull();
      const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'client.deleted', subjectId: client.id } });
      expect(audit).toHaveLength(1);
      expect((await as.owner.get(`/api/clients/${client.id}`)).status).toBe(404);
    }
  });

  it('answers 403 to a technician, the client, the operator; 401 signed out; 404 for another firm; nothing deleted', async () => {
    const client = await buildClient(a.firm);
    const homeowner = await signedIn(await buildClientUser(a.firm, client));
    expect((await as.technician.delete(`/api/clients/${client.id}`)).status).toBe(403);
    expect((await homeowner.delete(`/api/clients/${client.id}`)).status).toBe(403);
    expect((await as.operator.delete(`/api/clients/${client.id}`)).status).toBe(403);
    expect((await as.anon.delete(`/api/clients/${client.id}`)).status).toBe(401);
    expect((await as.client.delete(`/api/clients/${client.id}`)).status).toBe(404);
    const other = await buildClient(b.firm);
    for (const role of FIRM_ROLES) expect((await as[role].delete(`/api/clients/${other.id}`)).status, role).toBe(404);
    expect(await Client.count({ where: { tenantId: a.firm.id, id: client.id } })).toBe(1);
    expect(await Client.count({ where: { tenantId: b.firm.id, id: other.id } })).toBe(1);
    const bad = await as.owner.delete('/api/clients/123');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('clientId');
  });
});
