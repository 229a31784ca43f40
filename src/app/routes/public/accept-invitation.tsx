import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { LIMITS } from '@domain/limits';
import { homeFor, paths } from '@/config/paths';
import { AuthCard } from '@/components/layouts/public-layout';
import { Skeleton } from '@/components/ui/skeleton';
import { invitationQuery } from '@/features/auth/api/auth-mutations';
import { AcceptInvitationForm } from '@/features/auth/components/accept-invitation-form';

export default function AcceptInvitationPage() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const preview = useQuery(invitationQuery(token));

  if (preview.isPending) {
    return (
      <AuthCard title="Opening your invitation…">
        <Skeleton className="h-24 w-full" />
      </AuthCard>
    );
  }
  if (preview.isError) {
    return (
      <AuthCard title="This invitation cannot be used">
        <p className="text-sm">{preview.error.message}</p>
        <p className="mt-4 text-sm text-slate-500">
          Invitation links work once and expire after {LIMITS.invitationDays} days. Ask the person who invited you to send a new one, or{' '}
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            sign in
          </Link>{' '}
          if you already accepted.
        </p>
      </AuthCard>
    );
  }
  const inv = preview.data;
  if (inv.hasSignIn) {
    return (
      <AuthCard title={`This address cannot join ${inv.firm.name}`}>
        <p className="text-sm">{inv.notice}</p>
        <p className="mt-4 text-sm">
          <Link to={paths.signIn} className="font-medium text-brass-700 underline">
            Sign in
          </Link>
        </p>
      </AuthCard>
    );
  }
  return (
    <AuthCard
      title={`Join ${inv.firm.name}`}
      intro={
        <>
          You are invited as <strong className="text-ink">{inv.roleLabel.toLowerCase()}</strong>. You will sign in with <strong className="text-ink">{inv.email}</strong>.
        </>
      }
    >
      <AcceptInvitationForm token={token} submitLabel="Accept and sign in" onAccepted={() => void navigate(homeFor(inv.role), { replace: true })} />
    </AuthCard>
  );
}
