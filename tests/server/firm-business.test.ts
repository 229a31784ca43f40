import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Client } from '@server/models/Client';
import type { Tenant } from '@server/models/Tenant';
import type { User } from '@server/models/User';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildClient, buildClientUser, buildFirmWithStaff, buildSite, buildUser, TEST_PASSWORD } from '../support/factories';

// 03:00 UTC on 1 June 2026 is still 22:00 on 31 May in Chicago (CDT, UTC−5): the firm's today.
const NOW = new Date('2026-06-01T03:00:00.000Z');

let t: TestApp;
let staff: Awaited<ReturnType<typeof buildFirmWithStaff>>;
let clientUser: User;
let marlowe: Client;
let penrose: Client;
const siteIds: Record<string, string> = {};

interface Contract {
  startsOn?: string;
  termMonths?: number;
  feeCents?: number;
  cancelledOn?: string;
}

async function siteWithContract(tenant: Tenant, client: Client, name: string, contract: Contract): Promise<string> {
  const site = await buildSite(tenant, client, { name });
  await site.update({
    contractStartsOn: contract.startsOn ?? null,
    contractTermMonths: contract.termMonths ?? null,
    contractMonthlyFeeCents: contract.feeCents ?? null,
    contractCancelledOn: contract.cancelledOn ?? null,
  });
  return site.id;
}

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  expect((await v.signIn(user.email, TEST_PASSWORD)).status).toBe(200);
  return v;
}

interface Business {
  today: string;
  rmrCents: number;
  activeContracts: number;
  newContracts12m: number;
  cancelledContracts12m: number;
  attrition: {
    periodStart: string;
    periodEnd: string;
    cancelled: number;
    activeAtStart: number;
    activeAtEnd: number;
    averageActive: number;
    rate: number | null;
  };
  renewals: { siteId: string; siteName: string; clientId: string; clientName: string; renewsOn: string; monthlyFeeCents: number | null }[];
  series: { month: string; label: string; rmrCents: number; activeContracts: number }[];
}

beforeAll(async () => {
  t = await createTestApp();
  t.clock.now = NOW;
  staff = await buildFirmWithStaff({ state: 'active' });
  await staff.firm.update({ timeZone: 'America/Chicago' });
  marlowe = await buildClient(staff.firm, { name: 'Marlowe household' });
  penrose = await buildClient(staff.firm, { name: 'Penrose household' });
  clientUser = await buildClientUser(staff.firm, marlowe);

  const f = staff.firm;
  siteIds.alder = await siteWithContract(f, marlowe, 'Alder Cottage', { startsOn: '2024-03-10', termMonths: 12, feeCents: 3500 });
  siteIds.beacon = await siteWithContract(f, marlowe, 'Beacon House', { startsOn: '2025-08-20', termMonths: 12, feeCents: 4200 });
  siteIds.copse = await siteWithContract(f, marlowe, 'Copse End', {
    startsOn: '2023-06-15',
    termMonths: 36,
    feeCents: 2900,
    cancelledOn: '2026-02-01',
  });
  siteIds.dovecote = await siteWithContract(f, marlowe, 'Dovecote Barn', { startsOn: '2025-06-30', termMonths: 12, feeCents: 5000 });
  siteIds.elm = await siteWithContract(f, marlowe, 'Elm Lodge', { startsOn: '2025-05-31', termMonths: 24, feeCents: 3000 });
  siteIds.fern = await siteWithContract(f, penrose, 'Fern Row', {
    startsOn: '2025-01-01',
    termMonths: 12,
    feeCents: 2500,
    cancelledOn: '2025-05-31',
  });
  siteIds.glebe = await siteWithContract(f, penrose, 'Glebe Farm', { startsOn: '2026-06-10', termMonths: 12, feeCents: 9900 });
  siteIds.hollins = await siteWithContract(f, penrose, 'Hollins Mill', {});
  siteIds.ivy = await siteWithContract(f, penrose, 'Ivy Court', {
    startsOn: '2025-09-01',
    termMonths: 12,
    feeCents: 3300,
    cancelledOn: '2026-05-31',
  });
  siteIds.juniper = await siteWithContract(f, penrose, 'Juniper Lane', { startsOn: '2024-08-29', termMonths: 24, feeCents: 4000 });
  siteIds.kestrel = await siteWithContract(f, penrose, 'Kestrel View', {
    startsOn: '2025-07-15',
    termMonths: 12,
    feeCents: 2000,
    cancelledOn: '2026-07-15',
  });

  // Another firm with a large book and renewals due soon: none of it may show up.
  const other = await buildFirmWithStaff({ state: 'active' });
  const rook = await buildClient(other.firm, { name: 'Rookwood household' });
  await siteWithContract(other.firm, rook, 'Rookwood Hall', { startsOn: '2025-06-15', termMonths: 12, feeCents: 99_900 });
  await siteWithContract(other.firm, rook, 'Rookwood Lodge', { startsOn: '2025-03-01', termMonths: 12, feeCents: 88_800, cancelledOn: '2026-01-01' });
});

