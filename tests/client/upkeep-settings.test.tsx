import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { DEFAULT_UPKEEP_SETTINGS, type UpkeepSettings } from '@domain/device-life';
import { UpkeepSettingsForm } from '@/features/firm/components/upkeep-settings-form';
import { technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

function stubApi(settings: Partial<UpkeepSettings>, error?: { status: number; fields: Record<string, string> }) {
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    if (url === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
    if (url === '/api/firm/upkeep-settings' && (init?.method ?? 'GET') === 'GET')
      return Promise.resolve(jsonResponse(200, { data: { settings, defaults: DEFAULT_UPKEEP_SETTINGS } }));
    if (url === '/api/firm/upkeep-settings' && init?.method === 'PUT') {
      if (error) return Promise.resolve(jsonResponse(error.status, { error: { code: 'validation_failed', message: 'Check the highlighted fields.', fields: error.fields } }));
      const body = JSON.parse(init.body as string) as UpkeepSettings;
      return Promise.resolve(jsonResponse(200, { data: { settings: body, defaults: DEFAULT_UPKEEP_SETTINGS } }));
    }
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'Not found.' } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  const puts = () => fetchMock.mock.calls.filter(([url, init]) => url === '/api/firm/upkeep-settings' && init?.method === 'PUT').map(([, init]) => JSON.parse(init!.body as string) as Record<string, unknown>);
  return { fetchMock, puts };
}

function renderForm() {
  return renderRoutes([{ path: '/', element: <UpkeepSettingsForm canEdit /> }], { session: technicianSession });
}

describe('upkeep settings form', () => {
  it('names the household smoke alarm’s standard and limit, and sends the smoke detector, heat and battery-share settings', async () => {
    const { puts } = stubApi({ ...DEFAULT_UPKEEP_SETTINGS });
    const user = userEvent.setup();
    renderForm();

    const smoke = await screen.findByLabelText('Household smoke alarm life (UL 217), years');
    expect(smoke).toHaveValue('10');
    expect(screen.getByText('NFPA 72 allows at most 10 years from the date of manufacture.')).toBeInTheDocument();
    const detector = screen.getByLabelText('System smoke detector life (years)');
    const heat = screen.getByLabelText('Heat alarm life (years)');
    const share = screen.getByLabelText('Usable share of battery capacity');
    expect(detector).toHaveValue('10');
    expect(heat).toHaveValue('10');
    expect(share).toHaveValue('0.8');
    expect(share).toHaveAccessibleDescription('Common practice: 0.8. Forecasts use nominal capacity × this share.');

    await user.clear(detector);
    await user.type(detector, '12');
    await user.clear(heat);
    await user.type(heat, '8');
    await user.clear(share);
    await user.type(share, '0.75');
    await user.click(screen.getByRole('button', { name: 'Save device life' }));

    await waitFor(() => expect(puts()).toHaveLength(1));
    expect(puts()[0]).toMatchObject({
      smokeEndOfLifeYears: 10,
      smokeDetectorEndOfLifeYears: 12,
      heatEndOfLifeYears: 8,
      coEndOfLifeYears: 7,
      usableCapacityFraction: 0.75,
      soonDays: 90,
    });
  });

  it('fills the newer settings from the defaults when the saved settings lack them', async () => {
    stubApi({ smokeEndOfLifeYears: 9, coEndOfLifeYears: 6, soonDays: 60, batteryYearsOverride: {}, averageCurrentMicroAmps: {} });
    renderForm();
    expect(await screen.findByLabelText('Household smoke alarm life (UL 217), years')).toHaveValue('9');
    expect(screen.getByLabelText('System smoke detector life (years)')).toHaveValue('10');
    expect(screen.getByLabelText('Usable share of battery capacity')).toHaveValue('0.8');
  });

  it('shows the server’s message against the battery-share field', async () => {
    const message = 'At least 0.5 (half the nominal capacity).';
    stubApi({ ...DEFAULT_UPKEEP_SETTINGS }, { status: 400, fields: { usableCapacityFraction: message } });
    const user = userEvent.setup();
    renderForm();
    const share = await screen.findByLabelText('Usable share of battery capacity');
    await user.clear(share);
    await user.type(share, '0.3');
    await user.click(screen.getByRole('button', { name: 'Save device life' }));
    expect(await screen.findByText(message)).toBeInTheDocument();
    expect(share).toHaveAttribute('aria-invalid', 'true');
  });
});
