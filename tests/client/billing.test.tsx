import { Suspense, type ReactNode } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { defineRulesFor } from '@domain/abilities';
import { PLANS } from '@domain/plans';
import type { Role } from '@domain/roles';
import BillingPage from '@/app/routes/firm/billing';
import NewSitePage from '@/app/routes/firm/site-new';
import StaffPage from '@/app/routes/firm/staff';
import { FirmLayout } from '@/components/layouts/firm-layout';
import type { ApiBilling, ApiFirm, ApiInvoice, SessionInfo } from '@/types/api';
import { jsonResponse, renderRoutes } from './render';

const TRIAL_ENDED = 'Your trial ended on March 3, 2026. Choose a plan on the Billing page to keep adding and changing records; everything you saved is still here.';

function sessionAs(role: Role, tenant: Partial<ApiFirm> = {}): SessionInfo {
  return {
    user: {
      id: 'u1',
      tenantId: 't1',
      email: 'wren@quillfield.example',
      name: 'Wren Ashdown',
      role,
      active: true,
      deactivatedAt: null,
      lastSignInAt: null,
      createdAt: '2026-01-01T00:00:00Z',
    },
    tenant: {
      id: 't1',
      name: 'Quillfield Alarm Co.',
      shortName: 'quillfield',
      accentColor: '#8f5c17',
      accentColorReadable: '#8f5c17',
      logoUrl: null,
      monitoringCenterName: 'Ridgeway Monitoring',
      monitoringCenterPhone: '+1 555 010 4400',
      timeZone: 'UTC',
      state: 'trialing',
      trialDaysLeft: 9,
      readOnly: null,
      ...tenant,
    },
    rules: defineRulesFor({ id: 'u1', role, tenantId: 't1' }),
    csrfToken: 'token-1',
  };
}

const plans = PLANS.map(({ key, name, monthlyPriceCents, staffSeats, activeSites, pitch }) => ({ key, name, monthlyPriceCents, staffSeats, activeSites, pitch }));
const crew = { key: 'crew', name: 'Crew', monthlyPriceCents: 14_900, staffSeats: 10, activeSites: 400 };

/** A firm 5 days into its trial, with more sites than Bench allows. */
const onTrial: ApiBilling = {
  state: 'trialing',
  stateLabel: 'Trial',
  planKey: null,
  plan: null,
  trialEndsAt: '2026-03-12T15:00:00.000Z',
  trialDaysLeft: 9,
  pastDueSince: null,
  graceEndsAt: null,
  currentPeriodEnd: null,
  cancelAtPeriodEnd: false,
  readOnly: null,
  usage: { activeSites: 120, staffSeats: 3 },
  limits: { activeSites: 2000, staffSeats: 40, onTrial: true },
  hasSubscription: false,
  paymentsConfigured: true,
  plans,
};

/** The same firm on Crew, paying, near its seat limit and at its site limit. */
const onCrew: ApiBilling = {
  ...onTrial,
  state: 'active',
  stateLabel: 'Active',
  planKey: 'crew',
  plan: crew,
  trialEndsAt: '2026-03-12T15:00:00.000Z',
  trialDaysLeft: null,
  currentPeriodEnd: '2026-04-08T09:00:00.000Z',
  usage: { activeSites: 400, staffSeats: 8 },
  limits: { activeSites: 400, staffSeats: 10, onTrial: false },
  hasSubscription: true,
};

const invoices: ApiInvoice[] = [
  {
    id: 'in_2',
    number: 'QF-0002',
    status: 'open',
    amountDueCents: 14_900,
    amountPaidCents: 0,
    currency: 'usd',
    createdAt: '2026-04-08T09:00:00.000Z',
    periodStart: '2026-04-08T09:00:00.000Z',
    periodEnd: '2026-05-08T09:00:00.000Z',
    hostedInvoiceUrl: 'https://pay.example/invoices/in_2',
    pdfUrl: null,
  },
  {
    id: 'in_1',
    number: 'QF-0001',
    status: 'paid',
    amountDueCents: 14_950,
    amountPaidCents: 14_950,
    currency: 'usd',
    createdAt: '2026-03-08T09:00:00.000Z',
    periodStart: '2026-03-08T09:00:00.000Z',
    periodEnd: '2026-04-08T09:00:00.000Z',
    hostedInvoiceUrl: 'https://pay.example/invoices/in_1',
    pdfUrl: 'https://pay.example/invoices/in_1.pdf',
  },
];

