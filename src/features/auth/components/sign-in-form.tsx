import { useState, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { Role } from '@domain/roles';
import { signInSchema, type SignInInput } from '@domain/schemas/auth';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { takeRefusal, useSignIn } from '@/lib/auth';
import { applyServerErrors } from '@/lib/form-errors';

interface SignInFormProps {
  /** Called once the session is open, with the signed-in user's role. */
  onSignedIn: (role: Role | undefined) => void;
  /** Extra classes for the inputs (the portal's larger touch targets). */
  inputClassName?: string;
  /** Links under the button, inside the form. */
  links?: ReactNode;
}

/**
 * The e-mail and password form of a sign-in page, with the server's errors and the banner
 * of a refused session (see takeRefusal).
 */
export function SignInForm({ onSignedIn, inputClassName, links }: SignInFormProps) {
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
      onSuccess: (session) => onSignedIn(session.data.user?.role),
      onError: (err) => setFormError(applyServerErrors(err, setError, ['email', 'password'])),
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      {refusal && !formError && <FormError message={refusal} />}
      <FormError message={formError} />
      <FormField label="E-mail" error={formState.errors.email?.message}>
        <Input type="email" autoComplete="username" inputMode="email" className={inputClassName} {...register('email')} />
      </FormField>
      <FormField label="Password" error={formState.errors.password?.message}>
        <Input type="password" autoComplete="current-password" className={inputClassName} {...register('password')} />
      </FormField>
      <Button type="submit" size="lg" className="w-full" busy={signIn.isPending}>
        Sign in
      </Button>
      {links}
    </form>
  );
}
