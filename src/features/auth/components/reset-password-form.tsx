import { useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { passwordResetSchema } from '@domain/schemas/auth';
import { LIMITS } from '@domain/limits';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useResetPassword } from '@/features/auth/api/auth-mutations';
import { applyServerErrors } from '@/lib/form-errors';

interface ResetPasswordFormProps {
  /** The token from the e-mailed link. */
  token: string;
  /** Called once the new password is set. */
  onDone: () => void;
  /** Extra classes for the input (the portal's larger touch target). */
  inputClassName?: string;
  /** Shown under the button, inside the form, given the form's error (null while there is none). */
  footer?: (formError: string | null) => ReactNode;
  /** Shown after the form, given the form's error (null while there is none). */
  after?: (formError: string | null) => ReactNode;
}

/** Sets a new password with the token from a password-reset e-mail. */
export function ResetPasswordForm({ token, onDone, inputClassName, footer, after }: ResetPasswordFormProps) {
  const reset = useResetPassword(token);
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<{ password: string }>({
    resolver: zodResolver(passwordResetSchema),
    defaultValues: { password: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    reset.mutate(values, {
      onSuccess: () => onDone(),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['password'])),
    });
  });

  return (
    <>
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <FormError message={formError} />
        <FormField label="New password" error={formState.errors.password?.message} hint={`At least ${LIMITS.passwordMin} characters.`}>
          <Input type="password" autoComplete="new-password" className={inputClassName} {...register('password')} />
        </FormField>
        <Button type="submit" size="lg" className="w-full" busy={reset.isPending}>
          Set the new password
        </Button>
        {footer?.(formError)}
      </form>
      {after?.(formError)}
    </>
  );
}
