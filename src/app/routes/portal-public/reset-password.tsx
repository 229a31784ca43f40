import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useParams } from 'react-router-dom';
import { passwordResetSchema } from '@domain/schemas/auth';
import { LIMITS } from '@domain/limits';
import { paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { Button, ButtonLink } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useResetPassword } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

export default function PortalResetPasswordPage() {
  const firm = usePortalFirm();
  const { token = '' } = useParams();
  const reset = useResetPassword(token);
  const [done, setDone] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<{ password: string }>({
    resolver: zodResolver(passwordResetSchema),
    defaultValues: { password: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    reset.mutate(values, {
      onSuccess: () => setDone(true),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['password'])),
    });
  });

  if (done) {
    return (
      <PortalCard title="Password changed">
        <p className="text-sm">Your new password is set, and any other open sessions were signed out.</p>
        <ButtonLink to={paths.firmPortal.signIn(firm.shortName)} size="lg" className="mt-6 w-full">
          Sign in
        </ButtonLink>
      </PortalCard>
    );
  }
  return (
    <PortalCard title="Choose a new password">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="New password" error={formState.errors.password?.message} hint={`At least ${LIMITS.passwordMin} characters.`}>
          <Input type="password" autoComplete="new-password" className="min-h-12" {...register('password')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={reset.isPending}>
          Set the new password
        </Button>
      </form>
      <p className="mt-4 text-sm">
        <Link to={formError ? paths.firmPortal.forgotPassword(firm.shortName) : paths.firmPortal.signIn(firm.shortName)} className={portalLinkClass}>
          {formError ? 'Ask for a new link' : 'Back to sign-in'}
        </Link>
      </p>
    </PortalCard>
  );
}
