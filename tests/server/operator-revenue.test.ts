import crypto from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TenantState } from '@domain/tenant-states';
import { Invitation } from '@server/models/Invitation';
import { Site } from '@server/models/Site';
import { SubscriptionChange } from '@server/models/SubscriptionChange';
import type { Tenant } from '@server/models/Tenant';
import type { User } from '@server/models/User';
import { countActiveSites, countStaffSeats, usageOf } from '@server/services/plan-usage';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildClientUser, buildFirm, buildFirmWithStaff, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

// Mid-June 2026, noon UTC: the operator's months are UTC calendar months.
const NOW = new Date('2026-06-15T12:00:00.000Z');
const HOUR = 60 * 60 * 1000;
const DAY = 24 * HOUR;

let t: TestApp;
let op: Visitor;
let roleFirm: Awaited<ReturnType<typeof buildFirmWithStaff>>;
let roleFirmClient: User;
const firms: Record<string, Tenant> = {};
let usageFirm: Tenant;

interface Revenue {
  mrrCents: number;
  activeSubscriptions: number;
  firmsByState: Record<TenantState, number>;
  trialsEndingThisWeek: { id: string; name: string; trialEndsAt: string }[];
  series: { month: string; label: string; mrrCents: number }[];
}

async function firm(name: string, state: TenantState, extra: { planKey?: string | null; trialEndsAt?: Date | null } = {}): Promise<Tenant> {
  const tenant = await buildFirm({ name, state });
  await tenant.update({ planKey: extra.planKey ?? null, trialEndsAt: extra.trialEndsAt ?? null });
  return tenant;
}

async function change(tenant: Tenant, from: string, state: TenantState, planKey: string | null, monthlyAmountCents: number) {
  await SubscriptionChange.create({ tenantId: tenant.id, from: new Date(from), state, planKey, monthlyAmountCents, stripeEventId: null });
}

async function invite(
  tenant: Tenant,
  role: 'coordinator' | 'technician' | 'client',
  state: Partial<{ acceptedAt: Date; revokedAt: Date; expiresAt: Date }> = {},
) {
  await Invitation.create({
    tenantId: tenant.id,
    email: `invited-${crypto.randomUUID().slice(0, 8)}@test.example`,
    role,
    tokenHash: crypto.randomBytes(32).toString('hex'),
    invitedById: null,
    expiresAt: state.expiresAt ?? new Date(NOW.getTime() + 3 * DAY),
    acceptedAt: state.acceptedAt ?? null,
    revokedAt: state.revokedAt ?? null,
  });
}

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