type Reply = Response | ((init: RequestInit | undefined) => Response);

/** A fetch stub answering "METHOD /path" keys (GET /api/session is always answered); anything else is 404. */
function stubApi(session: SessionInfo, routes: Record<string, Reply>) {
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    const key = `${init?.method ?? 'GET'} ${url}`;
    const reply = routes[key] ?? (key === 'GET /api/session' ? () => jsonResponse(200, session) : undefined);
    if (!reply) return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: `Not stubbed: ${key}` } }));
    return Promise.resolve(typeof reply === 'function' ? reply(init) : reply.clone());
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function callsTo(fetchMock: ReturnType<typeof stubApi>, method: string, url: string) {
  return fetchMock.mock.calls.filter(([u, init]) => u === url && (init?.method ?? 'GET') === method);
}

/** Leaving for Stripe: window.location.assign, stubbed. */
function stubAssign() {
  const assign = vi.fn();
  vi.stubGlobal('location', { ...window.location, assign });
  return assign;
}

function suspended(node: ReactNode) {
  return <Suspense fallback={<p>Loading</p>}>{node}</Suspense>;
}

function renderBilling(session: SessionInfo, path = '/app/billing') {
  return renderRoutes([{ path: '/app', element: <FirmLayout />, children: [{ path: 'billing', element: suspended(<BillingPage />) }] }], { path, session });
}

