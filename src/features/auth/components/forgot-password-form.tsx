import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { passwordResetRequestSchema } from '@domain/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useRequestPasswordReset } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

interface ForgotPasswordFormProps {
  /** Called with the e-mail address once the server has taken the request. */
  onSent: (email: string) => void;
  /** Extra classes for the input (the portal's larger touch target). */
  inputClassName?: string;
}

/** Asks for the e-mail address to send a password-reset link to. */
export function ForgotPasswordForm({ onSent, inputClassName }: ForgotPasswordFormProps) {
  const request = useRequestPasswordReset();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<{ email: string }>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    request.mutate(values, {
      onSuccess: () => onSent(values.email),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['email'])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <FormError message={formError} />
      <FormField label="E-mail" error={formState.errors.email?.message}>
        <Input type="email" autoComplete="username" inputMode="email" className={inputClassName} {...register('email')} />
      </FormField>
      <Button type="submit" size="lg" className="w-full" busy={request.isPending}>
        Send the link
      </Button>
    </form>
  );
}
