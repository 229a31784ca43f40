import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { signUpSchema, type SignUpInput } from '@domain/schemas/auth';
import { LIMITS } from '@domain/limits';
import { paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useSignUp } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

const FIELDS = ['firmName', 'name', 'email', 'password'] as const;

export default function SignUpPage() {
  const signUp = useSignUp();
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<SignUpInput>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { firmName: '', name: '', email: '', password: '' },
  });

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    signUp.mutate(values, {
      onSuccess: (answer) => setSentTo(answer.email),
      onError: (err) => setFormError(applyServerErrors(err, setError, FIELDS)),
    });
  });

  if (sentTo) {
    return (
      <AuthCard title="Check your inbox">
        <div role="status" className="space-y-4 text-sm">
          <p>
            Check your inbox at <strong className="break-words">{sentTo}</strong> for a link to finish setting up your firm. The link works once and expires in{' '}
            {LIMITS.signUpConfirmationHours} hours.
          </p>
          <p className="text-slate-500">Nothing after a few minutes? Look in your spam folder, or check the address and sign up again.</p>
          <p>
            <button type="button" className="font-medium text-brass-700 underline" onClick={() => setSentTo(null)}>
              Use another address
            </button>
          </p>
        </div>
      </AuthCard>
    );
  }

  return (
    <AuthCard title="Start your firm’s trial" intro="14 days, every feature, no card needed. You can invite your office and technicians right after.">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="Firm name" error={formState.errors.firmName?.message}>
          <Input autoComplete="organization" {...register('firmName')} />
        </FormField>
        <FormField label="Your name" error={formState.errors.name?.message}>
          <Input autoComplete="name" {...register('name')} />
        </FormField>
        <FormField label="Work e-mail" error={formState.errors.email?.message}>
          <Input type="email" autoComplete="email" inputMode="email" {...register('email')} />
        </FormField>
        <FormField label="Password" error={formState.errors.password?.message} hint={`At least ${LIMITS.passwordMin} characters.`}>
          <Input type="password" autoComplete="new-password" {...register('password')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={signUp.isPending}>
          Create my firm
        </Button>
        <p className="text-center text-sm text-slate-500">
          Already on Mullion?{' '}
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            Sign in
          </Link>
        </p>
      </form>
    </AuthCard>
  );
}
