import { Link, useNavigate } from 'react-router-dom';
import { homeFor, paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { SignInForm } from '@/features/auth/components/sign-in-form';

/** A household signs in at its firm's portal address and lands on its portal. */
export default function PortalSignInPage() {
  const firm = usePortalFirm();
  const navigate = useNavigate();

  return (
    <PortalCard
      title="Sign in to your home’s alarm portal"
      intro={`${firm.name} keeps your alarm’s record here: which doors and windows are protected, your devices, upkeep and visits.`}
    >
      <SignInForm
        onSignedIn={(role) => void navigate(homeFor(role), { replace: true })}
        inputClassName="min-h-12"
        links={
          <p className="text-center text-sm">
            <Link to={paths.firmPortal.forgotPassword(firm.shortName)} className={portalLinkClass}>
              Forgot your password?
            </Link>
          </p>
        }
      />
    </PortalCard>
  );
}