function planCard(name: string): HTMLElement {
  return screen.getByRole('article', { name });
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('billing page on trial', () => {
  it('shows the state in words, usage against the trial’s limits, and the three plans', async () => {
    const session = sessionAs('owner');
    stubApi(session, { 'GET /api/billing': jsonResponse(200, { data: onTrial }), 'GET /api/billing/invoices': jsonResponse(200, { data: [] }) });
    renderBilling(session);

    expect(await screen.findByRole('heading', { name: 'Billing', level: 1 })).toBeInTheDocument();
    expect(screen.getByText('Trial', { selector: 'span' })).toBeInTheDocument();
    expect(screen.getByText('Trial — 9 days left, ends Mar 12, 2026')).toBeInTheDocument();

    expect(screen.getByText('Active sites 120 of 2,000')).toBeInTheDocument();
    expect(screen.getByText('Staff seats 3 of 40')).toBeInTheDocument();
    const sites = screen.getByRole('progressbar', { name: 'Active sites 120 of 2,000' });
    expect(sites).toHaveAttribute('aria-valuenow', '120');
    expect(sites).toHaveAttribute('aria-valuemax', '2000');
    expect(screen.getByText(/Your trial uses the largest plan’s limits \(Fleet\)/)).toBeInTheDocument();

    for (const [name, price] of [
      ['Bench', '$49'],
      ['Crew', '$149'],
      ['Fleet', '$399'],
    ]) {
      const card = planCard(name!);
      expect(within(card).getByText(price!)).toBeInTheDocument();
      expect(within(card).getByRole('button', { name: `Choose ${name}` })).toBeInTheDocument();
    }
    expect(within(planCard('Crew')).getByText('Up to 400 active sites')).toBeInTheDocument();
    expect(within(planCard('Crew')).getByText('Up to 10 staff sign-ins')).toBeInTheDocument();
    expect(within(planCard('Crew')).getByText(PLANS[1]!.pitch)).toBeInTheDocument();

    expect(await screen.findByText('No invoices yet — your first appears after you choose a plan.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Manage payment and plan/ })).toBeNull();
  });

  it('chooses a plan: posts the plan and sends the browser to Stripe Checkout', async () => {
    const session = sessionAs('owner');
    const assign = stubAssign();
    const fetchMock = stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: onTrial }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
      'POST /api/billing/checkout': jsonResponse(201, { data: { url: 'https://checkout.example/c/cs_test_1' } }),
    });
    renderBilling(session);

    await userEvent.click(await screen.findByRole('button', { name: 'Choose Crew' }));
    await waitFor(() => expect(assign).toHaveBeenCalledWith('https://checkout.example/c/cs_test_1'));
    const [call] = callsTo(fetchMock, 'POST', '/api/billing/checkout');
    expect(JSON.parse(call![1]!.body as string)).toEqual({ planKey: 'crew' });
    // Busy until the browser has left; no second checkout meanwhile.
    expect(within(planCard('Crew')).getByRole('button', { name: 'Choose Crew' })).toBeDisabled();
    expect(within(planCard('Fleet')).getByRole('button', { name: 'Choose Fleet' })).toBeDisabled();
  });

  it('a firm on a plan Stripe does not bill yet sees its plan marked and can start paying for it by card', async () => {
    const session = sessionAs('owner');
    const assign = stubAssign();
    const fetchMock = stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: { ...onCrew, usage: { activeSites: 12, staffSeats: 4 }, hasSubscription: false } }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
      'POST /api/billing/checkout': jsonResponse(201, { data: { url: 'https://checkout.example/c/cs_test_2' } }),
    });
    renderBilling(session);

    const card = await screen.findByRole('article', { name: 'Crew' });
    expect(within(card).getByText('Your plan')).toBeInTheDocument();
    expect(within(card).queryByRole('button', { name: 'Choose Crew' })).toBeNull();
    await userEvent.click(within(card).getByRole('button', { name: 'Pay for it by card' }));
    await waitFor(() => expect(assign).toHaveBeenCalledWith('https://checkout.example/c/cs_test_2'));
    expect(JSON.parse(callsTo(fetchMock, 'POST', '/api/billing/checkout')[0]![1]!.body as string)).toEqual({ planKey: 'crew' });
    expect(within(planCard('Fleet')).getByRole('button', { name: 'Choose Fleet' })).toBeInTheDocument();
  });

  it('disables a plan smaller than what the firm uses, and says why', async () => {
    const session = sessionAs('owner');
    stubApi(session, { 'GET /api/billing': jsonResponse(200, { data: onTrial }), 'GET /api/billing/invoices': jsonResponse(200, { data: [] }) });
    renderBilling(session);

    const bench = await screen.findByRole('button', { name: 'Choose Bench' });
    expect(bench).toBeDisabled();
    expect(bench).toHaveAccessibleDescription('Not available: You have 120 active sites; Bench allows 75.');
    expect(screen.getByRole('button', { name: 'Choose Crew' })).toBeEnabled();
  });

  it.each([
    [503, 'service_unavailable', 'Payments are not set up on this Mullion. Ask the service operator to configure Stripe.'],
    [409, 'conflict', 'Your firm already has a subscription. Change plan or card from “Manage payment and plan” instead.'],
  ])('shows the server’s %i answer on the plan and stays on the page', async (status, code, message) => {
    const session = sessionAs('owner');
    const assign = stubAssign();
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: onTrial }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
      'POST /api/billing/checkout': jsonResponse(status, { error: { code, message } }),
    });
    renderBilling(session);

    await userEvent.click(await screen.findByRole('button', { name: 'Choose Fleet' }));
    expect(await within(planCard('Fleet')).findByRole('alert')).toHaveTextContent(message);
    expect(assign).not.toHaveBeenCalled();
    expect(screen.getByRole('button', { name: 'Choose Fleet' })).toBeEnabled();
  });

  it('says when payments are not set up, with the plan buttons disabled', async () => {
    const session = sessionAs('owner');
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: { ...onTrial, paymentsConfigured: false } }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
    });
    renderBilling(session);

    expect(await screen.findByText(/Payments are not set up on this Mullion yet/)).toBeInTheDocument();
    for (const name of ['Bench', 'Crew', 'Fleet']) expect(screen.getByRole('button', { name: `Choose ${name}` })).toBeDisabled();
  });
});

