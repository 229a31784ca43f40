import { createBrowserRouter, redirect, type LoaderFunctionArgs, type RouteObject } from 'react-router-dom';
import type { QueryClient } from '@tanstack/react-query';
import { homeFor, paths } from '@/config/paths';
import { sessionQuery } from '@/lib/auth';
import { RouteError } from '@/components/errors/route-error';
import { PublicLayout } from '@/components/layouts/public-layout';
import type { SessionInfo } from '@/types/api';
import { createAbility } from '@domain/abilities';

type Guard = (session: SessionInfo, args: LoaderFunctionArgs) => Response | null;

function signInRedirect(request: Request): Response {
  const url = new URL(request.url);
  const next = url.pathname + url.search;
  return redirect(`${paths.signIn}?next=${encodeURIComponent(next)}`);
}

const firmOnly: Guard = (s, { request }) => {
  if (!s.user) return signInRedirect(request);
  if (s.user.role === 'operator' || s.user.role === 'client') return redirect(homeFor(s.user.role));
  return null;
};
const operatorOnly: Guard = (s, { request }) => {
  if (!s.user) return signInRedirect(request);
  return s.user.role === 'operator' ? null : redirect(homeFor(s.user.role));
};
const clientOnly: Guard = (s, { request }) => {
  if (!s.user) return signInRedirect(request);
  return s.user.role === 'client' ? null : redirect(homeFor(s.user.role));
};
/** Firm settings: only those who may change the firm (the owner). */
const firmEditorsOnly: Guard = (s, args) => firmOnly(s, args) ?? (createAbility(s.rules).can('update', 'Tenant') ? null : redirect(paths.firm.overview));
const signedOutOnly: Guard = (s) => (s.user ? redirect(homeFor(s.user.role)) : null);

