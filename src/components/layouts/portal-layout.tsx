import { useEffect } from 'react';
import { useQuery } from '@tanstack/react-query';
import { NavLink, Outlet, useLocation, useNavigate, useParams } from 'react-router-dom';
import { FileText, Home, LifeBuoy, Phone, ShieldCheck, Users, Zap } from 'lucide-react';
import { paths } from '@/config/paths';
import { useSession, useSignOut } from '@/lib/auth';
import { cn } from '@/lib/cn';
import { brandStyle, telHref } from '@/features/portal/brand';
import { portalSitesQuery } from '@/features/portal/api/portal-queries';

const SECTIONS = [
  { key: 'home', label: 'Home', icon: Home, to: paths.portal.site, end: true },
  { key: 'coverage', label: 'Doors & windows', icon: ShieldCheck, to: paths.portal.coverage, end: false },
  { key: 'devices', label: 'Devices', icon: Zap, to: paths.portal.devices, end: false },
  { key: 'service', label: 'Visits', icon: LifeBuoy, to: paths.portal.service, end: false },
  { key: 'contacts', label: 'Contacts', icon: Users, to: paths.portal.contacts, end: false },
  { key: 'documents', label: 'Documents', icon: FileText, to: paths.portal.documents, end: false },
] as const;

/** Which section a portal address shows, so the site switcher keeps it. */
function sectionOf(pathname: string): (typeof SECTIONS)[number] {
  const last = pathname.split('/').pop() ?? '';
  return SECTIONS.find((s) => s.key === last) ?? SECTIONS[0];
}

/**
 * The household's portal, in the firm's colours: the firm's logo and phone always in view,
 * a site switcher when the household has several sites, and the sections of the chosen site.
 */
export function PortalLayout() {
  const { tenant, user } = useSession();
  const { siteId } = useParams();
  const location = useLocation();
  const navigate = useNavigate();
  const signOut = useSignOut();
  const sites = useQuery(portalSitesQuery());
  const list = sites.data ?? [];
  const current = list.find((s) => s.id === siteId);
  const phone = tenant?.phone || tenant?.monitoringCenterPhone || '';

  useEffect(() => {
    document.title = tenant ? `${current ? `${current.name} · ` : ''}${tenant.name} — client portal` : 'Client portal';
  }, [tenant, current]);

  const leave = () => signOut.mutate(undefined, { onSettled: () => void navigate(tenant ? paths.firmPortal.signIn(tenant.shortName) : paths.signIn) });

  return (
    <div className="min-h-dvh bg-paper" style={brandStyle(tenant?.accentColorReadable)}>
      <a href="#portal-main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded-md focus:bg-card focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="bg-brass-600 text-white">
        <div className="mx-auto flex min-h-16 max-w-5xl items-center justify-between gap-3 px-4 py-2">
          <span className="flex min-w-0 items-center gap-3">
            {tenant?.logoUrl && <img src={tenant.logoUrl} alt="" className="size-10 shrink-0 rounded-md bg-white object-contain p-0.5" />}
            <span className="min-w-0">
              <span className="block truncate text-base leading-tight font-semibold">{tenant?.name}</span>
              <span className="block truncate text-xs text-white/85">Client portal · {user?.name}</span>
            </span>
          </span>
          <span className="flex shrink-0 items-center gap-1">
            {phone && (
              <a
                href={telHref(phone)}
                className="flex h-12 items-center gap-2 rounded-md px-3 text-sm font-medium hover:bg-white/15 focus-visible:outline-white"
                aria-label={`Call ${tenant?.name ?? 'your alarm firm'}: ${phone}`}
              >
                <Phone className="size-4" aria-hidden="true" />
                <span className="hidden sm:inline">{phone}</span>
                <span className="sm:hidden">Call</span>
              </a>
            )}
            <button type="button" onClick={leave} className="h-12 rounded-md px-3 text-sm hover:bg-white/15 focus-visible:outline-white">
              Sign out
            </button>
          </span>
        </div>
      </header>

      {current && (
        <div className="sticky top-0 z-20 border-b border-line bg-card">
          <div className="mx-auto max-w-5xl px-4">
            {list.length > 1 && (
              <div className="flex items-center gap-2 pt-3">
                <label htmlFor="portal-site" className="text-sm text-slate-500">
                  Home
                </label>
                <select
                  id="portal-site"
                  value={current.id}
                  onChange={(e) => void navigate(sectionOf(location.pathname).to(e.target.value))}
                  className="h-10 min-w-0 flex-1 rounded-md border border-line bg-card px-2 text-sm sm:flex-none"
                >
                  {list.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.name}
                      {s.address.line1 ? ` — ${s.address.line1}` : ''}
                    </option>
                  ))}
                </select>
              </div>
            )}
            <nav aria-label="Portal sections" className="-mx-4 overflow-x-auto px-4">
              <ul className="flex min-w-max gap-1">
                {SECTIONS.map((s) => (
                  <li key={s.key}>
                    <NavLink
                      to={s.to(current.id)}
                      end={s.end}
                      className={({ isActive }) =>
                        cn(
                          'flex h-12 items-center gap-2 border-b-2 px-3 text-sm font-medium whitespace-nowrap',
                          isActive ? 'border-brass-600 text-ink' : 'border-transparent text-slate-500 hover:text-ink',
                        )
                      }
                    >
                      <s.icon className="size-4" aria-hidden="true" />
                      {s.label}
                    </NavLink>
                  </li>
                ))}
              </ul>
            </nav>
          </div>
        </div>
      )}

      <main id="portal-main" className="mx-auto max-w-5xl px-4 py-6 sm:py-8">
        <Outlet />
      </main>
      <footer className="mx-auto max-w-5xl px-4 pb-8 text-xs text-slate-500">
        {tenant?.name} looks after your alarm system. Portal by Mullion.
      </footer>
    </div>
  );
}
