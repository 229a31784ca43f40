import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_CHECKLISTS } from '@domain/jobs';
import { createTestApp, visitor, type TestApp } from '../support/test-app';
import { buildFirmWithSite, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

async function as(email: string) {
  const v = await visitor(t.app);
  await v.signIn(email, TEST_PASSWORD);
  return v;
}

describe('GET|PUT /api/firm/checklists', () => {
  it('answers 401 signed out and 403 to the operator and a client', async () => {
    const { clientUser } = await buildFirmWithSite();
    const operator = await buildUser(null, 'operator');
    expect((await (await visitor(t.app)).get('/api/firm/checklists')).status).toBe(401);
    expect((await (await as(operator.email)).get('/api/firm/checklists')).status).toBe(403);
    expect((await (await as(clientUser.email)).get('/api/firm/checklists')).status).toBe(403);
  });

  it('starts from the defaults, which carry the mounting practice for installs', async () => {
    const { technician } = await buildFirmWithSite();
    const res = await (await as(technician.email)).get('/api/firm/checklists');
    expect(res.status).toBe(200);
    expect(res.body.data.checklists.install).toEqual(DEFAULT_CHECKLISTS.install);
  });

  it('lets the owner set a checklist that new jobs of that kind start from; others get 403', async () => {
    const { owner, coordinator, site } = await buildFirmWithSite();
    const mine = { inspection: ['Test the siren', 'Check the standby battery date'] };
    expect((await (await as(coordinator.email)).put('/api/firm/checklists', mine)).status).toBe(403);
    const ownerVisitor = await as(owner.email);
    const saved = await ownerVisitor.put('/api/firm/checklists', mine);
    expect(saved.status).toBe(200);
    expect(saved.body.data.checklists.inspection).toEqual(mine.inspection);
    expect(saved.body.data.checklists.install).toEqual(DEFAULT_CHECKLISTS.install);
    const job = await ownerVisitor.post('/api/jobs', { siteId: site.id, kind: 'inspection', summary: 'Yearly inspection' });
    expect(job.status).toBe(201);
    expect(job.body.data.checklist).toEqual([
      { label: 'Test the siren', done: false },
      { label: 'Check the standby battery date', done: false },
    ]);
  });

  it('answers 400 naming the item for an empty line or an unknown kind', async () => {
    const { owner } = await buildFirmWithSite();
    const v = await as(owner.email);
    const res = await v.put('/api/firm/checklists', { install: ['Fine', '  '] });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(['install.1']);
    expect((await v.put('/api/firm/checklists', { picnic: ['Bring sandwiches'] })).status).toBe(400);
  });
});
