import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ZoneImportDialog } from '@/features/zones/components/zone-import-dialog';
import { technicianSession } from './panel-fixtures';
import { jsonResponse, renderRoutes } from './render';

/** XMLHttpRequest as uploadWithProgress uses it: answers each send with the next queued response. */
class FakeXhr {
  static queue: { status: number; body: unknown }[] = [];
  static sent: { url: string; body: unknown }[] = [];
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  status = 0;
  responseText = '';
  private url = '';
  open(_method: string, url: string) {
    this.url = url;
  }
  setRequestHeader() {}
  send(body: unknown) {
    FakeXhr.sent.push({ url: this.url, body });
    const next = FakeXhr.queue.shift() ?? { status: 500, body: {} };
    setTimeout(() => {
      this.upload.onprogress?.({ lengthComputable: true, loaded: 512, total: 1024 });
      this.status = next.status;
      this.responseText = JSON.stringify(next.body);
      this.onload?.();
    }, 0);
  }
}

beforeEach(() => {
  FakeXhr.queue = [];
  FakeXhr.sent = [];
  vi.stubGlobal('XMLHttpRequest', FakeXhr);
  vi.stubGlobal('fetch', vi.fn(() => Promise.resolve(jsonResponse(200, technicianSession))));
});
afterEach(() => vi.unstubAllGlobals());

const csv = () => new File(['number,description,deviceType\n12,Den window,window_contact\n'], 'zones.csv', { type: 'text/csv' });

function renderDialog(onClose = vi.fn()) {
  renderRoutes([{ path: '/', element: <ZoneImportDialog open onClose={onClose} panelId="p1" panelLabel="Main panel" /> }], { session: technicianSession });
  return onClose;
}

describe('zone CSV import', () => {
  it('lists every row error of a 400 answer by row and field, and offers no import', async () => {
    FakeXhr.queue.push({
      status: 400,
      body: {
        error: {
          code: 'validation_failed',
          message: '2 rows have errors. Nothing was saved.',
          fields: {
            'rows.12.serial': 'Use the digits and letters printed on the device.',
            'rows.3.deviceType': 'Choose the device type.',
          },
        },
      },
    });
    renderDialog();
    await userEvent.upload(screen.getByLabelText('CSV file of zones'), csv());

    expect(await screen.findByText('Row 3, deviceType: Choose the device type.')).toBeInTheDocument();
    const items = within(screen.getByRole('list')).getAllByRole('listitem').map((li) => li.textContent);
    expect(items).toEqual(['Row 3, deviceType: Choose the device type.', 'Row 12, serial: Use the digits and letters printed on the device.']);
    expect(screen.getByText(/Nothing was saved/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /^Import/ })).not.toBeInTheDocument();
    expect(FakeXhr.sent).toHaveLength(1);
    expect(FakeXhr.sent[0]!.url).toBe('/api/panels/p1/zones/import?dryRun=true');
    expect((FakeXhr.sent[0]!.body as FormData).get('file')).toBeInstanceOf(File);
  });

  it('previews a valid file from the dry run, then imports it for real', async () => {
    FakeXhr.queue.push({
      status: 200,
      body: {
        data: {
          dryRun: true,
          creates: 2,
          updates: 1,
          unchanged: 0,
          rows: [
            { row: 1, action: 'create', zoneId: null, number: 12, description: 'Den window', deviceType: 'window_contact', zoneType: 'perimeter', serial: '0533104', input: 1 },
            { row: 2, action: 'create', zoneId: null, number: 13, description: 'Hall smoke', deviceType: 'smoke', zoneType: 'fire_24h', serial: '0533190', input: 1 },
            { row: 3, action: 'update', zoneId: 'z1', number: 9, description: 'Front door', deviceType: 'door_contact', zoneType: 'entry_exit', serial: '0412877', input: 1 },
          ],
        },
      },
    });
    FakeXhr.queue.push({ status: 200, body: { data: { dryRun: false, creates: 2, updates: 1, unchanged: 0 } } });
    const onClose = renderDialog();
    await userEvent.upload(screen.getByLabelText('CSV file of zones'), csv());

    const importButton = await screen.findByRole('button', { name: 'Import 3 zones' });
    expect(screen.getByText('The file is valid: 3 zones to import')).toBeInTheDocument();
    expect(screen.getByText('Hall smoke')).toBeInTheDocument();
    expect(screen.getByText('0533104')).toHaveClass('font-mono');

    await userEvent.click(importButton);
    await vi.waitFor(() => expect(onClose).toHaveBeenCalled());
    expect(FakeXhr.sent.map((s) => s.url)).toEqual(['/api/panels/p1/zones/import?dryRun=true', '/api/panels/p1/zones/import?dryRun=false']);
    expect(await screen.findByText('3 zones imported: 2 new, 1 updated.')).toBeInTheDocument();
  });
});
