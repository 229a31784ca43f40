import { afterEach, describe, expect, it, vi } from 'vitest';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import SignUpPage from '@/app/routes/public/sign-up';
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

  it('puts a server field error (e-mail taken) on the e-mail field', async () => {
    const fetchMock = vi.fn((url: string, _init?: RequestInit) => {
      if (url === '/api/session') return Promise.resolve(jsonResponse(200, signedOut));
      return Promise.resolve(jsonResponse(409, {
        error: { code: 'email_taken', message: 'That e-mail address already has a Mullion account.', fields: { email: 'This e-mail address is already in use.' } },
      }));
    });
    vi.stubGlobal('fetch', fetchMock);
    renderRoutes([{ path: '/', element: <SignUpPage /> }], { session: signedOut });
    await userEvent.type(screen.getByLabelText('Firm name'), 'Brookmere Alarms');
    await userEvent.type(screen.getByLabelText('Your name'), 'Ines Brook');
    await userEvent.type(screen.getByLabelText('Work e-mail'), 'ines@brookmere.example');
    await userEvent.type(screen.getByLabelText('Password'), 'a good long password');
    await userEvent.click(screen.getByRole('button', { name: 'Create my firm' }));
    expect(await screen.findByText('This e-mail address is already in use.')).toBeInTheDocument();
    const post = fetchMock.mock.calls.find(([url]) => url === '/api/signup');
    expect(post).toBeDefined();
    const init = post![1]!;
    expect(JSON.parse(init.body as string)).toEqual({ firmName: 'Brookmere Alarms', name: 'Ines Brook', email: 'ines@brookmere.example', password: 'a good long password' });
    expect((init.headers as Record<string, string>)['X-CSRF-Token']).toBe('token-1');
  });
});
