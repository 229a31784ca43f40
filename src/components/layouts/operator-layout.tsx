import { Link, Outlet, useLocation, useNavigate } from 'react-router-dom';
import { LogOut } from 'lucide-react';
import { paths } from '@/config/paths';
import { AbilityProvider, useAbilityFromRules } from '@/lib/ability';
import { useSession, useSignOut } from '@/lib/auth';
import { MullionWordmark } from '@/components/ui/logo';
import { cn } from '@/lib/cn';

/** The console's sections; a firm's page belongs to "Firms". */
const OPERATOR_NAV = [
  { to: paths.operator.tenants, label: 'Firms', matches: (pathname: string) => !pathname.startsWith(paths.operator.revenue) },
  { to: paths.operator.revenue, label: 'Revenue', matches: (pathname: string) => pathname.startsWith(paths.operator.revenue) },
];

/** The operator console: its own header (ink with a thin brass rule) so nobody mistakes it for a firm's workspace. */
export function OperatorLayout() {
  const session = useSession();
  const ability = useAbilityFromRules(session.rules);
  const signOut = useSignOut();
  const navigate = useNavigate();
  const { pathname } = useLocation();
  return (
    <AbilityProvider value={ability}>
      <div className="min-h-dvh">
        <header className="border-b-2 border-brass-600 bg-ink text-paper">
          <div className="mx-auto flex h-14 max-w-6xl items-center justify-between gap-3 px-4 sm:px-6">
            <Link to={paths.operator.root} className="flex items-center gap-3">
              <MullionWordmark tone="light" />
              <span className="rounded-md border border-brass-600 px-2 py-0.5 text-xs tracking-wide text-paper uppercase">
                Operator<span className="hidden sm:inline"> console</span>
              </span>
            </Link>
            <div className="flex items-center gap-3 text-sm">
              <span className="hidden text-paper/80 sm:inline">{session.user?.name}</span>
              <button
                type="button"
                onClick={() => signOut.mutate(undefined, { onSettled: () => void navigate(paths.signIn) })}
                className="inline-flex items-center gap-1.5 rounded-md px-2 py-1 text-paper/85 hover:bg-paper/10 hover:text-paper"
              >
                <LogOut className="size-4" aria-hidden="true" /> Sign out
              </button>
            </div>
          </div>
          <nav aria-label="Operator console" className="mx-auto flex max-w-6xl gap-1 px-2 pb-2 text-sm sm:px-4">
            {OPERATOR_NAV.map((item) => {
              const current = item.matches(pathname);
              return (
                <Link
                  key={item.to}
                  to={item.to}
                  aria-current={current ? 'page' : undefined}
                  className={cn(
                    'rounded-md px-2 py-1',
                    current ? 'bg-paper/10 font-semibold text-paper' : 'text-paper/80 hover:bg-paper/5 hover:text-paper',
                  )}
                >
                  {item.label}
                </Link>
              );
            })}
          </nav>
        </header>
        <main className="mx-auto w-full min-w-0 max-w-6xl px-4 py-6 sm:px-6 md:py-8">
          <Outlet />
        </main>
      </div>
    </AbilityProvider>
  );
}
