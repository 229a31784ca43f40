import { Suspense } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createAbility } from '@domain/abilities';
import PremisesPage from '@/app/routes/firm/premises';
import { ZoneFormDialog } from '@/features/zones/components/zone-form-dialog';
import { AbilityProvider } from '@/lib/ability';
import type { ApiCoverage, ApiFloor, ApiPremises } from '@/types/api';
import { makePanel, technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

const emptyCoverage: ApiCoverage = {
  openings: { total: 0, protected: 0, unprotectedGroundReachable: 0 },
  summary: 'No openings recorded yet',
  findings: [],
  caution: null,
  floors: [],
};

/** A small in-memory premises server: what is posted shows up in the next GET. */
function stubPremisesApi(start: ApiFloor[] = [], patchError?: Record<string, string>) {
  const premises: ApiPremises = { floors: structuredClone(start), zones: [] };
  let next = 1;
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    const path = url.split('?')[0]!;
    const method = init?.method ?? 'GET';
    const body = init?.body ? (JSON.parse(init.body as string) as Record<string, unknown>) : {};
    const created = (data: unknown) => Promise.resolve(jsonResponse(201, { data }));
    if (path === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
    if (path === '/api/sites/s1/premises') return Promise.resolve(jsonResponse(200, { data: premises }));
    if (path === '/api/sites/s1/coverage') return Promise.resolve(jsonResponse(200, { data: emptyCoverage }));
    if (path === '/api/sites/s1')
      return Promise.resolve(jsonResponse(200, { data: { id: 's1', clientId: 'c1', clientName: 'Hedda Marrow', name: 'Home' } }));
    if (method === 'POST' && path === '/api/sites/s1/floors') {
      const floor = { id: `f${next++}`, siteId: 's1', planImageId: null, planImageUrl: null, ...body, rooms: [] } as unknown as ApiFloor;
      premises.floors.push(floor);
      return created(floor);
    }
    const roomPost = /^\/api\/floors\/([^/]+)\/rooms$/.exec(path);
    if (method === 'POST' && roomPost) {
      const room = { id: `r${next++}`, floorId: roomPost[1], ...body, openings: [] } as unknown as ApiFloor['rooms'][number];
      premises.floors.find((f) => f.id === roomPost[1])!.rooms.push(room);
      return created(room);
    }
    const openingPost = /^\/api\/rooms\/([^/]+)\/openings$/.exec(path);
    if (method === 'POST' && openingPost) {
      const opening = { id: `o${next++}`, roomId: openingPost[1], ...body } as unknown as ApiFloor['rooms'][number]['openings'][number];
      premises.floors
        .flatMap((f) => f.rooms)
        .find((r) => r.id === openingPost[1])!
        .openings.push(opening);
      return created(opening);
    }
    const roomPatch = /^\/api\/rooms\/([^/]+)$/.exec(path);
    if (method === 'PATCH' && roomPatch) {
      if (patchError) return Promise.resolve(jsonResponse(400, { error: { code: 'validation_failed', message: 'Check the highlighted fields.', fields: patchError } }));
      const room = premises.floors.flatMap((f) => f.rooms).find((r) => r.id === roomPatch[1])!;
      Object.assign(room, body);
      return Promise.resolve(jsonResponse(200, { data: room }));
    }
    const floorDelete = /^\/api\/floors\/([^/]+)$/.exec(path);
    if (method === 'DELETE' && floorDelete) {
      premises.floors = premises.floors.filter((f) => f.id !== floorDelete[1]);
      return Promise.resolve(jsonResponse(204, null));
    }
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  const sent = (method: string, path: string) =>
    fetchMock.mock.calls
      .filter(([url, init]) => url === path && (init?.method ?? 'GET') === method)
      .map(([, init]) => JSON.parse((init?.body as string | undefined) ?? 'null') as unknown);
  return { fetchMock, sent };
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

describe('premises page', () => {
  it('builds a floor, a room and its openings from the keyboard: Enter adds, and focus moves on to what comes next', async () => {
    const { sent } = stubPremisesApi();
    const user = userEvent.setup();
    renderPremises();

    // the first floor's name has the focus when there is no floor yet
    const floorForm = await screen.findByRole('form', { name: 'Add a floor' });
    await waitFor(() => expect(within(floorForm).getByLabelText('Floor name')).toHaveFocus());
    await user.keyboard('Ground floor{Enter}');
    await waitFor(() => expect(sent('POST', '/api/sites/s1/floors')).toEqual([{ name: 'Ground floor', level: 0, belowGrade: false }]));

    // focus moves to the new floor's first room; the kind follows the name
    const roomForm = await screen.findByRole('form', { name: 'Add a room to Ground floor' });
    await waitFor(() => expect(within(roomForm).getByLabelText('Room name')).toHaveFocus());
    await user.keyboard('Bedroom 2');
    expect(within(roomForm).getByLabelText<HTMLSelectElement>('Kind of room').value).toBe('bedroom');
    await user.keyboard('{Enter}');
    await waitFor(() =>
      expect(sent('POST', '/api/floors/f1/rooms')).toEqual([
        { name: 'Bedroom 2', kind: 'bedroom', fuelBurningAppliance: false, attachedGarage: false, servedByHallId: null, hallWithin21FtConfirmed: false, attachedToBedroomId: null },
      ]),
    );

    // then to the room's first door or window; on the ground floor "reachable from the ground" starts ticked
    const openingForm = await screen.findByRole('form', { name: 'Add an opening to Bedroom 2' });
    const label = within(openingForm).getByLabelText('Opening');
    await waitFor(() => expect(label).toHaveFocus());
    await user.keyboard('Patio slider{Enter}');
    await waitFor(() =>
      expect(sent('POST', '/api/rooms/r2/openings')).toEqual([{ kind: 'sliding_door', label: 'Patio slider', groundReachable: true }]),
    );

    // the line clears and keeps the focus for the next one; Enter on the checkbox submits too
    await waitFor(() => expect(label).toHaveValue(''));
    expect(label).toHaveFocus();
    await user.keyboard('Den window');
    await user.tab(); // kind of opening
    await user.tab(); // reachable from the ground
    expect(within(openingForm).getByLabelText('Reachable from the ground')).toHaveFocus();
    await user.keyboard(' {Enter}');
    await waitFor(() => expect(sent('POST', '/api/rooms/r2/openings')).toHaveLength(2));
    expect(sent('POST', '/api/rooms/r2/openings')[1]).toEqual({ kind: 'window', label: 'Den window', groundReachable: false });

    // both openings are listed; Enter on the empty line goes back to the floor's next room
    const list = await screen.findByRole('list', { name: 'Doors and windows of Bedroom 2' });
    await within(list).findByText('Den window');
    expect(within(list).getByText('Patio slider')).toBeInTheDocument();
    within(openingForm).getByLabelText('Opening').focus();
    await user.keyboard('{Enter}');
    await waitFor(() => expect(within(screen.getByRole('form', { name: 'Add a room to Ground floor' })).getByLabelText('Room name')).toHaveFocus());
    expect(sent('POST', '/api/rooms/r2/openings')).toHaveLength(2);
  });

  it('shows the schema’s message and sends nothing when a floor has no name', async () => {
    const { sent } = stubPremisesApi();
    const user = userEvent.setup();
    renderPremises();
    const floorForm = await screen.findByRole('form', { name: 'Add a floor' });
    await user.click(within(floorForm).getByRole('button', { name: 'Add floor' }));
    expect(await within(floorForm).findByText('Name the floor, like “Ground floor”.')).toBeInTheDocument();
    expect(sent('POST', '/api/sites/s1/floors')).toEqual([]);
  });

  it('asks before deleting a floor that has rooms, then deletes it', async () => {
    const floor: ApiFloor = {
      id: 'f9',
      siteId: 's1',
      name: 'Basement',
      level: -1,
      belowGrade: true,
      planImageId: null,
      planImageUrl: null,
      rooms: [{ id: 'r9', floorId: 'f9', name: 'Utility', kind: 'utility', fuelBurningAppliance: true, attachedGarage: false, openings: [] }],
    };
    const { fetchMock } = stubPremisesApi([floor]);
    const user = userEvent.setup();
    renderPremises();
    await user.click(await screen.findByRole('button', { name: 'Delete Basement' }));
    expect(await screen.findByText(/This deletes its 1 room\. Zones linked to them stay on their panel/)).toBeInTheDocument();
    expect(fetchMock.mock.calls.some(([, init]) => init?.method === 'DELETE')).toBe(false);
    await user.click(screen.getByRole('button', { name: 'Delete floor' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([url, init]) => url === '/api/floors/f9' && init?.method === 'DELETE')).toBe(true));
    await waitFor(() => expect(screen.queryByRole('heading', { name: 'Basement' })).toBeNull());
  });
});

describe('premises page, sleeping areas', () => {
  const LANDING = 'aaaaaaaa-0000-4000-8000-000000000001';
  const KITCHEN = 'aaaaaaaa-0000-4000-8000-000000000002';
  const MAIN_BEDROOM = 'aaaaaaaa-0000-4000-8000-000000000003';
  const EN_SUITE = 'aaaaaaaa-0000-4000-8000-000000000004';
  const STUDY = 'aaaaaaaa-0000-4000-8000-000000000005';
  const DEN = 'aaaaaaaa-0000-4000-8000-000000000006';
  const room = (id: string, floorId: string, name: string, kind: ApiFloor['rooms'][number]['kind'], extra: Partial<ApiFloor['rooms'][number]> = {}) => ({
    id,
    floorId,
    name,
    kind,
    fuelBurningAppliance: false,
    attachedGarage: false,
    servedByHallId: null,
    hallWithin21FtConfirmed: false,
    attachedToBedroomId: null,
    openings: [],
    ...extra,
  });
  const floors = (): ApiFloor[] => [
    {
      id: 'f1',
      siteId: 's1',
      name: 'Ground floor',
      level: 0,
      belowGrade: false,
      planImageId: null,
      planImageUrl: null,
      rooms: [room(DEN, 'f1', 'Den', 'living')],
    },
    {
      id: 'f2',
      siteId: 's1',
      name: 'Upstairs',
      level: 1,
      belowGrade: false,
      planImageId: null,
      planImageUrl: null,
      rooms: [
        room(LANDING, 'f2', 'Upstairs landing', 'hall'),
        room(KITCHEN, 'f2', 'Kitchenette', 'kitchen'),
        room(MAIN_BEDROOM, 'f2', 'Main bedroom', 'bedroom'),
        room(EN_SUITE, 'f2', 'En-suite', 'bath'),
        room(STUDY, 'f2', 'Study', 'office'),
      ],
    },
  ];

  const optionTexts = (select: HTMLElement) => within(select).getAllByRole('option').map((o) => o.textContent);

  it('offers a bedroom only the rooms that can serve its sleeping area, sends the hall and the 21 ft confirmation, and shows them in words', async () => {
    const { sent } = stubPremisesApi(floors());
    const user = userEvent.setup();
    renderPremises();

    // before a hall is chosen the bedroom says so
    const bedroomRow = (await screen.findByRole('heading', { name: /Main bedroom/ })).closest('li')!;
    expect(within(bedroomRow).getByText('Sleeping area: no hall or landing chosen')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Edit Main bedroom' }));
    const form = await screen.findByRole('form', { name: 'Edit Main bedroom' });
    const hall = within(form).getByLabelText<HTMLSelectElement>('Hall or landing outside it');
    // halls, living rooms, offices and the like, from every floor: never a kitchen, a bathroom or the bedroom itself
    expect(optionTexts(hall)).toEqual(['Not chosen yet', 'Den', 'Upstairs landing', 'Study']);
    expect(within(hall).getByRole('group', { name: 'Upstairs' })).toBeInTheDocument();
    const within21 = within(form).getByLabelText('Door within 21 ft of that hall’s alarm (measured on site along the path of travel)');
    expect(within21).toBeDisabled();

    await user.selectOptions(hall, LANDING);
    expect(within21).toBeEnabled();
    await user.click(within21);
    await user.click(within(form).getByRole('button', { name: 'Save' }));

    await waitFor(() => expect(sent('PATCH', `/api/rooms/${MAIN_BEDROOM}`)).toHaveLength(1));
    expect(sent('PATCH', `/api/rooms/${MAIN_BEDROOM}`)[0]).toMatchObject({
      kind: 'bedroom',
      servedByHallId: LANDING,
      hallWithin21FtConfirmed: true,
      attachedToBedroomId: null,
    });
    const saved = (await screen.findByRole('heading', { name: /Main bedroom/ })).closest('li')!;
    await waitFor(() => expect(saved).toHaveTextContent('Sleeping area: Upstairs landing · 21 ft confirmed'));
  });

  it('says “not confirmed” until the distance is confirmed, and names a hall on another floor with its floor', async () => {
    const start = floors();
    start[1]!.rooms[2] = room(MAIN_BEDROOM, 'f2', 'Main bedroom', 'bedroom', { servedByHallId: DEN });
    stubPremisesApi(start);
    renderPremises();
    const bedroomRow = (await screen.findByRole('heading', { name: /Main bedroom/ })).closest('li')!;
    expect(bedroomRow).toHaveTextContent('Sleeping area: Den (Ground floor) · 21 ft not confirmed');
  });

  it('offers a bathroom only the bedrooms, and shows the link', async () => {
    const { sent } = stubPremisesApi(floors());
    const user = userEvent.setup();
    renderPremises();
    await user.click(await screen.findByRole('button', { name: 'Edit En-suite' }));
    const form = await screen.findByRole('form', { name: 'Edit En-suite' });
    expect(within(form).queryByLabelText('Hall or landing outside it')).toBeNull();
    const bedroom = within(form).getByLabelText<HTMLSelectElement>('Attached to bedroom');
    expect(optionTexts(bedroom)).toEqual(['Not attached to a bedroom', 'Main bedroom']);
    await user.selectOptions(bedroom, MAIN_BEDROOM);
    await user.click(within(form).getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(sent('PATCH', `/api/rooms/${EN_SUITE}`)[0]).toMatchObject({ kind: 'bath', attachedToBedroomId: MAIN_BEDROOM, servedByHallId: null }));
    const row = (await screen.findByRole('heading', { name: /En-suite/ })).closest('li')!;
    await waitFor(() => expect(row).toHaveTextContent('Attached to bedroom: Main bedroom'));
  });

  it('shows the server’s refusal against the hall field', async () => {
    const message = 'Choose a room of this site.';
    stubPremisesApi(floors(), { servedByHallId: message });
    const user = userEvent.setup();
    renderPremises();
    await user.click(await screen.findByRole('button', { name: 'Edit Main bedroom' }));
    const form = await screen.findByRole('form', { name: 'Edit Main bedroom' });
    const hall = within(form).getByLabelText('Hall or landing outside it');
    await user.selectOptions(hall, STUDY);
    await user.click(within(form).getByRole('button', { name: 'Save' }));
    const error = await within(form).findByText(message);
    expect(hall).toHaveAttribute('aria-invalid', 'true');
    expect(hall.getAttribute('aria-describedby')).toContain(error.id);
  });
});

describe('zone form, where it is', () => {
  const ROOM_DEN = '11111111-1111-4111-8111-111111111111';
  const ROOM_HALL = '22222222-2222-4222-8222-222222222222';
  const DEN_WINDOW = '33333333-3333-4333-8333-333333333333';

  it('links a zone to a door or window chosen by floor, which sets its room', async () => {
    const floors: ApiFloor[] = [
      {
        id: 'f1',
        siteId: 's1',
        name: 'Ground floor',
        level: 0,
        belowGrade: false,
        planImageId: null,
        planImageUrl: null,
        rooms: [
          { id: ROOM_HALL, floorId: 'f1', name: 'Hall', kind: 'hall', fuelBurningAppliance: false, attachedGarage: false, openings: [] },
          {
            id: ROOM_DEN,
            floorId: 'f1',
            name: 'Den',
            kind: 'office',
            fuelBurningAppliance: false,
            attachedGarage: false,
            openings: [{ id: DEN_WINDOW, roomId: ROOM_DEN, kind: 'window', label: 'Den window', groundReachable: true }],
          },
        ],
      },
    ];
    const fetchMock = vi.fn((url: string, init?: RequestInit) => {
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
      if (url === '/api/sites/s1/premises') return Promise.resolve(jsonResponse(200, { data: { floors } }));
      if (init?.method === 'POST')
        return Promise.resolve(jsonResponse(201, { data: { ...(JSON.parse(init.body as string) as object), id: 'z1', elsewhere: [] } }));
      return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
    });
    vi.stubGlobal('fetch', fetchMock);
    const user = userEvent.setup();
    renderRoutes([{ path: '/', element: <ZoneFormDialog open onClose={vi.fn()} panel={makePanel({ siteId: 's1' })} /> }], {
      session: technicianSession,
    });

    await user.type(screen.getByLabelText('Description'), 'Den window');
    await user.selectOptions(screen.getByLabelText('Device type'), 'window_contact');
    const opening = await screen.findByLabelText<HTMLSelectElement>('Door or window');
    expect(within(opening).getByRole('group', { name: 'Ground floor' })).toBeInTheDocument();
    await user.selectOptions(opening, DEN_WINDOW);
    expect(screen.getByLabelText<HTMLSelectElement>('Room').value).toBe(ROOM_DEN);

    // another room clears an opening that is not in it
    await user.selectOptions(screen.getByLabelText('Room'), ROOM_HALL);
    expect(opening.value).toBe('');
    await user.selectOptions(opening, DEN_WINDOW);

    await user.click(screen.getByRole('button', { name: 'Add zone' }));
    await waitFor(() => expect(fetchMock.mock.calls.some(([url, init]) => url === '/api/panels/p1/zones' && init?.method === 'POST')).toBe(true));
    const post = fetchMock.mock.calls.find(([url, init]) => url === '/api/panels/p1/zones' && init?.method === 'POST')!;
    expect(JSON.parse(post[1]!.body as string)).toMatchObject({
      description: 'Den window',
      deviceType: 'window_contact',
      roomId: ROOM_DEN,
      openingId: DEN_WINDOW,
    });
  });
});
