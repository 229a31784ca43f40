/** Renders a page inside the real providers and a memory router, with a given session. */
import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { AppProvider } from '@/app/provider';
import { createQueryClient } from '@/lib/query-client';
import { sessionQuery } from '@/lib/auth';
import type { SessionInfo } from '@/types/api';

export function renderRoutes(routes: RouteObject[], { path = '/', session }: { path?: string; session?: SessionInfo } = {}) {
  const queryClient = createQueryClient();
  if (session) queryClient.setQueryData(sessionQuery.queryKey, session);
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const utils = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...utils, router, queryClient };
}

export function jsonResponse(status: number, body: unknown): Response {
  return new Response(status === 204 ? null : JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}
