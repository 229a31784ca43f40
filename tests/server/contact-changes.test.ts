import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent } from '@server/models/AuditEvent';
import type { Site } from '@server/models/Site';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildContact, buildFirmWithSite, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
type World = Awaited<ReturnType<typeof buildFirmWithSite>>;
let a: World;
let b: World;
let secondCoordinator: User;
let formerCoordinator: User;
const as: Record<'owner' | 'coordinator' | 'technician' | 'client' | 'operator' | 'anon' | 'otherFirm', Visitor> = {} as never;

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

beforeAll(async () => {
  t = await createTestApp();
  a = await buildFirmWithSite();
  b = await buildFirmWithSite();
  a.firm.monitoringCenterName = 'Harbourlight Monitoring';
  a.firm.monitoringCenterPhone = '+15550107000';
  await a.firm.save();
  secondCoordinator = await buildUser(a.firm, 'coordinator');
  formerCoordinator = await buildUser(a.firm, 'coordinator', { deactivatedAt: new Date('2026-01-05T00:00:00Z') });
  as.owner = await signedIn(a.owner);
  as.coordinator = await signedIn(a.coordinator);
  as.technician = await signedIn(a.technician);
  as.client = await signedIn(a.clientUser);
  as.operator = await signedIn(await buildUser(null, 'operator'));
  as.otherFirm = await signedIn(b.coordinator);
  as.anon = await visitor(t.app);
});
afterAll(async () => {
  await t.close();
});

interface Snapshot {
  name: string;
  relation: string;
  phone: string;
  altPhone: string;
}
interface Change {
  id: string;
  at: string;
  action: string;
  actor: { name: string; role: string } | null;
  byHousehold: boolean;
  before: Snapshot[] | null;
  after: Snapshot[] | null;
  summary: string;
}

/** A site of the signed-in household (firm A's client) with contacts in this order. */
async function householdSite(names: string[]): Promise<Site> {
  const site = await buildSite(a.firm, a.client);
  for (const [i, name] of names.entries()) await buildContact(site, i + 1, { name, phone: `+1555010${String(4500 + i)}` });
  return site;
}

async function changesOf(v: Visitor, siteId: string): Promise<Change[]> {
  const res = await v.get(`/api/sites/${siteId}/contacts/changes`);
  expect(res.status).toBe(200);
  return res.body.data as Change[];
}

const mailsAbout = (site: Site) => t.outbox.filter((m) => m.text.includes(`/app/sites/${site.id}`));

