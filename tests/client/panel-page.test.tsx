import { Suspense } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createAbility } from '@domain/abilities';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import PanelPage from '@/app/routes/firm/panel';
import { AbilityProvider } from '@/lib/ability';
import type { ApiPanel, ApiZone } from '@/types/api';
import { makePanel, makeZone, technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

function stubApi(panel: ApiPanel, zones: ApiZone[]) {
  const fetchMock = vi.fn((url: string) => {
    const path = url.split('?')[0];
    if (path === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
    if (path === `/api/panels/${panel.id}`) return Promise.resolve(jsonResponse(200, { data: panel }));
    if (path === `/api/panels/${panel.id}/zones`) return Promise.resolve(jsonResponse(200, { data: zones, page: { number: 1, size: 1000, total: zones.length } }));
    if (path === `/api/panels/${panel.id}/changes`) return Promise.resolve(jsonResponse(200, { data: [], page: { number: 1, size: 20, total: 0 } }));
    if (path === `/api/sites/${panel.siteId}`) return Promise.resolve(jsonResponse(200, { data: { id: panel.siteId, name: '14 Quarry Lane', timeZone: 'America/Chicago' } }));
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function renderPanelPage() {
  const ability = createAbility(technicianSession.rules);
  return renderRoutes(
    [
      {
        path: '/app/panels/:panelId',
        element: (
          <AbilityProvider value={ability}>
            <Suspense fallback={<p>Loading</p>}>
              <PanelPage />
            </Suspense>
          </AbilityProvider>
        ),
      },
    ],
    { path: '/app/panels/p1', session: technicianSession },
  );
}

const smoke = makeZone({
  id: 'z2',
  number: 10,
  description: 'Hall smoke',
  deviceType: 'smoke',
  zoneType: 'fire_24h',
  serial: '0533190',
  chime: false,
  batteryType: 'sealed 10-year',
  manufacturedOn: '2017-03-01',
  life: { batteryDueOn: '2027-03-01', endOfLifeOn: '2027-03-01', state: 'due' },
});

describe('panel page', () => {
  it('lists the zones and shows the life-safety caution word for word when a smoke zone is listed', async () => {
    stubApi(makePanel({ changedSinceProgrammed: true }), [makeZone(), smoke]);
    renderPanelPage();

    expect(await screen.findByRole('heading', { name: 'Main panel', level: 1 })).toBeInTheDocument();
    expect(await screen.findByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
    const table = screen.getByRole('table', { name: 'Zones of this panel' });
    expect(within(table).getByText('Hall smoke')).toBeInTheDocument();
    expect(within(table).getByText('Replace alarm due Mar 2027')).toBeInTheDocument();
    expect(within(table).getByText('0412877')).toHaveClass('font-mono');
    expect(screen.getByText('Changed since last programmed')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Mark as programmed' })).toBeEnabled();
    expect(await screen.findByRole('link', { name: '14 Quarry Lane' })).toHaveAttribute('href', '/app/sites/s1');
  });

  it('shows no caution when the panel has no smoke, heat or CO zone', async () => {
    stubApi(makePanel(), [makeZone()]);
    renderPanelPage();

    const table = await screen.findByRole('table', { name: 'Zones of this panel' });
    expect(within(table).getByText('Front door')).toBeInTheDocument();
    expect(within(table).getByText('Battery ok · Apr 2030')).toBeInTheDocument();
    expect(screen.queryByText(LIFE_SAFETY_CAUTION)).not.toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Mark as programmed' })).toBeDisabled();
  });

  it('sorts the zone table on the client and pages it 50 at a time', async () => {
    const zones = Array.from({ length: 60 }, (_, i) =>
      makeZone({ id: `z${i}`, number: 9 + i, description: `Window ${String(60 - i).padStart(2, '0')}`, deviceType: 'window_contact', zoneType: 'perimeter', serial: `05${String(i).padStart(5, '0')}` }),
    );
    const fetchMock = stubApi(makePanel({ zoneCount: 60, nextZoneNumber: null }), zones);
    renderPanelPage();

    const table = await screen.findByRole('table', { name: 'Zones of this panel' });
    expect(within(table).getAllByRole('row')).toHaveLength(51);
    expect(screen.getByText('1–50 of 60')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Next page' }));
    expect(screen.getByText('51–60 of 60')).toBeInTheDocument();

    await userEvent.click(within(table).getByRole('button', { name: /Description/ }));
    expect(screen.getByText('1–50 of 60')).toBeInTheDocument();
    expect(within(within(table).getAllByRole('row')[1]!).getByText('Window 01')).toBeInTheDocument();
    const zoneCalls = fetchMock.mock.calls.filter(([url]) => url.startsWith('/api/panels/p1/zones'));
    expect(zoneCalls).toHaveLength(1);
  });

  it('shows the panel checks — CP-01 and power — on the one severity scale, with “From memory” and its note', async () => {
    const audit: ApiPanel['audit'] = [
      {
        code: 'fire_phone_line_only',
        severity: 'error',
        field: 'commPath',
        clause: 'NFPA 72-2013 §26.6.3, one communications technology',
        evidence: 'public',
        message: 'This panel reports fire over a single phone line, which cannot tell the monitoring center when the line itself is cut.',
        topic: 'power',
        lifeSafety: true,
      },
      {
        code: 'swinger_high',
        severity: 'warning',
        field: 'swingerLimit',
        clause: 'CP-01 §4.3.2 swinger shutdown',
        evidence: 'memory',
        message: 'Swinger shutdown after 6 trips is above what CP-01 allows.',
        topic: 'cp01',
        lifeSafety: false,
      },
      {
        code: 'standby_battery_age_unknown',
        severity: 'info',
        field: 'batteryManufacturedOn',
        clause: 'Sealed lead-acid batteries: replace about 5 years after manufacture',
        evidence: 'practice',
        message: 'Record the date on the standby battery’s label.',
        topic: 'power',
        lifeSafety: false,
      },
    ];
    stubApi(makePanel({ audit }), [makeZone()]);
    renderPanelPage();

    const checks = (await screen.findByRole('heading', { name: 'Panel checks' })).closest('section')!;
    expect(screen.queryByRole('heading', { name: 'CP-01 findings' })).toBeNull();
    const item = (text: RegExp) => within(checks).getByText(text).closest('li')!;
    expect(within(item(/single phone line/)).getByText('Fix')).toBeInTheDocument();
    expect(within(item(/Swinger shutdown after 6 trips/)).getByText('Check')).toBeInTheDocument();
    expect(within(item(/Swinger shutdown after 6 trips/)).getByText('From memory')).toBeInTheDocument();
    expect(within(item(/standby battery’s label/)).getByText('Note')).toBeInTheDocument();
    expect(within(item(/single phone line/)).queryByText('From memory')).toBeNull();
    for (const old of ['Error', 'Warning']) expect(within(checks).queryByText(old)).toBeNull();
    // CP-01 first, then power and path
    expect(within(within(checks).getByRole('region', { name: 'Alarm reduction (CP-01)' })).getByText(/Swinger shutdown/)).toBeInTheDocument();
    expect(within(within(checks).getByRole('region', { name: 'Power and path' })).getByText(/single phone line/)).toBeInTheDocument();
    expect(within(checks).getByText(/“From memory” marks rules Mullion knows without a public text to cite/)).toBeInTheDocument();
    // a life-safety finding brings the caution
    expect(within(checks).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('works out the standby battery of a fire panel and carries the caution', async () => {
    const panel = makePanel({
      occupancy: 'household',
      standbyCurrentMa: 180,
      alarmCurrentMa: 900,
      batteryAh: 4,
      batteryManufacturedOn: '2024-02-01',
      standby: { duty: 'household_fire', standbyHours: 24, alarmMinutes: 4, neededAh: 4.38, requiredAh: 5.256, batteryDueOn: '2029-02-01' },
    });
    stubApi(panel, [makeZone()]);
    renderPanelPage();

    const card = (await screen.findByRole('heading', { name: 'Standby battery' })).closest('section')!;
    expect(within(card).getByText('Household fire')).toBeInTheDocument();
    expect(within(card).getByText('24 h standby + 4 min alarm')).toBeInTheDocument();
    expect(within(card).getByText('4.38 Ah · 5.26 Ah with 20% headroom')).toBeInTheDocument();
    expect(within(card).getByText('4 Ah')).toBeInTheDocument();
    expect(within(card).getByText('Too small')).toBeInTheDocument();
    expect(within(card).getByText('Feb 1, 2029')).toBeInTheDocument();
    expect(within(card).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('shows no caution on the standby battery of an intrusion-only panel', async () => {
    const panel = makePanel({
      standbyCurrentMa: 120,
      alarmCurrentMa: 600,
      batteryAh: 7,
      standby: { duty: 'intrusion', standbyHours: 4, alarmMinutes: 4, neededAh: 0.52, requiredAh: 0.624, batteryDueOn: null },
    });
    stubApi(panel, [makeZone()]);
    renderPanelPage();
    const card = (await screen.findByRole('heading', { name: 'Standby battery' })).closest('section')!;
    expect(within(card).getByText('Intrusion only')).toBeInTheDocument();
    expect(within(card).getByText('Enough')).toBeInTheDocument();
    expect(within(card).getByText('Record the battery label date')).toBeInTheDocument();
    expect(screen.queryByText(LIFE_SAFETY_CAUTION)).toBeNull();
  });

  it('asks to check the label date of a life-safety device without a manufacture date', async () => {
    const installedOnly = makeZone({
      id: 'z3',
      number: 11,
      description: 'Landing smoke',
      deviceType: 'smoke',
      zoneType: 'fire_24h',
      chime: false,
      batteryType: 'sealed 10-year',
      installedOn: '2021-06-10',
      manufacturedOn: null,
      life: { batteryDueOn: null, endOfLifeOn: '2031-06-10', endOfLifeBasis: 'installed', state: 'check' },
    });
    const nothing = makeZone({
      id: 'z4',
      number: 12,
      description: 'Loft heat',
      deviceType: 'heat',
      zoneType: 'fire_24h',
      chime: false,
      installedOn: null,
      manufacturedOn: null,
      batteryType: null,
      life: { batteryDueOn: null, endOfLifeOn: null, endOfLifeBasis: 'unknown', state: 'check' },
    });
    stubApi(makePanel(), [installedOnly, nothing]);
    renderPanelPage();

    const table = await screen.findByRole('table', { name: 'Zones of this panel' });
    const row = (name: string) => within(table).getByText(name).closest('tr')!;
    const first = within(row('Landing smoke')).getByText('Check label date');
    expect(first.closest('[title]')).toHaveAttribute('title', expect.stringContaining('No manufacture date on record: replace by Jun 2031 at the latest'));
    expect(first.closest('span')).toHaveClass('text-ochre-600');
    const second = within(row('Loft heat')).getByText('Check label date');
    expect(second.closest('[title]')).toHaveAttribute('title', expect.stringContaining('No manufacture or installation date on record'));
    // a sealed 10-year alarm shows its end of life only, never a battery date
    expect(within(row('Landing smoke')).queryByText(/Battery/)).toBeNull();
  });

  it('shows a sealed alarm’s end of life only, and warns when a life-safety battery would not last a year', async () => {
    const sealed = makeZone({
      id: 'z5',
      number: 13,
      description: 'Hall smoke',
      deviceType: 'smoke',
      zoneType: 'fire_24h',
      chime: false,
      batteryType: 'sealed 10-year',
      manufacturedOn: '2024-01-15',
      life: { batteryDueOn: null, endOfLifeOn: '2034-01-15', endOfLifeBasis: 'manufactured', state: 'ok', batteryYears: null, batteryUnderOneYear: false },
    });
    const thirsty = makeZone({
      id: 'z6',
      number: 14,
      description: 'Kitchen heat',
      deviceType: 'heat',
      zoneType: 'fire_24h',
      chime: false,
      batteryType: 'CR2032',
      manufacturedOn: '2025-01-15',
      life: { batteryDueOn: '2026-09-01', endOfLifeOn: '2035-01-15', endOfLifeBasis: 'manufactured', state: 'ok', batteryYears: 0.6, batteryUnderOneYear: true },
    });
    stubApi(makePanel(), [sealed, thirsty]);
    renderPanelPage();
    const table = await screen.findByRole('table', { name: 'Zones of this panel' });
    const row = (name: string) => within(table).getByText(name).closest('tr')!;
    expect(within(row('Hall smoke')).getByText('Alarm ok · Jan 2034')).toBeInTheDocument();
    expect(within(row('Hall smoke')).queryByText(/Battery/)).toBeNull();
    const warning = within(row('Kitchen heat')).getByText('Battery under 1 year');
    expect(warning.closest('[title]')).toHaveAttribute('title', expect.stringContaining('Battery forecast under 1 year (NFPA 72 §23.16.2)'));
  });

  it('marks a smoke zone that is not programmed to protect with “Not protecting”, and says what to change', async () => {
    const wrong = makeZone({
      id: 'z7',
      number: 15,
      description: 'Nursery smoke',
      deviceType: 'smoke',
      zoneType: 'perimeter',
      reportsToMonitoring: false,
      manufacturedOn: '2024-01-15',
      life: { batteryDueOn: null, endOfLifeOn: '2034-01-15', endOfLifeBasis: 'manufactured', state: 'ok' },
      lifeSafetyProblems: [
        {
          code: 'wrong_zone_type',
          field: 'zoneType',
          what: 'it is on a “Perimeter” zone, so the panel treats it as a burglary or other zone',
          fix: 'set its zone type to Fire, always armed',
        },
        {
          code: 'not_reported',
          field: 'reportsToMonitoring',
          what: 'it does not report to the monitoring center, so nobody is called when it sounds',
          fix: 'turn on “Reports to the monitoring center”',
        },
      ],
    });
    stubApi(makePanel(), [makeZone(), smoke, wrong]);
    renderPanelPage();
    const table = await screen.findByRole('table', { name: 'Zones of this panel' });
    const row = (name: string) => within(table).getByText(name).closest('tr')!;
    expect(within(row('Hall smoke')).queryByText('Not protecting')).toBeNull();
    expect(within(row('Front door')).queryByText('Not protecting')).toBeNull();

    const badge = within(row('Nursery smoke')).getByText('Not protecting');
    expect(badge.closest('span')).toHaveClass('text-clay-600');
    const button = badge.closest('button')!;
    expect(button).toHaveAttribute('title', expect.stringContaining('It is on a “Perimeter” zone'));
    expect(button).toHaveAttribute('title', expect.stringContaining('To fix: set its zone type to Fire, always armed.'));
    expect(button).toHaveAttribute('aria-expanded', 'false');
    await userEvent.click(button);
    expect(button).toHaveAttribute('aria-expanded', 'true');
    expect(within(row('Nursery smoke')).getByText(/To fix: turn on “Reports to the monitoring center”/)).toBeVisible();
  });
});
