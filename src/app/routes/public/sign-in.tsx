import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { signInSchema, type SignInInput } from '@domain/schemas/auth';
import { homeFor, paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { takeRefusal, useSignIn } from '@/lib/auth';
import { applyServerErrors } from '@/lib/form-errors';

/** Only same-site paths are followed after sign-in. */
function safeNext(next: string | null): string | null {
  return next && next.startsWith('/') && !next.startsWith('//') ? next : null;
}

export default function SignInPage() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const signIn = useSignIn();
  const [refusal] = useState(() => takeRefusal());
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<SignInInput>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    signIn.mutate(values, {
      onSuccess: (session) => {
        const role = session.data.user?.role;
        void navigate(safeNext(params.get('next')) ?? homeFor(role), { replace: true });
      },
      onError: (err) => setFormError(applyServerErrors(err, setError, ['email', 'password'])),
    });
  });

  return (
    <AuthCard title="Sign in to Mullion">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {refusal && !formError && <FormError message={refusal} />}
        <FormError message={formError} />
        <FormField label="E-mail" error={formState.errors.email?.message}>
          <Input type="email" autoComplete="username" inputMode="email" {...register('email')} />
        </FormField>
        <FormField label="Password" error={formState.errors.password?.message}>
          <Input type="password" autoComplete="current-password" {...register('password')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={signIn.isPending}>
          Sign in
        </Button>
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
      </form>
    </AuthCard>
  );
}
