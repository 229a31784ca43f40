import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TenantState } from '@domain/tenant-states';
import { AuditEvent } from '@server/models/AuditEvent';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirm, buildFirmWithStaff, buildUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;
let operator: User;
let op: Visitor;
beforeAll(async () => {
  t = await createTestApp();
  operator = await buildUser(null, 'operator', { name: 'Orla Operator' });
  op = await signedIn(operator);
});
afterAll(async () => {
  await t.close();
});

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

interface OperatorTenant {
  id: string;
  name: string;
  shortName: string;
  state: TenantState;
  staffCount: number;
  suspendedReason: string | null;
}
interface TenantList {
  data: OperatorTenant[];
  page: { number: number; size: number; total: number };
}

/** A word that appears in no other firm's name, for q searches. */
const marker = () => `Zq${crypto.randomUUID().slice(0, 8)}`;

describe('GET /api/operator/tenants', () => {
  it('lists firms with their state and staff seats in use', async () => {
    const m = marker();
    const a = await buildFirm({ name: `${m} Alpha Alarms`, state: 'active' });
    await Promise.all([buildUser(a, 'owner'), buildUser(a, 'coordinator'), buildUser(a, 'technician'), buildUser(a, 'technician')]);
    // not counted: a deactivated technician and a client
    await buildUser(a, 'technician', { deactivatedAt: new Date() });
    await buildUser(a, 'client');
    const b = await buildFirm({ name: `${m} Beta Security`, state: 'past_due' });
    await buildUser(b, 'owner');

    const res = await op.get(`/api/operator/tenants?q=${m}`);
    expect(res.status).toBe(200);
    const body = res.body as TenantList;
    expect(body.page).toEqual({ number: 1, size: 25, total: 2 });
    expect(body.data.map((x) => [x.name, x.state, x.staffCount])).toEqual([
      [`${m} Alpha Alarms`, 'active', 4],
      [`${m} Beta Security`, 'past_due', 1],
    ]);
    expect(body.data[0]).toMatchObject({ id: a.id, shortName: a.shortName, suspendedReason: null });
    // firm-level fields only: no people, no e-mail addresses
    expect(JSON.stringify(body)).not.toContain('@test.example');
  });

  it('pages with page and pageSize and sorts by name either way', async () => {
    const m = marker();
    for (const n of ['Cedar', 'Alder', 'Birch']) await buildFirm({ name: `${m} ${n}` });
    const p1 = (await op.get(`/api/operator/tenants?q=${m}&pageSize=2&page=1`)).body as TenantList;
    const p2 = (await op.get(`/api/operator/tenants?q=${m}&pageSize=2&page=2`)).body as TenantList;
    expect(p1.page).toEqual({ number: 1, size: 2, total: 3 });
    expect(p1.data.map((x) => x.name)).toEqual([`${m} Alder`, `${m} Birch`]);
    expect(p2.data.map((x) => x.name)).toEqual([`${m} Cedar`]);
    const desc = (await op.get(`/api/operator/tenants?q=${m}&sort=-name`)).body as TenantList;
    expect(desc.data.map((x) => x.name)).toEqual([`${m} Cedar`, `${m} Birch`, `${m} Alder`]);
  });

  it('lists every firm when no filter is given', async () => {
    const firms = await Tenant.count();
    const res = await op.get('/api/operator/tenants?pageSize=100');
    expect(res.status).toBe(200);
    expect((res.body as TenantList).page.total).toBe(firms);
  });

  it('searches the short name too', async () => {
    const firm = await buildFirm({ name: 'Plain Name Alarms' });
    const res = await op.get(`/api/operator/tenants?q=${firm.shortName}`);
    expect((res.body as TenantList).data.map((x) => x.id)).toEqual([firm.id]);
  });

  it('filters by state', async () => {
    const m = marker();
    const active = await buildFirm({ name: `${m} Active`, state: 'active' });
    const trialing = await buildFirm({ name: `${m} Trialing`, state: 'trialing' });
    const suspended = await buildFirm({ name: `${m} Suspended`, state: 'suspended' });
    const pick = async (state: string) =>
      ((await op.get(`/api/operator/tenants?q=${m}&state=${state}`)).body as TenantList).data.map((x) => x.id);
    expect(await pick('active')).toEqual([active.id]);
    expect(await pick('trialing')).toEqual([trialing.id]);
    expect(await pick('suspended')).toEqual([suspended.id]);
    expect(await pick('cancelled')).toEqual([]);
  });

  it('answers 400 naming the field for a bad sort or state', async () => {
    const badSort = await op.get('/api/operator/tenants?sort=revenue');
    expect(badSort.status).toBe(400);
    expect(badSort.body.error.code).toBe('validation_failed');
    expect(badSort.body.error.fields).toHaveProperty('sort');
    const weirdSort = await op.get('/api/operator/tenants?sort=name;drop');
    expect(weirdSort.status).toBe(400);
    expect(weirdSort.body.error.fields).toHaveProperty('sort');
    const badState = await op.get('/api/operator/tenants?state=deleted');
    expect(badState.status).toBe(400);
    expect(badState.body.error.fields).toHaveProperty('state');
  });

  it('answers 403 to owners, coordinators, technicians and clients, 401 when signed out', async () => {
    const { firm, owner, coordinator, technician } = await buildFirmWithStaff();
    const client = await buildUser(firm, 'client');
    for (const who of [owner, coordinator, technician, client]) {
      const v = await signedIn(who);
      const res = await v.get('/api/operator/tenants');
      expect(res.status, who.role).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      expect((await v.get(`/api/operator/tenants/${firm.id}`)).status).toBe(403);
    }
    const anon = await visitor(t.app);
    const res = await anon.get('/api/operator/tenants');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});

describe('GET /api/operator/tenants/:tenantId', () => {
  it('shows one firm with its owner and seats', async () => {
    const { firm, owner } = await buildFirmWithStaff({ state: 'active' });
    const res = await op.get(`/api/operator/tenants/${firm.id}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      id: firm.id,
      name: firm.name,
      state: 'active',
      staffCount: 3,
      owner: { name: owner.name, email: owner.email },
      actions: [],
    });
  });

  it('answers 404 for an unknown id and 400 for a malformed one', async () => {
    const unknown = await op.get('/api/operator/tenants/00000000-0000-4000-8000-000000000000');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
    const malformed = await op.get('/api/operator/tenants/not-a-uuid');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toHaveProperty('tenantId');
  });
});

describe('POST /api/operator/tenants/:tenantId/suspend and /restore', () => {
  it('suspends: sign-in refused, open sessions refused on their next request, nothing deleted; restore undoes it', async () => {
    const { firm, owner, coordinator, technician } = await buildFirmWithStaff({ state: 'active' });
    const openOwner = await signedIn(owner);
    const openTech = await signedIn(technician);
    expect((await openOwner.get('/api/staff')).status).toBe(200);

    const res = await op.post(`/api/operator/tenants/${firm.id}/suspend`, { reason: 'Unpaid invoices since March' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: firm.id, state: 'suspended', suspendedReason: 'Unpaid invoices since March', staffCount: 3 });
    expect(res.body.data.suspendedAt).not.toBeNull();

    // an open session is refused on its next request, with the reason
    const ownerNext = await openOwner.get('/api/staff');
    expect(ownerNext.status).toBe(403);
    expect(ownerNext.body.error.code).toBe('firm_suspended');
    const techNext = await openTech.get('/api/session');
    expect(techNext.status).toBe(403);
    expect(techNext.body.error.code).toBe('firm_suspended');

    // nobody of the firm can sign in
    for (const who of [owner, coordinator, technician]) {
      const v = await visitor(t.app);
      const signIn = await v.post('/api/session', { email: who.email, password: TEST_PASSWORD });
      expect(signIn.status).toBe(403);
      expect(signIn.body.error.code).toBe('firm_suspended');
    }

    // its data stays
    expect(await User.count({ where: { tenantId: firm.id } })).toBe(3);
    expect(await Tenant.count({ where: { id: firm.id } })).toBe(1);

    // the operator's own session is unaffected
    expect((await op.get(`/api/operator/tenants/${firm.id}`)).body.data.state).toBe('suspended');

    const restored = await op.post(`/api/operator/tenants/${firm.id}/restore`, { reason: 'Paid in full' });
    expect(restored.status).toBe(200);
    expect(restored.body.data).toMatchObject({ state: 'active', suspendedAt: null, suspendedReason: null });
    const again = await visitor(t.app);
    expect((await again.signIn(owner.email, TEST_PASSWORD)).status).toBe(200);
    expect((await again.get('/api/staff')).status).toBe(200);
    expect((await again.get('/api/firm')).body.data.state).toBe('active');
  });

  it('restore returns the firm to the state it had before the suspension', async () => {
    for (const state of ['trialing', 'past_due', 'cancelled'] as const) {
      const firm = await buildFirm({ state });
      await op.post(`/api/operator/tenants/${firm.id}/suspend`, { reason: 'Checking the account' }).expect(200);
      const res = await op.post(`/api/operator/tenants/${firm.id}/restore`, { reason: 'Checked' });
      expect(res.status).toBe(200);
      expect(res.body.data.state).toBe(state);
      expect((await Tenant.findOne({ where: { id: firm.id } }))!.state).toBe(state);
    }
  });

  it('writes both actions as audit events with the reason, shown on the firm', async () => {
    const { firm } = await buildFirmWithStaff();
    await op.post(`/api/operator/tenants/${firm.id}/suspend`, { reason: 'Reported abuse, checking' }).expect(200);
    await op.post(`/api/operator/tenants/${firm.id}/restore`, { reason: 'Report was mistaken' }).expect(200);

    const events = await AuditEvent.findAll({ where: { tenantId: firm.id }, order: [['createdAt', 'ASC']] });
    const byAction = new Map(events.map((e) => [e.action, e]));
    const suspended = byAction.get('firm.suspended');
    const restored = byAction.get('firm.restored');
    expect(suspended).toBeDefined();
    expect(restored).toBeDefined();
    expect(suspended).toMatchObject({ actorId: operator.id, actorRole: 'operator', subjectType: 'Tenant', subjectId: firm.id });
    expect(suspended!.details).toMatchObject({ reason: 'Reported abuse, checking', state: 'suspended' });
    expect(restored).toMatchObject({ actorId: operator.id, actorRole: 'operator', subjectId: firm.id });
    expect(restored!.details).toMatchObject({ reason: 'Report was mistaken', state: 'trialing' });

    const detail = await op.get(`/api/operator/tenants/${firm.id}`);
    const actions = detail.body.data.actions as { action: string; reason: string; by: string }[];
    expect(actions.map((a) => [a.action, a.reason, a.by]).sort()).toEqual([
      ['firm.restored', 'Report was mistaken', 'Orla Operator'],
      ['firm.suspended', 'Reported abuse, checking', 'Orla Operator'],
    ]);
  });

  it('answers 409 to suspending a suspended firm or restoring one that is not suspended', async () => {
    const firm = await buildFirm({ state: 'active' });
    const notSuspended = await op.post(`/api/operator/tenants/${firm.id}/restore`, { reason: 'Nothing to restore' });
    expect(notSuspended.status).toBe(409);
    await op.post(`/api/operator/tenants/${firm.id}/suspend`, { reason: 'First time' }).expect(200);
    const twice = await op.post(`/api/operator/tenants/${firm.id}/suspend`, { reason: 'Second time' });
    expect(twice.status).toBe(409);
    const stored = await Tenant.findOne({ where: { id: firm.id } });
    expect(stored!.suspendedReason).toBe('First time');
    expect(stored!.stateBeforeSuspension).toBe('active');
  });

  it('answers 400 naming reason when it is missing or too short, and changes nothing', async () => {
    const firm = await buildFirm({ state: 'active' });
    for (const body of [{}, { reason: '' }, { reason: '  x ' }, { reason: 42 }]) {
      const res = await op.post(`/api/operator/tenants/${firm.id}/suspend`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(Object.keys(res.body.error.fields)).toEqual(['reason']);
    }
    const long = await op.post(`/api/operator/tenants/${firm.id}/suspend`, { reason: 'x'.repeat(501) });
    expect(long.status).toBe(400);
    expect((await Tenant.findOne({ where: { id: firm.id } }))!.state).toBe('active');
    expect(await AuditEvent.count({ where: { tenantId: firm.id } })).toBe(0);
  });

  it('answers 404 for an unknown firm', async () => {
    const res = await op.post('/api/operator/tenants/00000000-0000-4000-8000-000000000000/suspend', { reason: 'No such firm' });
    expect(res.status).toBe(404);
  });

  it('refuses firm-role users (403) and signed-out visitors (401)', async () => {
    const { firm, owner, coordinator, technician } = await buildFirmWithStaff({ state: 'active' });
    const other = await buildFirm({ state: 'active' });
    for (const who of [owner, coordinator, technician]) {
      const v = await signedIn(who);
      for (const id of [firm.id, other.id]) {
        const res = await v.post(`/api/operator/tenants/${id}/suspend`, { reason: 'Trying it on' });
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
    }
    const anon = await visitor(t.app);
    expect((await anon.post(`/api/operator/tenants/${other.id}/suspend`, { reason: 'Trying it on' })).status).toBe(401);
    expect((await Tenant.findOne({ where: { id: firm.id } }))!.state).toBe('active');
    expect((await Tenant.findOne({ where: { id: other.id } }))!.state).toBe('active');
  });
});

describe('the operator and firm routes', () => {
  it('never reads a firm’s routes: 403 on staff, invitations and firm', async () => {
    for (const url of ['/api/staff', '/api/staff/invitations', '/api/firm', '/api/firm/logo']) {
      const res = await op.get(url);
      expect(res.status, url).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });

  it('has a session without a firm, and rules limited to the console', async () => {
    const res = await op.get('/api/session');
    expect(res.body.user).toMatchObject({ id: operator.id, role: 'operator', tenantId: null });
    expect(res.body.tenant).toBeNull();
    const subjects = new Set((res.body.rules as { subject: string }[]).map((r) => r.subject));
    expect([...subjects].sort()).toEqual(['AuditEvent', 'OperatorConsole', 'Tenant']);
  });
});
