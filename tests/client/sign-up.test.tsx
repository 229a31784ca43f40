import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import SignUpPage from '@/app/routes/public/sign-up';
import ConfirmSignUpPage from '@/app/routes/public/confirm-sign-up';
import { jsonResponse, renderRoutes } from './render';

const signedOut = { user: null, tenant: null, rules: [], csrfToken: 'token-1' };

afterEach(() => vi.unstubAllGlobals());

describe('sign-up form', () => {
  it('shows the schema’s messages beside each field and sends nothing while invalid', async () => {
    const fetchMock = vi.fn();
    vi.stubGlobal('fetch', fetchMock);
    renderRoutes([{ path: '/', element: <SignUpPage /> }], { session: signedOut });
    await userEvent.type(screen.getByLabelText('Work e-mail'), 'not-an-address');
    await userEvent.type(screen.getByLabelText('Password'), 'short');
    await userEvent.click(screen.getByRole('button', { name: 'Create my firm' }));
    expect(await screen.findByText('Enter the firm name.')).toBeInTheDocument();
    expect(screen.getByText('Enter a valid e-mail address, like name@example.com.')).toBeInTheDocument();
    expect(screen.getByText('Use at least 10 characters.')).toBeInTheDocument();
    expect(screen.getByLabelText('Firm name')).toHaveAttribute('aria-invalid', 'true');
    expect(fetchMock).not.toHaveBeenCalled();
  });

  async function fillAndSend() {
    await userEvent.type(screen.getByLabelText('Firm name'), 'Brookmere Alarms');
    await userEvent.type(screen.getByLabelText('Your name'), 'Ines Brook');
    await userEvent.type(screen.getByLabelText('Work e-mail'), 'ines@brookmere.example');
    await userEvent.type(screen.getByLabelText('Password'), 'a good long password');
    await userEvent.click(screen.getByRole('button', { name: 'Create my firm' }));
  }

  it('shows “check your inbox” with the address after the request, whatever the address', async () => {
    const fetchMock = vi.fn((url: string, _init?: RequestInit) => {
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, signedOut));
      return Promise.resolve(
        jsonResponse(202, { data: { email: 'ines@brookmere.example', message: 'Check your inbox at ines@brookmere.example for a link to finish setting up your firm.' } }),
      );
    });
    vi.stubGlobal('fetch', fetchMock);
    renderRoutes([{ path: '/', element: <SignUpPage /> }], { session: signedOut });
    await fillAndSend();
    expect(await screen.findByRole('heading', { name: 'Check your inbox' })).toBeInTheDocument();
    expect(screen.getByRole('status')).toHaveTextContent('Check your inbox at ines@brookmere.example for a link to finish setting up your firm.');
    expect(screen.queryByLabelText('Password')).not.toBeInTheDocument();
    const post = fetchMock.mock.calls.find(([url]) => url === '/api/signup');
    const init = post![1]!;
    expect(JSON.parse(init.body as string)).toEqual({ firmName: 'Brookmere Alarms', name: 'Ines Brook', email: 'ines@brookmere.example', password: 'a good long password' });
    expect((init.headers as Record<string, string>)['X-CSRF-Token']).toBe('token-1');

    await userEvent.click(screen.getByRole('button', { name: 'Use another address' }));
    expect(screen.getByLabelText('Work e-mail')).toHaveValue('ines@brookmere.example');
  });

  it('shows a limit from the server above the form', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn((url: string) => {
        if (url === '/api/session') return Promise.resolve(jsonResponse(200, signedOut));
        return Promise.resolve(jsonResponse(429, { error: { code: 'rate_limited', message: 'Too many sign-ups from your network. Wait 40 minutes and try again.' } }));
      }),
    );
    renderRoutes([{ path: '/', element: <SignUpPage /> }], { session: signedOut });
    await fillAndSend();
    expect(await screen.findByText('Too many sign-ups from your network. Wait 40 minutes and try again.')).toBeInTheDocument();
    expect(screen.queryByRole('heading', { name: 'Check your inbox' })).not.toBeInTheDocument();
  });
});

describe('confirming a sign-up from the e-mailed link', () => {
  const TOKEN = 'abcdefghijklmnopqrstuvwxyz012345';
  const routes = [
    { path: '/sign-up/confirm/:token', element: <ConfirmSignUpPage /> },
    { path: '/app', element: <p>Firm overview</p> },
  ];

  it('shows the firm and address, and starts the trial only when the button is pressed', async () => {
    const fetchMock = vi.fn((url: string, init?: RequestInit) => {
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, signedOut));
      if (url === `/api/signups/${TOKEN}` && (init?.method ?? 'GET') === 'GET') {
        return Promise.resolve(jsonResponse(200, { data: { firmName: 'Brookmere Alarms', name: 'Ines Brook', email: 'ines@brookmere.example', expiresAt: '2026-07-01T00:00:00Z' } }));
      }
      return Promise.resolve(jsonResponse(201, { data: signedOut }));
    });
    vi.stubGlobal('fetch', fetchMock);
    renderRoutes(routes, { path: `/sign-up/confirm/${TOKEN}`, session: signedOut });
    expect(await screen.findByRole('heading', { name: 'Finish setting up Brookmere Alarms' })).toBeInTheDocument();
    expect(screen.getByText('ines@brookmere.example')).toBeInTheDocument();
    expect(fetchMock.mock.calls.filter(([, init]) => init?.method === 'POST')).toHaveLength(0);
    await userEvent.click(screen.getByRole('button', { name: 'Start my trial' }));
    expect(await screen.findByText('Firm overview')).toBeInTheDocument();
    const post = fetchMock.mock.calls.find(([url, init]) => url === `/api/signups/${TOKEN}` && init?.method === 'POST');
    expect(post).toBeDefined();
  });

  it('explains a used or expired link and offers sign-in and a new sign-up', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn((url: string) => {
        if (url === '/api/session') return Promise.resolve(jsonResponse(200, signedOut));
        return Promise.resolve(jsonResponse(404, { error: { code: 'not_found', message: 'This link is no longer valid: it was already used or has expired.' } }));
      }),
    );
    renderRoutes(routes, { path: `/sign-up/confirm/${TOKEN}`, session: signedOut });
    expect(await screen.findByRole('heading', { name: 'This link cannot be used' })).toBeInTheDocument();
    expect(screen.getByText('This link is no longer valid: it was already used or has expired.')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Sign in' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'sign up again' })).toBeInTheDocument();
  });
});
