import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { ResetPasswordForm } from '@/features/auth/components/reset-password-form';

export default function ResetPasswordPage() {
  const { token = '' } = useParams();
  const [done, setDone] = useState(false);

  if (done) {
    return (
      <AuthCard title="Password changed">
        <p className="text-sm">Your new password is set, and any other open sessions were signed out.</p>
        <p className="mt-4 text-sm">
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            Sign in
          </Link>
        </p>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Choose a new password">
      <ResetPasswordForm
        token={token}
        onDone={() => setDone(true)}
        footer={(formError) =>
          formError && (
            <p className="text-sm">
              <Link to={paths.forgotPassword} className="font-medium text-brass-700 underline">
                Ask for a new link
              </Link>
            </p>
          )
        }
      />
    </AuthCard>
  );
}
