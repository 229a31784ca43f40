import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import { EmergencyContact } from '@server/models/EmergencyContact';
import type { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildContact, buildFirmWithSite, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let bContact: EmergencyContact;
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
  bContact = await buildContact(b.site, 1, { name: 'Firm B Contact' });
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

const FIRM_ROLES = ['owner', 'coordinator', 'technician', 'client'] as const;

interface ContactRow {
  id: string;
  siteId: string;
  position: number;
  name: string;
  relation: string;
  phone: string;
  altPhone: string;
}

/** A site of firm A with contacts named by position: "Ada", "Ben", … */
async function siteWith(names: string[]): Promise<{ site: Site; contacts: EmergencyContact[] }> {
  const site = await buildSite(a.firm, a.client);
  const contacts: EmergencyContact[] = [];
  for (const [i, name] of names.entries()) contacts.push(await buildContact(site, i + 1, { name }));
  return { site, contacts };
}

/** The stored order of a site's contacts: names by position, and the positions themselves. */
async function storedOrder(siteId: string) {
  const rows = await EmergencyContact.findAll({ where: { tenantId: a.firm.id, siteId }, order: [['position', 'ASC']] });
  return { names: rows.map((r) => r.name), positions: rows.map((r) => r.position) };
}

describe('GET /api/sites/:siteId/contacts', () => {
  it('answers every staff role the contacts in calling order', async () => {
    const { site } = await siteWith(['Ada Quill', 'Ben Rook', 'Cai Moss']);
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      const res = await as[role].get(`/api/sites/${site.id}/contacts`);
      expect(res.status).toBe(200);
      const data = res.body.data as ContactRow[];
      expect(data.map((c) => c.name)).toEqual(['Ada Quill', 'Ben Rook', 'Cai Moss']);
      expect(data.map((c) => c.position)).toEqual([1, 2, 3]);
      expect(Object.keys(data[0]!).sort()).toEqual(['altPhone', 'id', 'name', 'phone', 'position', 'relation', 'siteId']);
      expect(res.body.page.total).toBe(3);
    }
  });

  it('answers the client 403 on their own site (contacts are edited in the portal) and 404 on another client’s site', async () => {
    const own = await as.client.get(`/api/sites/${a.site.id}/contacts`);
    expect(own.status).toBe(403);
    const neighbourSite = await buildSite(a.firm, await buildClient(a.firm));
    expect((await as.client.get(`/api/sites/${neighbourSite.id}/contacts`)).status).toBe(404);
  });

  it('answers 404 for another firm’s site to every role, 403 to the operator, 401 signed out, 400 for a malformed id', async () => {
    for (const role of FIRM_ROLES) {
      const res = await as[role].get(`/api/sites/${b.site.id}/contacts`);
      expect(res.status, role).toBe(404);
      expect(res.text).not.toContain('Firm B Contact');
    }
    expect((await as.operator.get(`/api/sites/${a.site.id}/contacts`)).status).toBe(403);
    expect((await as.anon.get(`/api/sites/${a.site.id}/contacts`)).status).toBe(401);
    const bad = await as.owner.get('/api/sites/nope/contacts');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('siteId');
  });
});