afterAll(async () => {
  await t.close();
});

describe('GET /api/firm/business', () => {
  it('answers the numbers of a worked example, in the firm’s calendar', async () => {
    /*
     * Worked example computed by hand. Today = 2026-05-31 (Chicago), so the 12-month period is
     * after 2025-05-31 up to and including 2026-05-31; renewals up to 2026-08-29 (today + 90).
     *
     *   site            starts      term  fee    cancelled   in force today
     *   Alder Cottage   2024-03-10  12    3,500  —           yes
     *   Beacon House    2025-08-20  12    4,200  —           yes   new
     *   Copse End       2023-06-15  36    2,900  2026-02-01  no    cancelled in period
     *   Dovecote Barn   2025-06-30  12    5,000  —           yes   new
     *   Elm Lodge       2025-05-31  24    3,000  —           yes   (starts on the period start: not new)
     *   Fern Row        2025-01-01  12    2,500  2025-05-31  no    (gone on the period start: not counted)
     *   Glebe Farm      2026-06-10  12    9,900  —           no    (starts after today)
     *   Hollins Mill    no contract                          no
     *   Ivy Court       2025-09-01  12    3,300  2026-05-31  no    new, cancelled in period (today)
     *   Juniper Lane    2024-08-29  24    4,000  —           yes
     *   Kestrel View    2025-07-15  12    2,000  2026-07-15  yes   new
     *
     * RMR = 3,500 + 4,200 + 5,000 + 3,000 + 4,000 + 2,000 = 21,700; 6 contracts in force.
     * New in the period: Beacon, Dovecote, Ivy, Kestrel = 4. Cancelled: Copse, Ivy = 2.
     * In force on 2025-05-31: Alder, Copse, Elm, Juniper = 4; today: 6; average 5;
     * attrition = 2 ÷ 5 = 0.4.
     * Renewals: Dovecote 2026-06-30, Beacon 2026-08-20, Juniper 2026-08-29 (the 90th day,
     * included); Kestrel ends on its renewal day, so it does not renew; Alder 2027-03-10 and
     * Elm 2027-05-31 are too far.
     * RMR at month ends: Jun 2025 Alder+Copse+Dovecote+Elm+Juniper = 18,400 (5); Jul + Kestrel
     * 20,400 (6); Aug + Beacon 24,600 (7); Sep + Ivy 27,900 (8) until Jan 2026; Feb − Copse
     * 25,000 (7) until Apr; May − Ivy 21,700 (6).
     */
    const owner = await signedIn(staff.owner);
    const res = await owner.get('/api/firm/business');
    expect(res.status).toBe(200);
    const body = (res.body as { data: Business }).data;
    expect(body.today).toBe('2026-05-31');
    expect(body.rmrCents).toBe(21_700);
    expect(body.activeContracts).toBe(6);
    expect(body.newContracts12m).toBe(4);
    expect(body.cancelledContracts12m).toBe(2);
    expect(body.attrition).toEqual({
      periodStart: '2025-05-31',
      periodEnd: '2026-05-31',
      cancelled: 2,
      activeAtStart: 4,
      activeAtEnd: 6,
      averageActive: 5,
      rate: 0.4,
    });
    expect(body.renewals).toEqual([
      {
        siteId: siteIds.dovecote,
        siteName: 'Dovecote Barn',
        clientId: marlowe.id,
        clientName: 'Marlowe household',
        renewsOn: '2026-06-30',
        monthlyFeeCents: 5000,
      },
      {
        siteId: siteIds.beacon,
        siteName: 'Beacon House',
        clientId: marlowe.id,
        clientName: 'Marlowe household',
        renewsOn: '2026-08-20',
        monthlyFeeCents: 4200,
      },
      {
        siteId: siteIds.juniper,
        siteName: 'Juniper Lane',
        clientId: penrose.id,
        clientName: 'Penrose household',
        renewsOn: '2026-08-29',
        monthlyFeeCents: 4000,
      },
    ]);
    expect(body.series).toEqual([
      { month: '2025-06', label: 'Jun 2025', rmrCents: 18_400, activeContracts: 5 },
      { month: '2025-07', label: 'Jul 2025', rmrCents: 20_400, activeContracts: 6 },
      { month: '2025-08', label: 'Aug 2025', rmrCents: 24_600, activeContracts: 7 },
      { month: '2025-09', label: 'Sep 2025', rmrCents: 27_900, activeContracts: 8 },
      { month: '2025-10', label: 'Oct 2025', rmrCents: 27_900, activeContracts: 8 },
      { month: '2025-11', label: 'Nov 2025', rmrCents: 27_900, activeContracts: 8 },
      { month: '2025-12', label: 'Dec 2025', rmrCents: 27_900, activeContracts: 8 },
      { month: '2026-01', label: 'Jan 2026', rmrCents: 27_900, activeContracts: 8 },
      { month: '2026-02', label: 'Feb 2026', rmrCents: 25_000, activeContracts: 7 },
      { month: '2026-03', label: 'Mar 2026', rmrCents: 25_000, activeContracts: 7 },
      { month: '2026-04', label: 'Apr 2026', rmrCents: 25_000, activeContracts: 7 },
      { month: '2026-05', label: 'May 2026', rmrCents: 21_700, activeContracts: 6 },
    ]);
    // nothing of the other firm
    expect(JSON.stringify(body)).not.toContain('Rookwood');
  });

  it('turns the day in the firm’s time zone, not in UTC', async () => {
    // 05:00 UTC on 1 June is midnight in Chicago: June has begun for the firm
    t.clock.now = new Date('2026-06-01T05:00:00.000Z');
    try {
      const owner = await signedIn(staff.owner);
      const body = ((await owner.get('/api/firm/business')).body as { data: Business }).data;
      expect(body.today).toBe('2026-06-01');
      expect(body.series.at(-1)).toMatchObject({ month: '2026-06', rmrCents: 21_700 });
      expect(body.series[0]).toMatchObject({ month: '2025-07' });
      // the period is now after 2025-06-01: Elm Lodge (2025-05-31) was in force at its start
      expect(body.attrition).toMatchObject({ periodStart: '2025-06-01', activeAtStart: 4, cancelled: 2 });
    } finally {
      t.clock.now = NOW;
    }
  });

  it('answers 403 to coordinators, technicians, clients and the operator, 401 when signed out', async () => {
    const operator = await buildUser(null, 'operator');
    for (const user of [staff.coordinator, staff.technician, clientUser, operator]) {
      const v = await signedIn(user);
      const res = await v.get('/api/firm/business');
      expect(res.status, user.role).toBe(403);
      expect(JSON.stringify(res.body)).not.toContain('rmrCents');
    }
    const anonymous = await visitor(t.app);
    expect((await anonymous.get('/api/firm/business')).status).toBe(401);
  });

  it('gives a firm without contracts zeros and no attrition rate', async () => {
    const empty = await buildFirmWithStaff({ state: 'trialing' });
    const owner = await signedIn(empty.owner);
    const body = ((await owner.get('/api/firm/business')).body as { data: Business }).data;
    expect(body).toMatchObject({ rmrCents: 0, activeContracts: 0, newContracts12m: 0, cancelledContracts12m: 0, renewals: [] });
    expect(body.attrition.rate).toBeNull();
    expect(body.series).toHaveLength(12);
    expect(body.series.every((p) => p.rmrCents === 0 && p.activeContracts === 0)).toBe(true);
  });
});
