import { Suspense } from 'react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import { defineRulesFor } from '@domain/abilities';
import OperatorRevenuePage from '@/app/routes/operator/revenue';
import OperatorTenantPage from '@/app/routes/operator/tenant';
import { OperatorLayout } from '@/components/layouts/operator-layout';
import type { OperatorRevenue, OperatorTenantBilling, OperatorTenantDetail, SessionInfo } from '@/types/api';
import { jsonResponse, renderRoutes } from './render';

// Noon UTC on 15 June 2026: the same calendar day in every zone the tests may run in.
const NOW = new Date('2026-06-15T12:00:00.000Z');

const session: SessionInfo = {
  user: {
    id: 'op1',
    tenantId: null,
    email: 'orla@mullion.example',
    name: 'Orla Penhallow',
    role: 'operator',
    active: true,
    deactivatedAt: null,
    lastSignInAt: null,
    createdAt: '2026-01-01T00:00:00Z',
  },
  tenant: null,
  rules: defineRulesFor({ id: 'op1', role: 'operator', tenantId: null }),
  csrfToken: 'token-1',
};

const revenue: OperatorRevenue = {
  mrrCents: 44_800,
  activeSubscriptions: 2,
  firmsByState: { trialing: 4, active: 3, past_due: 1, suspended: 1, cancelled: 0 },
  trialsEndingThisWeek: [
    { id: 't-dunmere', name: 'Dunmere Systems', trialEndsAt: '2026-06-18T12:00:00.000Z' },
    { id: 't-eastwick', name: 'Eastwick Watch', trialEndsAt: '2026-06-22T12:00:00.000Z' },
  ],
  series: [
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
  ].map(([month, label, mrrCents]) => ({ month: month as string, label: label as string, mrrCents: mrrCents as number })),
};

function tenantDetail(billing: OperatorTenantBilling): OperatorTenantDetail {
  return {
    id: 't-ivy',
    name: 'Ivybridge Alarms',
    shortName: 'ivybridge',
    state: 'active',
    planKey: billing.planKey,
    staffCount: 3,
    trialEndsAt: null,
    suspendedAt: null,
    suspendedReason: null,
    createdAt: '2026-01-05T10:00:00.000Z',
    owner: { name: 'Ines Varga', email: 'ines@ivybridge.example' },
    actions: [],
    billing,
  };
}

