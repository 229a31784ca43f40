import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { acceptInvitationSchema, type AcceptInvitationInput } from '@domain/schemas/auth';
import { LIMITS } from '@domain/limits';
import { homeFor, paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { invitationQuery, useAcceptInvitation } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

export default function AcceptInvitationPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const preview = useQuery(invitationQuery(token));
  const accept = useAcceptInvitation(token);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<AcceptInvitationInput>({
    resolver: zodResolver(acceptInvitationSchema),
    defaultValues: { name: '', password: '' },
  });

  if (preview.isPending) {
    return (
      <AuthCard title="Opening your invitation…">
        <Skeleton className="h-24 w-full" />
      </AuthCard>
    );
  }
  if (preview.isError) {
    return (
      <AuthCard title="This invitation cannot be used">
        <p className="text-sm">{preview.error.message}</p>
        <p className="mt-4 text-sm text-slate-500">
          Invitation links work once and expire after {LIMITS.invitationDays} days. Ask the person who invited you to send a new one, or{' '}
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            sign in
          </Link>{' '}
          if you already accepted.
        </p>
      </AuthCard>
    );
  }
  const inv = preview.data;
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    accept.mutate(values, {
      onSuccess: () => void navigate(homeFor(inv.role), { replace: true }),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['name', 'password'])),
    });
  });
  return (
    <AuthCard
      title={`Join ${inv.firm.name}`}
      intro={
        <>
          You are invited as <strong className="text-ink">{inv.roleLabel.toLowerCase()}</strong>. You will sign in with <strong className="text-ink">{inv.email}</strong>.
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="Your name" error={formState.errors.name?.message}>
          <Input autoComplete="name" {...register('name')} />
        </FormField>
        <FormField label="Choose a password" error={formState.errors.password?.message} hint={`At least ${LIMITS.passwordMin} characters.`}>
          <Input type="password" autoComplete="new-password" {...register('password')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={accept.isPending}>
          Accept and sign in
        </Button>
      </form>
    </AuthCard>
  );
}
