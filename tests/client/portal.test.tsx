import type { ComponentType } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { QueryClient } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider, type LoaderFunctionArgs, type RouteObject } from 'react-router-dom';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { AppProvider } from '@/app/provider';
import * as homePage from '@/app/routes/portal/home';
import * as sitePage from '@/app/routes/portal/site';
import * as coveragePage from '@/app/routes/portal/coverage';
import * as devicesPage from '@/app/routes/portal/devices';
import * as servicePage from '@/app/routes/portal/service';
import * as contactsPage from '@/app/routes/portal/contacts';
import * as documentsPage from '@/app/routes/portal/documents';
import { PortalLayout } from '@/components/layouts/portal-layout';
import { brandStyle, MULLION_BRASS, telHref } from '@/features/portal/brand';
import { lifeWords, monthYear } from '@/features/portal/life-words';
import { sessionQuery } from '@/lib/auth';
import { createQueryClient } from '@/lib/query-client';
import type { ApiContact, PortalCoverage, PortalDevice, PortalDocument, PortalService, PortalSite, PortalSiteSummary, SessionInfo } from '@/types/api';
import {
  ACCENT_READABLE,
  CENTER_PHONE,
  COVERAGE_SUMMARY,
  FIRM_NAME,
  FIRM_PHONE,
  HALL_SMOKE_ZONE,
  KEYPAD_PHOTO_URL,
  OTHER_SITE_ID,
  PLAN_URL,
  REPORT_URL,
  SITE_ID,
  SUMMARY_SENTENCE,
  backDoorDevice,
  clientSession,
  contacts,
  devices,
  documents,
  elmHollow,
  garageHeatDevice,
  hallSmokeDevice,
  kitchenWindowDevice,
  lakeCabin,
  landingCoDevice,
  lifeSafetyMessages,
  makeCoverage,
  makeService,
  makeSummary,
  NOT_PROTECTING_WORDS,
  signedOutSession,
  stairSmokeDevice,
} from './portal-fixtures';
import { jsonResponse } from './render';

afterEach(() => vi.unstubAllGlobals());

// ---------------------------------------------------------------------------------------------
// Rendering the portal as the app router does: the layout, each page with its own loader.
// ---------------------------------------------------------------------------------------------

interface PageModule {
  default: ComponentType;
  loader?: (queryClient: QueryClient, args: LoaderFunctionArgs) => Promise<unknown>;
}

function page(queryClient: QueryClient, mod: PageModule): Pick<RouteObject, 'Component' | 'loader'> {
  const load = mod.loader;
  return { Component: mod.default, ...(load ? { loader: (args: LoaderFunctionArgs) => load(queryClient, args) } : {}) };
}

function portalRoutes(queryClient: QueryClient): RouteObject[] {
  return [
    {
      path: '/portal',
      element: <PortalLayout />,
      HydrateFallback: () => null,
      children: [
        { index: true, ...page(queryClient, homePage) },
        { path: 'sites/:siteId', ...page(queryClient, sitePage) },
        { path: 'sites/:siteId/coverage', ...page(queryClient, coveragePage) },
        { path: 'sites/:siteId/devices', ...page(queryClient, devicesPage) },
        { path: 'sites/:siteId/service', ...page(queryClient, servicePage) },
        { path: 'sites/:siteId/contacts', ...page(queryClient, contactsPage) },
        { path: 'sites/:siteId/documents', ...page(queryClient, documentsPage) },
      ],
    },
    { path: '/p/:shortName', element: <h1>Firm sign-in page</h1> },
  ];
}

function renderPortal(path: string, session: SessionInfo = clientSession) {
  const queryClient = createQueryClient();
  queryClient.setQueryData(sessionQuery.queryKey, session);
  const router = createMemoryRouter(portalRoutes(queryClient), { initialEntries: [path] });
  const utils = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...utils, router, queryClient };
}

// ---------------------------------------------------------------------------------------------
// The API, per URL.
// ---------------------------------------------------------------------------------------------

type Handler = (body: unknown) => Response;

interface PortalData {
  sites: PortalSite[];
  summary: PortalSiteSummary;
  coverage: PortalCoverage;
  devices: PortalDevice[];
  service: PortalService;
  contacts: ApiContact[];
  documents: PortalDocument[];
}

const cabinDevice: PortalDevice = {
  id: '9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4c99',
  description: 'Cabin porch door',
  kind: 'Door contact',
  whenArmed: 'When the alarm is set, opening it starts the entry countdown so you can switch the alarm off.',
  chime: true,
  life: { state: 'ok', batteryDueOn: '2030-04-01', endOfLifeOn: null },
};

const site = (id: string) => `/api/portal/sites/${id}`;

/**
 * A fetch that answers the session and the portal's endpoints for Elm Hollow house (and a little
 * for the Lake cabin); `handlers` ("METHOD url") answer first. Unknown addresses get a 404.
 */
function stubApi(data: Partial<PortalData> = {}, handlers: Record<string, Handler> = {}) {
  const d: PortalData = {
    sites: [elmHollow, lakeCabin],
    summary: makeSummary(),
    coverage: makeCoverage(),
    devices,
    service: makeService(),
    contacts,
    documents,
    ...data,
  };
  let session = clientSession;
  const pageOf = (n: number) => ({ number: 1, size: 200, total: n });
  const answers: Record<string, () => Response> = {
    'GET /api/session': () => jsonResponse(200, session),
    'DELETE /api/session': () => {
      session = signedOutSession;
      return jsonResponse(204, null);
    },
    'GET /api/portal/sites': () => jsonResponse(200, { data: d.sites, page: pageOf(d.sites.length) }),
    [`GET ${site(SITE_ID)}`]: () => jsonResponse(200, { data: d.summary }),
    [`GET ${site(SITE_ID)}/coverage`]: () => jsonResponse(200, { data: d.coverage }),
    [`GET ${site(SITE_ID)}/devices`]: () => jsonResponse(200, { data: d.devices }),
    [`GET ${site(SITE_ID)}/service`]: () => jsonResponse(200, { data: d.service }),
    [`GET ${site(SITE_ID)}/contacts`]: () => jsonResponse(200, { data: d.contacts }),
    [`GET ${site(SITE_ID)}/documents`]: () => jsonResponse(200, { data: d.documents, page: pageOf(d.documents.length) }),
    [`GET ${site(OTHER_SITE_ID)}`]: () => jsonResponse(200, { data: makeSummary({ site: lakeCabin, devicesDueSoon: [], nextVisit: null }) }),
    [`GET ${site(OTHER_SITE_ID)}/devices`]: () => jsonResponse(200, { data: [cabinDevice] }),
  };
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    const method = init?.method ?? 'GET';
    const key = `${method} ${url}`;
    const body: unknown = typeof init?.body === 'string' ? JSON.parse(init.body) : undefined;
    const own = handlers[key];
    if (own) return Promise.resolve(own(body));
    const answer = answers[key];
    if (answer) return Promise.resolve(answer());
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: `Unexpected ${key}` } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function callsTo(fetchMock: ReturnType<typeof stubApi>, url: string, method = 'GET') {
  return fetchMock.mock.calls.filter(([u, init]) => u === url && (init?.method ?? 'GET') === method);
}

