import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import { defineRulesFor } from '@domain/abilities';
import type { Role } from '@domain/roles';
import BusinessPage from '@/app/routes/firm/business';
import { FirmLayout } from '@/components/layouts/firm-layout';
import type { FirmBusiness, SessionInfo } from '@/types/api';
import { jsonResponse, renderRoutes } from './render';

function sessionAs(role: Role): SessionInfo {
  return {
    user: {
      id: 'u1',
      tenantId: 't1',
      email: 'hazel@thornbury.example',
      name: 'Hazel Thornbury',
      role,
      active: true,
      deactivatedAt: null,
      lastSignInAt: null,
      createdAt: '2026-01-01T00:00:00Z',
    },
    tenant: {
      id: 't1',
      name: 'Thornbury Alarm Co.',
      shortName: 'thornbury',
      accentColor: '#8f5c17',
      accentColorReadable: '#8f5c17',
      logoUrl: null,
      monitoringCenterName: 'Ridgeway Monitoring',
      monitoringCenterPhone: '+1 555 010 4400',
      timeZone: 'America/Chicago',
      state: 'active',
    },
    rules: defineRulesFor({ id: 'u1', role, tenantId: 't1' }),
    csrfToken: 'token-1',
  };
}

// The server's worked example (tests/server/firm-business.test.ts).
const business: FirmBusiness = {
  today: '2026-05-31',
  rmrCents: 21_700,
  activeContracts: 6,
  newContracts12m: 4,
  cancelledContracts12m: 2,
  attrition: { periodStart: '2025-05-31', periodEnd: '2026-05-31', cancelled: 2, activeAtStart: 4, activeAtEnd: 6, averageActive: 5, rate: 0.4 },
  renewals: [
    {
      siteId: 's-dovecote',
      siteName: 'Dovecote Barn',
      clientId: 'c-marlowe',
      clientName: 'Marlowe household',
      renewsOn: '2026-06-30',
      monthlyFeeCents: 5000,
    },
    {
      siteId: 's-beacon',
      siteName: 'Beacon House',
      clientId: 'c-marlowe',
      clientName: 'Marlowe household',
      renewsOn: '2026-08-20',
      monthlyFeeCents: 4250,
    },
    {
      siteId: 's-juniper',
      siteName: 'Juniper Lane',
      clientId: 'c-penrose',
      clientName: 'Penrose household',
      renewsOn: '2026-08-29',
      monthlyFeeCents: null,
    },
  ],
  series: [
    ['2025-06', 'Jun 2025', 18_400, 5],
    ['2025-07', 'Jul 2025', 20_400, 6],
    ['2025-08', 'Aug 2025', 24_600, 7],
    ['2025-09', 'Sep 2025', 27_900, 8],
    ['2025-10', 'Oct 2025', 27_900, 8],
    ['2025-11', 'Nov 2025', 27_900, 8],
    ['2025-12', 'Dec 2025', 27_900, 8],
    ['2026-01', 'Jan 2026', 27_900, 8],
    ['2026-02', 'Feb 2026', 25_000, 7],
    ['2026-03', 'Mar 2026', 25_000, 7],
    ['2026-04', 'Apr 2026', 25_000, 7],
    ['2026-05', 'May 2026', 21_700, 6],
  ].map(([month, label, rmrCents, activeContracts]) => ({
    month: month as string,
    label: label as string,
    rmrCents: rmrCents as number,
    activeContracts: activeContracts as number,
  })),
};