describe('billing page with a subscription', () => {
  it('marks the current plan, warns near and at the limits, and opens the billing portal', async () => {
    const session = sessionAs('owner', { state: 'active', trialDaysLeft: null });
    const assign = stubAssign();
    const fetchMock = stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: onCrew }),
      'GET /api/billing/invoices': jsonResponse(200, { data: invoices }),
      'POST /api/billing/portal': jsonResponse(201, { data: { url: 'https://billing.example/p/session_1' } }),
    });
    renderBilling(session);

    expect(await screen.findByText('Crew plan, $149 a month, renews Apr 8, 2026')).toBeInTheDocument();
    expect(screen.getByText('Active', { selector: 'span' })).toBeInTheDocument();
    expect(within(planCard('Crew')).getByText('Your plan')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /^Choose / })).toBeNull();

    const sites = screen.getByRole('progressbar', { name: 'Active sites 400 of 400' });
    expect(sites).toHaveAccessibleDescription('At the limit');
    expect(sites.firstElementChild).toHaveClass('bg-clay-600');
    const seats = screen.getByRole('progressbar', { name: 'Staff seats 8 of 10' });
    expect(seats).toHaveAttribute('aria-valuenow', '8');
    expect(seats).toHaveAccessibleDescription('Nearly at the limit');
    expect(seats.firstElementChild).toHaveClass('bg-ochre-600');
    // A smaller plan that cannot hold the firm says why (the change itself happens in the portal).
    expect(within(planCard('Bench')).getByText('Not available: You have 400 active sites; Bench allows 75. You have 8 staff seats in use; Bench allows 3.')).toBeInTheDocument();

    await userEvent.click(screen.getByRole('button', { name: 'Manage payment and plan' }));
    await waitFor(() => expect(assign).toHaveBeenCalledWith('https://billing.example/p/session_1'));
    expect(callsTo(fetchMock, 'POST', '/api/billing/portal')).toHaveLength(1);
    expect(callsTo(fetchMock, 'POST', '/api/billing/checkout')).toHaveLength(0);
  });

  it('says when the plan ends instead of renewing', async () => {
    const session = sessionAs('owner', { state: 'active' });
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: { ...onCrew, cancelAtPeriodEnd: true } }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
    });
    renderBilling(session);
    expect(await screen.findByText('Crew plan, $149 a month, ends Apr 8, 2026')).toBeInTheDocument();
  });

  it('lists invoices with dates, numbers, amounts, states and links', async () => {
    const session = sessionAs('owner', { state: 'active' });
    stubApi(session, { 'GET /api/billing': jsonResponse(200, { data: onCrew }), 'GET /api/billing/invoices': jsonResponse(200, { data: invoices }) });
    renderBilling(session);

    const table = await screen.findByRole('table', { name: 'Invoices, newest first' });
    expect(
      within(table)
        .getAllByRole('columnheader')
        .map((th) => th.textContent),
    ).toEqual(['Date', 'Number', 'Period', 'Amount', 'Status', 'Invoice documents']);
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows.map((row) => [...row.children].slice(0, 5).map((cell) => cell.textContent))).toEqual([
      ['Apr 8, 2026', 'QF-0002', 'Apr 8, 2026 – May 8, 2026', '$149', 'Due'],
      ['Mar 8, 2026', 'QF-0001', 'Mar 8, 2026 – Apr 8, 2026', '$149.50', 'Paid'],
    ]);
    expect(within(rows[0]!).getByRole('link', { name: 'View invoice QF-0002 (opens in a new tab)' })).toHaveAttribute('href', 'https://pay.example/invoices/in_2');
    expect(within(rows[0]!).queryByRole('link', { name: /PDF/ })).toBeNull();
    expect(within(rows[1]!).getByRole('link', { name: 'PDF of invoice QF-0001 (opens in a new tab)' })).toHaveAttribute('href', 'https://pay.example/invoices/in_1.pdf');
  });

  it('keeps the page when invoices cannot be read, and says so', async () => {
    const session = sessionAs('owner', { state: 'active' });
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: onCrew }),
      'GET /api/billing/invoices': jsonResponse(503, { error: { code: 'service_unavailable', message: 'Stripe did not answer when listing your invoices. Try again in a minute.' } }),
    });
    renderBilling(session);
    // Stripe's 503 is tried again twice (a second, then two) before the page says so.
    expect(await screen.findByText('Stripe did not answer when listing your invoices. Try again in a minute.', undefined, { timeout: 6000 })).toBeInTheDocument();
    expect(screen.getByText('Staff seats 8 of 10')).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'Plans' })).toBeInTheDocument();
  }, 10_000);
});

