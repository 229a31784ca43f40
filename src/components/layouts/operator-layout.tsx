import { Link, Outlet, useNavigate } from 'react-router-dom';
import { LogOut } from 'lucide-react';
import { paths } from '@/config/paths';
import { AbilityProvider, useAbilityFromRules } from '@/lib/ability';
import { useSession, useSignOut } from '@/lib/auth';
import { MullionWordmark } from '@/components/ui/logo';

/** The operator console: its own header (ink with a thin brass rule) so nobody mistakes it for a firm's workspace. */
export function OperatorLayout() {
  const session = useSession();
  const ability = useAbilityFromRules(session.rules);
  const signOut = useSignOut();
  const navigate = useNavigate();
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
        </header>
        <main className="mx-auto w-full min-w-0 max-w-6xl px-4 py-6 sm:px-6 md:py-8">
          <Outlet />
        </main>
      </div>
    </AbilityProvider>
  );
}