function stubApi(routes: Record<string, unknown>) {
  const fetchMock = vi.fn((url: string) => {
    const path = url.split('?')[0]!;
    if (path in routes) return Promise.resolve(jsonResponse(200, { data: routes[path] }));
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: `No stub for ${path}` } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(NOW);
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

function renderRevenue() {
  return renderRoutes([{ path: '/operator', element: <OperatorLayout />, children: [{ path: 'revenue', element: <OperatorRevenuePage /> }] }], {
    path: '/operator/revenue',
    session,
  });
}

/** The number shown under a headline label. */
function statValue(label: string): string {
  const term = screen.getByText(label, { selector: 'dt' });
  return term.nextElementSibling?.textContent ?? '';
}

describe('operator revenue page', () => {
  it('shows MRR, subscriptions, firms by state in words and the trials ending this week', async () => {
    const fetchMock = stubApi({ '/api/operator/revenue': revenue });
    renderRevenue();

    expect(await screen.findByText('MRR', { selector: 'dt' })).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'Revenue', level: 1 })).toBeInTheDocument();
    expect(statValue('MRR')).toBe('$448');
    expect(statValue('Active subscriptions')).toBe('2');
    expect(statValue('Trials ending this week')).toBe('2');
    expect(fetchMock.mock.calls.some(([url]) => url === '/api/operator/revenue')).toBe(true);

    // every state, with its word and count, zero included
    const states = screen.getByRole('list', { name: 'Firms by state' });
    expect(
      within(states)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(['Trial4 firms', 'Active3 firms', 'Past due1 firm', 'Suspended1 firm', 'Cancelled0 firms']);
    expect(screen.getByText('firms in all').textContent).toBe('9 firms in all');

    const trials = screen.getByRole('list', { name: 'Trials ending this week' });
    const items = within(trials).getAllByRole('listitem');
    expect(items).toHaveLength(2);
    expect(within(items[0]!).getByRole('link', { name: 'Dunmere Systems' })).toHaveAttribute('href', '/operator/firms/t-dunmere');
    expect(items[0]).toHaveTextContent('Ends Jun 18, 2026 (in 3 days)');
    expect(within(items[1]!).getByRole('link', { name: 'Eastwick Watch' })).toHaveAttribute('href', '/operator/firms/t-eastwick');
    expect(items[1]).toHaveTextContent('Ends Jun 22, 2026 (in 7 days)');

    // the console's navigation marks this section
    const nav = screen.getByRole('navigation', { name: 'Operator console' });
    expect(within(nav).getByRole('link', { name: 'Revenue' })).toHaveAttribute('aria-current', 'page');
    expect(within(nav).getByRole('link', { name: 'Firms' })).toHaveAttribute('href', '/operator');
    expect(within(nav).getByRole('link', { name: 'Firms' })).not.toHaveAttribute('aria-current');
  });

  it('gives the chart’s numbers as a table and a summary in words', async () => {
    stubApi({ '/api/operator/revenue': revenue });
    renderRevenue();

    const table = await screen.findByRole('table', { name: 'MRR at the end of each month' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(12);
    expect(rows.map((row) => [...row.children].map((cell) => cell.textContent))).toEqual(
      revenue.series.map((p) => [p.label, `$${(p.mrrCents / 100).toLocaleString('en-US')}`]),
    );
    expect(within(rows[7]!).getByRole('rowheader')).toHaveTextContent('Feb 2026');
    expect(within(rows[7]!).getByRole('cell')).toHaveTextContent('$396');
    expect(screen.getByText('MRR went from $0 in Jul 2025 to $448 in Jun 2026.')).toBeInTheDocument();

    // the drawing: one brass line, hidden from screen readers (the table speaks for it)
    const curve = document.querySelector('.recharts-area-curve');
    expect(curve).toHaveAttribute('stroke', '#8f5c17');
    expect(curve!.closest('[aria-hidden="true"]')).not.toBeNull();
  });

  it('says so when no trial ends this week', async () => {
    stubApi({ '/api/operator/revenue': { ...revenue, trialsEndingThisWeek: [] } });
    renderRevenue();
    expect(await screen.findByText('No trial ends in the next 7 days.')).toBeInTheDocument();
    expect(statValue('Trials ending this week')).toBe('0');
  });
});

describe('operator firm page: plan and usage', () => {
  function renderTenant() {
    return renderRoutes(
      [
        {
          path: '/operator/firms/:tenantId',
          element: (
            <Suspense fallback={null}>
              <OperatorTenantPage />
            </Suspense>
          ),
        },
      ],
      { path: '/operator/firms/t-ivy', session },
    );
  }

  it('shows the plan, its price and usage against the limits in words', async () => {
    stubApi({
      '/api/operator/tenants/t-ivy': tenantDetail({
        planKey: 'crew',
        planName: 'Crew',
        monthlyPriceCents: 14_900,
        usage: { activeSites: 42, staffSeats: 10 },
        limits: { activeSites: 400, staffSeats: 10, onTrial: false },
      }),
    });
    renderTenant();

    expect(await screen.findByText('Sites 42 of 400')).toBeInTheDocument();
    expect(screen.getByText('Staff seats 10 of 10')).toBeInTheDocument();
    expect(screen.getByText('At the limit')).toBeInTheDocument();
    expect(screen.getByText('Crew')).toBeInTheDocument();
    expect(screen.getByText('· $149/month')).toBeInTheDocument();
    expect(screen.queryByText(/On trial/)).not.toBeInTheDocument();
  });

  it('says when a firm on trial borrows the largest plan’s limits, and when it is over a limit', async () => {
    stubApi({
      '/api/operator/tenants/t-ivy': tenantDetail({
        planKey: null,
        planName: null,
        monthlyPriceCents: null,
        usage: { activeSites: 2_003, staffSeats: 5 },
        limits: { activeSites: 2_000, staffSeats: 40, onTrial: true },
      }),
    });
    renderTenant();

    expect(await screen.findByText('No plan chosen yet')).toBeInTheDocument();
    expect(screen.getByText('On trial: the largest plan’s limits apply until the firm chooses a plan.')).toBeInTheDocument();
    expect(screen.getByText('Sites 2,003 of 2,000')).toBeInTheDocument();
    expect(screen.getByText('Over the limit by 3')).toBeInTheDocument();
    expect(screen.getByText('Staff seats 5 of 40')).toBeInTheDocument();
  });
});