describe('POST /api/sites/:siteId/contacts', () => {
  it('appends at the end with the phone normalised, audited (owner and coordinator)', async () => {
    const { site } = await siteWith(['Ada Quill']);
    const res = await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'Ben Rook', relation: 'Son', phone: '(555) 010-3344', altPhone: '555.010.3345' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ siteId: site.id, position: 2, name: 'Ben Rook', relation: 'Son', phone: '+15550103344', altPhone: '+15550103345' });
    const byCoordinator = await as.coordinator.post(`/api/sites/${site.id}/contacts`, { name: 'Cai Moss', phone: '+1 555 010 9000' });
    expect(byCoordinator.status).toBe(201);
    expect(byCoordinator.body.data.position).toBe(3);
    expect(await storedOrder(site.id)).toEqual({ names: ['Ada Quill', 'Ben Rook', 'Cai Moss'], positions: [1, 2, 3] });
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'contact.created', subjectId: res.body.data.id } });
    expect(audit).toHaveLength(1);
    expect(JSON.stringify(audit[0]!.details)).not.toContain('555');
  });

  it('inserts at a given position and shifts the others down; a position past the end appends', async () => {
    const { site } = await siteWith(['Ada Quill', 'Ben Rook', 'Cai Moss']);
    const first = await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'Dov Park', phone: '5550101111', position: 1 });
    expect(first.status).toBe(201);
    expect(first.body.data.position).toBe(1);
    const middle = await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'Eli Shaw', phone: '5550101112', position: 3 });
    expect(middle.body.data.position).toBe(3);
    const far = await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'Fay Lind', phone: '5550101113', position: 20 });
    expect(far.body.data.position).toBe(6);
    expect(await storedOrder(site.id)).toEqual({ names: ['Dov Park', 'Ada Quill', 'Eli Shaw', 'Ben Rook', 'Cai Moss', 'Fay Lind'], positions: [1, 2, 3, 4, 5, 6] });
    const listed = await as.owner.get(`/api/sites/${site.id}/contacts`);
    expect((listed.body.data as ContactRow[]).map((c) => c.name)).toEqual(['Dov Park', 'Ada Quill', 'Eli Shaw', 'Ben Rook', 'Cai Moss', 'Fay Lind']);
  });

  it('answers 400 naming the field for a bad phone, name or position; nothing stored', async () => {
    const { site } = await siteWith([]);
    for (const [body, fields] of [
      [{ name: 'Gil Hart', phone: '12' }, ['phone']],
      [{ name: 'Gil Hart', phone: 'call the office' }, ['phone']],
      [{ name: 'Gil Hart' }, ['phone']],
      [{ name: '', phone: '5550101234' }, ['name']],
      [{ name: 'Gil Hart', phone: '5550101234', altPhone: '99' }, ['altPhone']],
      [{ name: 'Gil Hart', phone: '5550101234', position: 0 }, ['position']],
    ] as const) {
      const res = await as.owner.post(`/api/sites/${site.id}/contacts`, body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields)).toEqual(fields);
    }
    expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
  });

  it('refuses an eleventh contact with 409', async () => {
    const { site } = await siteWith(Array.from({ length: 10 }, (_, i) => `Person ${i + 1}`));
    const res = await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'One Too Many', phone: '5550101234' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/10 emergency contacts/);
  });

  it('answers 403 to a technician, the client and the operator, 401 signed out, 404 for another firm; nothing stored', async () => {
    const { site } = await siteWith([]);
    const body = { name: 'Not Allowed', phone: '5550101234' };
    expect((await as.technician.post(`/api/sites/${site.id}/contacts`, body)).status).toBe(403);
    expect((await as.client.post(`/api/sites/${a.site.id}/contacts`, body)).status).toBe(403);
    expect((await as.operator.post(`/api/sites/${site.id}/contacts`, body)).status).toBe(403);
    expect((await as.anon.post(`/api/sites/${site.id}/contacts`, body)).status).toBe(401);
    for (const role of FIRM_ROLES) expect((await as[role].post(`/api/sites/${b.site.id}/contacts`, body)).status, role).toBe(404);
    expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
    expect(await EmergencyContact.count({ where: { tenantId: b.firm.id, siteId: b.site.id } })).toBe(1);
  });
});

