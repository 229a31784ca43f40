import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { acceptInvitationSchema, type AcceptInvitationInput } from '@domain/schemas/auth';
import { LIMITS } from '@domain/limits';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useAcceptInvitation } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

interface AcceptInvitationFormProps {
  /** The token from the invitation link. */
  token: string;
  /** The submit button's text. */
  submitLabel: string;
  /** Called once the invitation is accepted and the session is open. */
  onAccepted: () => void;
  /** Extra classes for the inputs (the portal's larger touch targets). */
  inputClassName?: string;
}

/** The name and password an invited person chooses to accept the invitation. */
export function AcceptInvitationForm({ token, submitLabel, onAccepted, inputClassName }: AcceptInvitationFormProps) {
  const accept = useAcceptInvitation(token);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<AcceptInvitationInput>({
    resolver: zodResolver(acceptInvitationSchema),
    defaultValues: { name: '', password: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    accept.mutate(values, {
      onSuccess: () => onAccepted(),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['name', 'password'])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormError message={formError} />
      <FormField label="Your name" error={formState.errors.name?.message}>
        <Input autoComplete="name" className={inputClassName} {...register('name')} />
      </FormField>
      <FormField label="Choose a password" error={formState.errors.password?.message} hint={`At least ${LIMITS.passwordMin} characters.`}>
        <Input type="password" autoComplete="new-password" className={inputClassName} {...register('password')} />
      </FormField>
      <Button type="submit" size="lg" className="w-full" busy={accept.isPending}>
        {submitLabel}
      </Button>
    </form>
  );
}
