import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { homeFor, paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { SignInForm } from '@/features/auth/components/sign-in-form';

/** Only same-site paths are followed after sign-in. */
function safeNext(next: string | null): string | null {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : null;
}

export default function SignInPage() {
  const navigate = useNavigate();
  const [params] = useSearchParams();

  return (
    <AuthCard title="Sign in to Mullion">
      <SignInForm
        onSignedIn={(role) => void navigate(safeNext(params.get('next')) ?? homeFor(role), { replace: true })}
        links={
          <div className="flex flex-col items-center gap-2 text-sm text-slate-500 sm:flex-row sm:justify-between">
            <Link to={paths.forgotPassword} className="font-medium text-brass-700 underline">
              Forgot your password?
            </Link>
            <span>
              New firm?{' '}
              <Link to={paths.signUp} className="font-medium text-brass-700 underline">
                Start a trial
              </Link>
            </span>
          </div>
        }
      />
    </AuthCard>
  );
}