describe('PUT /api/sites/:siteId/contacts', () => {
  it('replaces the whole ordered list in one go, positions 1..n, audited', async () => {
    const { site, contacts } = await siteWith(['Old One', 'Old Two']);
    const res = await as.coordinator.put(`/api/sites/${site.id}/contacts`, {
      contacts: [
        { name: 'New First', relation: 'Daughter', phone: '(555) 010-7001' },
        { name: 'New Second', phone: '555-010-7002' },
        { name: 'New Third', phone: '+1 555 010 7003', altPhone: '555 010 7004' },
      ],
    });
    expect(res.status).toBe(200);
    const data = res.body.data as ContactRow[];
    expect(data.map((c) => [c.position, c.name, c.phone])).toEqual([
      [1, 'New First', '+15550107001'],
      [2, 'New Second', '+15550107002'],
      [3, 'New Third', '+15550107003'],
    ]);
    expect(await storedOrder(site.id)).toEqual({ names: ['New First', 'New Second', 'New Third'], positions: [1, 2, 3] });
    expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, id: contacts.map((c) => c.id) } })).toBe(0);
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'contacts.replaced', subjectId: site.id } })).toBe(1);
    // an empty list clears them
    const cleared = await as.owner.put(`/api/sites/${site.id}/contacts`, { contacts: [] });
    expect(cleared.status).toBe(200);
    expect(cleared.body.data).toEqual([]);
    expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, siteId: site.id } })).toBe(0);
  });

  it('answers 400 naming contacts.1.phone style paths and keeps the stored list', async () => {
    const { site } = await siteWith(['Keep One', 'Keep Two']);
    const res = await as.owner.put(`/api/sites/${site.id}/contacts`, {
      contacts: [
        { name: 'Fine', phone: '5550107001' },
        { name: 'Bad Phone', phone: '12' },
        { name: '', phone: '5550107003' },
      ],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ 'contacts.1.phone': expect.any(String), 'contacts.2.name': expect.any(String) });
    const tooMany = await as.owner.put(`/api/sites/${site.id}/contacts`, { contacts: Array.from({ length: 11 }, (_, i) => ({ name: `P${i}`, phone: '5550107001' })) });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.fields).toHaveProperty('contacts');
    const missing = await as.owner.put(`/api/sites/${site.id}/contacts`, {});
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toHaveProperty('contacts');
    expect(await storedOrder(site.id)).toEqual({ names: ['Keep One', 'Keep Two'], positions: [1, 2] });
  });

  it('answers 403 to a technician, the client and the operator, 401 signed out, 404 for another firm; nothing changes', async () => {
    const { site } = await siteWith(['Stays']);
    const body = { contacts: [{ name: 'Intruder', phone: '5550107001' }] };
    expect((await as.technician.put(`/api/sites/${site.id}/contacts`, body)).status).toBe(403);
    expect((await as.client.put(`/api/sites/${a.site.id}/contacts`, body)).status).toBe(403);
    expect((await as.operator.put(`/api/sites/${site.id}/contacts`, body)).status).toBe(403);
    expect((await as.anon.put(`/api/sites/${site.id}/contacts`, body)).status).toBe(401);
    for (const role of FIRM_ROLES) expect((await as[role].put(`/api/sites/${b.site.id}/contacts`, body)).status, role).toBe(404);
    expect((await storedOrder(site.id)).names).toEqual(['Stays']);
    const bStored = await EmergencyContact.findAll({ where: { tenantId: b.firm.id, siteId: b.site.id } });
    expect(bStored.map((c) => c.name)).toEqual(['Firm B Contact']);
  });
});

