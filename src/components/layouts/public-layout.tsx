import { Link, NavLink, Outlet } from 'react-router-dom';
import { paths, homeFor } from '@/config/paths';
import { useSession } from '@/lib/auth';
import { MullionWordmark } from '@/components/ui/logo';
import { buttonClass } from '@/components/ui/button';
import { cn } from '@/lib/cn';

export function PublicLayout() {
  const { user } = useSession();
  return (
    <div className="flex min-h-dvh flex-col">
      <header className="border-b border-line bg-paper">
        <div className="mx-auto flex h-16 max-w-6xl items-center justify-between gap-3 px-4 sm:px-6">
          <Link to={paths.home} aria-label="Mullion home">
            <MullionWordmark />
          </Link>
          <nav className="flex items-center gap-1 sm:gap-3" aria-label="Main">
            <NavLink to={paths.pricing} className={({ isActive }) => cn('hidden rounded-md px-2 py-1 text-sm sm:inline', isActive ? 'font-semibold' : 'text-slate-500 hover:text-ink')}>
              Pricing
            </NavLink>
            {user ? (
              <Link to={homeFor(user.role)} className={buttonClass('primary', 'sm')}>
                Open Mullion
              </Link>
            ) : (
              <>
                <Link to={paths.signIn} className={buttonClass('ghost', 'sm')}>
                  Sign in
                </Link>
                <Link to={paths.signUp} className={buttonClass('primary', 'sm')}>
                  Start free trial
                </Link>
              </>
            )}
          </nav>
        </div>
      </header>
      <div className="flex-1">
        <Outlet />
      </div>
      <footer className="border-t border-line">
        <div className="mx-auto flex max-w-6xl flex-col gap-2 px-4 py-6 text-xs text-slate-500 sm:flex-row sm:justify-between sm:px-6">
          <span>Mullion — the installed-base record for alarm firms, and a window for their clients.</span>
          <span>
            <Link to={paths.pricing} className="hover:text-ink">
              Pricing
            </Link>
            {' · '}
            <Link to={paths.signIn} className="hover:text-ink">
              Sign in
            </Link>
          </span>
        </div>
      </footer>
    </div>
  );
}

/** Narrow centred card for sign-in, sign-up and the like. */
export function AuthCard({ title, intro, children }: { title: string; intro?: React.ReactNode; children: React.ReactNode }) {
  return (
    <main className="mx-auto w-full max-w-md px-4 py-10 sm:py-16">
      <div className="rounded-md border border-line bg-card p-6 sm:p-8">
        <h1 className="text-xl font-semibold">{title}</h1>
        {intro && <div className="mt-1 text-sm text-slate-500">{intro}</div>}
        <div className="mt-6">{children}</div>
      </div>
    </main>
  );
}