describe('contact history after a household change in the portal', () => {
  it('keeps the list before and after, the household as actor, and a plain summary', async () => {
    const site = await householdSite(['Bram Trevane', 'Lena Quill']);
    const res = await as.client.put(`/api/portal/sites/${site.id}/contacts`, {
      contacts: [
        { name: 'Lena Quill', relation: 'Neighbour', phone: '+15550104501' },
        { name: 'Ora Neighbour', relation: 'Friend', phone: '(555) 010-4777', altPhone: '555 010 4778' },
      ],
    });
    expect(res.status).toBe(200);

    const [change, ...rest] = await changesOf(as.coordinator, site.id);
    expect(rest).toEqual([]);
    expect(change).toMatchObject({
      action: 'contacts.replaced',
      actor: { name: a.clientUser.name, role: 'client' },
      byHousehold: true,
      summary: 'Replaced the list: added Ora Neighbour; removed Bram Trevane; Lena Quill moved to first',
    });
    expect(change!.before).toEqual([
      { name: 'Bram Trevane', relation: 'Neighbour', phone: '+15550104500', altPhone: '' },
      { name: 'Lena Quill', relation: 'Neighbour', phone: '+15550104501', altPhone: '' },
    ]);
    expect(change!.after).toEqual([
      { name: 'Lena Quill', relation: 'Neighbour', phone: '+15550104501', altPhone: '' },
      { name: 'Ora Neighbour', relation: 'Friend', phone: '+15550104777', altPhone: '+15550104778' },
    ]);
    expect(Number.isNaN(Date.parse(change!.at))).toBe(false);
    expect(Object.keys(change!).sort()).toEqual(['action', 'actor', 'after', 'at', 'before', 'byHousehold', 'id', 'summary']);
  });

  it('e-mails the owner and every active coordinator, not technicians or deactivated staff', async () => {
    const site = await householdSite(['Bram Trevane', 'Lena Quill']);
    const res = await as.client.put(`/api/portal/sites/${site.id}/contacts`, {
      contacts: [
        { name: 'Lena Quill', relation: 'Daughter', phone: '+15550104501' },
        { name: 'Bram Trevane', relation: 'Neighbour', phone: '+15550104500' },
      ],
    });
    expect(res.status).toBe(200);
    const mails = mailsAbout(site);
    expect(mails.map((m) => m.to).sort()).toEqual([a.owner.email, a.coordinator.email, secondCoordinator.email].sort());
    expect(mails.some((m) => m.to === a.technician.email || m.to === formerCoordinator.email || m.to === a.clientUser.email)).toBe(false);

    const mail = mails.find((m) => m.to === a.owner.email)!;
    expect(mail.subject).toBe(`${a.client.name} changed their emergency contacts`);
    expect(mail.text).toContain('Lena Quill moved to first; new relation for Lena Quill');
    expect(mail.text).toContain('Before, in calling order:\n1. Bram Trevane (Neighbour), +1 555 010 4500\n2. Lena Quill (Neighbour), +1 555 010 4501');
    expect(mail.text).toContain('Now, in calling order:\n1. Lena Quill (Daughter), +1 555 010 4501\n2. Bram Trevane (Neighbour), +1 555 010 4500');
    expect(mail.text).toContain('Confirm the new list with the monitoring center (Harbourlight Monitoring, +1 555 010 7000)');
    expect(mail.text).toContain(`Open the site: http://mullion.test/app/sites/${site.id}`);
    expect(mail.html).toContain(`href="http://mullion.test/app/sites/${site.id}"`);
    expect(mail.html).toContain('1. Lena Quill (Daughter), +1 555 010 4501<br>2. Bram Trevane (Neighbour), +1 555 010 4500');
  });

  it('a household save that changes nothing is recorded but e-mails nobody', async () => {
    const site = await householdSite(['Bram Trevane']);
    const res = await as.client.put(`/api/portal/sites/${site.id}/contacts`, { contacts: [{ name: 'Bram Trevane', relation: 'Neighbour', phone: '+15550104500' }] });
    expect(res.status).toBe(200);
    expect(mailsAbout(site)).toEqual([]);
    const [change] = await changesOf(as.owner, site.id);
    expect(change).toMatchObject({ byHousehold: true, summary: 'Saved the list without changes' });
  });
});

