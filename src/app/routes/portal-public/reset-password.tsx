import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { ButtonLink } from '@/components/ui/button';
import { ResetPasswordForm } from '@/features/auth/components/reset-password-form';

export default function PortalResetPasswordPage() {
  const firm = usePortalFirm();
  const { token = '' } = useParams();
  const [done, setDone] = useState(false);

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
      <ResetPasswordForm
        token={token}
        onDone={() => setDone(true)}
        inputClassName="min-h-12"
        after={(formError) => (
          <p className="mt-4 text-sm">
            <Link
              to={formError ? paths.firmPortal.forgotPassword(firm.shortName) : paths.firmPortal.signIn(firm.shortName)}
              className={portalLinkClass}
            >
              {formError ? 'Ask for a new link' : 'Back to sign-in'}
            </Link>
          </p>
        )}
      />
    </PortalCard>
  );
}