beforeAll(async () => {
  t = await createTestApp();
  t.clock.now = NOW;
  op = await signedIn(await buildUser(null, 'operator'));

  // Every firm in this database is made here, so the service-wide counts are known.
  firms.aldermoor = await firm('Aldermoor Alarms', 'active', { planKey: 'fleet' });
  firms.brackenfield = await firm('Brackenfield Security', 'past_due', { planKey: 'bench' });
  firms.cinderford = await firm('Cinderford Locks', 'cancelled', { planKey: 'crew' });
  firms.dunmere = await firm('Dunmere Systems', 'trialing', { trialEndsAt: new Date(NOW.getTime() + 3 * DAY) });
  firms.eastwick = await firm('Eastwick Watch', 'trialing', { trialEndsAt: new Date(NOW.getTime() + 7 * DAY) });
  firms.fallowby = await firm('Fallowby Alarm Co', 'trialing', { trialEndsAt: new Date(NOW.getTime() + 8 * DAY) });
  firms.gorsey = await firm('Gorsey Hill Alarms', 'trialing', { trialEndsAt: new Date(NOW.getTime() - HOUR) });
  firms.harrowgate = await firm('Harrowgate Guard', 'suspended', { planKey: 'bench' });
  roleFirm = await buildFirmWithStaff({ state: 'active' });
  roleFirmClient = await buildClientUser(roleFirm.firm, await buildClient(roleFirm.firm));
  usageFirm = await firm('Ivybridge Alarms', 'active', { planKey: 'crew' });

  // Subscription history, stored out of time order on purpose.
  await change(firms.aldermoor, '2026-05-20T09:00:00Z', 'active', 'fleet', 39900);
  await change(firms.aldermoor, '2026-01-10T09:00:00Z', 'trialing', null, 0);
  await change(firms.aldermoor, '2026-02-05T09:00:00Z', 'active', 'crew', 14900);
  await change(firms.aldermoor, '2026-06-20T09:00:00Z', 'cancelled', 'fleet', 0); // after now: not yet in effect
  await change(firms.brackenfield, '2025-09-01T09:00:00Z', 'active', 'bench', 4900);
  await change(firms.brackenfield, '2026-06-01T09:00:00Z', 'past_due', 'bench', 4900);
  await change(firms.cinderford, '2025-08-15T09:00:00Z', 'active', 'crew', 14900);
  await change(firms.cinderford, '2026-03-10T09:00:00Z', 'cancelled', 'crew', 0);
  await change(firms.dunmere, '2026-06-04T09:00:00Z', 'trialing', null, 0);
  await change(firms.harrowgate, '2025-11-01T09:00:00Z', 'active', 'bench', 4900);
  await change(firms.harrowgate, '2026-04-01T09:00:00Z', 'suspended', 'bench', 4900);

  // Ivybridge's usage: sites of active clients count, a cancelled client's do not.
  const marlowe = await buildClient(usageFirm, { name: 'Marlowe household' });
  const penrose = await buildClient(usageFirm, { name: 'Penrose household' });
  const quill = await buildClient(usageFirm, { name: 'Quill household', status: 'cancelled' });
  await buildSite(usageFirm, marlowe, { name: '3 Brook Row' });
  await buildSite(usageFirm, marlowe, { name: 'Marlowe workshop' });
  await buildSite(usageFirm, penrose, { name: '7 Vetch Lane' });
  await buildSite(usageFirm, quill, { name: '12 Tansy Close' });
  // Staff: three working, one deactivated; a client's sign-in never takes a seat.
  await buildUser(usageFirm, 'owner');
  await buildUser(usageFirm, 'coordinator');
  await buildUser(usageFirm, 'technician');
  await buildUser(usageFirm, 'technician', { deactivatedAt: new Date(NOW.getTime() - 30 * DAY) });
  await buildClientUser(usageFirm, marlowe);
  // Invitations: only the pending staff one holds a seat.
  await invite(usageFirm, 'coordinator');
  await invite(usageFirm, 'technician', { acceptedAt: new Date(NOW.getTime() - DAY) });
  await invite(usageFirm, 'technician', { revokedAt: new Date(NOW.getTime() - DAY) });
  await invite(usageFirm, 'technician', { expiresAt: new Date(NOW.getTime() - HOUR) });
  await invite(usageFirm, 'client');

  // Another firm's sites, staff and invitations, which must never count for Ivybridge.
  const other = await buildClient(firms.aldermoor, { name: 'Rookwood household' });
  await buildSite(firms.aldermoor, other, { name: '1 Rookwood Lane' });
  await buildSite(firms.aldermoor, other, { name: '2 Rookwood Lane' });
  await buildUser(firms.aldermoor, 'owner');
  await invite(firms.aldermoor, 'technician');
});

afterAll(async () => {
  await t.close();
});

