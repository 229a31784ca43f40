import { useEffect, useState } from 'react';
import { Link, NavLink, Outlet, useLocation, useMatch, useNavigate } from 'react-router-dom';
import { AlertTriangle, Building2, CalendarDays, ClipboardList, CreditCard, Home, LayoutDashboard, LogOut, Menu, Settings, Sun, TrendingUp, Users } from 'lucide-react';
import type { LucideIcon } from 'lucide-react';
import { paths } from '@/config/paths';
import { AbilityProvider, useAbilityFromRules } from '@/lib/ability';
import { useSession, useSignOut } from '@/lib/auth';
import { ROLE_LABELS, type Role } from '@domain/roles';
import type { AppAbility } from '@domain/abilities';
import { MullionMark } from '@/components/ui/logo';
import { Badge } from '@/components/ui/badge';
import { cn } from '@/lib/cn';

interface NavItem {
  to: string;
  label: string;
  icon: LucideIcon;
  end?: boolean;
  visible: (ability: AppAbility, role: Role | undefined) => boolean;
}

/** Only sections the role may use, and only screens that exist. */
const NAV: NavItem[] = [
  { to: paths.firm.overview, label: 'Overview', icon: LayoutDashboard, end: true, visible: (a) => a.can('read', 'Tenant') },
  { to: paths.firm.today, label: 'Today', icon: Sun, visible: (a, role) => role === 'technician' && a.can('read', 'Job') },
  { to: paths.firm.jobs, label: 'Jobs', icon: ClipboardList, visible: (a) => a.can('read', 'Job') },
  { to: paths.firm.schedule, label: 'Schedule', icon: CalendarDays, visible: (a) => a.can('read', 'Job') },
  { to: paths.firm.clients, label: 'Clients', icon: Home, visible: (a) => a.can('read', 'Client') },
  { to: paths.firm.staff, label: 'Staff', icon: Users, visible: (a) => a.can('read', 'User') },
  { to: paths.firm.business, label: 'Business', icon: TrendingUp, visible: (a) => a.can('manage', 'Billing') },
  { to: paths.firm.billing, label: 'Billing', icon: CreditCard, visible: (a) => a.can('manage', 'Billing') },
  { to: paths.firm.settings, label: 'Firm settings', icon: Settings, visible: (a) => a.can('update', 'Tenant') },
];

/**
 * The phone's bottom bar holds three sections and "More": a technician's day first for
 * technicians, the overview for the office; then jobs and clients. "More" opens the rest of the
 * sections the role may use, and Sign out.
 */
function phoneItems(items: NavItem[], role: Role | undefined): NavItem[] {
  const wanted = role === 'technician' ? [paths.firm.today, paths.firm.jobs, paths.firm.clients] : [paths.firm.overview, paths.firm.jobs, paths.firm.clients];
  const chosen = wanted.map((to) => items.find((i) => i.to === to)).filter((i): i is NavItem => Boolean(i));
  for (const item of items) if (chosen.length < 3 && !chosen.includes(item)) chosen.push(item);
  return chosen.slice(0, 3);
}

