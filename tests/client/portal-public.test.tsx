import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { RouteObject } from 'react-router-dom';
import { PortalPublicLayout } from '@/components/layouts/portal-public-layout';
import PortalSignInPage from '@/app/routes/portal-public/sign-in';
import PortalForgotPasswordPage from '@/app/routes/portal-public/forgot-password';
import PortalResetPasswordPage from '@/app/routes/portal-public/reset-password';
import PortalAcceptInvitationPage from '@/app/routes/portal-public/accept-invitation';
import type { PublicFirm, SessionInfo } from '@/types/api';
import { jsonResponse, renderRoutes } from './render';

const firm: PublicFirm = {
  name: 'Lanternfield Alarms',
  shortName: 'lanternfield',
  accentColor: '#3a8fd0',
  accentColorReadable: '#1f5f8b',
  logoUrl: '/api/public/firms/lanternfield/logo?v=4f2a91c0',
  phone: '01632 960 455',
  monitoringCenterPhone: '01632 960 123',
};
const token = 'Kq3vX8pLm2Tz9RwYb4Nc7Hd';

const signedOut: SessionInfo = { user: null, tenant: null, rules: [], csrfToken: 'token-1' };
const client = {
  id: 'u9',
  tenantId: 't1',
  email: 'mara@homes.example',
  name: 'Mara Quill',
  role: 'client' as const,
  active: true,
  deactivatedAt: null,
  lastSignInAt: null,
  createdAt: '2026-01-01T00:00:00Z',
};
const signedIn: SessionInfo = { user: client, tenant: null, rules: [], csrfToken: 'token-2' };

const routes: RouteObject[] = [
  {
    path: '/p/:shortName',
    element: <PortalPublicLayout />,
    children: [
      { index: true, element: <PortalSignInPage /> },
      { path: 'forgot-password', element: <PortalForgotPasswordPage /> },
      { path: 'reset-password/:token', element: <PortalResetPasswordPage /> },
      { path: 'invitations/:token', element: <PortalAcceptInvitationPage /> },
    ],
  },
  { path: '/portal', element: <h1>Your home</h1> },
];

type Handler = (method: string, body: unknown) => Response | undefined;

/** A fetch that answers the firm's branding and the session, plus the given handlers by URL. */
function stubApi(handlers: Record<string, Handler> = {}, { firmStatus = 200 } = {}) {
  let session = signedOut;
  const fetchMock = vi.fn((url: string, init?: RequestInit) => {
    const method = init?.method ?? 'GET';
    const body: unknown = typeof init?.body === 'string' ? JSON.parse(init.body) : undefined;
    const own = handlers[url]?.(method, body);
    if (own) {
      if (url === '/api/session' && method === 'POST') session = signedIn;
      return Promise.resolve(own);
    }
    if (url === `/api/public/firms/${firm.shortName}` && firmStatus === 200) return Promise.resolve(jsonResponse(200, { data: firm }));
    if (url.startsWith('/api/public/firms/')) return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'No such portal.' } }));
    if (url === '/api/session' && method === 'GET') return Promise.resolve(jsonResponse(200, session));
    return Promise.resolve(jsonResponse(500, { error: { code: 'internal', message: `Unexpected ${method} ${url}` } }));
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

function callsTo(fetchMock: ReturnType<typeof stubApi>, url: string, method: string) {
  return fetchMock.mock.calls.filter(([u, init]) => u === url && (init?.method ?? 'GET') === method);
}

afterEach(() => vi.unstubAllGlobals());

