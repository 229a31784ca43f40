import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ZoneFormDialog } from '@/features/zones/components/zone-form-dialog';
import { makePanel, technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

afterEach(() => vi.unstubAllGlobals());

function renderForm(onClose = vi.fn()) {
  return renderRoutes([{ path: '/', element: <ZoneFormDialog open onClose={onClose} panel={makePanel({ nextZoneNumber: 12 })} /> }], { session: technicianSession });
}

function behaviour() {
  return {
    zoneType: screen.getByLabelText<HTMLSelectElement>('Zone type').value,
    reported: screen.getByLabelText<HTMLInputElement>('Reports to monitoring center').checked,
    chime: screen.getByLabelText<HTMLInputElement>('Chime').checked,
    supervised: screen.getByLabelText<HTMLInputElement>('Supervised').checked,
  };
}

describe('zone form', () => {
  it('prefills the next free number and refills the behaviour from each device type chosen', async () => {
    vi.stubGlobal('fetch', vi.fn());
    renderForm();
    expect(screen.getByLabelText('Zone number')).toHaveValue(12);
    expect(screen.getByText(/Next free wireless number: 12/)).toBeInTheDocument();

    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'window_contact');
    expect(behaviour()).toEqual({ zoneType: 'perimeter', reported: true, chime: true, supervised: true });

    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'smoke');
    expect(behaviour()).toEqual({ zoneType: 'fire_24h', reported: true, chime: false, supervised: true });
    expect(screen.getByText('Filled from the defaults for smoke alarm.')).toBeInTheDocument();
  });

  it('stops following the device type once a behaviour field is changed by hand, until the defaults are asked for', async () => {
    vi.stubGlobal('fetch', vi.fn());
    renderForm();
    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'window_contact');
    await userEvent.click(screen.getByLabelText('Chime'));
    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'motion');
    expect(behaviour()).toEqual({ zoneType: 'perimeter', reported: true, chime: false, supervised: true });

    await userEvent.click(screen.getByRole('button', { name: /Use the defaults for motion detector/ }));
    expect(behaviour()).toEqual({ zoneType: 'interior_follower', reported: true, chime: false, supervised: true });
  });

  it('shows a 409 serial clash from the server under the serial field', async () => {
    const clash = 'Serial 0412877 input 1 is already zone 9 on this panel. Choose another input or edit zone 9.';
    const fetchMock = vi.fn((url: string, _init?: RequestInit) => {
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, technicianSession));
      return Promise.resolve(jsonResponse(409, { error: { code: 'conflict', message: clash, fields: { serial: clash } } }));
    });
    vi.stubGlobal('fetch', fetchMock);
    const onClose = vi.fn();
    renderForm(onClose);

    await userEvent.type(screen.getByLabelText('Description'), 'Den window');
    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'window_contact');
    await userEvent.type(screen.getByLabelText('Serial'), '0412877');
    await userEvent.click(screen.getByRole('button', { name: 'Add zone' }));

    const message = await screen.findByText(clash);
    const serial = screen.getByLabelText('Serial');
    expect(serial).toHaveAttribute('aria-invalid', 'true');
    expect(serial.getAttribute('aria-describedby')).toContain(message.id);
    expect(onClose).not.toHaveBeenCalled();

    const post = fetchMock.mock.calls.find(([url]) => url === '/api/panels/p1/zones');
    expect(post).toBeDefined();
    const body = JSON.parse(post![1]!.body as string);
    expect(body).toMatchObject({ number: 12, description: 'Den window', deviceType: 'window_contact', zoneType: 'perimeter', serial: '0412877', input: 1, chime: true });
  });

  it('names the standard of each life-safety device type in the device-type select', () => {
    vi.stubGlobal('fetch', vi.fn());
    renderForm();
    const select = screen.getByLabelText('Device type');
    const label = (value: string) => select.querySelector<HTMLOptionElement>(`option[value="${value}"]`)!.textContent;
    expect(label('smoke')).toBe('Smoke alarm (UL 217)');
    expect(label('smoke_detector')).toBe('System smoke detector (UL 268)');
    expect(label('smoke_co')).toBe('Smoke and CO alarm (combination, UL 217 and UL 2034)');
    expect(label('co')).toBe('CO alarm (UL 2034)');
    expect(label('heat')).toBe('Heat alarm (UL 521)');
    expect(label('window_contact')).toBe('Window contact');
  });

  it('warns, naming what to change, when a life-safety device’s behaviour would keep it from protecting', async () => {
    vi.stubGlobal('fetch', vi.fn());
    renderForm();
    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'smoke');
    // the defaults for a smoke alarm protect
    expect(screen.getByText(/Programmed to protect: “Fire, always armed”, reported and supervised\./)).toBeInTheDocument();
    expect(screen.queryByText(/does not count as protection/)).toBeNull();

    await userEvent.selectOptions(screen.getByLabelText('Zone type'), 'perimeter');
    await userEvent.click(screen.getByLabelText('Supervised'));
    expect(screen.getByText('As set, this smoke alarm does not count as protection.')).toBeInTheDocument();
    expect(screen.getByText(/set its zone type to Fire, always armed\./)).toBeInTheDocument();
    expect(screen.getByText(/turn on “Supervised”\./)).toBeInTheDocument();
    expect(screen.queryByText(/turn on “Reports to the monitoring center”/)).toBeNull();

    await userEvent.click(screen.getByLabelText('Reports to monitoring center'));
    expect(screen.getByText(/turn on “Reports to the monitoring center”\./)).toBeInTheDocument();

    // a CO alarm belongs on a CO zone
    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'co');
    expect(screen.getByText(/set its zone type to CO, always armed\./)).toBeInTheDocument();

    // not a life-safety device: nothing to say
    await userEvent.selectOptions(screen.getByLabelText('Device type'), 'window_contact');
    expect(screen.queryByText(/does not count as protection/)).toBeNull();
  });
});