function bodyOf(call: [string, RequestInit?]): unknown {
  return JSON.parse(call[1]?.body as string);
}

/** Text split over several elements, matched on the innermost element that holds all of it. */
const wholeText = (text: string) => (_content: string, el: Element | null) =>
  el?.textContent === text && Array.from(el.children).every((c) => c.textContent !== text);

/** The severity word of a finding's badge ("Fix", "Check" or "Note"), without its read-out meaning. */
const severityWordIn = (el: HTMLElement) => within(el).getByText(/^(Fix|Check|Note)$/).textContent.split(':')[0];

const sectionLinks = () =>
  within(screen.getByRole('navigation', { name: 'Portal sections' }))
    .getAllByRole('link')
    .map((a) => [a.textContent, a.getAttribute('href')]);

// ---------------------------------------------------------------------------------------------
// Layout
// ---------------------------------------------------------------------------------------------

describe('portal layout', () => {
  it('shows the firm’s name, logo and phone in its accent colour, and the sections of the home', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Elm Hollow house' })).toBeInTheDocument();

    const banner = screen.getByRole('banner');
    expect(within(banner).getByText(FIRM_NAME)).toBeInTheDocument();
    expect(within(banner).getByText('Client portal · Ines Pike')).toBeInTheDocument();
    expect(banner.querySelector('img')).toHaveAttribute('src', clientSession.tenant!.logoUrl);
    expect(within(banner).getByRole('link', { name: `Call ${FIRM_NAME}: ${FIRM_PHONE}` })).toHaveAttribute('href', 'tel:5550102870');
    expect(banner.parentElement!.style.getPropertyValue('--color-brass-600')).toBe(ACCENT_READABLE);

    await screen.findByRole('navigation', { name: 'Portal sections' });
    expect(sectionLinks()).toEqual([
      ['Home', `/portal/sites/${SITE_ID}`],
      ['Doors & windows', `/portal/sites/${SITE_ID}/coverage`],
      ['Devices', `/portal/sites/${SITE_ID}/devices`],
      ['Visits', `/portal/sites/${SITE_ID}/service`],
      ['Contacts', `/portal/sites/${SITE_ID}/contacts`],
      ['Documents', `/portal/sites/${SITE_ID}/documents`],
    ]);
    expect(screen.getByRole('link', { name: 'Home' })).toHaveAttribute('aria-current', 'page');
    expect(screen.getByRole('link', { name: 'Devices' })).not.toHaveAttribute('aria-current');
    expect(document.title).toBe(`Elm Hollow house · ${FIRM_NAME} — client portal`);
  });

  it('with two homes, offers a switcher that keeps the section when switching', async () => {
    const fetchMock = stubApi();
    const { router } = renderPortal(`/portal/sites/${SITE_ID}/devices`);
    expect(await screen.findByRole('heading', { level: 2, name: 'Hall smoke alarm' })).toBeInTheDocument();

    const switcher = await screen.findByRole('combobox', { name: 'Home' });
    expect(switcher).toHaveValue(SITE_ID);
    expect(within(switcher).getAllByRole('option').map((o) => o.textContent)).toEqual([
      'Elm Hollow house — 27 Elm Hollow Road',
      'Lake cabin — 4 Heron Point Trail',
    ]);
    expect(screen.getByRole('link', { name: 'Devices' })).toHaveAttribute('aria-current', 'page');

    await userEvent.selectOptions(switcher, OTHER_SITE_ID);
    expect(await screen.findByRole('heading', { level: 2, name: 'Cabin porch door' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(`/portal/sites/${OTHER_SITE_ID}/devices`);
    expect(screen.queryByRole('heading', { name: 'Hall smoke alarm' })).toBeNull();
    expect(callsTo(fetchMock, `${site(OTHER_SITE_ID)}/devices`)).toHaveLength(1);
    expect(screen.getByRole('combobox', { name: 'Home' })).toHaveValue(OTHER_SITE_ID);
    expect(screen.getByRole('link', { name: 'Devices' })).toHaveAttribute('href', `/portal/sites/${OTHER_SITE_ID}/devices`);
    expect(screen.getByRole('link', { name: 'Devices' })).toHaveAttribute('aria-current', 'page');
    expect(document.title).toBe(`Lake cabin · ${FIRM_NAME} — client portal`);
  });

  it('switching from a home’s front page lands on the other home’s front page', async () => {
    stubApi();
    const { router } = renderPortal(`/portal/sites/${SITE_ID}`);
    await userEvent.selectOptions(await screen.findByRole('combobox', { name: 'Home' }), OTHER_SITE_ID);
    expect(await screen.findByRole('heading', { level: 1, name: 'Lake cabin' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(`/portal/sites/${OTHER_SITE_ID}`);
  });

  it('with one home, shows the sections but no switcher', async () => {
    stubApi({ sites: [elmHollow] });
    renderPortal(`/portal/sites/${SITE_ID}`);
    await screen.findByRole('navigation', { name: 'Portal sections' });
    expect(sectionLinks()).toHaveLength(6);
    expect(screen.queryByRole('combobox', { name: 'Home' })).toBeNull();
    expect(screen.queryByLabelText('Home')).toBeNull();
  });

  it('calls the monitoring center and keeps Mullion’s brass when the firm has no office phone or usable accent', async () => {
    stubApi();
    const tenant = { ...clientSession.tenant!, phone: '', accentColorReadable: 'tomato' };
    renderPortal(`/portal/sites/${SITE_ID}`, { ...clientSession, tenant });
    await screen.findByRole('heading', { level: 1, name: 'Elm Hollow house' });
    const banner = screen.getByRole('banner');
    expect(within(banner).getByRole('link', { name: `Call ${FIRM_NAME}: ${CENTER_PHONE}` })).toHaveAttribute('href', 'tel:5550104400');
    expect(banner.parentElement!.style.getPropertyValue('--color-brass-600')).toBe(MULLION_BRASS);
  });

  it('signs out and returns to the firm’s own sign-in page', async () => {
    const fetchMock = stubApi();
    const { router } = renderPortal(`/portal/sites/${SITE_ID}`);
    await userEvent.click(await screen.findByRole('button', { name: 'Sign out' }));
    expect(await screen.findByRole('heading', { name: 'Firm sign-in page' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/p/lanternfield');
    expect(callsTo(fetchMock, '/api/session', 'DELETE')).toHaveLength(1);
  });

  it('sends /portal straight to the household’s first home', async () => {
    stubApi();
    const { router } = renderPortal('/portal');
    expect(await screen.findByRole('heading', { level: 1, name: 'Elm Hollow house' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(`/portal/sites/${SITE_ID}`);
  });

  it('greets a household whose home is not recorded yet and gives the firm’s numbers', async () => {
    stubApi({ sites: [] });
    const { router } = renderPortal('/portal');
    expect(await screen.findByRole('heading', { level: 1, name: 'Hello, Ines' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/portal');
    expect(screen.getByText('Your home is not in the portal yet')).toBeInTheDocument();
    const card = screen.getByRole('region', { name: 'Your alarm firm' });
    expect(within(card).getByRole('link', { name: new RegExp(FIRM_PHONE.replace(/[()]/g, '\\$&')) })).toHaveAttribute('href', 'tel:5550102870');
    expect(within(card).getByRole('link', { name: /Monitoring center — Ridgeway Monitoring/ })).toHaveAttribute('href', 'tel:5550104400');
    expect(screen.queryByRole('navigation', { name: 'Portal sections' })).toBeNull();
  });
});

// ---------------------------------------------------------------------------------------------
// A home's front page
// ---------------------------------------------------------------------------------------------

describe('portal site home', () => {
  it('shows protection, life safety with the caution, upkeep due, the next visit and the firm', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Elm Hollow house' })).toBeInTheDocument();
    expect(screen.getByText('27 Elm Hollow Road, Fenwick Falls')).toBeInTheDocument();

    const protection = screen.getByRole('region', { name: 'Protection' });
    expect(within(protection).getByText(SUMMARY_SENTENCE)).toBeInTheDocument();
    const counts = [...protection.querySelectorAll('dt')].map((dt) => [dt.textContent, dt.nextElementSibling?.textContent]);
    expect(counts).toEqual([
      ['Protected', '4'],
      ['No sensor yet', '3'],
      ['Of those, reachable from the ground', '2'],
    ]);
    expect(within(protection).getByRole('link', { name: 'See every door and window' })).toHaveAttribute('href', `/portal/sites/${SITE_ID}/coverage`);

    const lifeSafety = screen.getByRole('region', { name: 'Smoke and carbon monoxide' });
    const findings = within(within(lifeSafety).getByRole('list', { name: 'Life-safety findings' })).getAllByRole('listitem');
    expect(findings.map((li) => li.querySelector('span.min-w-0')?.textContent)).toEqual(lifeSafetyMessages.slice(0, 4));
    // the one severity scale, in words beside the triangle: three to fix, then one to check
    expect(findings.map((li) => severityWordIn(li))).toEqual(['Fix', 'Fix', 'Fix', 'Check']);
    expect(within(lifeSafety).queryByText(lifeSafetyMessages[4]!)).toBeNull();
    expect(within(lifeSafety).getByRole('link', { name: '2 more — see the rules and where' })).toHaveAttribute('href', `/portal/sites/${SITE_ID}/coverage`);
    expect(within(lifeSafety).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();

    const upkeep = screen.getByRole('region', { name: 'Batteries and upkeep' });
    const due = within(upkeep).getAllByRole('listitem');
    expect(due.map((li) => li.textContent)).toEqual([
      'Garage heat alarmHeat alarmCheck the date on its label — replace by March 2031 at the latest',
      'Hall smoke alarmSmoke alarmBattery due in March 2027',
      'Landing CO alarmCO alarmReplace now: past its end of life',
    ]);
    expect(within(upkeep).getByRole('link', { name: 'All devices' })).toHaveAttribute('href', `/portal/sites/${SITE_ID}/devices`);

    const next = screen.getByRole('region', { name: 'Next visit' });
    // 15:30 UTC is 9:30 in the morning at the house (America/Chicago), whatever the browser's zone
    expect(within(next).getByText(/^Dec 8, 2026, 9:30\sAM$/)).toBeInTheDocument();
    expect(within(next).getByText('Yearly inspection')).toBeInTheDocument();
    expect(within(next).getByRole('link', { name: 'Ask for a visit' })).toHaveAttribute('href', `/portal/sites/${SITE_ID}/service#request`);
    expect(within(next).getByRole('link', { name: 'All visits' })).toHaveAttribute('href', `/portal/sites/${SITE_ID}/service`);

    const firm = screen.getByRole('region', { name: 'Your alarm firm' });
    const phones = within(firm).getAllByRole('link');
    expect(phones.map((a) => [a.textContent, a.getAttribute('href')])).toEqual([
      [`${FIRM_NAME}, office${FIRM_PHONE}`, 'tel:5550102870'],
      [`Monitoring center — Ridgeway Monitoring${CENTER_PHONE}`, 'tel:5550104400'],
    ]);
  });

  it('lists exactly four findings without a “more” link, and points to the rest of many due devices', async () => {
    const many: PortalDevice[] = Array.from({ length: 6 }, (_, i) => ({
      ...hallSmokeDevice,
      id: `9e1d2c3b-4a5f-4e6d-8c7b-0a1f2e3d4d0${i}`,
      description: `Smoke alarm ${i + 1}`,
    }));
    const summary = makeSummary();
    stubApi({ summary: { ...summary, lifeSafety: { ...summary.lifeSafety, findings: summary.lifeSafety.findings.slice(0, 4) }, devicesDueSoon: many } });
    renderPortal(`/portal/sites/${SITE_ID}`);
    const lifeSafety = await screen.findByRole('region', { name: 'Smoke and carbon monoxide' });
    expect(within(lifeSafety).getAllByRole('listitem')).toHaveLength(4);
    expect(within(lifeSafety).queryByRole('link', { name: /more/ })).toBeNull();

    const upkeep = screen.getByRole('region', { name: 'Batteries and upkeep' });
    expect(within(upkeep).getAllByRole('listitem').map((li) => li.querySelector('.font-medium')?.textContent)).toEqual([
      'Smoke alarm 1',
      'Smoke alarm 2',
      'Smoke alarm 3',
      'Smoke alarm 4',
    ]);
    expect(within(upkeep).getByRole('link', { name: '2 more to look at — all devices' })).toHaveAttribute('href', `/portal/sites/${SITE_ID}/devices`);
  });

  it('puts the severity word beside each life-safety triangle, most severe first', async () => {
    const summary = makeSummary();
    stubApi({
      summary: {
        ...summary,
        lifeSafety: {
          caution: LIFE_SAFETY_CAUTION,
          findings: [
            { code: 'smoke_in_garage', severity: 'info', message: '“Garage smoke alarm” is in Garage (Ground floor).' },
            { code: 'sleeping_area_unknown', severity: 'warning', message: 'Main bedroom (Upstairs) does not say which landing serves it.' },
            { code: 'life_safety_zone_programming', severity: 'error', message: '“Stair smoke alarm” is not reported to the monitoring center.' },
          ],
        },
      },
    });
    renderPortal(`/portal/sites/${SITE_ID}`);
    const lifeSafety = await screen.findByRole('region', { name: 'Smoke and carbon monoxide' });
    const findings = within(within(lifeSafety).getByRole('list', { name: 'Life-safety findings' })).getAllByRole('listitem');
    expect(findings.map((li) => severityWordIn(li))).toEqual(['Fix', 'Check', 'Note']);
    expect(within(findings[0]!).getByText('“Stair smoke alarm” is not reported to the monitoring center.')).toBeInTheDocument();
    // the word's meaning is read out, and the triangle is drawn beside it
    expect(findings[0]).toHaveTextContent('Fix: something that must change');
    expect(findings.every((li) => li.querySelector('svg path[d^="M8 1.6"]') !== null)).toBe(true);
    expect(within(lifeSafety).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('lists a smoke alarm not set up to protect among the upkeep, with “Not protecting”', async () => {
    stubApi({ summary: makeSummary({ devicesDueSoon: [{ ...stairSmokeDevice, life: { state: 'soon', batteryDueOn: null, endOfLifeOn: '2027-01-31', endOfLifeBasis: 'manufactured' } }] }) });
    renderPortal(`/portal/sites/${SITE_ID}`);
    const upkeep = await screen.findByRole('region', { name: 'Batteries and upkeep' });
    const [row] = within(upkeep).getAllByRole('listitem');
    expect(within(row!).getByText('Not protecting')).toBeInTheDocument();
    expect(within(row!).getByText('Replace by January 2027')).toBeInTheDocument();
  });

  it('says so when nothing is recorded, due or booked', async () => {
    stubApi({
      summary: makeSummary({
        coverage: { openings: { total: 0, protected: 0, unprotectedGroundReachable: 0 }, summary: 'No openings recorded' },
        lifeSafety: { findings: [], caution: null },
        devicesDueSoon: [],
        nextVisit: null,
      }),
    });
    renderPortal(`/portal/sites/${SITE_ID}`);
    expect(await screen.findByText('Your firm has not recorded the doors and windows of this home yet.')).toBeInTheDocument();
    expect(screen.queryByText('No openings recorded')).toBeNull();
    expect(screen.getByText('Nothing to point out for the rooms and alarms your firm has recorded.')).toBeInTheDocument();
    expect(screen.getByText('Nothing due in the coming months.')).toBeInTheDocument();
    expect(screen.getByText('No visit booked.')).toBeInTheDocument();
  });
});

// ---------------------------------------------------------------------------------------------
// Doors and windows
// ---------------------------------------------------------------------------------------------

describe('portal coverage', () => {
  it('shows each opening with its state word, the openings without a sensor, the plan with its pins and the caution', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/coverage`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Doors and windows' })).toBeInTheDocument();
    expect(screen.getByText(COVERAGE_SUMMARY)).toBeInTheDocument();

    const ground = screen.getByRole('region', { name: 'Ground floor' });
    expect(within(ground).getByText(wholeText('Protected — Kitchen window'))).toBeInTheDocument();
    expect(within(ground).getByText(wholeText('Protected — Back door'))).toBeInTheDocument();
    expect(within(within(ground).getByText('Pantry window').closest('li')!).getByText('No sensor')).toBeInTheDocument();
    const upstairs = screen.getByRole('region', { name: 'Upstairs' });
    expect(within(within(upstairs).getByText('Dormer window').closest('li')!).getByText('No sensor')).toBeInTheDocument();

    const missing = screen.getByRole('region', { name: 'No sensor yet' });
    const rows = within(within(missing).getByRole('list', { name: 'Doors and windows without a sensor' })).getAllByRole('listitem');
    // ground-reachable first, each with its room and floor
    expect(rows.map((li) => li.textContent)).toEqual([
      'Pantry window · WindowKitchen, Ground floor · reachable from the ground',
      'Kitchen skylight · SkylightKitchen, Ground floor',
      'Dormer window · WindowMain bedroom, Upstairs',
    ]);

    expect(within(ground).getByRole('img', { name: 'Floor plan of Ground floor' })).toHaveAttribute('src', PLAN_URL);
    expect(within(ground).getByRole('img', { name: 'Zone 3: Kitchen window (window contact)' })).toHaveStyle({ left: '30%', top: '40%' });
    expect(within(upstairs).queryByRole('img', { name: /Floor plan/ })).toBeNull();

    const lifeSafety = screen.getByRole('region', { name: 'Smoke and carbon monoxide' });
    expect(within(lifeSafety).getByText('Main bedroom (Upstairs) has no smoke alarm in service.')).toBeInTheDocument();
    expect(within(lifeSafety).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('keeps the caution without findings, and says every opening has a sensor when none is missing', async () => {
    const coverage = makeCoverage();
    const allProtected = coverage.floors.map((f) => ({ ...f, rooms: f.rooms.map((r) => ({ ...r, openings: r.openings.map((o) => ({ ...o, protected: true, zoneDescription: o.label })) })) }));
    stubApi({ coverage: { ...coverage, findings: [], caution: null, floors: allProtected, summary: 'All 6 doors and windows protected' } });
    renderPortal(`/portal/sites/${SITE_ID}/coverage`);
    expect(await screen.findByText('All 6 doors and windows protected')).toBeInTheDocument();
    expect(within(screen.getByRole('region', { name: 'No sensor yet' })).getByText('Every door and window recorded has a sensor.')).toBeInTheDocument();
    expect(screen.queryByRole('list', { name: 'Doors and windows without a sensor' })).toBeNull();
    // the page still reports on smoke and CO, so the caution stays, word for word
    const lifeSafety = screen.getByRole('region', { name: 'Smoke and carbon monoxide' });
    expect(within(lifeSafety).getByText('Nothing to point out for the rooms and alarms your firm has recorded.')).toBeInTheDocument();
    expect(within(lifeSafety).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('words the findings Fix, Check or Note and shows a smoke alarm that is not set up to protect as not protecting', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/coverage`);
    const lifeSafety = await screen.findByRole('region', { name: 'Smoke and carbon monoxide' });
    const groups = within(lifeSafety).getAllByRole('listitem').filter((li) => li.parentElement?.getAttribute('aria-label') === 'Life-safety findings');
    // most severe first: the two to fix, then the note
    expect(groups.map((li) => severityWordIn(li))).toEqual(['Fix', 'Fix', 'Note']);
    expect(within(groups[2]!).getByText('A smoke alarm in a garage does not count for its level')).toBeInTheDocument();
    expect(within(lifeSafety).queryByText('Gap')).toBeNull();

    const upstairs = screen.getByRole('region', { name: 'Upstairs' });
    const notProtecting = within(upstairs).getByRole('list', { name: 'Not set up to protect in Main bedroom' });
    expect(notProtecting).toHaveTextContent('Not protecting — Stair smoke alarm (smoke alarm) is here but not set up to protect.');
    // never listed as a device that is there to protect the room
    expect(within(upstairs).queryByText(/Also here/)).toBeNull();
    const ground = screen.getByRole('region', { name: 'Ground floor' });
    expect(within(ground).getByText('Also here: Hall smoke alarm (smoke alarm)')).toBeInTheDocument();
    expect(within(ground).queryByText(/not set up to protect/)).toBeNull();
  });

  it('never shows where a rule comes from, even when the answer carries it', async () => {
    const coverage = makeCoverage();
    const leaky = coverage.findings.map((f) => ({
      ...f,
      source: 'NFPA 72 Chapter 29, locations to avoid — from memory; NFPA 72 §29.8.1 — references.md 4.1 (MEMORY)',
      evidence: 'memory' as const,
    }));
    stubApi({ coverage: { ...coverage, findings: leaky } });
    renderPortal(`/portal/sites/${SITE_ID}/coverage`);
    await screen.findByRole('region', { name: 'Smoke and carbon monoxide' });
    expect(document.body.textContent).not.toMatch(/from memory|references\.md|Source:/i);
  });

  it('says the home is not recorded yet when there are no floors', async () => {
    stubApi({ coverage: makeCoverage({ floors: [], findings: [], caution: null, plans: [] }) });
    renderPortal(`/portal/sites/${SITE_ID}/coverage`);
    expect(await screen.findByText('Not recorded yet')).toBeInTheDocument();
  });
});

// ---------------------------------------------------------------------------------------------
// Devices
// ---------------------------------------------------------------------------------------------

describe('portal devices', () => {
  it('shows each device’s name, life, kind, what it does when armed and its chime — and nothing else', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/devices`);
    const list = await screen.findByRole('list', { name: 'Devices' });
    const items = within(list).getAllByRole('listitem');
    const LS = ' (smoke, heat or carbon monoxide: life safety)';
    expect(items.map((li) => li.textContent)).toEqual([
      `Back doorNo battery date on recordDoor contact${backDoorDevice.whenArmed}Chimes when opened while the alarm is off`,
      `Garage heat alarmCheck the date on its label — replace by March 2031 at the latestHeat alarm${LS}${garageHeatDevice.whenArmed}No chime`,
      `Hall smoke alarmBattery due in March 2027Smoke alarm${LS}${hallSmokeDevice.whenArmed}No chime`,
      `Kitchen windowBattery due June 2029Window contact${kitchenWindowDevice.whenArmed}Chimes when opened while the alarm is off`,
      `Landing CO alarmReplace now: past its end of lifeCO alarm${LS}${landingCoDevice.whenArmed}No chime`,
      `Stair smoke alarmNot protectingReplace by May 2033Smoke alarm${LS}${NOT_PROTECTING_WORDS}No chime`,
    ]);
    expect(within(items[0]!).getByRole('heading', { level: 2, name: 'Back door' })).toBeInTheDocument();
    expect(screen.getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('marks each smoke, heat and CO device with the triangle, and shows the caution', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/devices`);
    const list = await screen.findByRole('list', { name: 'Devices' });
    const marked = within(list)
      .getAllByRole('listitem')
      .filter((li) => li.querySelector('h2 svg path[d^="M8 1.6"]') !== null)
      .map((li) => li.querySelector('h2')?.textContent);
    expect(marked).toEqual(['Garage heat alarm', 'Hall smoke alarm', 'Landing CO alarm', 'Stair smoke alarm']);
    expect(screen.getByText('The triangle marks smoke, heat and carbon monoxide alarms.')).toBeInTheDocument();
    expect(screen.getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('never says “Nothing to change” or “Good until”, and asks for the label date when the manufacture date is missing', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/devices`);
    const list = await screen.findByRole('list', { name: 'Devices' });
    expect(document.body.textContent).not.toMatch(/Nothing to change|Good until|good until/);
    const garage = within(list).getByRole('heading', { level: 2, name: 'Garage heat alarm' }).closest('li')!;
    expect(within(garage).getByText('Check the date on its label — replace by March 2031 at the latest')).toBeInTheDocument();
    const smoke = within(list).getByRole('heading', { level: 2, name: 'Hall smoke alarm' }).closest('li')!;
    expect(within(smoke).queryByText(/Good until/)).toBeNull();
  });

  it('shows “Not protecting” on a smoke alarm whose zone does not protect, with the words that say why', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/devices`);
    const list = await screen.findByRole('list', { name: 'Devices' });
    const stair = within(list).getByRole('heading', { level: 2, name: 'Stair smoke alarm' }).closest('li')!;
    expect(within(stair).getByText('Not protecting')).toBeInTheDocument();
    expect(within(stair).getByText(NOT_PROTECTING_WORDS)).toBeInTheDocument();
    // only that one
    expect(within(list).getAllByText('Not protecting')).toHaveLength(1);
  });

  it('says when no device is recorded', async () => {
    stubApi({ devices: [] });
    renderPortal(`/portal/sites/${SITE_ID}/devices`);
    expect(await screen.findByText('No devices recorded yet')).toBeInTheDocument();
    expect(screen.queryByRole('list', { name: 'Devices' })).toBeNull();
  });
});

// ---------------------------------------------------------------------------------------------
// Visits and the request form
// ---------------------------------------------------------------------------------------------

describe('portal visits', () => {
  it('shows upcoming visits with their state and technician, and past visits with notes, report and files', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/service`);
    const upcoming = await screen.findByRole('list', { name: 'Upcoming visits' });
    const [booked, requested] = within(upcoming).getAllByRole('listitem');
    expect(within(booked!).getByText('Yearly inspection')).toBeInTheDocument();
    expect(within(booked!).getByText('Booked')).toBeInTheDocument();
    expect(await within(booked!).findByText(/^Dec 8, 2026, 9:30\sAM · with Corin$/)).toBeInTheDocument();
    expect(within(booked!).getByText('Yearly check of every sensor and the siren.')).toBeInTheDocument();
    expect(within(requested!).getByText('Service call')).toBeInTheDocument();
    expect(within(requested!).getByText('Requested — not booked yet')).toBeInTheDocument();
    expect(within(requested!).getByText(`${FIRM_NAME} will call to agree a time.`)).toBeInTheDocument();

    const past = screen.getByRole('list', { name: 'Past visits' });
    const [install] = within(past).getAllByRole('listitem').filter((li) => li.parentElement === past);
    expect(within(install!).getByText('Install')).toBeInTheDocument();
    expect(within(install!).getByText('Done')).toBeInTheDocument();
    // 02:10 UTC on the 15th is the evening of the 14th at the house (America/Chicago)
    expect(await within(install!).findByText('Oct 14, 2026')).toBeInTheDocument();
    expect(within(install!).getByText('Your new keypad is by the back door. The code we set together is yours to change.')).toBeInTheDocument();
    expect(within(install!).getByRole('link', { name: 'Visit report (PDF)' })).toHaveAttribute('href', REPORT_URL);
    expect(within(install!).getByRole('link', { name: 'Photo of the new keypad' })).toHaveAttribute('href', KEYPAD_PHOTO_URL);
  });

  it('says when nothing is booked and no visit is recorded', async () => {
    stubApi({ service: { upcoming: [], past: [] } });
    renderPortal(`/portal/sites/${SITE_ID}/service`);
    expect(await screen.findByText('Nothing booked or requested.')).toBeInTheDocument();
    expect(screen.getByText('No visits recorded yet.')).toBeInTheDocument();
  });

  it('shows the field errors of an empty request and sends nothing', async () => {
    const fetchMock = stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/service`);
    await userEvent.click(await screen.findByRole('button', { name: 'Send request' }));
    expect(await screen.findByText('Describe what needs attention.')).toBeInTheDocument();
    expect(screen.getByText('Say when suits you.')).toBeInTheDocument();
    expect(screen.getByLabelText('What needs attention?')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByLabelText('When suits you?')).toHaveAttribute('aria-invalid', 'true');
    expect(callsTo(fetchMock, `${site(SITE_ID)}/service-requests`, 'POST')).toHaveLength(0);
  });

  it('sends the request with the chosen device, confirms it and shows it as requested', async () => {
    let service = makeService({ upcoming: [] });
    const created = {
      id: '10b00000-0000-4000-8000-000000000042',
      kind: 'service_call',
      kindLabel: 'Service call',
      state: 'requested' as const,
      scheduledStart: null,
      technicianFirstName: null,
      summary: 'The hall smoke alarm chirps at night.',
      requestedByClient: true,
    };
    const fetchMock = stubApi({}, {
      [`GET ${site(SITE_ID)}/service`]: () => jsonResponse(200, { data: service }),
      [`POST ${site(SITE_ID)}/service-requests`]: () => {
        service = { ...service, upcoming: [created] };
        return jsonResponse(201, { data: { ...created, clientNotes: '' } });
      },
    });
    renderPortal(`/portal/sites/${SITE_ID}/service`);
    expect(await screen.findByText('Nothing booked or requested.')).toBeInTheDocument();

    await userEvent.type(screen.getByLabelText('What needs attention?'), '  The hall smoke alarm chirps at night. ');
    await userEvent.selectOptions(await screen.findByLabelText('Which device? (optional)'), 'Hall smoke alarm — Smoke alarm');
    await userEvent.type(screen.getByLabelText('When suits you?'), 'Weekday mornings, not Fridays');
    await userEvent.click(screen.getByRole('button', { name: 'Send request' }));

    expect(await screen.findByRole('status')).toHaveTextContent(`Request sent. ${FIRM_NAME} will be in touch to book the visit.`);
    const posts = callsTo(fetchMock, `${site(SITE_ID)}/service-requests`, 'POST');
    expect(posts).toHaveLength(1);
    expect(bodyOf(posts[0]!)).toEqual({ description: 'The hall smoke alarm chirps at night.', preferredTimes: 'Weekday mornings, not Fridays', zoneId: HALL_SMOKE_ZONE });

    const upcoming = await screen.findByRole('list', { name: 'Upcoming visits' });
    expect(within(upcoming).getByText('Requested — not booked yet')).toBeInTheDocument();
    expect(within(upcoming).getByText('The hall smoke alarm chirps at night.')).toBeInTheDocument();
    expect(screen.getByLabelText('What needs attention?')).toHaveValue('');
    expect(screen.getByLabelText('When suits you?')).toHaveValue('');
    expect(screen.getByLabelText('Which device? (optional)')).toHaveValue('');
  });

  it('sends no device when none is chosen', async () => {
    const fetchMock = stubApi({}, { [`POST ${site(SITE_ID)}/service-requests`]: () => jsonResponse(201, { data: {} }) });
    renderPortal(`/portal/sites/${SITE_ID}/service`);
    await screen.findByLabelText('Which device? (optional)');
    await userEvent.type(screen.getByLabelText('What needs attention?'), 'Keypad light stays on');
    await userEvent.type(screen.getByLabelText('When suits you?'), 'Any afternoon');
    await userEvent.click(screen.getByRole('button', { name: 'Send request' }));
    await waitFor(() => expect(callsTo(fetchMock, `${site(SITE_ID)}/service-requests`, 'POST')).toHaveLength(1));
    const body = bodyOf(callsTo(fetchMock, `${site(SITE_ID)}/service-requests`, 'POST')[0]!) as Record<string, unknown>;
    expect(body).toEqual({ description: 'Keypad light stays on', preferredTimes: 'Any afternoon' });
    expect(Object.keys(body)).not.toContain('zoneId');
  });

  it('puts the server’s field errors on the fields', async () => {
    stubApi({}, {
      [`POST ${site(SITE_ID)}/service-requests`]: () =>
        jsonResponse(400, {
          error: {
            code: 'validation_failed',
            message: 'description: Say a little more about what happens.',
            fields: { description: 'Say a little more about what happens.', zoneId: 'That device is not at this home.' },
          },
        }),
    });
    renderPortal(`/portal/sites/${SITE_ID}/service`);
    await userEvent.type(await screen.findByLabelText('What needs attention?'), 'Beeps');
    await userEvent.selectOptions(await screen.findByLabelText('Which device? (optional)'), HALL_SMOKE_ZONE);
    await userEvent.type(screen.getByLabelText('When suits you?'), 'Saturdays');
    await userEvent.click(screen.getByRole('button', { name: 'Send request' }));

    expect(await screen.findByText('Say a little more about what happens.')).toBeInTheDocument();
    expect(screen.getByText('That device is not at this home.')).toBeInTheDocument();
    expect(screen.getByLabelText('What needs attention?')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByLabelText('Which device? (optional)')).toHaveAttribute('aria-invalid', 'true');
    expect(screen.getByLabelText('When suits you?')).not.toHaveAttribute('aria-invalid');
    // every error found its field, so no message for the whole form, and no confirmation
    expect(screen.queryByText('description: Say a little more about what happens.')).toBeNull();
    expect(screen.queryByRole('status')).toBeNull();
  });
});

// ---------------------------------------------------------------------------------------------
// Contacts
// ---------------------------------------------------------------------------------------------

describe('portal contacts', () => {
  it('says the firm confirms changes, and saves the edited list to the portal address', async () => {
    const saved: ApiContact[] = [
      ...contacts,
      { id: 'c0000000-0000-4000-8000-000000000003', siteId: SITE_ID, position: 3, name: 'Ines Pike', relation: 'Owner', phone: '+15550107712', altPhone: '' },
    ];
    const fetchMock = stubApi({}, { [`PUT ${site(SITE_ID)}/contacts`]: () => jsonResponse(200, { data: saved }) });
    renderPortal(`/portal/sites/${SITE_ID}/contacts`);
    expect(await screen.findByText('Dario Pike')).toBeInTheDocument();
    expect(screen.getByText(`Changes you save here go to ${FIRM_NAME}, who confirms them with the monitoring center. Until they do, the center may still call the people on the previous list.`)).toBeInTheDocument();
    // the staff history of changes is not part of the portal
    expect(screen.queryByRole('button', { name: /Show changes/ })).toBeNull();
    expect(fetchMock.mock.calls.some(([url]) => url.endsWith('/contacts/changes'))).toBe(false);

    await userEvent.click(screen.getByRole('button', { name: 'Edit' }));
    await userEvent.click(screen.getByRole('button', { name: 'Add contact' }));
    const added = screen.getByText('Contact 3').closest('li')!;
    await userEvent.type(within(added).getByLabelText('Name'), 'Ines Pike');
    await userEvent.type(within(added).getByLabelText('Relation'), 'Owner');
    await userEvent.type(within(added).getByLabelText('Phone'), '555 010 7712');
    await userEvent.click(screen.getByRole('button', { name: 'Save contacts' }));

    expect(await screen.findByRole('status')).toHaveTextContent(`Contacts saved. ${FIRM_NAME} will confirm the change with the monitoring center.`);
    const puts = callsTo(fetchMock, `${site(SITE_ID)}/contacts`, 'PUT');
    expect(puts).toHaveLength(1);
    expect(bodyOf(puts[0]!)).toEqual({
      contacts: [
        { name: 'Dario Pike', relation: 'Owner', phone: '+1 555 010 7711', altPhone: '' },
        { name: 'Maren Aldwick', relation: 'Neighbour', phone: '+1 555 010 3390', altPhone: '+1 555 010 3391' },
        { name: 'Ines Pike', relation: 'Owner', phone: '555 010 7712', altPhone: '' },
      ],
    });
    expect(callsTo(fetchMock, `/api/sites/${SITE_ID}/contacts`, 'PUT')).toHaveLength(0);
    // back to the list, now as the server saved it
    await waitFor(() => expect(screen.queryByRole('button', { name: 'Save contacts' })).toBeNull());
    expect(screen.getByText('Ines Pike')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: '+1 555 010 7712' })).toHaveAttribute('href', 'tel:+15550107712');
  });
});

// ---------------------------------------------------------------------------------------------
// Documents
// ---------------------------------------------------------------------------------------------

describe('portal documents', () => {
  it('lists the shared documents with their download links', async () => {
    stubApi();
    renderPortal(`/portal/sites/${SITE_ID}/documents`);
    const list = await screen.findByRole('list', { name: 'Shared documents' });
    const links = within(list).getAllByRole('link');
    expect(links.map((a) => a.getAttribute('href'))).toEqual(documents.map((d) => d.fileUrl));
    expect(links[0]).toHaveTextContent('Installation certificate');
    expect(links[0]).toHaveTextContent(/Certificate · Install, Oct 14, 2026 · 242 KB/);
    // no title: the kind stands in for it
    expect(within(links[1]!).getByText('Alarm permit', { selector: '.font-medium' })).toBeInTheDocument();
    expect(links[1]).toHaveTextContent(/Alarm permit · Sep 30, 2026 · 812 B/);
    expect(links.every((a) => a.textContent.includes('Download'))).toBe(true);
    expect(screen.getByText(`What ${FIRM_NAME} has shared with you about this home.`)).toBeInTheDocument();
  });

  it('says when nothing is shared yet', async () => {
    stubApi({ documents: [] });
    renderPortal(`/portal/sites/${SITE_ID}/documents`);
    expect(await screen.findByText('Nothing shared yet')).toBeInTheDocument();
    expect(screen.queryByRole('list', { name: 'Shared documents' })).toBeNull();
  });
});

// ---------------------------------------------------------------------------------------------
// Words and colours
// ---------------------------------------------------------------------------------------------

describe('life words', () => {
  const noBasis = { endOfLifeBasis: null };

  it('words a battery as due, soon or ok, and says when no date is on record', () => {
    expect(lifeWords({ state: 'due', batteryDueOn: '2026-10-01', endOfLifeOn: null, ...noBasis })).toEqual({ text: 'Battery due since October 2026', tone: 'bad' });
    expect(lifeWords({ state: 'soon', batteryDueOn: '2027-03-14', endOfLifeOn: null, ...noBasis })).toEqual({ text: 'Battery due in March 2027', tone: 'warn' });
    expect(lifeWords({ state: 'ok', batteryDueOn: '2029-06-30', endOfLifeOn: null, ...noBasis })).toEqual({ text: 'Battery due June 2029', tone: 'neutral' });
    expect(lifeWords({ state: 'ok', batteryDueOn: null, endOfLifeOn: null, ...noBasis })).toEqual({ text: 'No battery date on record', tone: 'neutral' });
  });

  it('words a smoke, heat or CO device by when to replace it, from its manufacture date', () => {
    const made = { endOfLifeBasis: 'manufactured' as const };
    expect(lifeWords({ state: 'ok', batteryDueOn: null, endOfLifeOn: '2034-08-01', ...made }, true)).toEqual({ text: 'Replace by August 2034', tone: 'ok' });
    expect(lifeWords({ state: 'soon', batteryDueOn: null, endOfLifeOn: '2027-01-31', ...made }, true)).toEqual({ text: 'Replace by January 2027', tone: 'warn' });
    expect(lifeWords({ state: 'due', batteryDueOn: null, endOfLifeOn: '2026-11-02', ...made }, true)).toEqual({ text: 'Replace now: past its end of life', tone: 'bad' });
    // the battery when it comes first and is near or past
    expect(lifeWords({ state: 'soon', batteryDueOn: '2027-03-14', endOfLifeOn: '2034-08-01', ...made }, true)).toEqual({ text: 'Battery due in March 2027', tone: 'warn' });
    expect(lifeWords({ state: 'due', batteryDueOn: '2026-09-01', endOfLifeOn: '2034-08-01', ...made }, true)).toEqual({ text: 'Battery due since September 2026', tone: 'bad' });
    // replacing it renews the battery: the end of life wins a tie
    expect(lifeWords({ state: 'due', batteryDueOn: '2026-09-01', endOfLifeOn: '2026-09-01', ...made }, true).text).toBe('Replace now: past its end of life');
    expect(lifeWords({ state: 'soon', batteryDueOn: '2027-03-14', endOfLifeOn: '2027-02-01', ...made }, true).text).toBe('Replace by February 2027');
  });

  it('never says “Nothing to change” or “Good until” about a smoke, heat or CO device', () => {
    const lives = [
      { state: 'ok', batteryDueOn: null, endOfLifeOn: '2034-08-01', endOfLifeBasis: 'manufactured' },
      { state: 'ok', batteryDueOn: '2029-06-30', endOfLifeOn: '2034-08-01', endOfLifeBasis: 'manufactured' },
      { state: 'check', batteryDueOn: null, endOfLifeOn: '2031-03-20', endOfLifeBasis: 'installed' },
      { state: 'check', batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: 'unknown' },
      { state: 'ok', batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: null },
    ] as const;
    for (const life of lives) {
      const { text } = lifeWords(life, true);
      expect(text).not.toMatch(/Nothing to change|Good until|good until/);
    }
    // a smoke alarm with no dates at all is not "nothing to change" either
    expect(lifeWords({ state: 'ok', batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: null }, true)).toEqual({ text: 'Check the date on its label', tone: 'warn' });
  });

  it('asks for the date on the label when the manufacture date is not on record', () => {
    const fitted = { endOfLifeBasis: 'installed' as const };
    expect(lifeWords({ state: 'check', batteryDueOn: null, endOfLifeOn: '2031-03-20', ...fitted }, true)).toEqual({
      text: 'Check the date on its label — replace by March 2031 at the latest',
      tone: 'warn',
    });
    expect(lifeWords({ state: 'soon', batteryDueOn: null, endOfLifeOn: '2027-01-31', ...fitted }, true)).toEqual({
      text: 'Replace by January 2027 at the latest — check the date on its label',
      tone: 'warn',
    });
    // even installation + the period has passed: no number of years is claimed
    expect(lifeWords({ state: 'due', batteryDueOn: null, endOfLifeOn: '2026-02-01', ...fitted }, true)).toEqual({ text: 'Replace now: even the latest date has passed', tone: 'bad' });
    expect(lifeWords({ state: 'due', batteryDueOn: '2026-09-01', endOfLifeOn: '2031-03-20', ...fitted }, true)).toEqual({
      text: 'Battery due since September 2026 — check the date on its label',
      tone: 'bad',
    });
    // neither date on record
    expect(lifeWords({ state: 'check', batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: 'unknown' }, true)).toEqual({ text: 'Check the date on its label', tone: 'warn' });
    expect(lifeWords({ state: 'soon', batteryDueOn: '2027-03-14', endOfLifeOn: null, endOfLifeBasis: 'unknown' }, true)).toEqual({
      text: 'Battery due in March 2027 — check the date on its label',
      tone: 'warn',
    });
  });

  it('words a device as life safety from its life when the flag is missing', () => {
    expect(lifeWords({ state: 'check', batteryDueOn: null, endOfLifeOn: '2031-03-20', endOfLifeBasis: 'installed' }).text).toBe('Check the date on its label — replace by March 2031 at the latest');
    expect(lifeWords({ state: 'ok', batteryDueOn: null, endOfLifeOn: '2034-08-01' }).text).toBe('Replace by August 2034');
  });

  const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];
  const firstsAndLasts = (year: number) =>
    MONTHS.flatMap((_, m) => {
      const mm = String(m + 1).padStart(2, '0');
      const last = new Date(Date.UTC(year, m + 1, 0)).getUTCDate();
      return [`${year}-${mm}-01`, `${year}-${mm}-${last}`];
    });

  it.each(['UTC', 'Pacific/Honolulu', 'Pacific/Kiritimati', 'America/Chicago', 'Asia/Tokyo'])('names every month of a year on its first and last day in %s', (zone) => {
    const before = process.env.TZ;
    process.env.TZ = zone;
    try {
      if (zone === 'Pacific/Honolulu') {
        // the zone really is in force: midnight UTC on March 1 is still February here
        expect(new Date('2027-03-01T00:00:00Z').getMonth()).toBe(1);
        expect(new Intl.DateTimeFormat('en-US', { month: 'long' }).format(new Date('2027-03-01T00:00:00Z'))).toBe('February');
      }
      expect(firstsAndLasts(2027).map(monthYear)).toEqual(MONTHS.flatMap((m) => [`${m} 2027`, `${m} 2027`]));
      expect(monthYear('2027-12-31')).toBe('December 2027');
      expect(monthYear('2028-01-01')).toBe('January 2028');
      expect(monthYear('2028-02-29')).toBe('February 2028');
    } finally {
      if (before === undefined) delete process.env.TZ;
      else process.env.TZ = before;
    }
  });
});

describe('portal brand and visit words', () => {
  it('puts a readable accent on the brass variables, and falls back to Mullion’s brass', () => {
    expect(brandStyle('#1f5f8b')).toMatchObject({ '--color-brass-600': '#1f5f8b' });
    expect(brandStyle('red')).toMatchObject({ '--color-brass-600': MULLION_BRASS });
    expect(brandStyle(null)).toMatchObject({ '--color-brass-600': MULLION_BRASS });
  });

  it('dials a phone number as people write it', () => {
    expect(telHref('(555) 010-2870')).toBe('tel:5550102870');
    expect(telHref('+1 555 010 4400')).toBe('tel:+15550104400');
  });

  it('words every visit state', () => {
    const words = (['requested', 'scheduled', 'in_progress', 'completed', 'cancelled'] as const).map((state) => servicePage.visitStateWords({ state, scheduledStart: null }).word);
    expect(words).toEqual(['Requested — not booked yet', 'Booked', 'Under way', 'Done', 'Cancelled']);
  });
});
