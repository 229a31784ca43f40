import { Suspense } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createAbility } from '@domain/abilities';
import JobPage from '@/app/routes/firm/job';
import { AbilityProvider } from '@/lib/ability';
import type { ApiJob, SessionInfo } from '@/types/api';
import { callsTo, makeJob, sessionAs, stubJobApi } from './job-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

function renderJobPage(session: SessionInfo) {
  return renderRoutes(
    [
      {
        path: '/app/jobs/:jobId',
        element: (
          <AbilityProvider value={createAbility(session.rules)}>
            <Suspense fallback={<p>Loading</p>}>
              <JobPage />
            </Suspense>
          </AbilityProvider>
        ),
      },
    ],
    { path: '/app/jobs/j1', session },
  );
}

const ALL_ACTIONS = ['Schedule', 'Back to requested', 'Start job', 'Back to scheduled', 'Complete job', 'Cancel job'];

async function actionButtons(): Promise<string[]> {
  await screen.findByRole('heading', { name: 'Fit back-door contact', level: 1 });
  return ALL_ACTIONS.filter((name) => screen.queryByRole('button', { name }) !== null);
}

describe('job page: legal transitions only', () => {
  const officeCases: [ApiJob['state'], string[]][] = [
    ['requested', ['Schedule', 'Cancel job']],
    ['scheduled', ['Back to requested', 'Start job', 'Cancel job']],
    ['in_progress', ['Back to scheduled', 'Complete job', 'Cancel job']],
    ['completed', []],
    ['cancelled', []],
  ];
  it.each(officeCases)('a coordinator on a %s job sees %j', async (state, expected) => {
    const session = sessionAs('coordinator');
    stubJobApi(
      session,
      makeJob({ state, ...(state === 'completed' ? { completedAt: '2026-03-03T16:20:00Z', reportUrl: '/api/jobs/j1/report.pdf' } : {}) }),
    );
    renderJobPage(session);
    expect(await actionButtons()).toEqual(expected);
    if (state === 'completed') expect(screen.getByRole('link', { name: /Completion report/ })).toHaveAttribute('href', '/api/jobs/j1/report.pdf');
  });

  it('the job’s technician may only start and complete it', async () => {
    const session = sessionAs('technician');
    stubJobApi(session, makeJob({ state: 'in_progress' }));
    renderJobPage(session);
    expect(await actionButtons()).toEqual(['Complete job']);
  });

  it('another technician reads the job without any action', async () => {
    const session = sessionAs('technician', 'u-other');
    stubJobApi(session, makeJob({ state: 'scheduled' }));
    renderJobPage(session);
    expect(await actionButtons()).toEqual([]);
    expect(screen.getByText(/you can read it; its technician or the office changes it/)).toBeInTheDocument();
  });

  it('shows the server’s 400 walk-test message when completing is refused', async () => {
    const session = sessionAs('technician');
    const message =
      '1 zone this job touched has no walk-test result yet. Test each one (a failed result with a note is allowed) before completing. Untested: zone 10 (Back door).';
    const fetchMock = stubJobApi(session, makeJob({ state: 'in_progress' }), (url, init) =>
      url === '/api/jobs/j1/transitions' && init?.method === 'POST'
        ? jsonResponse(400, { error: { code: 'validation_failed', message, fields: { walkTest: 'zones without result' } } })
        : undefined,
    );
    renderJobPage(session);
    await userEvent.click(await screen.findByRole('button', { name: 'Complete job' }));
    const dialog = await screen.findByRole('dialog', { name: 'Complete job' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Complete job' }));
    const alert = await screen.findByText(message);
    expect(alert).toHaveAttribute('role', 'alert');
    expect(screen.getByRole('link', { name: 'Go to the walk test' })).toHaveAttribute('href', '#walk-test');
    const [call] = callsTo(fetchMock, 'POST', '/api/jobs/j1/transitions');
    expect(JSON.parse(call![1]!.body as string)).toEqual({ to: 'completed' });
  });

  it('sends the cancel reason and refuses an empty one', async () => {
    const session = sessionAs('coordinator');
    const fetchMock = stubJobApi(session, makeJob({ state: 'scheduled' }), (url, init) =>
      url === '/api/jobs/j1/transitions' && init?.method === 'POST'
        ? jsonResponse(200, { data: makeJob({ state: 'cancelled', cancelReason: 'Booked twice' }) })
        : undefined,
    );
    renderJobPage(session);
    await userEvent.click(await screen.findByRole('button', { name: 'Cancel job' }));
    const dialog = await screen.findByRole('dialog', { name: 'Cancel job' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Cancel job' }));
    expect(await within(dialog).findByText('Say why the job is cancelled.')).toBeInTheDocument();
    expect(callsTo(fetchMock, 'POST', '/api/jobs/j1/transitions')).toHaveLength(0);
    await userEvent.type(within(dialog).getByLabelText('Reason'), 'Booked twice');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Cancel job' }));
    await waitFor(() => expect(callsTo(fetchMock, 'POST', '/api/jobs/j1/transitions')).toHaveLength(1));
    expect(JSON.parse(callsTo(fetchMock, 'POST', '/api/jobs/j1/transitions')[0]![1]!.body as string)).toEqual({
      to: 'cancelled',
      cancelReason: 'Booked twice',
    });
  });
});

describe('walk test', () => {
  it('lists touched zones first, needs a note for a failure, then sends the PUT body', async () => {
    const session = sessionAs('technician');
    const fetchMock = stubJobApi(session, makeJob({ state: 'in_progress' }), (url, init) =>
      url === '/api/jobs/j1/walk-test' && init?.method === 'PUT' ? jsonResponse(200, { data: makeJob({ state: 'in_progress' }) }) : undefined,
    );
    renderJobPage(session);
    const section = await screen.findByRole('region', { name: 'Walk test' });
    const rows = await within(section).findAllByRole('listitem');
    expect(rows.map((r) => r.getAttribute('aria-label'))).toEqual(['Zone 10 Back door', 'Zone 9 Front door']);

    const back = rows[0]!;
    expect(within(back).getByText('Touched by this job')).toBeInTheDocument();
    await userEvent.click(within(back).getByRole('button', { name: 'Failed' }));
    expect(within(back).getByRole('button', { name: 'Failed' })).toHaveAttribute('aria-pressed', 'true');
    await userEvent.click(within(section).getByRole('button', { name: 'Save walk test' }));
    expect(await within(back).findByText('Say what failed, so the next visit knows.')).toBeInTheDocument();
    expect(within(back).getByLabelText(/^Note/)).toHaveAttribute('aria-invalid', 'true');
    expect(callsTo(fetchMock, 'PUT', '/api/jobs/j1/walk-test')).toHaveLength(0);

    await userEvent.type(within(back).getByLabelText(/^Note/), 'No signal at the panel');
    await userEvent.click(within(back).getByRole('switch', { name: /Monitoring center confirmed/ }));
    await userEvent.click(within(rows[1]!).getByRole('button', { name: 'Passed' }));
    await userEvent.click(within(section).getByRole('button', { name: 'Save walk test' }));
    await waitFor(() => expect(callsTo(fetchMock, 'PUT', '/api/jobs/j1/walk-test')).toHaveLength(1));
    const body = JSON.parse(callsTo(fetchMock, 'PUT', '/api/jobs/j1/walk-test')[0]![1]!.body as string);
    expect(body).toEqual([
      { zoneId: 'z2', result: 'failed', monitoringConfirmed: true, note: 'No signal at the panel' },
      { zoneId: 'z1', result: 'passed', monitoringConfirmed: false, note: '' },
    ]);
  });

  it('ticks a checklist item and saves the whole checklist at once', async () => {
    const session = sessionAs('technician');
    const job = makeJob({ state: 'in_progress' });
    const fetchMock = stubJobApi(session, job, (url, init) =>
      url === '/api/jobs/j1' && init?.method === 'PATCH'
        ? jsonResponse(200, { data: { ...job, checklist: JSON.parse(init.body as string).checklist } })
        : undefined,
    );
    renderJobPage(session);
    const box = await screen.findByRole('checkbox', { name: 'Contact on the fixed frame, magnet on the moving door or sash' });
    await userEvent.click(box);
    await waitFor(() => expect(callsTo(fetchMock, 'PATCH', '/api/jobs/j1')).toHaveLength(1));
    expect(JSON.parse(callsTo(fetchMock, 'PATCH', '/api/jobs/j1')[0]![1]!.body as string)).toEqual({
      checklist: [
        { label: 'Contact on the fixed frame, magnet on the moving door or sash', done: true },
        { label: 'Walk-test every zone with the monitoring center', done: false },
      ],
    });
    expect(box).toBeChecked();
  });
});
