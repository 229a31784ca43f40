import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-field';
import { Skeleton } from '@/components/ui/skeleton';
import { signUpConfirmationQuery, useConfirmSignUp } from '@/features/auth/api/auth-mutations';

/**
 * The page the sign-up e-mail links to. Opening it changes nothing (mail scanners open links
 * too); the button confirms the address, creates the firm on its trial and signs the owner in.
 */
export default function ConfirmSignUpPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const preview = useQuery(signUpConfirmationQuery(token));
  const confirm = useConfirmSignUp(token);
  const [formError, setFormError] = useState<string | null>(null);

  if (preview.isPending) {
    return (
      <AuthCard title="Opening your link…">
        <Skeleton className="h-24 w-full" />
      </AuthCard>
    );
  }
  if (preview.isError) {
    return (
      <AuthCard title="This link cannot be used">
        <p className="text-sm">{preview.error.message}</p>
        <p className="mt-4 text-sm">
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            Sign in
          </Link>{' '}
          or{' '}
          <Link to={paths.signUp} className="font-medium text-brass-700 underline">
            sign up again
          </Link>
        </p>
      </AuthCard>
    );
  }
  const signUp = preview.data;
  return (
    <AuthCard
      title={`Finish setting up ${signUp.firmName}`}
      intro={
        <>
          You will be the firm’s owner and sign in as <strong className="break-words text-ink">{signUp.email}</strong> with the password you chose.
        </>
      }
    >
      <div className="space-y-4">
        <FormError message={formError} />
        <Button
          type="button"
          size="lg"
          className="w-full"
          busy={confirm.isPending}
          onClick={() => {
            setFormError(null);
            confirm.mutate(undefined, {
              onSuccess: () => void navigate(paths.firm.overview, { replace: true }),
              onError: (err) => setFormError(err.message),
            });
          }}
        >
          Start my trial
        </Button>
        <p className="text-sm text-slate-500">14 days, every feature, no card needed.</p>
      </div>
    </AuthCard>
  );
}