export function createAppRouter(queryClient: QueryClient) {
  const guarded =
    (guard: Guard) =>
    async (args: LoaderFunctionArgs): Promise<Response | null> => {
      const session = await queryClient.ensureQueryData(sessionQuery);
      return guard(session, args);
    };
  const loadSession = async () => {
    await queryClient.ensureQueryData(sessionQuery);
    return null;
  };

  const page = (load: () => Promise<{ default: React.ComponentType; loader?: (qc: QueryClient, args: LoaderFunctionArgs) => Promise<unknown> }>) => ({
    lazy: async () => {
      const mod = await load();
      return {
        Component: mod.default,
        ...(mod.loader ? { loader: (args: LoaderFunctionArgs) => mod.loader!(queryClient, args) } : {}),
      };
    },
  });

  /** A lazy page whose own loader runs only after the guard lets the visitor through. */
  const guardedPage = (guard: Guard, load: Parameters<typeof page>[0]) => ({
    lazy: async () => {
      const mod = await load();
      return {
        Component: mod.default,
        loader: async (args: LoaderFunctionArgs) => {
          const refused = await guarded(guard)(args);
          if (refused) return refused;
          return mod.loader ? mod.loader(queryClient, args) : null;
        },
      };
    },
  });

  const routes: RouteObject[] = [
    {
      id: 'root',
      loader: loadSession,
      errorElement: <RouteError />,
      HydrateFallback: () => null,
      children: [
        {
          element: <PublicLayout />,
          children: [
            { index: true, ...page(() => import('./routes/public/landing')) },
            { path: paths.pricing, ...page(() => import('./routes/public/pricing')) },
            { path: paths.signUp, loader: guarded(signedOutOnly), ...page(() => import('./routes/public/sign-up')) },
            { path: paths.confirmSignUp(), ...page(() => import('./routes/public/confirm-sign-up')) },
            { path: paths.signIn, loader: guarded(signedOutOnly), ...page(() => import('./routes/public/sign-in')) },
            { path: paths.forgotPassword, ...page(() => import('./routes/public/forgot-password')) },
            { path: paths.resetPassword(), ...page(() => import('./routes/public/reset-password')) },
            { path: paths.invitation(), ...page(() => import('./routes/public/accept-invitation')) },
          ],
        },
        {
          path: paths.firm.root,
          loader: guarded(firmOnly),
          lazy: async () => ({ Component: (await import('@/components/layouts/firm-layout')).FirmLayout }),
          children: [
            { index: true, ...page(() => import('./routes/firm/overview')) },
            { path: 'staff', ...page(() => import('./routes/firm/staff')) },
            { path: 'clients', ...page(() => import('./routes/firm/clients')) },
            { path: 'clients/:clientId', ...page(() => import('./routes/firm/client')) },
            { path: 'clients/:clientId/sites/new', ...page(() => import('./routes/firm/site-new')) },
            { path: 'sites/:siteId', ...page(() => import('./routes/firm/site')) },
            { path: 'sites/:siteId/edit', ...page(() => import('./routes/firm/site-edit')) },
            { path: 'sites/:siteId/premises', ...page(() => import('./routes/firm/premises')) },
            { path: 'sites/:siteId/coverage', ...page(() => import('./routes/firm/coverage')) },
            { path: 'settings', ...guardedPage(firmEditorsOnly, () => import('./routes/firm/settings')) },
            { path: 'billing', ...guardedPage(firmEditorsOnly, () => import('./routes/firm/billing')) },
            { path: 'business', ...guardedPage(firmEditorsOnly, () => import('./routes/firm/business')) },
            { path: 'panels/:panelId', ...page(() => import('./routes/firm/panel')) },
            { path: 'jobs', ...page(() => import('./routes/firm/jobs')) },
            { path: 'jobs/:jobId', ...page(() => import('./routes/firm/job')) },
            { path: 'today', ...page(() => import('./routes/firm/today')) },
            { path: 'schedule', ...page(() => import('./routes/firm/schedule')) },
          ],
        },
        {
          path: paths.operator.root,
          loader: guarded(operatorOnly),
          lazy: async () => ({ Component: (await import('@/components/layouts/operator-layout')).OperatorLayout }),
          children: [
            { index: true, ...page(() => import('./routes/operator/tenants')) },
            { path: 'firms/:tenantId', ...page(() => import('./routes/operator/tenant')) },
            { path: 'revenue', ...page(() => import('./routes/operator/revenue')) },
          ],
        },
        {
          // A firm's public portal pages (sign-in, forgotten password, reset, invitation), in its colours.
          path: paths.firmPortal.signIn(),
          lazy: async () => ({ Component: (await import('@/components/layouts/portal-public-layout')).PortalPublicLayout }),
          children: [
            { index: true, loader: guarded(signedOutOnly), ...page(() => import('./routes/portal-public/sign-in')) },
            { path: 'forgot-password', ...page(() => import('./routes/portal-public/forgot-password')) },
            { path: 'reset-password/:token', ...page(() => import('./routes/portal-public/reset-password')) },
            { path: 'invitations/:token', ...page(() => import('./routes/portal-public/accept-invitation')) },
          ],
        },
        {
          path: paths.portal.root,
          loader: guarded(clientOnly),
          lazy: async () => ({ Component: (await import('@/components/layouts/portal-layout')).PortalLayout }),
          children: [
            { index: true, ...page(() => import('./routes/portal/home')) },
            { path: 'sites/:siteId', ...page(() => import('./routes/portal/site')) },
            { path: 'sites/:siteId/coverage', ...page(() => import('./routes/portal/coverage')) },
            { path: 'sites/:siteId/devices', ...page(() => import('./routes/portal/devices')) },
            { path: 'sites/:siteId/service', ...page(() => import('./routes/portal/service')) },
            { path: 'sites/:siteId/contacts', ...page(() => import('./routes/portal/contacts')) },
            { path: 'sites/:siteId/documents', ...page(() => import('./routes/portal/documents')) },
          ],
        },
        { path: '*', ...page(() => import('./routes/not-found')) },
      ],
    },
  ];
  return createBrowserRouter(routes);
}