describe('a read-only firm', () => {
  it('shows the notice with its message and a way to choose a plan', async () => {
    const readOnly = { code: 'trial_ended' as const, message: TRIAL_ENDED };
    const session = sessionAs('owner', { trialDaysLeft: 0, readOnly });
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, { data: { ...onTrial, trialEndsAt: '2026-03-03T15:00:00.000Z', trialDaysLeft: 0, readOnly } }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
    });
    renderBilling(session);

    const notice = (await screen.findByRole('heading', { name: 'Your firm is read-only' })).closest('section')!;
    expect(within(notice).getByText(TRIAL_ENDED)).toBeInTheDocument();
    expect(screen.getByText('Trial ended', { selector: 'span' })).toBeInTheDocument();
    expect(screen.getByText('Trial ended on Mar 3, 2026. Choose a plan to carry on.')).toBeInTheDocument();
    // The layout's banner stays away from the page that has the full notice.
    expect(screen.getAllByText(TRIAL_ENDED)).toHaveLength(1);
    await userEvent.click(within(notice).getByRole('button', { name: 'Choose a plan' }));
    expect(screen.getByRole('heading', { name: 'Plans' })).toHaveFocus();
  });

  it('past due beyond the grace: the notice updates the card in the billing portal', async () => {
    const readOnly = { code: 'past_due' as const, message: 'Your payment has been past due since March 1, 2026 and the 7-day grace period ended on March 8, 2026. Update your payment details on the Billing page to keep adding and changing records; everything you saved is still here.' };
    const session = sessionAs('owner', { state: 'past_due', readOnly });
    const assign = stubAssign();
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, {
        data: { ...onCrew, state: 'past_due', stateLabel: 'Past due', pastDueSince: '2026-03-01T10:00:00.000Z', graceEndsAt: '2026-03-08T10:00:00.000Z', readOnly },
      }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
      'POST /api/billing/portal': jsonResponse(201, { data: { url: 'https://billing.example/p/session_2' } }),
    });
    renderBilling(session);

    const notice = (await screen.findByRole('heading', { name: 'Your firm is read-only' })).closest('section')!;
    expect(screen.getByText('Past due', { selector: 'span' })).toBeInTheDocument();
    expect(screen.getByText('Payment failed on Mar 1, 2026; the grace period ended on Mar 8, 2026.')).toBeInTheDocument();
    // One way to the portal, in the notice.
    expect(screen.queryByRole('button', { name: 'Manage payment and plan' })).toBeNull();
    await userEvent.click(within(notice).getByRole('button', { name: 'Update payment details' }));
    await waitFor(() => expect(assign).toHaveBeenCalledWith('https://billing.example/p/session_2'));
  });

  it('past due within the grace: says until when the card can be updated', async () => {
    const session = sessionAs('owner', { state: 'past_due' });
    stubApi(session, {
      'GET /api/billing': jsonResponse(200, {
        data: { ...onCrew, state: 'past_due', stateLabel: 'Past due', pastDueSince: '2026-03-01T10:00:00.000Z', graceEndsAt: '2026-03-08T10:00:00.000Z' },
      }),
      'GET /api/billing/invoices': jsonResponse(200, { data: [] }),
    });
    renderBilling(session);
    expect(await screen.findByText('Payment failed on Mar 1, 2026; you have until Mar 8, 2026 to update your card.')).toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: 'Your firm is read-only' })).toBeNull();
    expect(screen.getByRole('button', { name: 'Manage payment and plan' })).toBeEnabled();
  });
});

