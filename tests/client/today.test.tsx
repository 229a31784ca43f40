import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createAbility } from '@domain/abilities';
import TodayPage from '@/app/routes/firm/today';
import { AbilityProvider } from '@/lib/ability';
import type { SessionInfo } from '@/types/api';
import { callsTo, makeJob, sessionAs, stubJobApi, TECH_ID } from './job-fixtures';
import { jsonResponse, renderRoutes } from './render';

// 10:00 in Chicago on Tuesday 3 March 2026 (CST, UTC−6)
const NOW = new Date('2026-03-03T16:00:00.000Z');

beforeEach(() => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(NOW);
});
afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
});

function renderToday(session: SessionInfo) {
  return renderRoutes(
    [
      {
        path: '/app/today',
        element: (
          <AbilityProvider value={createAbility(session.rules)}>
            <TodayPage />
          </AbilityProvider>
        ),
      },
    ],
    { path: '/app/today', session },
  );
}

// Sent out of order on purpose; one is tomorrow at the site and one is cancelled.
const jobs = [
  makeJob({
    id: 'late',
    summary: 'Yearly inspection',
    kind: 'inspection',
    siteId: 's3',
    siteName: '2 Mill Row',
    scheduledStart: '2026-03-03T21:00:00.000Z',
    scheduledEnd: '2026-03-03T22:00:00.000Z',
  }),
  makeJob({
    id: 'done',
    summary: 'Swap keypad',
    kind: 'service_call',
    state: 'completed',
    siteId: 's2',
    siteName: '9 Orchard Close',
    scheduledStart: '2026-03-03T14:00:00.000Z',
    scheduledEnd: '2026-03-03T15:00:00.000Z',
    completedAt: '2026-03-03T15:05:00.000Z',
  }),
  makeJob({ id: 'next', summary: 'Fit back-door contact', scheduledStart: '2026-03-03T17:30:00.000Z', scheduledEnd: '2026-03-03T19:00:00.000Z' }),
  makeJob({
    id: 'tomorrow',
    summary: 'Remove old siren',
    kind: 'removal',
    scheduledStart: '2026-03-04T15:00:00.000Z',
    scheduledEnd: '2026-03-04T16:00:00.000Z',
  }),
  makeJob({
    id: 'off',
    summary: 'Cancelled visit',
    state: 'cancelled',
    cancelReason: 'Client away',
    scheduledStart: '2026-03-03T18:00:00.000Z',
    scheduledEnd: '2026-03-03T18:30:00.000Z',
  }),
];

describe('technician’s day', () => {
  it('lists today’s jobs in time order and opens the next one with address, access notes, checklist and panel', async () => {
    const session = sessionAs('technician');
    const fetchMock = stubJobApi(session, jobs);
    renderToday(session);

    const list = await screen.findByRole('list', { name: 'Today’s jobs in time order' });
    const cards = within(list).getAllByRole('article');
    expect(cards).toHaveLength(3);
    ['Service call · Swap keypad', 'Install · Fit back-door contact', 'Yearly inspection · Yearly inspection'].forEach((words, i) =>
      expect(within(cards[i]!).getByText(words)).toBeInTheDocument(),
    );
    // times at the site (Chicago)
    expect(within(cards[1]!).getByText('11:30 AM – 1:00 PM')).toBeInTheDocument();

    const [done, next, late] = cards as [HTMLElement, HTMLElement, HTMLElement];
    expect(within(done).getByRole('button', { expanded: false })).toBeInTheDocument();
    expect(within(late).getByRole('button', { expanded: false })).toBeInTheDocument();
    expect(within(next).getByRole('button', { expanded: true })).toBeInTheDocument();
    expect(within(next).getByText('Next')).toBeInTheDocument();

    const map = await within(next).findByRole('link', { name: /14 Quarry Lane, Ashby Vale, IL 60999/ });
    expect(map).toHaveAttribute('href', 'https://www.openstreetmap.org/search?query=14%20Quarry%20Lane%2C%20Ashby%20Vale%2C%20IL%2060999');
    expect(within(next).getByText('Key safe by the garage, code from the office.')).toBeInTheDocument();
    expect(within(next).getByRole('checkbox', { name: 'Contact on the fixed frame, magnet on the moving door or sash' })).toBeInTheDocument();
    expect(await within(next).findByRole('link', { name: /Zone list of Main panel/ })).toHaveAttribute('href', '/app/panels/p1');
    expect(within(next).getByRole('button', { name: 'Start job' })).toBeInTheDocument();

    // the technician's own jobs, in a window around now
    const listCall = fetchMock.mock.calls.find(([url]) => url.startsWith('/api/jobs?'))!;
    expect(new URLSearchParams(listCall[0].split('?')[1]).get('technicianId')).toBe(TECH_ID);
  });

  it('starts the next job with one big button', async () => {
    const session = sessionAs('technician');
    const fetchMock = stubJobApi(session, jobs, (url, init) =>
      url === '/api/jobs/next/transitions' && init?.method === 'POST'
        ? jsonResponse(200, { data: { ...jobs[2]!, state: 'in_progress' } })
        : undefined,
    );
    renderToday(session);
    const start = await screen.findByRole('button', { name: 'Start job' });
    await userEvent.click(start);
    await waitFor(() => expect(callsTo(fetchMock, 'POST', '/api/jobs/next/transitions')).toHaveLength(1));
    expect(JSON.parse(callsTo(fetchMock, 'POST', '/api/jobs/next/transitions')[0]![1]!.body as string)).toEqual({ to: 'in_progress' });
    expect(await screen.findByRole('button', { name: 'Complete job' })).toBeInTheDocument();
  });

  it('lets the office pick whose day to see', async () => {
    const session = sessionAs('coordinator');
    const fetchMock = stubJobApi(session, jobs);
    renderToday(session);
    expect(await screen.findByRole('heading', { name: 'Wren Aldous’s day', level: 1 })).toBeInTheDocument();
    expect(screen.getByLabelText('Technician')).toHaveValue(TECH_ID);
    await screen.findByRole('list', { name: 'Today’s jobs in time order' });
    const listCall = fetchMock.mock.calls.find(([url]) => url.startsWith('/api/jobs?'))!;
    expect(new URLSearchParams(listCall[0].split('?')[1]).get('technicianId')).toBe(TECH_ID);
  });
});
