/**
 * The session on the client: who is signed in, their firm and their rules. A session the
 * server refuses (firm suspended, sign-in deactivated) becomes signed out, with the reason
 * kept for the sign-in page to show.
 */
import { queryOptions, useMutation, useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import type { SessionInfo } from '@/types/api';
import { ApiError, api, setCsrfToken } from './api-client';

const REFUSAL_KEY = 'mullion.refusal';

export function takeRefusal(): string | null {
  try {
    const message = sessionStorage.getItem(REFUSAL_KEY);
    if (message) sessionStorage.removeItem(REFUSAL_KEY);
    return message;
  } catch {
    return null;
  }
}

function keepRefusal(message: string): void {
  try {
    sessionStorage.setItem(REFUSAL_KEY, message);
  } catch {
    /* storage unavailable: the page simply shows no banner */
  }
}

async function fetchSession(): Promise<SessionInfo> {
  try {
    const session = await api.get<SessionInfo>('/api/session');
    setCsrfToken(session.csrfToken);
    return session;
  } catch (err) {
    if (err instanceof ApiError && (err.code === 'firm_suspended' || err.code === 'user_deactivated')) {
      keepRefusal(err.message);
      const session = await api.get<SessionInfo>('/api/session');
      setCsrfToken(session.csrfToken);
      return session;
    }
    throw err;
  }
}

export const sessionQuery = queryOptions({
  queryKey: ['session'],
  queryFn: fetchSession,
  staleTime: 60_000,
});

export function useSession(): SessionInfo {
  return useSuspenseQuery(sessionQuery).data;
}

/** Refetch the session (and its new CSRF token) after sign-in or sign-out; drop every other cache. */
export async function refreshSession(queryClient: ReturnType<typeof useQueryClient>): Promise<SessionInfo> {
  setCsrfToken(null);
  queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== 'session' });
  return queryClient.fetchQuery({ ...sessionQuery, staleTime: 0 });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; password: string }) => api.post<{ data: SessionInfo }>('/api/session', input),
    onSuccess: () => refreshSession(queryClient),
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete('/api/session'),
    onSettled: () => refreshSession(queryClient),
  });
}
