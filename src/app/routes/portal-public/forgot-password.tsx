import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { passwordResetRequestSchema } from '@domain/schemas/auth';
import { paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useRequestPasswordReset } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

export default function PortalForgotPasswordPage() {
  const firm = usePortalFirm();
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
  const back = (
    <p className="mt-4 text-sm">
      <Link to={paths.firmPortal.signIn(firm.shortName)} className={portalLinkClass}>
        Back to sign-in
      </Link>
    </p>
  );

  if (sentTo) {
    return (
      <PortalCard title="Check your e-mail">
        <p className="text-sm">
          If <strong>{sentTo}</strong> has a sign-in for this portal, a link to choose a new password is on its way. It works once, for an hour.
        </p>
        {back}
      </PortalCard>
    );
  }
  return (
    <PortalCard title="Forgot your password?" intro="Enter the e-mail address you sign in with, and we will send a link to choose a new password.">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="E-mail" error={formState.errors.email?.message}>
          <Input type="email" autoComplete="username" inputMode="email" className="min-h-12" {...register('email')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={request.isPending}>
          Send the link
        </Button>
      </form>
      {back}
    </PortalCard>
  );
}
