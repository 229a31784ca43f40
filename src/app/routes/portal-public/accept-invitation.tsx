import { useQuery } from '@tanstack/react-query';
import { Link, Navigate, useNavigate, useParams } from 'react-router-dom';
import { LIMITS } from '@domain/limits';
import { paths } from '@/config/paths';
import { PortalCard, portalLinkClass, usePortalFirm } from '@/components/layouts/portal-public-layout';
import { Skeleton } from '@/components/ui/skeleton';
import { invitationQuery } from '@/features/auth/api/auth-mutations';
import { AcceptInvitationForm } from '@/features/auth/components/accept-invitation-form';
import { telHref } from '@/features/portal/brand';

/** A homeowner accepts the firm's invitation to its portal and chooses a password. */
export default function PortalAcceptInvitationPage() {
  const portalFirm = usePortalFirm();
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const preview = useQuery(invitationQuery(token));

  if (preview.isPending) {
    return (
      <PortalCard title="Opening your invitation…">
        <Skeleton className="h-24 w-full" />
      </PortalCard>
    );
  }
  if (preview.isError) {
    return (
      <PortalCard title="This invitation cannot be used">
        <p className="text-sm">{preview.error.message}</p>
        <p className="mt-3 text-sm text-slate-500">
          Invitation links work once and expire after {LIMITS.invitationDays} days. Ask {portalFirm.name} to send you a new link
          {portalFirm.phone ? (
            <>
              {' '}
              (call{' '}
              <a href={telHref(portalFirm.phone)} className="font-medium text-brass-700 underline">
                {portalFirm.phone}
              </a>
              )
            </>
          ) : null}
          .
        </p>
        <p className="mt-3 text-sm">
          Already set up your sign-in?{' '}
          <Link to={paths.firmPortal.signIn(portalFirm.shortName)} className={portalLinkClass}>
            Sign in
          </Link>
        </p>
      </PortalCard>
    );
  }
  const inv = preview.data;
  // A staff invitation opened at a portal address belongs on the staff invitation page.
  if (inv.role !== 'client') return <Navigate to={paths.invitation(token)} replace />;
  if (inv.hasSignIn) {
    return (
      <PortalCard title="This address already has a sign-in">
        <p className="text-sm">{inv.notice}</p>
        <p className="mt-3 text-sm">
          <Link to={paths.firmPortal.signIn(portalFirm.shortName)} className={portalLinkClass}>
            Sign in
          </Link>
        </p>
      </PortalCard>
    );
  }

  return (
    <PortalCard
      title={`Welcome to the ${inv.firm.name} client portal`}
      intro={
        <>
          <p>
            Here you will see which doors and windows of your home are protected, the devices of your alarm, upkeep that is due and the visits booked.
          </p>
          <p className="mt-2">
            You will sign in with <strong className="text-ink">{inv.email}</strong>.
          </p>
        </>
      }
    >
      <AcceptInvitationForm
        token={token}
        submitLabel="Create my sign-in"
        onAccepted={() => void navigate(paths.portal.root, { replace: true })}
        inputClassName="min-h-12"
      />
    </PortalCard>
  );
}
