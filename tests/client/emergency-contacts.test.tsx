import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { EmergencyContacts } from '@/features/sites/components/emergency-contacts';
import { jsonResponse, renderRoutes } from './render';

const SITE = '11111111-1111-4111-8111-111111111111';
const session = { user: null, tenant: null, rules: [], csrfToken: 'tok' };
const contacts = [
  { id: 'c1', siteId: SITE, position: 1, name: 'Hedda Marrow', relation: 'Neighbour', phone: '+15550101234', altPhone: '' },
  { id: 'c2', siteId: SITE, position: 2, name: 'Amos Quill', relation: 'Son', phone: '+15550105678', altPhone: '' },
];

afterEach(() => vi.unstubAllGlobals());

describe('emergency contacts', () => {
  it('lists contacts in calling order with formatted phone numbers', async () => {
    vi.stubGlobal('fetch', vi.fn(() => Promise.resolve(jsonResponse(200, { data: contacts }))));
    renderRoutes([{ path: '/', element: <EmergencyContacts siteId={SITE} canEdit={false} /> }], { session });
    const items = await screen.findAllByRole('listitem');
    expect(items.map((li) => li.textContent)).toEqual([expect.stringContaining('Hedda Marrow'), expect.stringContaining('Amos Quill')]);
    expect(screen.getByText('+1 555 010 1234')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Edit' })).toBeNull();
  });

  it('moves a contact up, sends the new order, and shows a server error on the field it names', async () => {
    const fetchMock = vi.fn((url: string, init?: RequestInit) => {
      if (init?.method === 'PUT')
        return Promise.resolve(
          jsonResponse(400, { error: { code: 'validation_failed', message: 'contacts.0.phone: Enter a phone number with its area code.', fields: { 'contacts.0.phone': 'Enter a phone number with its area code.' } } }),
        );
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, session));
      return Promise.resolve(jsonResponse(200, { data: contacts }));
    });
    vi.stubGlobal('fetch', fetchMock);
    renderRoutes([{ path: '/', element: <EmergencyContacts siteId={SITE} canEdit /> }], { session });
    await userEvent.click(await screen.findByRole('button', { name: 'Edit' }));
    await userEvent.click(screen.getByRole('button', { name: 'Move Amos Quill up' }));
    await userEvent.click(screen.getByRole('button', { name: 'Save contacts' }));

    const put = fetchMock.mock.calls.find(([, init]) => init?.method === 'PUT');
    expect(put?.[0]).toBe(`/api/sites/${SITE}/contacts`);
    const body = JSON.parse(put![1]!.body as string) as { contacts: { name: string }[] };
    expect(body.contacts.map((c) => c.name)).toEqual(['Amos Quill', 'Hedda Marrow']);

    const first = (await screen.findAllByRole('listitem'))[0]!;
    expect(await within(first).findByText('Enter a phone number with its area code.')).toBeInTheDocument();
    expect(within(first).getByLabelText('Phone')).toHaveAttribute('aria-invalid', 'true');
  });
});
