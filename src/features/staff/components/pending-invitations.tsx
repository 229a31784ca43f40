import { useQuery } from '@tanstack/react-query';
import { ROLE_LABELS } from '@domain/roles';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { formatDate } from '@/lib/format';
import { useResendInvitation, useRevokeInvitation } from '../api/staff-mutations';
import { staffInvitationsQuery } from '../api/staff-queries';

export function PendingInvitations({ timeZone }: { timeZone?: string | undefined }) {
  const invitations = useQuery(staffInvitationsQuery());
  const resend = useResendInvitation();
  const revoke = useRevokeInvitation();
  const toast = useToast();
  const fail = (e: unknown) => toast.error(e instanceof ApiError ? e.message : 'Something went wrong. Try again.');

  if (invitations.isPending) return <Skeleton className="h-20 w-full" />;
  if (invitations.isError) return <p className="text-sm text-clay-600">{invitations.error.message}</p>;
  if (invitations.data.length === 0) return null;

  return (
    <Card title="Invitations not yet accepted">
      <ul className="divide-y divide-line">
        {invitations.data.map((inv) => (
          <li key={inv.id} className="flex flex-col gap-2 py-2 first:pt-0 last:pb-0 sm:flex-row sm:items-center sm:justify-between">
            <div className="min-w-0">
              <p className="truncate text-sm font-medium">{inv.email}</p>
              <p className="text-xs text-slate-500">
                {ROLE_LABELS[inv.role]} · {inv.state === 'expired' ? `expired ${formatDate(inv.expiresAt, timeZone)}` : `link valid until ${formatDate(inv.expiresAt, timeZone)}`}
              </p>
            </div>
            <div className="flex items-center gap-2">
              {inv.state === 'expired' ? <Badge tone="warn">Expired</Badge> : <Badge tone="brass">Waiting</Badge>}
              <Button
                variant="secondary"
                size="sm"
                busy={resend.isPending && resend.variables === inv.id}
                onClick={() => resend.mutate(inv.id, { onSuccess: () => toast.success(`Sent again to ${inv.email}.`), onError: fail })}
              >
                Send again
              </Button>
              <Button
                variant="ghost"
                size="sm"
                busy={revoke.isPending && revoke.variables === inv.id}
                onClick={() => revoke.mutate(inv.id, { onSuccess: () => toast.success(`The link sent to ${inv.email} no longer works.`), onError: fail })}
              >
                Withdraw
              </Button>
            </div>
          </li>
        ))}
      </ul>
    </Card>
  );
}
