import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Document } from '@server/models/Document';
import { Tenant } from '@server/models/Tenant';
import type { User } from '@server/models/User';
import { TenantFiles } from '@server/storage/tenant-files';
import { createTestApp, linkFromMail, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildClientUser, buildFirmWithSite, buildFloor, buildJob, buildPanel, buildSite, buildUser, buildZone, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let files: TenantFiles;
beforeAll(async () => {
  t = await createTestApp();
  files = new TenantFiles(t.tenantsDir);
});
afterAll(async () => {
  await t.close();
});

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

const PNG_1PX = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010806000000' + '1f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082', 'hex');

/** A client's site with a shared site document, an internal one, a completed job with a report, and a floor plan with pins. */
async function fixture() {
  const f = await buildFirmWithSite();
  const client = await buildClient(f.firm);
  const site = await buildSite(f.firm, client, { name: 'Wren Cottage' });
  const clientUser = await buildClientUser(f.firm, client);
  const sharedId = await files.save(f.firm.id, Buffer.from('%PDF-1.4 permit'), 'pdf');
  const internalId = await files.save(f.firm.id, Buffer.from('%PDF-1.4 internal'), 'pdf');
  const reportId = await files.save(f.firm.id, Buffer.from('%PDF-1.4 report'), 'pdf');
  const base = { tenantId: f.firm.id, siteId: site.id, contentType: 'application/pdf', sizeBytes: 15, uploadedById: null };
  const shared = await Document.create({ ...base, kind: 'permit', title: 'Alarm permit 2026', fileId: sharedId, sharedWithClient: true });
  const internal = await Document.create({ ...base, kind: 'contract', title: 'Internal contract copy', fileId: internalId, sharedWithClient: false });
  const job = await buildJob(site, { kind: 'inspection', state: 'completed', completedAt: new Date(Date.now() - 86_400_000) });
  const report = await Document.create({ ...base, kind: 'other', title: 'Completion report', fileId: reportId, sharedWithClient: true, jobId: job.id });
  await job.update({ reportFileId: reportId });
  const planId = await files.save(f.firm.id, PNG_1PX, 'png');
  const floor = await buildFloor(site, { name: 'Ground floor', planImageId: planId, planImageContentType: 'image/png' });
  const panel = await buildPanel(site);
  const pinned = await buildZone(panel, { number: 3, description: 'Kitchen window', serial: 'SN-PIN-5550001' });
  await pinned.update({ pinFloorId: floor.id, pinX: 0.25, pinY: 0.5 });
  await buildZone(panel, { number: 4, description: 'Unpinned door', serial: 'SN-PIN-5550002' });
  return { ...f, client, site, clientUser, shared, internal, report, job, floor };
}

describe('portal: shared documents', () => {
  it('lists only documents shared with the household, each with a portal download address', async () => {
    const f = await fixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}/documents`);
    expect(res.status).toBe(200);
    const titles = (res.body.data as { title: string }[]).map((d) => d.title).sort();
    expect(titles).toEqual(['Alarm permit 2026', 'Completion report']);
    const permit = (res.body.data as { id: string; kindLabel: string; fileUrl: string; visit: unknown }[]).find((d) => d.id === f.shared.id)!;
    expect(permit.fileUrl).toBe(`/api/portal/sites/${f.site.id}/documents/${f.shared.id}/file`);
    expect(permit.visit).toBeNull();
    expect(JSON.stringify(res.body)).not.toContain('Internal contract copy');
    expect(JSON.stringify(res.body)).not.toContain('fileId');
  });

  it('downloads a shared document; an internal one, another site’s or another firm’s is a 404', async () => {
    const f = await fixture();
    const other = await fixture();
    const v = await signedIn(f.clientUser);
    const ok = await v.get(`/api/portal/sites/${f.site.id}/documents/${f.shared.id}/file`);
    expect(ok.status).toBe(200);
    expect(ok.headers['content-type']).toContain('application/pdf');
    expect(Buffer.from(ok.body as Buffer).toString()).toContain('permit');
    expect((await v.get(`/api/portal/sites/${f.site.id}/documents/${f.internal.id}/file`)).status).toBe(404);
    expect((await v.get(`/api/portal/sites/${f.site.id}/documents/${other.shared.id}/file`)).status).toBe(404);
    expect((await v.get(`/api/portal/sites/${other.site.id}/documents/${other.shared.id}/file`)).status).toBe(404);
    expect((await v.get(`/api/portal/sites/${other.site.id}/documents`)).status).toBe(404);
  });

  it('a shared document whose file is gone from storage answers 404, not a server error', async () => {
    const f = await fixture();
    const lost = await Document.create({
      tenantId: f.firm.id, siteId: f.site.id, kind: 'permit', title: 'Lost permit', fileId: 'missing-file.pdf', contentType: 'application/pdf',
      sizeBytes: 10, sharedWithClient: true, uploadedById: null,
    });
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}/documents/${lost.id}/file`);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe('No such document file.');
  });

  it('the service history points the report at the portal download, which works for the client', async () => {
    const f = await fixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}/service`);
    const past = (res.body.data.past as { id: string; reportUrl: string | null }[]).find((p) => p.id === f.job.id)!;
    expect(past.reportUrl).toBe(`/api/portal/sites/${f.site.id}/documents/${f.report.id}/file`);
    const pdf = await v.get(past.reportUrl!);
    expect(pdf.status).toBe(200);
    expect(Buffer.from(pdf.body as Buffer).toString()).toContain('report');
  });

  it('staff cannot use the portal download routes (403)', async () => {
    const f = await fixture();
    const v = await signedIn(f.owner);
    expect((await v.get(`/api/portal/sites/${f.site.id}/documents/${f.shared.id}/file`)).status).toBe(403);
  });
});

describe('portal: floor plans and pins', () => {
  it('coverage carries each plan with the pinned devices in client terms', async () => {
    const f = await fixture();
    const v = await signedIn(f.clientUser);
    const res = await v.get(`/api/portal/sites/${f.site.id}/coverage`);
    expect(res.status).toBe(200);
    expect(res.body.data.plans).toEqual([
      {
        floorId: f.floor.id,
        imageUrl: expect.stringMatching(new RegExp(`^/api/portal/sites/${f.site.id}/floors/${f.floor.id}/plan\\?v=`)),
        pins: [{ zoneId: expect.any(String), number: 3, description: 'Kitchen window', kind: expect.any(String), x: 0.25, y: 0.5 }],
      },
    ]);
    expect(JSON.stringify(res.body)).not.toContain('SN-PIN-');
    const image = await v.get(res.body.data.plans[0].imageUrl);
    expect(image.status).toBe(200);
    expect(image.headers['content-type']).toBe('image/png');
  });

  it('another client cannot fetch the plan (404)', async () => {
    const f = await fixture();
    const stranger = await buildClientUser(f.firm, await buildClient(f.firm));
    const v = await signedIn(stranger);
    expect((await v.get(`/api/portal/sites/${f.site.id}/floors/${f.floor.id}/plan`)).status).toBe(404);
  });
});

describe('public portal address and branded e-mails', () => {
  it('a firm’s portal branding is public by short name; a suspended firm’s and an unknown one are 404', async () => {
    const f = await fixture();
    await f.firm.update({ accentColor: '#f5c518', monitoringCenterPhone: '+1 312 555 0142' });
    const anon = await visitor(t.app);
    const res = await anon.get(`/api/public/firms/${f.firm.shortName}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({
      name: f.firm.name,
      shortName: f.firm.shortName,
      accentColor: '#f5c518',
      accentColorReadable: expect.stringMatching(/^#[0-9a-f]{6}$/),
      logoUrl: null,
      phone: '',
      monitoringCenterPhone: '+1 312 555 0142',
    });
    expect(res.body.data.accentColorReadable).not.toBe('#f5c518'); // a pale yellow is darkened for white text
    expect((await anon.get('/api/public/firms/no-such-firm-here')).status).toBe(404);
    expect((await anon.get('/api/public/firms/Bad_Name!')).status).toBe(400);
    await f.firm.update({ state: 'suspended' });
    expect((await anon.get(`/api/public/firms/${f.firm.shortName}`)).status).toBe(404);
  });

  it('serves the logo publicly once uploaded', async () => {
    const f = await fixture();
    const logoId = await files.save(f.firm.id, PNG_1PX, 'png');
    await Tenant.update({ logoFileId: logoId, logoContentType: 'image/png' }, { where: { id: f.firm.id } });
    const anon = await visitor(t.app);
    const res = await anon.get(`/api/public/firms/${f.firm.shortName}`);
    expect(res.body.data.logoUrl).toMatch(new RegExp(`^/api/public/firms/${f.firm.shortName}/logo\\?v=`));
    const logo = await anon.get(res.body.data.logoUrl);
    expect(logo.status).toBe(200);
    expect(logo.headers['content-type']).toBe('image/png');
  });

  it('a client invitation opens the firm’s portal address and carries the firm’s name and logo', async () => {
    const f = await fixture();
    const logoId = await files.save(f.firm.id, PNG_1PX, 'png');
    await Tenant.update({ logoFileId: logoId, logoContentType: 'image/png' }, { where: { id: f.firm.id } });
    const client = await buildClient(f.firm);
    const v = await signedIn(f.coordinator);
    const email = `home-${Date.now()}@example.test`;
    expect((await v.post(`/api/clients/${client.id}/invitations`, { email })).status).toBe(201);
    const mail = t.outbox.filter((m) => m.to === email).at(-1)!;
    expect(mail.subject).toContain(f.firm.name);
    expect(mail.html).toContain('cid:firm-logo');
    expect(mail.attachments?.[0]).toMatchObject({ cid: 'firm-logo', contentType: 'image/png' });
    const link = linkFromMail(t.outbox, email, '/invitations/');
    expect(link).toMatch(new RegExp(`^/p/${f.firm.shortName}/invitations/[A-Za-z0-9_-]+$`));
    const anon = await visitor(t.app);
    const preview = await anon.get(`/api/invitations/${link.split('/').pop()!}`);
    expect(preview.status).toBe(200);
    expect(preview.body.data.firm).toMatchObject({ name: f.firm.name, shortName: f.firm.shortName, logoUrl: expect.stringContaining('/api/public/firms/') });
  });

  it('a staff invitation still opens the Mullion address', async () => {
    const f = await fixture();
    const v = await signedIn(f.owner);
    const email = `staff-${Date.now()}@example.test`;
    expect((await v.post('/api/staff/invitations', { email, role: 'technician' })).status).toBe(201);
    expect(linkFromMail(t.outbox, email, '/invitations/')).toMatch(/^\/invitations\//);
  });

  it('a client’s password reset link opens the firm’s portal; a staff member’s does not', async () => {
    const f = await fixture();
    const anon = await visitor(t.app);
    expect((await anon.post('/api/password-resets', { email: f.clientUser.email })).status).toBeLessThan(300);
    await t.flushMail();
    expect(linkFromMail(t.outbox, f.clientUser.email, '/reset-password/')).toMatch(new RegExp(`^/p/${f.firm.shortName}/reset-password/`));
    const staff = await buildUser(f.firm, 'technician');
    expect((await anon.post('/api/password-resets', { email: staff.email })).status).toBeLessThan(300);
    await t.flushMail();
    expect(linkFromMail(t.outbox, staff.email, '/reset-password/')).toMatch(/^\/reset-password\//);
  });

  it('a household’s reset e-mail carries its firm’s name, colour and logo, as its invitation does; a staff member’s is Mullion’s', async () => {
    const f = await fixture();
    const logoId = await files.save(f.firm.id, PNG_1PX, 'png');
    await Tenant.update({ logoFileId: logoId, logoContentType: 'image/png', accentColor: '#1f5f8b' }, { where: { id: f.firm.id } });
    const anon = await visitor(t.app);
    expect((await anon.post('/api/password-resets', { email: f.clientUser.email })).status).toBe(202);
    const staff = await buildUser(f.firm, 'coordinator');
    expect((await anon.post('/api/password-resets', { email: staff.email })).status).toBe(202);
    await t.flushMail();

    const household = t.outbox.filter((m) => m.to === f.clientUser.email).at(-1)!;
    expect(household.subject).toBe(`Reset your password for ${f.firm.name}'s client portal`);
    expect(household.text).toContain(`${f.firm.name}'s client portal`);
    expect(household.html).toContain(`background:#1f5f8b;`);
    expect(household.html).toContain('cid:firm-logo');
    expect(household.html).not.toContain('>Mullion</div>');
    expect(household.attachments?.[0]).toMatchObject({ cid: 'firm-logo', contentType: 'image/png' });

    const own = t.outbox.filter((m) => m.to === staff.email).at(-1)!;
    expect(own.subject).toBe('Reset your Mullion password');
    expect(own.html).toContain('>Mullion</div>');
    expect(own.attachments).toBeUndefined();
  });
});
