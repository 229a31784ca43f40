import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { passwordResetRequestSchema } from '@domain/schemas/auth';
import { paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useRequestPasswordReset } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

export default function ForgotPasswordPage() {
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<{ email: string }>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    request.mutate(values, {
      onSuccess: () => setSentTo(values.email),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['email'])),
    });
  });

  if (sentTo) {
    return (
      <AuthCard title="Check your e-mail">
        <p className="text-sm">
          If <strong>{sentTo}</strong> has a Mullion sign-in, a link to choose a new password is on its way. It works once, for an hour.
        </p>
        <p className="mt-4 text-sm">
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            Back to sign-in
          </Link>
        </p>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Forgot your password?" intro="Enter your e-mail and we will send a link to choose a new one.">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="E-mail" error={formState.errors.email?.message}>
          <Input type="email" autoComplete="username" inputMode="email" {...register('email')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={request.isPending}>
          Send the link
        </Button>
      </form>
    </AuthCard>
  );
}
