import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate } from 'react-router-dom';
import { signInSchema, type SignInInput } from '@domain/schemas/auth';
import { homeFor, paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { takeRefusal, useSignIn } from '@/lib/auth';
import { applyServerErrors } from '@/lib/form-errors';

/** A household signs in at its firm's portal address and lands on its portal. */
export default function PortalSignInPage() {
  const firm = usePortalFirm();
  const navigate = useNavigate();
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
      onSuccess: (session) => void navigate(homeFor(session.data.user?.role), { replace: true }),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['email', 'password'])),
    });
  });

  return (
    <PortalCard
      title="Sign in to your home’s alarm portal"
      intro={`${firm.name} keeps your alarm’s record here: which doors and windows are protected, your devices, upkeep and visits.`}
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        {refusal && !formError && <FormError message={refusal} />}
        <FormError message={formError} />
        <FormField label="E-mail" error={formState.errors.email?.message}>
          <Input type="email" autoComplete="username" inputMode="email" className="min-h-12" {...register('email')} />
        </FormField>
        <FormField label="Password" error={formState.errors.password?.message}>
          <Input type="password" autoComplete="current-password" className="min-h-12" {...register('password')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={signIn.isPending}>
          Sign in
        </Button>
        <p className="text-center text-sm">
          <Link to={paths.firmPortal.forgotPassword(firm.shortName)} className={portalLinkClass}>
            Forgot your password?
          </Link>
        </p>
      </form>
    </PortalCard>
  );
}
