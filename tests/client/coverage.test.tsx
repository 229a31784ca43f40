import { Suspense } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import { createAbility } from '@domain/abilities';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import CoveragePage from '@/app/routes/firm/coverage';
import { AbilityProvider } from '@/lib/ability';
import type { ApiCoverage, ApiPremises } from '@/types/api';
import { technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

const SUMMARY = '2 of 3 openings protected; 1 window reachable from the ground has no sensor';
const SMOKE_RULE = 'NFPA 72: a smoke alarm in every sleeping room';
const SMOKE_SOURCE = 'NFPA 72 Chapter 29, required detection — references.md 4.1 (PUBLIC)';

function makeCoverage(overrides: Partial<ApiCoverage> = {}): ApiCoverage {
  return {
    openings: { total: 3, protected: 2, unprotectedGroundReachable: 1 },
    summary: SUMMARY,
    findings: [
      {
        code: 'smoke_missing_sleeping_room',
        severity: 'error',
        rule: SMOKE_RULE,
        source: SMOKE_SOURCE,
        message: 'Guest room (Upstairs) has no smoke alarm in service.',
        floorId: 'f2',
        roomId: 'r3',
        lifeSafety: true,
      },
      {
        code: 'opening_unprotected_ground',
        severity: 'warning',
        rule: 'Every door and window reachable from the ground has a sensor',
        source: 'Alarm trade practice — common practice, no published source',
        message: 'Bay window, a window in Living room (Ground floor), can be reached from the ground and has no sensor.',
        floorId: 'f1',
        roomId: 'r2',
        lifeSafety: false,
      },
    ],
    caution: LIFE_SAFETY_CAUTION,
    floors: [
      {
        id: 'f1',
        name: 'Ground floor',
        level: 0,
        belowGrade: false,
        rooms: [
          {
            id: 'r1',
            name: 'Den',
            kind: 'office',
            openings: [{ id: 'o1', kind: 'window', label: 'Den window', groundReachable: true, protected: true, zoneDescription: 'Den window' }],
            devices: [],
          },
          {
            id: 'r2',
            name: 'Living room',
            kind: 'living',
            openings: [
              { id: 'o2', kind: 'window', label: 'Bay window', groundReachable: true, protected: false, zoneDescription: null },
              { id: 'o3', kind: 'sliding_door', label: 'Patio slider', groundReachable: true, protected: true, zoneDescription: 'Patio door' },
            ],
            devices: [{ zoneId: 'z5', description: 'Living room glass', deviceType: 'glass_break' }],
          },
        ],
      },
      {
        id: 'f2',
        name: 'Upstairs',
        level: 1,
        belowGrade: false,
        rooms: [{ id: 'r3', name: 'Guest room', kind: 'bedroom', openings: [], devices: [] }],
      },
    ],
    ...overrides,
  };
}

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
    { id: 'f2', siteId: 's1', name: 'Upstairs', level: 1, belowGrade: false, planImageId: null, planImageUrl: null, rooms: [] },
  ],
  zones: [
    {
      id: 'z12',
      panelId: 'p1',
      panelLabel: 'Main panel',
      number: 12,
      description: 'Den window',
      deviceType: 'window_contact',
      status: 'active',
      roomId: 'r1',
      openingId: 'o1',
      pin: { floorId: 'f1', x: 0.25, y: 0.5 },
    },
  ],
};