describe('read-only banner in the firm layout', () => {
  const readOnly = { code: 'trial_ended', message: TRIAL_ENDED };
  const renderLayout = (session: SessionInfo) =>
    renderRoutes([{ path: '/app', element: <FirmLayout />, children: [{ index: true, element: <p>Overview page</p> }] }], { path: '/app', session });

  it('gives the owner the message and a link to billing', () => {
    renderLayout(sessionAs('owner', { readOnly }));
    const banner = screen.getByText(TRIAL_ENDED, { exact: false }).closest('[role="status"]') as HTMLElement;
    expect(banner).toHaveTextContent(TRIAL_ENDED);
    expect(within(banner).getByRole('link', { name: 'Go to billing' })).toHaveAttribute('href', '/app/billing');
    expect(within(banner).queryByText(/Ask your firm’s owner/)).toBeNull();
  });

  it('tells a coordinator to ask the owner, without a link they could not use', () => {
    renderLayout(sessionAs('coordinator', { readOnly }));
    const banner = screen.getByText(TRIAL_ENDED, { exact: false }).closest('[role="status"]') as HTMLElement;
    expect(within(banner).getByText('Ask your firm’s owner to sort out billing.')).toBeInTheDocument();
    expect(within(banner).queryByRole('link')).toBeNull();
  });

  it('is not there while the firm may write', () => {
    renderLayout(sessionAs('owner'));
    expect(screen.getByText('Overview page')).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Go to billing' })).toBeNull();
  });
});

describe('coming back from Stripe Checkout', () => {
  it('waits for the webhook, then welcomes the firm to its plan and tidies the address', async () => {
    const session = sessionAs('owner');
    let asked = 0;
    const fetchMock = stubApi(session, {
      // The first answer comes before Stripe's webhook has landed; the next one after.
      'GET /api/billing': () => jsonResponse(200, { data: asked++ === 0 ? onTrial : { ...onCrew, usage: onTrial.usage } }),
      'GET /api/billing/invoices': () => jsonResponse(200, { data: [] }),
    });
    const { router } = renderBilling(session, '/app/billing?checkout=done&session_id=cs_test_1');

    expect(await screen.findByText('Finishing your checkout: waiting for Stripe to confirm your plan…')).toBeInTheDocument();
    expect(router.state.location.search).toBe('?checkout=done&session_id=cs_test_1');
    expect(await screen.findByText('Payment received. Welcome to the Crew plan.', undefined, { timeout: 4000 })).toBeInTheDocument();
    expect(asked).toBe(2);
    await waitFor(() => expect(router.state.location.search).toBe(''));
    expect(router.state.location.pathname).toBe('/app/billing');
    // The session (read-only banner, trial days) is asked again now the plan is in place.
    await waitFor(() => expect(callsTo(fetchMock, 'GET', '/api/session').length).toBeGreaterThan(0));
    // No more asking once it is confirmed.
    await new Promise((resolve) => setTimeout(resolve, 1700));
    expect(asked).toBe(2);
  }, 10_000);

  it('a cancelled checkout says nothing was charged', async () => {
    const session = sessionAs('owner');
    stubApi(session, { 'GET /api/billing': jsonResponse(200, { data: onTrial }), 'GET /api/billing/invoices': jsonResponse(200, { data: [] }) });
    const { router } = renderBilling(session, '/app/billing?checkout=cancelled');

    expect(await screen.findByText('Checkout cancelled; nothing was charged.')).toBeInTheDocument();
    await waitFor(() => expect(router.state.location.search).toBe(''));
    expect(screen.getByText('Checkout cancelled; nothing was charged.')).toBeInTheDocument();
    expect(screen.queryByText(/Welcome to the/)).toBeNull();
  });
});