describe('firm portal sign-in page', () => {
  it('shows the firm’s name, logo and phone, and puts its accent colour on the root', async () => {
    stubApi();
    renderRoutes(routes, { path: '/p/lanternfield', session: signedOut });
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in to your home’s alarm portal' })).toBeInTheDocument();
    const banner = screen.getByRole('banner');
    expect(within(banner).getByText('Lanternfield Alarms')).toBeInTheDocument();
    const logo = banner.querySelector('img');
    expect(logo).toHaveAttribute('src', firm.logoUrl);
    expect(logo).toHaveAttribute('alt', '');
    expect(banner.parentElement!.style.getPropertyValue('--color-brass-600')).toBe('#1f5f8b');
    const footer = screen.getByRole('contentinfo');
    expect(within(footer).getByRole('link', { name: '01632 960 455' })).toHaveAttribute('href', 'tel:01632960455');
    expect(within(footer).getByRole('link', { name: '01632 960 123' })).toHaveAttribute('href', 'tel:01632960123');
    expect(footer).toHaveTextContent('Portal by Mullion');
    expect(document.title).toBe('Lanternfield Alarms — client portal');
    expect(screen.getByLabelText('E-mail')).toHaveAttribute('autocomplete', 'username');
    expect(screen.getByLabelText('Password')).toHaveAttribute('autocomplete', 'current-password');
  });

  it('says there is no client portal at an unknown address', async () => {
    const fetchMock = stubApi({}, { firmStatus: 404 });
    renderRoutes(routes, { path: '/p/nowhere-alarms', session: signedOut });
    expect(await screen.findByRole('heading', { name: 'There is no client portal at this address' })).toBeInTheDocument();
    expect(screen.getByText(/Check the link in the e-mail from your alarm firm/)).toBeInTheDocument();
    expect(screen.queryByLabelText('Password')).not.toBeInTheDocument();
    expect(callsTo(fetchMock, '/api/public/firms/nowhere-alarms', 'GET')).toHaveLength(1);
  });

  it('signs the household in with /api/session and lands on the portal', async () => {
    const fetchMock = stubApi({
      '/api/session': (method) => (method === 'POST' ? jsonResponse(200, { data: signedIn }) : undefined),
    });
    const { router } = renderRoutes(routes, { path: '/p/lanternfield', session: signedOut });
    await userEvent.type(await screen.findByLabelText('E-mail'), 'mara@homes.example');
    await userEvent.type(screen.getByLabelText('Password'), 'a long secret phrase');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { name: 'Your home' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/portal');
    const posts = callsTo(fetchMock, '/api/session', 'POST');
    expect(posts).toHaveLength(1);
    expect(JSON.parse(posts[0]![1]!.body as string)).toEqual({ email: 'mara@homes.example', password: 'a long secret phrase' });
  });

  it('shows the server’s refusal and stays on the page when the password is wrong', async () => {
    stubApi({
      '/api/session': (method) =>
        method === 'POST'
          ? jsonResponse(401, { error: { code: 'invalid_credentials', message: 'That e-mail and password do not match.' } })
          : undefined,
    });
    const { router } = renderRoutes(routes, { path: '/p/lanternfield', session: signedOut });
    await userEvent.type(await screen.findByLabelText('E-mail'), 'mara@homes.example');
    await userEvent.type(screen.getByLabelText('Password'), 'wrong guess');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('That e-mail and password do not match.')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/p/lanternfield');
  });

  it('links “Forgot your password?” to the firm’s own forgotten-password page, which links back', async () => {
    const fetchMock = stubApi({
      '/api/password-resets': (method) => (method === 'POST' ? jsonResponse(202, { data: { message: 'Sent.' } }) : undefined),
    });
    const { router } = renderRoutes(routes, { path: '/p/lanternfield', session: signedOut });
    const link = await screen.findByRole('link', { name: 'Forgot your password?' });
    expect(link).toHaveAttribute('href', '/p/lanternfield/forgot-password');
    await userEvent.click(link);
    expect(await screen.findByRole('heading', { name: 'Forgot your password?' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/p/lanternfield/forgot-password');
    await userEvent.type(screen.getByLabelText('E-mail'), 'mara@homes.example');
    await userEvent.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByRole('heading', { name: 'Check your e-mail' })).toBeInTheDocument();
    expect(JSON.parse(callsTo(fetchMock, '/api/password-resets', 'POST')[0]![1]!.body as string)).toEqual({ email: 'mara@homes.example' });
    expect(screen.getByRole('link', { name: 'Back to sign-in' })).toHaveAttribute('href', '/p/lanternfield');
  });

  it('sets a new password and offers the firm’s sign-in', async () => {
    const fetchMock = stubApi({
      [`/api/password-resets/${token}`]: (method) => (method === 'POST' ? jsonResponse(200, { data: { message: 'Changed.' } }) : undefined),
    });
    renderRoutes(routes, { path: `/p/lanternfield/reset-password/${token}`, session: signedOut });
    await userEvent.type(await screen.findByLabelText('New password'), 'a fresh long phrase');
    await userEvent.click(screen.getByRole('button', { name: 'Set the new password' }));
    expect(await screen.findByRole('heading', { name: 'Password changed' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Sign in' })).toHaveAttribute('href', '/p/lanternfield');
    expect(JSON.parse(callsTo(fetchMock, `/api/password-resets/${token}`, 'POST')[0]![1]!.body as string)).toEqual({
      password: 'a fresh long phrase',
    });
  });
});

describe('firm portal invitation', () => {
  const preview = { firm, email: 'mara@homes.example', role: 'client', roleLabel: 'Client', expiresAt: '2026-07-01T00:00:00Z' };

  it('welcomes the homeowner to the firm’s portal and accepts with name and password', async () => {
    const fetchMock = stubApi({
      [`/api/invitations/${token}`]: (method) => (method === 'GET' ? jsonResponse(200, { data: preview }) : undefined),
      [`/api/invitations/${token}/accept`]: (method) => (method === 'POST' ? jsonResponse(201, { data: signedIn }) : undefined),
    });
    const { router } = renderRoutes(routes, { path: `/p/lanternfield/invitations/${token}`, session: signedOut });
    expect(await screen.findByRole('heading', { level: 1, name: 'Welcome to the Lanternfield Alarms client portal' })).toBeInTheDocument();
    expect(screen.getByText('mara@homes.example')).toBeInTheDocument();
    await userEvent.type(screen.getByLabelText('Your name'), 'Mara Quill');
    await userEvent.type(screen.getByLabelText('Choose a password'), 'a long secret phrase');
    await userEvent.click(screen.getByRole('button', { name: 'Create my sign-in' }));
    expect(await screen.findByRole('heading', { name: 'Your home' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/portal');
    const posts = callsTo(fetchMock, `/api/invitations/${token}/accept`, 'POST');
    expect(posts).toHaveLength(1);
    expect(JSON.parse(posts[0]![1]!.body as string)).toEqual({ name: 'Mara Quill', password: 'a long secret phrase' });
  });

  it('explains an unusable invitation and gives the firm’s phone', async () => {
    stubApi({
      [`/api/invitations/${token}`]: () => jsonResponse(410, { error: { code: 'invitation_expired', message: 'This invitation has expired.' } }),
    });
    renderRoutes(routes, { path: `/p/lanternfield/invitations/${token}`, session: signedOut });
    expect(await screen.findByRole('heading', { name: 'This invitation cannot be used' })).toBeInTheDocument();
    expect(screen.getByText('This invitation has expired.')).toBeInTheDocument();
    expect(screen.getByText(/Ask Lanternfield Alarms to send you a new link/)).toBeInTheDocument();
    const main = screen.getByRole('main');
    expect(within(main).getByRole('link', { name: '01632 960 455' })).toHaveAttribute('href', 'tel:01632960455');
    expect(screen.queryByRole('button', { name: 'Create my sign-in' })).not.toBeInTheDocument();
  });
});