function stubApi(coverage: ApiCoverage) {
  const fetchMock = vi.fn((url: string) => {
    const path = url.split('?')[0];
    if (path === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
    if (path === '/api/sites/s1/coverage') return Promise.resolve(jsonResponse(200, { data: coverage }));
    if (path === '/api/sites/s1/premises') return Promise.resolve(jsonResponse(200, { data: premises }));
    if (path === '/api/sites/s1')
      return Promise.resolve(
        jsonResponse(200, {
          data: { id: 's1', clientId: 'c1', clientName: 'Hedda Marrow', name: 'Home', address: { line1: '14 Quarry Lane', city: 'Harrowgate Mill' } },
        }),
      );
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function renderCoverage() {
  return renderRoutes(
    [
      {
        path: '/app/sites/:siteId/coverage',
        element: (
          <AbilityProvider value={createAbility(technicianSession.rules)}>
            <Suspense fallback={<p>Loading</p>}>
              <CoveragePage />
            </Suspense>
          </AbilityProvider>
        ),
      },
    ],
    { path: '/app/sites/s1/coverage', session: technicianSession },
  );
}

/** Text split over several elements, matched on the element that holds all of it. */
const wholeText = (text: string) => (_content: string, el: Element | null) =>
  el?.textContent === text && Array.from(el.children).every((c) => c.textContent !== text);

describe('coverage page', () => {
  it('shows the summary, every opening with its state words, the findings with their rules, and the caution word for word', async () => {
    stubApi(makeCoverage());
    renderCoverage();

    expect(await screen.findByText(SUMMARY)).toBeInTheDocument();
    expect(screen.getByRole('heading', { name: 'Coverage', level: 1 })).toBeInTheDocument();

    const ground = screen.getByRole('region', { name: 'Ground floor' });
    expect(within(ground).getByText(wholeText('Protected — Den window'))).toBeInTheDocument();
    expect(within(ground).getByText(wholeText('Protected — Patio door'))).toBeInTheDocument();
    const bay = within(ground).getByText('Bay window').closest('li')!;
    expect(within(bay).getByText('No sensor')).toBeInTheDocument();
    // the symbol is drawn beside the word and hidden from screen readers
    const symbol = bay.querySelector('svg[data-kind="window"]')!;
    expect(symbol).toHaveAttribute('aria-hidden', 'true');
    expect(symbol).toHaveAttribute('data-state', 'none');

    const lifeSafety = screen.getByRole('region', { name: /Life safety/ });
    expect(within(lifeSafety).getByText(SMOKE_RULE)).toBeInTheDocument();
    // the standard and section, without the pointer into our own reference file
    expect(within(lifeSafety).getByText("Source: NFPA 72 Chapter 29, required detection")).toBeInTheDocument();
    expect(within(lifeSafety).getByText('Guest room (Upstairs) has no smoke alarm in service.')).toBeInTheDocument();
    expect(within(lifeSafety).getByText('Fix')).toBeInTheDocument();
    expect(within(lifeSafety).queryByText('Gap')).toBeNull();
    expect(within(lifeSafety).getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();

    const others = screen.getByRole('region', { name: /Intrusion gaps/ });
    expect(within(others).getByText('Every door and window reachable from the ground has a sensor')).toBeInTheDocument();
    expect(within(others).queryByText(SMOKE_RULE)).toBeNull();

    // the floor's plan, read only, with the zone's pin
    expect(await within(ground).findByRole('img', { name: 'Floor plan of Ground floor' })).toHaveAttribute('src', '/api/floors/f1/plan?v=img1');
    expect(within(ground).getByRole('img', { name: 'Zone 12: Den window' })).toHaveStyle({ left: '25%', top: '50%' });
  });

  it('shows the caution whenever any finding is shown, even without a life-safety one', async () => {
    const coverage = makeCoverage();
    stubApi({ ...coverage, caution: null, findings: coverage.findings.filter((f) => !f.lifeSafety) });
    renderCoverage();
    expect(await screen.findByText(SUMMARY)).toBeInTheDocument();
    expect(screen.getByText('No smoke or CO findings for the rooms and devices recorded.')).toBeInTheDocument();
    expect(screen.getByText(LIFE_SAFETY_CAUTION)).toBeInTheDocument();
  });

  it('shows no caution when there is no finding and the answer carries none', async () => {
    stubApi(makeCoverage({ findings: [], caution: null }));
    renderCoverage();
    expect(await screen.findByText(SUMMARY)).toBeInTheDocument();
    expect(screen.queryByText(LIFE_SAFETY_CAUTION)).toBeNull();
  });

  it('words every finding on the one severity scale — Fix, Check, Note — and marks rules known from memory', async () => {
    const coverage = makeCoverage();
    stubApi({
      ...coverage,
      findings: [
        ...coverage.findings,
        {
          code: 'co_missing_level',
          severity: 'warning',
          rule: 'NFPA 720: a CO alarm on every occupiable level, including basements',
          source: 'NFPA 720-2012/2015 §9.4.1, now in NFPA 72-2022 — references.md 4.17 (MEMORY)',
          evidence: 'memory',
          message: 'Upstairs has no CO alarm in service.',
          floorId: 'f2',
          roomId: null,
          lifeSafety: true,
        },
        {
          code: 'room_without_interior_detection',
          severity: 'info',
          rule: 'A room with doors or windows has a motion or glass-break detector',
          source: 'Alarm trade practice — common practice, no published source',
          evidence: 'practice',
          message: 'Den (Ground floor) has no motion or glass-break detector.',
          floorId: 'f1',
          roomId: 'r1',
          lifeSafety: false,
        },
      ],
    });
    renderCoverage();
    expect(await screen.findByText(SUMMARY)).toBeInTheDocument();

    const lifeSafety = screen.getByRole('region', { name: /Life safety/ });
    const smokeItem = within(lifeSafety).getByText(SMOKE_RULE).closest('li')!;
    expect(within(smokeItem).getByText('Fix')).toBeInTheDocument();
    expect(within(smokeItem).queryByText('From memory')).toBeNull();
    const coItem = within(lifeSafety).getByText(/NFPA 720: a CO alarm on every occupiable level/).closest('li')!;
    expect(within(coItem).getByText('Check')).toBeInTheDocument();
    expect(within(coItem).getByText('From memory')).toBeInTheDocument();
    expect(within(lifeSafety).getByText(/“From memory” marks rules Mullion knows without a public text to cite/)).toBeInTheDocument();

    const others = screen.getByRole('region', { name: /Intrusion gaps/ });
    const groundItem = within(others).getByText('Every door and window reachable from the ground has a sensor').closest('li')!;
    expect(within(groundItem).getByText('Check')).toBeInTheDocument();
    const roomItem = within(others).getByText('A room with doors or windows has a motion or glass-break detector').closest('li')!;
    expect(within(roomItem).getByText('Note')).toBeInTheDocument();
    expect(within(others).queryByText('From memory')).toBeNull();
    // the words are the same as the severity scale's, and the legend counts stay
    expect(screen.getByText('Reachable from the ground, no sensor')).toBeInTheDocument();
  });

  it('says when a smoke alarm in a room does not count because its zone is not programmed to protect', async () => {
    const coverage = makeCoverage();
    const floors = structuredClone(coverage.floors);
    floors[1]!.rooms[0]!.devices = [{ zoneId: 'z7', description: 'Guest smoke', deviceType: 'smoke', counts: false }];
    stubApi({ ...coverage, floors });
    renderCoverage();
    const upstairs = await screen.findByRole('region', { name: 'Upstairs' });
    expect(within(upstairs).getByText(/Guest smoke \(smoke alarm\)/).closest('p')).toHaveTextContent('not programmed to protect, does not count');
  });
});