describe('contact history after staff changes', () => {
  it('shows staff changes newest first with their role, single-contact changes too, and e-mails nobody', async () => {
    const site = await householdSite(['Bram Trevane', 'Lena Quill']);
    expect((await as.client.put(`/api/portal/sites/${site.id}/contacts`, { contacts: [{ name: 'Lena Quill', phone: '+15550104501' }] })).status).toBe(200);
    const mailsBefore = t.outbox.length;

    const put = await as.coordinator.put(`/api/sites/${site.id}/contacts`, {
      contacts: [
        { name: 'Lena Quill', phone: '+15550104501' },
        { name: 'Bram Trevane', relation: 'Brother', phone: '+15550104500' },
      ],
    });
    expect(put.status).toBe(200);
    const added = await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'Cai Moss', relation: 'Friend', phone: '+15550104600', position: 1 });
    expect(added.status).toBe(201);
    const patched = await as.owner.patch(`/api/contacts/${added.body.data.id}`, { name: 'Cai Moss-Ferrow', phone: '+15550104601', position: 3 });
    expect(patched.status).toBe(200);
    expect((await as.coordinator.delete(`/api/contacts/${added.body.data.id}`)).status).toBe(204);
    expect(t.outbox.length).toBe(mailsBefore);

    const changes = await changesOf(as.technician, site.id);
    expect(changes.map((c) => [c.action, c.actor?.name, c.actor?.role, c.byHousehold, c.summary])).toEqual([
      ['contact.deleted', a.coordinator.name, 'coordinator', false, 'Removed Cai Moss-Ferrow'],
      ['contact.updated', a.owner.name, 'owner', false, 'Renamed Cai Moss to Cai Moss-Ferrow; new phone for Cai Moss-Ferrow; Cai Moss-Ferrow moved to third'],
      ['contact.created', a.owner.name, 'owner', false, 'Added Cai Moss in first place'],
      ['contacts.replaced', a.coordinator.name, 'coordinator', false, 'Replaced the list: added Bram Trevane'],
      ['contacts.replaced', a.clientUser.name, 'client', true, 'Replaced the list: removed Bram Trevane; Lena Quill moved to first; new relation for Lena Quill'],
    ]);
    expect(changes[3]!.before).toEqual([{ name: 'Lena Quill', relation: '', phone: '+15550104501', altPhone: '' }]);
    expect(changes[3]!.after!.map((c) => c.name)).toEqual(['Lena Quill', 'Bram Trevane']);
    expect(changes.slice(0, 3).every((c) => c.before === null && c.after === null)).toBe(true);
    // single-contact records name the contact but keep phone numbers out of the audit
    const single = await AuditEvent.findAll({ where: { tenantId: a.firm.id, subjectId: added.body.data.id } });
    expect(single).toHaveLength(3);
    expect(JSON.stringify(single.map((e) => e.details))).not.toContain('555');
  });

  it('shows only this site’s changes, at most 50, and names no one from another firm', async () => {
    const site = await householdSite(['Bram Trevane']);
    const elsewhere = await householdSite(['Ora Neighbour']);
    expect((await as.coordinator.put(`/api/sites/${elsewhere.id}/contacts`, { contacts: [] })).status).toBe(200);
    expect((await as.owner.post(`/api/sites/${site.id}/contacts`, { name: 'Cai Moss', phone: '+15550104600' })).status).toBe(201);
    // recorded an hour from now, so they are the newest
    const start = Date.now() + 3_600_000;
    for (let i = 0; i < 52; i++) {
      await AuditEvent.create({
        tenantId: a.firm.id,
        actorId: i === 51 ? b.owner.id : a.technician.id,
        actorRole: i === 51 ? 'owner' : 'technician',
        action: 'contacts.replaced',
        subjectType: 'Site',
        subjectId: site.id,
        details: { count: i },
        ip: null,
        createdAt: new Date(start + i * 60_000),
      });
    }
    const changes = await changesOf(as.owner, site.id);
    expect(changes).toHaveLength(50);
    expect(changes[0]).toMatchObject({ actor: null, byHousehold: false, before: null, after: null, summary: 'Replaced the list (51 contacts)' });
    expect(changes[1]).toMatchObject({ actor: { name: a.technician.name, role: 'technician' }, summary: 'Replaced the list (50 contacts)' });
    expect(changes[49]!.summary).toBe('Replaced the list (2 contacts)');
    expect((await changesOf(as.owner, elsewhere.id)).map((c) => c.summary)).toEqual(['Cleared the list: removed Ora Neighbour']);
  });
});

describe('GET /api/sites/:siteId/contacts/changes: who may read it', () => {
  it('every staff role reads it; the technician too', async () => {
    for (const role of ['owner', 'coordinator', 'technician'] as const) {
      expect((await as[role].get(`/api/sites/${a.site.id}/contacts/changes`)).status, role).toBe(200);
    }
  });

  it('the household cannot read the staff history: 403 on its own site, 404 on another household’s', async () => {
    expect((await as.client.get(`/api/sites/${a.site.id}/contacts/changes`)).status).toBe(403);
    const otherHousehold = await buildSite(a.firm, await buildClient(a.firm));
    await buildContact(otherHousehold, 1, { name: 'Ora Neighbour' });
    expect((await as.client.get(`/api/sites/${otherHousehold.id}/contacts/changes`)).status).toBe(404);
  });

  it('another firm’s site is 404; the operator 403; no sign-in 401; a bad id 400', async () => {
    const res = await as.otherFirm.get(`/api/sites/${a.site.id}/contacts/changes`);
    expect(res.status).toBe(404);
    expect(JSON.stringify(res.body)).not.toContain(a.site.name);
    expect((await as.operator.get(`/api/sites/${a.site.id}/contacts/changes`)).status).toBe(403);
    expect((await as.anon.get(`/api/sites/${a.site.id}/contacts/changes`)).status).toBe(401);
    const bad = await as.owner.get('/api/sites/not-a-site/contacts/changes');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('siteId');
  });
});