describe('GET /api/operator/revenue', () => {
  it('answers the numbers of a worked example', async () => {
    /*
     * Worked example computed by hand, now = 2026-06-15 12:00 UTC.
     *
     * In effect now (the latest change on or before now, per firm):
     *   Aldermoor     2026-05-20 active Fleet   $399  (the 2026-06-20 change is still ahead)
     *   Brackenfield  2026-06-01 past due Bench $49   (past due still counts)
     *   Cinderford    2026-03-10 cancelled      —
     *   Dunmere       2026-06-04 trialing       —
     *   Harrowgate    2026-04-01 suspended      —
     *   MRR = 39,900 + 4,900 = 44,800 cents; subscriptions counted = 2.
     *
     * Month ends (UTC), Jul 2025 … Jun 2026 (June measured now):
     *   Jul 2025       0
     *   Aug 2025  14,900  Cinderford from Aug 15
     *   Sep 2025  19,800  + Brackenfield
     *   Oct 2025  19,800
     *   Nov 2025  24,700  + Harrowgate
     *   Dec 2025  24,700
     *   Jan 2026  24,700  Aldermoor on trial pays nothing
     *   Feb 2026  39,600  + Aldermoor Crew 14,900
     *   Mar 2026  24,700  − Cinderford (cancelled)
     *   Apr 2026  19,800  − Harrowgate (suspended)
     *   May 2026  44,800  Aldermoor moves to Fleet: 39,900 + 4,900
     *   Jun 2026  44,800
     *
     * Firms by state: trialing 4 (Dunmere, Eastwick, Fallowby, Gorsey Hill); active 3
     * (Aldermoor, Ivybridge, the firm with staff); past due 1; suspended 1; cancelled 1.
     * Trials ending within 7 days: Dunmere (+3 days), Eastwick (+7 days exactly, included);
     * not Fallowby (+8 days) nor Gorsey Hill (ended an hour ago).
     */
    const res = await op.get('/api/operator/revenue');
    expect(res.status).toBe(200);
    const body = (res.body as { data: Revenue }).data;
    expect(body.mrrCents).toBe(44_800);
    expect(body.activeSubscriptions).toBe(2);
    expect(body.firmsByState).toEqual({ trialing: 4, active: 3, past_due: 1, suspended: 1, cancelled: 1 });
    expect(body.trialsEndingThisWeek).toEqual([
      { id: firms.dunmere!.id, name: 'Dunmere Systems', trialEndsAt: '2026-06-18T12:00:00.000Z' },
      { id: firms.eastwick!.id, name: 'Eastwick Watch', trialEndsAt: '2026-06-22T12:00:00.000Z' },
    ]);
    expect(body.series.map((p) => [p.month, p.label, p.mrrCents])).toEqual([
      ['2025-07', 'Jul 2025', 0],
      ['2025-08', 'Aug 2025', 14_900],
      ['2025-09', 'Sep 2025', 19_800],
      ['2025-10', 'Oct 2025', 19_800],
      ['2025-11', 'Nov 2025', 24_700],
      ['2025-12', 'Dec 2025', 24_700],
      ['2026-01', 'Jan 2026', 24_700],
      ['2026-02', 'Feb 2026', 39_600],
      ['2026-03', 'Mar 2026', 24_700],
      ['2026-04', 'Apr 2026', 19_800],
      ['2026-05', 'May 2026', 44_800],
      ['2026-06', 'Jun 2026', 44_800],
    ]);
  });

  it('moves with the clock: once the future change takes effect, MRR drops', async () => {
    t.clock.now = new Date('2026-06-21T00:00:00.000Z');
    try {
      const body = ((await op.get('/api/operator/revenue')).body as { data: Revenue }).data;
      // Aldermoor cancelled on 2026-06-20: only Brackenfield's 4,900 remains
      expect(body.mrrCents).toBe(4_900);
      expect(body.activeSubscriptions).toBe(1);
      // Dunmere's trial ended on the 18th; Eastwick (22nd) and Fallowby (23rd) end within 7 days
      expect(body.trialsEndingThisWeek.map((f) => f.name)).toEqual(['Eastwick Watch', 'Fallowby Alarm Co']);
    } finally {
      t.clock.now = NOW;
    }
  });

  it('answers 403 to owners, coordinators, technicians and clients, 401 when signed out', async () => {
    for (const user of [roleFirm.owner, roleFirm.coordinator, roleFirm.technician, roleFirmClient]) {
      const v = await signedIn(user);
      const res = await v.get('/api/operator/revenue');
      expect(res.status, user.role).toBe(403);
      expect(JSON.stringify(res.body)).not.toContain('mrrCents');
    }
    const anonymous = await visitor(t.app);
    expect((await anonymous.get('/api/operator/revenue')).status).toBe(401);
  });
});