describe('PATCH /api/contacts/:contactId', () => {
  it('changes fields and moves a contact, positions staying 1..n without gaps', async () => {
    const { site, contacts } = await siteWith(['Ada Quill', 'Ben Rook', 'Cai Moss', 'Dov Park']);
    const renamed = await as.coordinator.patch(`/api/contacts/${contacts[1]!.id}`, { name: 'Ben Rookwood', phone: '555 010 8080' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.data).toMatchObject({ name: 'Ben Rookwood', phone: '+15550108080', position: 2 });

    const moved = await as.owner.patch(`/api/contacts/${contacts[3]!.id}`, { position: 1 });
    expect(moved.status).toBe(200);
    expect(moved.body.data.position).toBe(1);
    expect(await storedOrder(site.id)).toEqual({ names: ['Dov Park', 'Ada Quill', 'Ben Rookwood', 'Cai Moss'], positions: [1, 2, 3, 4] });

    const down = await as.owner.patch(`/api/contacts/${contacts[0]!.id}`, { position: 9 });
    expect(down.body.data.position).toBe(4);
    expect(await storedOrder(site.id)).toEqual({ names: ['Dov Park', 'Ben Rookwood', 'Cai Moss', 'Ada Quill'], positions: [1, 2, 3, 4] });
    const audit = await AuditEvent.findAll({ where: { tenantId: a.firm.id, action: 'contact.updated', subjectId: contacts[1]!.id } });
    expect((audit[0]!.details as { changed: string[] }).changed.sort()).toEqual(['name', 'phone']);
  });

  it('answers 400 naming the field and changes nothing', async () => {
    const { contacts } = await siteWith(['Ada Quill']);
    for (const [body, field] of [
      [{ phone: '1' }, 'phone'],
      [{ name: '' }, 'name'],
      [{ position: 0 }, 'position'],
      [{ position: 'first' }, 'position'],
    ] as const) {
      const res = await as.owner.patch(`/api/contacts/${contacts[0]!.id}`, body);
      expect(res.status).toBe(400);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    }
    const bad = await as.owner.patch('/api/contacts/123', { name: 'X' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('contactId');
  });

  it('answers 403 to a technician and the operator, 404 to the client, 401 signed out, 404 for another firm', async () => {
    const { contacts } = await siteWith(['Ada Quill']);
    const own = await buildContact(a.site, 1, { name: 'Client Own Contact' });
    expect((await as.technician.patch(`/api/contacts/${contacts[0]!.id}`, { name: 'Tech' })).status).toBe(403);
    expect((await as.operator.patch(`/api/contacts/${contacts[0]!.id}`, { name: 'Op' })).status).toBe(403);
    expect((await as.client.patch(`/api/contacts/${own.id}`, { name: 'Client' })).status).toBe(404);
    expect((await as.anon.patch(`/api/contacts/${contacts[0]!.id}`, { name: 'Anon' })).status).toBe(401);
    for (const role of FIRM_ROLES) expect((await as[role].patch(`/api/contacts/${bContact.id}`, { name: 'Taken' })).status, role).toBe(404);
    const stored = await EmergencyContact.findOne({ where: { tenantId: b.firm.id, id: bContact.id } });
    expect(stored!.name).toBe('Firm B Contact');
    expect((await storedOrder(contacts[0]!.siteId)).names).toEqual(['Ada Quill']);
  });
});

describe('DELETE /api/contacts/:contactId', () => {
  it('removes the contact and closes the gap (owner and coordinator), audited', async () => {
    const { site, contacts } = await siteWith(['Ada Quill', 'Ben Rook', 'Cai Moss', 'Dov Park']);
    expect((await as.owner.delete(`/api/contacts/${contacts[1]!.id}`)).status).toBe(204);
    expect(await storedOrder(site.id)).toEqual({ names: ['Ada Quill', 'Cai Moss', 'Dov Park'], positions: [1, 2, 3] });
    expect((await as.coordinator.delete(`/api/contacts/${contacts[0]!.id}`)).status).toBe(204);
    expect(await storedOrder(site.id)).toEqual({ names: ['Cai Moss', 'Dov Park'], positions: [1, 2] });
    expect(await AuditEvent.count({ where: { tenantId: a.firm.id, action: 'contact.deleted', subjectId: contacts[1]!.id } })).toBe(1);
    expect((await as.owner.delete(`/api/contacts/${contacts[1]!.id}`)).status).toBe(404);
  });

  it('answers 403 to a technician and the operator, 404 to the client, 401 signed out, 404 for another firm; nothing deleted', async () => {
    const { site, contacts } = await siteWith(['Ada Quill']);
    expect((await as.technician.delete(`/api/contacts/${contacts[0]!.id}`)).status).toBe(403);
    expect((await as.operator.delete(`/api/contacts/${contacts[0]!.id}`)).status).toBe(403);
    expect((await as.client.delete(`/api/contacts/${contacts[0]!.id}`)).status).toBe(404);
    expect((await as.anon.delete(`/api/contacts/${contacts[0]!.id}`)).status).toBe(401);
    for (const role of FIRM_ROLES) expect((await as[role].delete(`/api/contacts/${bContact.id}`)).status, role).toBe(404);
    expect((await storedOrder(site.id)).names).toEqual(['Ada Quill']);
    expect(await EmergencyContact.count({ where: { tenantId: b.firm.id, id: bContact.id } })).toBe(1);
    const bad = await as.owner.delete('/api/contacts/abc');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('contactId');
  });
});
