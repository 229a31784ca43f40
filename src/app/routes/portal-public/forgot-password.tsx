import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { ForgotPasswordForm } from '@/features/auth/components/forgot-password-form';

export default function PortalForgotPasswordPage() {
  const firm = usePortalFirm();
  const [sentTo, setSentTo] = useState<string | null>(null);
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
      <ForgotPasswordForm onSent={setSentTo} inputClassName="min-h-12" />
      {back}
    </PortalCard>
  );
}
