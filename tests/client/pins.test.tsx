import { Suspense } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createAbility } from '@domain/abilities';
import PremisesPage from '@/app/routes/firm/premises';
import { AbilityProvider } from '@/lib/ability';
import type { ApiCoverage, ApiPremises, ApiPremisesZone } from '@/types/api';
import { technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

const coverage: ApiCoverage = {
  openings: { total: 1, protected: 1, unprotectedGroundReachable: 0 },
  summary: 'All 1 openings protected',
  findings: [],
  caution: null,
  floors: [],
};

function zone(overrides: Partial<ApiPremisesZone>): ApiPremisesZone {
  return {
    id: 'z12',
    panelId: 'p1',
    panelLabel: 'Main panel',
    number: 12,
    description: 'Den window',
    deviceType: 'window_contact',
    status: 'active',
    roomId: null,
    openingId: null,
    pin: null,
    ...overrides,
  };
}

function stubApi(zones: ApiPremisesZone[]) {
  const premises: ApiPremises = {
    floors: [
      {
        id: 'f1',
        siteId: 's1',
        name: 'Ground floor',
        level: 0,
        belowGrade: false,
        planImageId: 'img1',
        planImageUrl: '/api/floors/f1/plan?v=img1',
        rooms: [],
      },
    ],
    zones,
  };
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    const path = url.split('?')[0]!;
    const method = init?.method ?? 'GET';
    if (path === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
    if (path === '/api/sites/s1/premises') return Promise.resolve(jsonResponse(200, { data: premises }));
    if (path === '/api/sites/s1/coverage') return Promise.resolve(jsonResponse(200, { data: coverage }));
    if (path === '/api/sites/s1') return Promise.resolve(jsonResponse(200, { data: { id: 's1', clientId: 'c1', name: 'Home' } }));
    const pin = /^\/api\/zones\/([^/]+)\/pin$/.exec(path);
    if (method === 'PUT' && pin) {
      const body = JSON.parse(init!.body as string) as ApiPremisesZone['pin'];
      premises.zones = premises.zones!.map((z) => (z.id === pin[1] ? { ...z, pin: body } : z));
      return Promise.resolve(jsonResponse(200, { data: premises.zones.find((z) => z.id === pin[1]) }));
    }
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  const pinPuts = () =>
    fetchMock.mock.calls
      .filter(([url, init]) => init?.method === 'PUT' && url.endsWith('/pin'))
      .map(([url, init]) => ({ url, body: JSON.parse(init!.body as string) as unknown }));
  return { pinPuts };
}

function renderPremises() {
  return renderRoutes(
    [
      {
        path: '/app/sites/:siteId/premises',
        element: (
          <AbilityProvider value={createAbility(technicianSession.rules)}>
            <Suspense fallback={<p>Loading</p>}>
              <PremisesPage />
            </Suspense>
          </AbilityProvider>
        ),
      },
    ],
    { path: '/app/sites/s1/premises', session: technicianSession },
  );
}

/** The plan image sits at (100, 50) and is drawn 400 × 200 px. */
function placeImage(img: HTMLElement) {
  vi.spyOn(img, 'getBoundingClientRect').mockReturnValue({
    left: 100,
    top: 50,
    width: 400,
    height: 200,
    right: 500,
    bottom: 250,
    x: 100,
    y: 50,
    toJSON: () => ({}),
  });
}

describe('floor-plan pins', () => {
  it('places a pin by choosing a zone and then clicking the plan, sending fractions of the image', async () => {
    const { pinPuts } = stubApi([zone({})]);
    const user = userEvent.setup();
    renderPremises();

    const img = await screen.findByRole('img', { name: 'Floor plan of Ground floor' });
    placeImage(img);
    const choose = screen.getByRole('button', { name: 'Place zone 12 Den window' });
    await user.click(choose);
    expect(choose).toHaveAttribute('aria-pressed', 'true');
    expect(screen.getByText(/click or tap the plan where it is/)).toBeInTheDocument();

    fireEvent.click(img, { clientX: 200, clientY: 100 });
    await waitFor(() => expect(pinPuts()).toEqual([{ url: '/api/zones/z12/pin', body: { floorId: 'f1', x: 0.25, y: 0.25 } }]));

    const pin = await screen.findByRole('button', { name: /^Zone 12: Den window/ });
    expect(pin).toHaveStyle({ left: '25%', top: '25%' });
    expect(choose).toHaveAttribute('aria-pressed', 'false');
    const list = screen.getByRole('list', { name: 'Zones to place on Ground floor' });
    expect(await within(list).findByText('On this plan')).toBeInTheDocument();
  });

  it('moves a focused pin with the arrow keys and saves its new place', async () => {
    const { pinPuts } = stubApi([zone({ pin: { floorId: 'f1', x: 0.5, y: 0.5 } })]);
    const user = userEvent.setup();
    renderPremises();
    const pin = await screen.findByRole('button', { name: /^Zone 12: Den window/ });
    pin.focus();
    await user.keyboard('{ArrowRight}{ArrowRight}{Shift>}{ArrowDown}{/Shift}');
    expect(pin).toHaveStyle({ left: '52%', top: '55%' });
    await waitFor(() => expect(pinPuts()).toEqual([{ url: '/api/zones/z12/pin', body: { floorId: 'f1', x: 0.52, y: 0.55 } }]), { timeout: 2000 });
  });

  it('drops a zone dragged from the list onto the plan (pointer events, mouse or touch)', async () => {
    const { pinPuts } = stubApi([zone({}), zone({ id: 'z13', number: 13, description: 'Back door', deviceType: 'door_contact' })]);
    renderPremises();
    const img = await screen.findByRole('img', { name: 'Floor plan of Ground floor' });
    placeImage(img);
    const row = screen.getByRole('button', { name: 'Place zone 13 Back door' }).closest('li')!;
    const grip = row.querySelector('span[aria-hidden="true"]')!;
    fireEvent.pointerDown(grip, { pointerId: 1, button: 0, clientX: 600, clientY: 300 });
    fireEvent.pointerMove(grip, { pointerId: 1, clientX: 500, clientY: 250 });
    fireEvent.pointerMove(grip, { pointerId: 1, clientX: 400, clientY: 200 });
    fireEvent.pointerUp(grip, { pointerId: 1, clientX: 400, clientY: 200 });
    await waitFor(() => expect(pinPuts()).toEqual([{ url: '/api/zones/z13/pin', body: { floorId: 'f1', x: 0.75, y: 0.75 } }]));
  });
});
