import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { EmergencyContacts } from '@/features/sites/components/emergency-contacts';
import type { ApiContactChange } from '@/types/api';
import { jsonResponse, renderRoutes } from './render';

const SITE = '11111111-1111-4111-8111-111111111111';
const session = { user: null, tenant: null, rules: [], csrfToken: 'tok' };
const contacts = [
  { id: 'c1', siteId: SITE, position: 1, name: 'Hedda Marrow', relation: 'Neighbour', phone: '+15550101234', altPhone: '' },
  { id: 'c2', siteId: SITE, position: 2, name: 'Amos Quill', relation: 'Son', phone: '+15550105678', altPhone: '' },
];

const changes: ApiContactChange[] = [
  {
    id: 'e2',
    at: '2026-11-30T15:15:00.000Z',
    action: 'contacts.replaced',
    actor: { name: 'Ines Harrow', role: 'client' },
    byHousehold: true,
    before: [{ name: 'Amos Quill', relation: 'Son', phone: '+15550105678', altPhone: '' }],
    after: [
      { name: 'Hedda Marrow', relation: 'Neighbour', phone: '+15550101234', altPhone: '' },
      { name: 'Amos Quill', relation: 'Son', phone: '+15550105678', altPhone: '' },
    ],
    summary: 'Replaced the list: added Hedda Marrow',
  },
  {
    id: 'e1',
    at: '2026-11-02T20:05:00.000Z',
    action: 'contact.created',
    actor: { name: 'Tamsin Brightwater', role: 'coordinator' },
    byHousehold: false,
    before: null,
    after: null,
    summary: 'Added Amos Quill in first place',
  },
];

/** Answers the site's contacts and their changes; `put` answers a save. */
function stubApi({ history = changes, put }: { history?: ApiContactChange[]; put?: () => Response } = {}) {
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    if (init?.method === 'PUT' && put) return Promise.resolve(put());
    if (url === '/api/session') return Promise.resolve(jsonResponse(200, session));
    if (url === `/api/sites/${SITE}/contacts/changes`) return Promise.resolve(jsonResponse(200, { data: history }));
    if (url === `/api/sites/${SITE}/contacts`) return Promise.resolve(jsonResponse(200, { data: contacts }));
    return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: `Unexpected ${url}` } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

afterEach(() => vi.unstubAllGlobals());

describe('emergency contacts', () => {
  it('lists contacts in calling order with formatted phone numbers', async () => {
    stubApi();
    renderRoutes([{ path: '/', element: <EmergencyContacts siteId={SITE} canEdit={false} /> }], { session });
    const items = await screen.findAllByRole('listitem');
    expect(items.map((li) => li.textContent)).toEqual([expect.stringContaining('Hedda Marrow'), expect.stringContaining('Amos Quill')]);
    expect(screen.getByText('+1 555 010 1234')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Edit' })).toBeNull();
  });

  it('moves a contact up, sends the new order, and shows a server error on the field it names', async () => {
    const fetchMock = stubApi({
      put: () =>
        jsonResponse(400, { error: { code: 'validation_failed', message: 'contacts.0.phone: Enter a phone number with its area code.', fields: { 'contacts.0.phone': 'Enter a phone number with its area code.' } } }),
    });
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

  it('folds the changes away behind a count, then shows who changed what, newest first, marking the household’s changes', async () => {
    stubApi();
    renderRoutes([{ path: '/', element: <EmergencyContacts siteId={SITE} canEdit timeZone="America/Chicago" /> }], { session });
    const toggle = await screen.findByRole('button', { name: 'Show changes (2)' });
    expect(toggle).toHaveAttribute('aria-expanded', 'false');
    expect(screen.queryByRole('list', { name: 'Changes to the emergency contacts' })).toBeNull();

    await userEvent.click(toggle);
    expect(toggle).toHaveAttribute('aria-expanded', 'true');
    expect(toggle).toHaveTextContent('Hide changes');
    const list = screen.getByRole('list', { name: 'Changes to the emergency contacts' });
    const [household, coordinator] = within(list).getAllByRole('listitem');
    expect(within(household!).getByText('Nov 30, 2026, 9:15 AM · Ines Harrow (the household)')).toBeInTheDocument();
    expect(within(household!).getByText('Replaced the list: added Hedda Marrow')).toBeInTheDocument();
    expect(within(household!).getByText('By the household — confirm with the monitoring center')).toBeInTheDocument();
    expect(within(coordinator!).getByText('Nov 2, 2026, 2:05 PM · Tamsin Brightwater (Coordinator)')).toBeInTheDocument();
    expect(within(coordinator!).getByText('Added Amos Quill in first place')).toBeInTheDocument();
    expect(within(coordinator!).queryByText(/By the household/)).toBeNull();

    await userEvent.click(toggle);
    expect(screen.queryByRole('list', { name: 'Changes to the emergency contacts' })).toBeNull();
    expect(toggle).toHaveTextContent('Show changes (2)');
  });

  it('says when nothing was changed yet', async () => {
    stubApi({ history: [] });
    renderRoutes([{ path: '/', element: <EmergencyContacts siteId={SITE} canEdit={false} /> }], { session });
    expect(await screen.findByText('No changes recorded yet.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Show changes/ })).toBeNull();
  });

  it('fetches the changes again after a staff save', async () => {
    let history = changes.slice(1);
    const fetchMock = vi.fn((url: string, init?: RequestInit) => {
      if (init?.method === 'PUT') {
        history = changes;
        return Promise.resolve(jsonResponse(200, { data: contacts }));
      }
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, session));
      if (url === `/api/sites/${SITE}/contacts/changes`) return Promise.resolve(jsonResponse(200, { data: history }));
      return Promise.resolve(jsonResponse(200, { data: contacts }));
    });
    vi.stubGlobal('fetch', fetchMock);
    renderRoutes([{ path: '/', element: <EmergencyContacts siteId={SITE} canEdit /> }], { session });
    expect(await screen.findByRole('button', { name: 'Show changes (1)' })).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Edit' }));
    await userEvent.click(screen.getByRole('button', { name: 'Save contacts' }));
    expect(await screen.findByRole('button', { name: 'Show changes (2)' })).toBeInTheDocument();
    await waitFor(() => expect(fetchMock.mock.calls.filter(([url]) => url === `/api/sites/${SITE}/contacts/changes`)).toHaveLength(2));
  });
});
