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
});