describe('staff seats on the staff page', () => {
  const staffList = {
    data: [
      { id: 'u1', tenantId: 't1', email: 'wren@quillfield.example', name: 'Wren Ashdown', role: 'owner', active: true, deactivatedAt: null, lastSignInAt: null, createdAt: '2026-01-01T00:00:00Z' },
    ],
    page: { number: 1, size: 25, total: 1 },
  };
  const staffRoutes = {
    'GET /api/staff?page=1&pageSize=25&sort=name': () => jsonResponse(200, staffList),
    'GET /api/staff/invitations': () => jsonResponse(200, { data: [], page: { number: 1, size: 25, total: 0 } }),
  };
  const renderStaff = (session: SessionInfo) =>
    renderRoutes([{ path: '/app', element: <FirmLayout />, children: [{ path: 'staff', element: <StaffPage /> }] }], { path: '/app/staff', session });

  it('shows the owner the seats near the invite button, and counts again after an invitation', async () => {
    const session = sessionAs('owner', { state: 'active' });
    let invited = false;
    stubApi(session, {
      ...staffRoutes,
      'GET /api/billing': () => jsonResponse(200, { data: { ...onCrew, usage: { activeSites: 42, staffSeats: invited ? 4 : 3 } } }),
      'POST /api/staff/invitations': () => {
        invited = true;
        return jsonResponse(201, { data: { id: 'i1', email: 'new@quillfield.example', role: 'technician', state: 'pending', expiresAt: '2026-04-15T00:00:00Z', sentAt: null, createdAt: '2026-04-08T00:00:00Z' } });
      },
    });
    renderStaff(session);

    expect(await screen.findByText('Staff seats 3 of 10')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Invite a colleague' }));
    await userEvent.type(screen.getByLabelText('E-mail'), 'new@quillfield.example');
    await userEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Staff seats 4 of 10')).toBeInTheDocument();
  });

  it('shows the plan limit refusal as a message for the whole invitation form', async () => {
    const session = sessionAs('owner', { state: 'active' });
    const message = 'Your Crew plan allows 10 staff seats and you have 10. Move to a larger plan on the Billing page, or deactivate a staff member who has left.';
    stubApi(session, {
      ...staffRoutes,
      'GET /api/billing': () => jsonResponse(200, { data: { ...onCrew, usage: { activeSites: 42, staffSeats: 10 } } }),
      'POST /api/staff/invitations': () => jsonResponse(402, { error: { code: 'plan_limit_reached', message, fields: { staffSeats: 'Limit 10' } } }),
    });
    renderStaff(session);

    expect(await screen.findByText('Staff seats 10 of 10')).toBeInTheDocument();
    expect(screen.getByText('· at the limit')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Invite a colleague' }));
    await userEvent.type(screen.getByLabelText('E-mail'), 'new@quillfield.example');
    await userEvent.click(screen.getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(message);
    expect(screen.getByLabelText('E-mail')).not.toHaveAttribute('aria-invalid');
  });

  it('keeps the page without seats when billing cannot be read', async () => {
    const session = sessionAs('owner', { state: 'active' });
    stubApi(session, { ...staffRoutes, 'GET /api/billing': () => jsonResponse(503, { error: { code: 'internal', message: 'Try again.' } }) });
    renderStaff(session);
    expect(await screen.findByRole('table', { name: 'Staff of the firm' })).toBeInTheDocument();
    await waitFor(() => expect(screen.queryByText(/Staff seats/)).toBeNull());
  });

  it('does not ask a coordinator’s page for billing', async () => {
    const session = sessionAs('coordinator', { state: 'active' });
    const fetchMock = stubApi(session, staffRoutes);
    renderStaff(session);
    expect(await screen.findByRole('table', { name: 'Staff of the firm' })).toBeInTheDocument();
    expect(screen.queryByText(/Staff seats/)).toBeNull();
    expect(callsTo(fetchMock, 'GET', '/api/billing')).toHaveLength(0);
  });
});

describe('a refused new site', () => {
  it('shows a read-only refusal as a message for the whole form', async () => {
    const clientId = '7f7e2f1c-8a4b-4c55-9b7a-0c3c5f1d2e11';
    const message = 'Your trial ended on March 3, 2026. Choose a plan on the Billing page to keep adding and changing records; everything you saved is still here.';
    const session = sessionAs('coordinator');
    stubApi(session, {
      [`GET /api/clients/${clientId}`]: jsonResponse(200, { data: { id: clientId, name: 'Marlowe household', email: '', phone: '', altPhone: '', status: 'active', createdAt: '2026-01-01T00:00:00Z' } }),
      'POST /api/sites': () => jsonResponse(402, { error: { code: 'read_only', message } }),
    });
    renderRoutes([{ path: '/app/clients/:clientId/sites/new', element: suspended(<NewSitePage />) }], { path: `/app/clients/${clientId}/sites/new`, session });

    await userEvent.type(await screen.findByLabelText('Street address'), '14 Wicket Lane');
    await userEvent.type(screen.getByLabelText('City'), 'Quillfield');
    await userEvent.click(screen.getByRole('button', { name: 'Add site' }));
    expect(await screen.findByRole('alert')).toHaveTextContent(message);
    expect(screen.getByLabelText('Street address')).not.toHaveAttribute('aria-invalid');
  });
});