export function FirmLayout() {
  const session = useSession();
  const ability = useAbilityFromRules(session.rules);
  const signOut = useSignOut();
  const navigate = useNavigate();
  const items = NAV.filter((item) => item.visible(ability, session.user?.role));
  const phone = phoneItems(items, session.user?.role);
  const more = items.filter((item) => !phone.includes(item));
  // "More" stays open only on the page where it was opened: going anywhere closes it.
  const location = useLocation();
  const [moreOpenAt, setMoreOpenAt] = useState<string | null>(null);
  const moreOpen = moreOpenAt === location.pathname;
  const setMoreOpen = (open: boolean) => setMoreOpenAt(open ? location.pathname : null);
  useEffect(() => {
    if (!moreOpen) return;
    const close = (e: KeyboardEvent) => e.key === 'Escape' && setMoreOpenAt(null);
    window.addEventListener('keydown', close);
    return () => window.removeEventListener('keydown', close);
  }, [moreOpen]);
  const firm = session.tenant;
  const user = session.user;
  // The Billing page shows the read-only notice itself, with its action.
  const onBillingPage = useMatch(paths.firm.billing) !== null;

  const doSignOut = () => signOut.mutate(undefined, { onSettled: () => void navigate(paths.signIn) });

  return (
    <AbilityProvider value={ability}>
      <div className="min-h-dvh md:grid md:grid-cols-[15rem_1fr] md:bg-[linear-gradient(to_right,var(--color-ink)_15rem,transparent_15rem)]">
        <aside className="hidden bg-ink text-paper md:sticky md:top-0 md:flex md:h-dvh md:flex-col">
          <div className="flex items-center gap-2 px-4 pt-5 pb-4">
            <MullionMark className="size-6 text-paper/20" />
            <span className="text-xs tracking-wide text-paper/70 uppercase">Mullion</span>
          </div>
          <div className="px-4 pb-4">
            <p className="truncate font-semibold" title={firm?.name}>
              {firm?.name}
            </p>
            {firm?.state === 'trialing' && firm.trialDaysLeft !== null && firm.trialDaysLeft !== undefined && (
              <p className="mt-1 text-xs text-paper/70">Trial · {firm.trialDaysLeft} {firm.trialDaysLeft === 1 ? 'day' : 'days'} left</p>
            )}
          </div>
          <nav aria-label="Workspace" className="flex-1 space-y-0.5 px-2">
            {items.map((item) => (
              <NavLink
                key={item.to}
                to={item.to}
                end={item.end ?? false}
                className={({ isActive }) =>
                  cn('flex items-center gap-3 rounded-md px-3 py-2 text-sm', isActive ? 'bg-paper/10 font-semibold text-paper' : 'text-paper/75 hover:bg-paper/5 hover:text-paper')
                }
              >
                <item.icon className="size-4" aria-hidden="true" />
                {item.label}
              </NavLink>
            ))}
          </nav>
          <div className="border-t border-paper/10 px-4 py-4 text-sm">
            <p className="truncate font-medium">{user?.name}</p>
            <p className="truncate text-xs text-paper/70">{user ? ROLE_LABELS[user.role] : ''}</p>
            <button type="button" onClick={doSignOut} className="mt-3 inline-flex items-center gap-2 text-xs text-paper/80 hover:text-paper">
              <LogOut className="size-3.5" aria-hidden="true" /> Sign out
            </button>
          </div>
        </aside>

        <div className="flex min-h-dvh min-w-0 flex-col pb-16 md:pb-0">
          <header className="flex h-14 items-center justify-between gap-2 border-b border-line bg-ink px-4 text-paper md:hidden">
            <span className="flex min-w-0 items-center gap-2">
              <Building2 className="size-4 shrink-0 text-paper/70" aria-hidden="true" />
              <span className="truncate font-semibold">{firm?.name}</span>
            </span>
            {firm?.state === 'trialing' && firm.trialDaysLeft != null && <Badge tone="brass">Trial · {firm.trialDaysLeft}d</Badge>}
          </header>
          {firm?.readOnly && !onBillingPage && (
            <div role="status" className="border-b border-clay-600/40 bg-clay-50 px-4 py-2 text-sm text-ink sm:px-6">
              <p className="mx-auto flex max-w-6xl flex-wrap items-start gap-x-2 gap-y-1">
                <AlertTriangle className="mt-0.5 size-4 shrink-0 text-clay-600" aria-hidden="true" />
                <span className="min-w-0 flex-1">
                  {firm.readOnly.message}{' '}
                  {ability.can('manage', 'Billing') ? (
                    <Link to={paths.firm.billing} className="font-medium whitespace-nowrap text-clay-600 underline underline-offset-2 hover:text-ink">
                      Go to billing
                    </Link>
                  ) : (
                    <span className="font-medium">Ask your firm’s owner to sort out billing.</span>
                  )}
                </span>
              </p>
            </div>
          )}
          <main className="mx-auto w-full min-w-0 max-w-6xl flex-1 px-4 py-6 sm:px-6 md:py-8">
            <Outlet />
          </main>
        </div>

        <nav aria-label="Workspace" className="fixed inset-x-0 bottom-0 z-40 grid h-16 grid-cols-4 border-t border-line bg-card md:hidden">
          {phone.map((item) => (
            <NavLink
              key={item.to}
              to={item.to}
              end={item.end ?? false}
              className={({ isActive }) => cn('flex flex-col items-center justify-center gap-0.5 text-xs', isActive ? 'font-semibold text-brass-700' : 'text-slate-500')}
            >
              <item.icon className="size-5" aria-hidden="true" />
              {item.label.replace('Firm settings', 'Settings')}
            </NavLink>
          ))}
          {Array.from({ length: Math.max(0, 3 - phone.length) }, (_, i) => (
            <span key={`gap-${i}`} />
          ))}
          <button
            type="button"
            onClick={() => setMoreOpen(!moreOpen)}
            aria-expanded={moreOpen}
            aria-controls="firm-more"
            className={cn('flex flex-col items-center justify-center gap-0.5 text-xs', moreOpen ? 'font-semibold text-brass-700' : 'text-slate-500')}
          >
            <Menu className="size-5" aria-hidden="true" />
            More
          </button>
        </nav>
        {moreOpen && (
          <div id="firm-more" className="fixed inset-x-0 bottom-16 z-40 border-t border-line bg-card shadow-[0_-8px_24px_rgb(29_42_48/0.12)] md:hidden">
            <ul className="divide-y divide-line" aria-label="More sections">
              {more.map((item) => (
                <li key={item.to}>
                  <NavLink
                    to={item.to}
                    end={item.end ?? false}
                    className={({ isActive }) => cn('flex h-12 items-center gap-3 px-4 text-sm', isActive ? 'font-semibold text-brass-700' : 'text-ink')}
                  >
                    <item.icon className="size-5 text-slate-500" aria-hidden="true" />
                    {item.label}
                  </NavLink>
                </li>
              ))}
              <li>
                <button type="button" onClick={doSignOut} className="flex h-12 w-full items-center gap-3 px-4 text-left text-sm text-ink">
                  <LogOut className="size-5 text-slate-500" aria-hidden="true" />
                  Sign out{user ? <span className="truncate text-slate-500"> · {user.name}</span> : null}
                </button>
              </li>
            </ul>
          </div>
        )}
      </div>
    </AbilityProvider>
  );
}