function stubBusiness(body: FirmBusiness) {
  const fetchMock = vi.fn((url: string) =>
    Promise.resolve(
      url === '/api/firm/business' ? jsonResponse(200, { data: body }) : jsonResponse(404, { error: { code: 'not_found', message: 'Not stubbed.' } }),
    ),
  );
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

afterEach(() => {
  vi.unstubAllGlobals();
});

function renderBusiness() {
  return renderRoutes([{ path: '/app/business', element: <BusinessPage /> }], { path: '/app/business', session: sessionAs('owner') });
}

function statValue(label: string): string {
  return screen.getByText(label, { selector: 'dt' }).nextElementSibling?.textContent ?? '';
}

describe('business page', () => {
  it('shows RMR, contracts, new and cancelled in the last 12 months', async () => {
    stubBusiness(business);
    renderBusiness();
    expect(await screen.findByText('RMR', { selector: 'dt' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'Business', level: 1 })).toBeInTheDocument();
    expect(screen.getByText('Your monitoring contracts as of May 31, 2026.')).toBeInTheDocument();
    expect(statValue('RMR')).toBe('$217');
    expect(statValue('Active contracts')).toBe('6');
    expect(statValue('New in the last 12 months')).toBe('4');
    expect(statValue('Cancelled in the last 12 months')).toBe('2');
  });

  it('gives the attrition rate with its formula in words and where it comes from', async () => {
    stubBusiness(business);
    renderBusiness();
    const card = (await screen.findByRole('heading', { name: 'Attrition over the last 12 months' })).closest('section')!;
    expect(within(card).getByText('40%')).toBeInTheDocument();
    expect(within(card).getByText('Cancelled in the period ÷ average of active at start and end.')).toBeInTheDocument();
    expect(within(card).getByText('2 cancelled ÷ 5 (the average of 4 active on May 31, 2025 and 6 on May 31, 2026)')).toBeInTheDocument();
    expect(within(card).getByText('Common practice, no published source.')).toBeInTheDocument();
  });

  it('has no rate when nothing was in force, and says why', async () => {
    stubBusiness({
      ...business,
      rmrCents: 0,
      activeContracts: 0,
      attrition: { ...business.attrition, cancelled: 0, activeAtStart: 0, activeAtEnd: 0, averageActive: 0, rate: null },
      renewals: [],
    });
    renderBusiness();
    const card = (await screen.findByRole('heading', { name: 'Attrition over the last 12 months' })).closest('section')!;
    expect(within(card).getByText('—')).toBeInTheDocument();
    expect(within(card).getByText('No contracts were in force in the period, so there is no rate yet.')).toBeInTheDocument();
    expect(screen.getByText('No contract renews in the next 90 days.')).toBeInTheDocument();
  });

  it('lists renewals soonest first with links to the site and the client', async () => {
    stubBusiness(business);
    renderBusiness();
    const table = await screen.findByRole('table', { name: 'Contracts renewing in the next 90 days, soonest first' });
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((th) => th.textContent),
    ).toEqual(['Site', 'Client', 'Renews on', 'Monthly fee']);
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((row) => [...row.children].map((cell) => cell.textContent))).toEqual([
      ['Dovecote Barn', 'Marlowe household', 'Jun 30, 2026', '$50'],
      ['Beacon House', 'Marlowe household', 'Aug 20, 2026', '$42.50'],
      ['Juniper Lane', 'Penrose household', 'Aug 29, 2026', '—'],
    ]);
    expect(within(rows[0]!).getByRole('link', { name: 'Dovecote Barn' })).toHaveAttribute('href', '/app/sites/s-dovecote');
    expect(within(rows[2]!).getByRole('link', { name: 'Penrose household' })).toHaveAttribute('href', '/app/clients/c-penrose');
  });

  it('gives the RMR chart’s numbers, with contracts in force, as a table', async () => {
    stubBusiness(business);
    renderBusiness();
    const table = await screen.findByRole('table', { name: 'RMR at the end of each month' });
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((th) => th.textContent),
    ).toEqual(['Month', 'RMR', 'Active contracts']);
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(12);
    expect([...rows[0]!.children].map((cell) => cell.textContent)).toEqual(['Jun 2025', '$184', '5']);
    expect([...rows[8]!.children].map((cell) => cell.textContent)).toEqual(['Feb 2026', '$250', '7']);
    expect(screen.getByText('RMR went from $184 in Jun 2025 to $217 in May 2026.')).toBeInTheDocument();
  });

  it('shows the server’s refusal in words', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(() => Promise.resolve(jsonResponse(403, { error: { code: 'forbidden', message: 'You do not have permission to do that.' } }))),
    );
    renderBusiness();
    expect(await screen.findByRole('alert')).toHaveTextContent('You do not have permission to do that.');
  });
});

describe('firm navigation: Business', () => {
  it('shows Business to the owner only', () => {
    for (const [role, shown] of [
      ['owner', true],
      ['coordinator', false],
      ['technician', false],
    ] as const) {
      const { unmount } = renderRoutes([{ path: '/', element: <FirmLayout /> }], { session: sessionAs(role) });
      const sidebar = screen.getAllByRole('navigation', { name: 'Workspace' })[0]!;
      const link = within(sidebar).queryByRole('link', { name: 'Business' });
      if (shown) expect(link, role).toHaveAttribute('href', '/app/business');
      else expect(link, role).toBeNull();
      unmount();
    }
  });
});
