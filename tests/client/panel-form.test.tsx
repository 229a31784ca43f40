import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { PanelFormDialog } from '@/features/panels/components/panel-form-dialog';
import type { ApiPanel } from '@/types/api';
import { makePanel, technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

function stubApi(panel: ApiPanel, error?: Record<string, string>) {
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    if (url === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
    if (url === `/api/panels/${panel.id}` && init?.method === 'PATCH') {
      if (error) return Promise.resolve(jsonResponse(400, { error: { code: 'validation_failed', message: 'Check the highlighted fields.', fields: error } }));
      return Promise.resolve(jsonResponse(200, { data: { ...panel, ...(JSON.parse(init.body as string) as object) } }));
    }
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  const patches = () =>
    fetchMock.mock.calls.filter(([url, init]) => url === `/api/panels/${panel.id}` && init?.method === 'PATCH').map(([, init]) => JSON.parse(init!.body as string) as Record<string, unknown>);
  return { patches };
}

function renderForm(panel: ApiPanel) {
  return renderRoutes([{ path: '/', element: <PanelFormDialog open onClose={vi.fn()} siteId={panel.siteId} panel={panel} /> }], { session: technicianSession });
}

describe('panel form, power and path', () => {
  it('records occupancy, currents, battery and the path-failure time; empty fields stay “not recorded”', async () => {
    const panel = makePanel();
    const { patches } = stubApi(panel);
    const user = userEvent.setup();
    renderForm(panel);

    const group = screen.getByRole('group', { name: 'Power and path' });
    const occupancy = within(group).getByLabelText<HTMLSelectElement>('Occupancy');
    expect(within(occupancy).getAllByRole('option').map((o) => o.textContent)).toEqual(['Home', 'Business']);
    await user.selectOptions(occupancy, 'commercial');
    await user.type(within(group).getByLabelText('Standby current (mA)'), '180');
    await user.type(within(group).getByLabelText('Alarm current (mA)'), '950.5');
    await user.type(within(group).getByLabelText('Battery (Ah)'), '7');
    await user.type(within(group).getByLabelText('Battery label date'), '2024-02-01');
    await user.click(screen.getByRole('button', { name: 'Save panel' }));

    await waitFor(() => expect(patches()).toHaveLength(1));
    expect(patches()[0]).toMatchObject({
      occupancy: 'commercial',
      standbyCurrentMa: 180,
      alarmCurrentMa: 950.5,
      batteryAh: 7,
      batteryManufacturedOn: '2024-02-01',
      pathFailureReportMin: null,
    });
  });

  it('shows the server’s message against the path-failure field', async () => {
    const message = 'Use whole minutes.';
    const panel = makePanel({ pathFailureReportMin: 3 });
    stubApi(panel, { pathFailureReportMin: message });
    const user = userEvent.setup();
    renderForm(panel);
    const minutes = screen.getByLabelText('Minutes until a path failure reaches the monitoring center');
    expect(minutes).toHaveValue(3);
    await user.click(screen.getByRole('button', { name: 'Save panel' }));
    expect(await screen.findByText(message)).toBeInTheDocument();
    expect(minutes).toHaveAttribute('aria-invalid', 'true');
  });
});