interface Billing {
  planKey: string | null;
  planName: string | null;
  monthlyPriceCents: number | null;
  usage: { activeSites: number; staffSeats: number };
  limits: { activeSites: number; staffSeats: number; onTrial: boolean };
}

describe('GET /api/operator/tenants/:tenantId billing', () => {
  it('shows the plan and usage against its limits', async () => {
    /*
     * Ivybridge (Crew: 400 sites, 10 seats, $149):
     *   active sites = Marlowe 2 + Penrose 1 = 3 (Quill is cancelled: its site does not count;
     *   Aldermoor's two sites are another firm's)
     *   staff seats = owner + coordinator + technician = 3 (the deactivated technician and the
     *   client sign-in do not count) + 1 pending coordinator invitation (accepted, revoked,
     *   expired and client invitations do not count) = 4
     */
    const res = await op.get(`/api/operator/tenants/${usageFirm.id}`);
    expect(res.status).toBe(200);
    expect((res.body as { data: { billing: Billing } }).data.billing).toEqual({
      planKey: 'crew',
      planName: 'Crew',
      monthlyPriceCents: 14_900,
      usage: { activeSites: 3, staffSeats: 4 },
      limits: { activeSites: 400, staffSeats: 10, onTrial: false },
    });
  });

  it('counts each firm on its own', async () => {
    // Aldermoor: two sites, one owner and one pending technician invitation
    const res = await op.get(`/api/operator/tenants/${firms.aldermoor!.id}`);
    expect((res.body as { data: { billing: Billing } }).data.billing).toMatchObject({
      planKey: 'fleet',
      planName: 'Fleet',
      usage: { activeSites: 2, staffSeats: 2 },
      limits: { activeSites: 2000, staffSeats: 40, onTrial: false },
    });
  });

  it('gives a firm on trial without a plan the trial limits', async () => {
    const res = await op.get(`/api/operator/tenants/${firms.dunmere!.id}`);
    expect((res.body as { data: { billing: Billing } }).data.billing).toEqual({
      planKey: null,
      planName: null,
      monthlyPriceCents: null,
      usage: { activeSites: 0, staffSeats: 0 },
      limits: { activeSites: 2000, staffSeats: 40, onTrial: true },
    });
  });
});

describe('plan usage counts', () => {
  it('count inside the caller’s transaction', async () => {
    const marlowe = await buildClient(usageFirm, { name: 'Marlowe annex' });
    const rolledBack = new Error('roll back');
    await expect(
      t.sequelize.transaction(async (transaction) => {
        await Site.create(
          {
            tenantId: usageFirm.id,
            clientId: marlowe.id,
            name: 'Annex',
            addressLine1: '3 Brook Row',
            city: 'Ashby Vale',
            timeZone: 'America/Chicago',
          },
          { transaction },
        );
        expect(await countActiveSites(usageFirm.id, transaction)).toBe(4);
        expect(await usageOf(usageFirm.id, NOW, transaction)).toEqual({ activeSites: 4, staffSeats: 4 });
        throw rolledBack;
      }),
    ).rejects.toBe(rolledBack);
    expect(await countActiveSites(usageFirm.id)).toBe(3);
  });

  it('an invitation stops holding a seat the moment it expires', async () => {
    // the pending coordinator invitation expires three days after now
    expect(await countStaffSeats(usageFirm.id, new Date(NOW.getTime() + 3 * DAY - 1))).toBe(4);
    expect(await countStaffSeats(usageFirm.id, new Date(NOW.getTime() + 3 * DAY))).toBe(3);
  });
});
