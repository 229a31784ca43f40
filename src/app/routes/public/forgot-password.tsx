import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';

export default function ForgotPasswordPage() {
  const [sentTo, setSentTo] = useState<string | null>(null);

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
      <ForgotPasswordForm onSent={setSentTo} />
    </AuthCard>
  );
}
