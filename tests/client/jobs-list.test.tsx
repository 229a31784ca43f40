import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createAbility } from '@domain/abilities';
import JobsPage from '@/app/routes/firm/jobs';
import { AbilityProvider } from '@/lib/ability';
import type { SessionInfo } from '@/types/api';
import { makeJob, sessionAs, stubJobApi, TECH_ID } from './job-fixtures';
import { renderRoutes } from './render';
import { dayKey, startOfDayIn } from '@/features/jobs/time';

afterEach(() => vi.unstubAllGlobals());

function renderJobs(session: SessionInfo) {
  return renderRoutes(
    [
      {
        path: '/app/jobs',
        element: (
          <AbilityProvider value={createAbility(session.rules)}>
            <JobsPage />
          </AbilityProvider>
        ),
      },
    ],
    { path: '/app/jobs', session },
  );
}

function listUrls(fetchMock: ReturnType<typeof stubJobApi>): URLSearchParams[] {
  return fetchMock.mock.calls.filter(([url]) => url.startsWith('/api/jobs?')).map(([url]) => new URLSearchParams(url.split('?')[1]));
}

describe('jobs list', () => {
  const jobs = [
    makeJob(),
    makeJob({
      id: 'j2',
      summary: 'Battery change, spring',
      kind: 'battery_round',
      state: 'requested',
      scheduledStart: null,
      scheduledEnd: null,
      technicianId: null,
      technicianName: null,
    }),
    makeJob({ id: 'j3', summary: 'Yearly inspection', kind: 'inspection', overlaps: ['j1'] }),
  ];

  it('shows each job with its state in words, times in the site’s zone, and overlaps flagged', async () => {
    const session = sessionAs('coordinator');
    stubJobApi(session, jobs);
    renderJobs(session);
    const table = await screen.findByRole('table', { name: 'Jobs of the firm' });
    const rows = within(table).getAllByRole('row').slice(1);
    expect(rows).toHaveLength(3);
    expect(within(rows[0]!).getByRole('link', { name: 'Fit back-door contact' })).toHaveAttribute('href', '/app/jobs/j1');
    expect(within(rows[0]!).getByText('Scheduled')).toBeInTheDocument();
    // 15:00 UTC is 9:00 AM in Chicago in March (CST)
    expect(within(rows[0]!).getByText('9:00 AM – 10:30 AM')).toBeInTheDocument();
    expect(within(rows[1]!).getByText('Requested')).toBeInTheDocument();
    expect(within(rows[1]!).getByText('Not scheduled')).toBeInTheDocument();
    expect(within(rows[2]!).getByText('Overlap')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'New job' })).toBeInTheDocument();
  });

  it('sends the filters to the API and starts again at page 1', async () => {
    const session = sessionAs('coordinator');
    const fetchMock = stubJobApi(session, jobs);
    renderJobs(session);
    await screen.findByRole('table', { name: 'Jobs of the firm' });
    await userEvent.selectOptions(screen.getByLabelText('State'), 'completed');
    await userEvent.selectOptions(screen.getByLabelText('Kind'), 'battery_round');
    await userEvent.clear(screen.getByLabelText('From'));
    await userEvent.type(screen.getByLabelText('From'), '2026-03-01');
    await userEvent.type(screen.getByLabelText('To'), '2026-03-07');
    await waitFor(() => {
      const last = listUrls(fetchMock).at(-1)!;
      expect(last.get('state')).toBe('completed');
      expect(last.get('kind')).toBe('battery_round');
      // days in the firm's zone (Chicago, CST): from midnight of the first to midnight after the last
      expect(last.get('from')).toBe('2026-03-01T06:00:00.000Z');
      expect(last.get('to')).toBe('2026-03-08T06:00:00.000Z');
      expect(last.get('page')).toBe('1');
      expect(last.get('sort')).toBe('scheduledStart');
    });
  });

  it('starts with upcoming jobs: from today at the firm', async () => {
    const session = sessionAs('coordinator');
    const fetchMock = stubJobApi(session, jobs);
    renderJobs(session);
    await screen.findByRole('table', { name: 'Jobs of the firm' });
    const first = listUrls(fetchMock).find((p) => p.get('pageSize') === '25')!;
    expect(first.get('from')).toBe(startOfDayIn(dayKey(new Date(), 'America/Chicago'), 'America/Chicago').toISOString());
    expect(first.get('to')).toBeNull();
  });

  it('a technician starts on their own jobs and cannot add one', async () => {
    const session = sessionAs('technician');
    const fetchMock = stubJobApi(session, jobs);
    renderJobs(session);
    await screen.findByRole('table', { name: 'Jobs of the firm' });
    expect(
      listUrls(fetchMock)
        .find((p) => p.get('pageSize') === '25')!
        .get('technicianId'),
    ).toBe(TECH_ID);
    expect(screen.queryByRole('button', { name: 'New job' })).not.toBeInTheDocument();
  });
});
