import { useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Send } from 'lucide-react';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { useToast } from '@/components/ui/toast';
import { api, ApiError } from '@/lib/api-client';
import { formatDate } from '@/lib/format';
import type { ApiClient, ApiInvitation } from '@/types/api';
import { clientKeys } from '../api/clients-queries';

/**
 * Invites the household to the firm's portal, where they see what protects their home.
 * Pending invitations can be sent again or withdrawn.
 */
export function PortalInvitation({ client }: { client: ApiClient }) {
  const key = [...clientKeys.detail(client.id), 'invitations'] as const;
  const queryClient = useQueryClient();
  const toast = useToast();
  const [email, setEmail] = useState(client.email);
  const [error, setError] = useState<string | null>(null);
  const pending = useQuery({ queryKey: key, queryFn: ({ signal }) => api.get<{ data: ApiInvitation[] }>(`/api/clients/${client.id}/invitations`, signal).then((r) => r.data) });
  const refresh = () => queryClient.invalidateQueries({ queryKey: key });
  const fail = (err: unknown) => setError(err instanceof ApiError ? (Object.values(err.fields)[0] ?? err.message) : 'Something went wrong. Try again.');
  const invite = useMutation({ mutationFn: () => api.post(`/api/clients/${client.id}/invitations`, { email }), onSuccess: refresh });
  const resend = useMutation({ mutationFn: (id: string) => api.post(`/api/clients/${client.id}/invitations/${id}/resend`), onSuccess: refresh });
  const revoke = useMutation({ mutationFn: (id: string) => api.delete(`/api/clients/${client.id}/invitations/${id}`), onSuccess: refresh });

  return (
    <Card title="Client portal">
      <div className="space-y-3 text-sm">
        <p className="text-slate-500">The household signs in to see which doors and windows are protected, upkeep due, their visits and the documents you share.</p>
        {pending.data?.map((inv) => (
          <div key={inv.id} className="flex flex-wrap items-center justify-between gap-2 rounded-md border border-line px-3 py-2">
            <span className="min-w-0">
              <span className="block truncate font-medium">{inv.email}</span>
              <span className="text-xs text-slate-500">{inv.state === 'expired' ? 'Link expired' : `Link valid until ${formatDate(inv.expiresAt)}`}</span>
            </span>
            <span className="flex items-center gap-1">
              <Badge tone={inv.state === 'expired' ? 'warn' : 'brass'}>{inv.state === 'expired' ? 'Expired' : 'Waiting'}</Badge>
              <Button variant="ghost" size="sm" busy={resend.isPending} onClick={() => resend.mutate(inv.id, { onSuccess: () => toast.success(`Sent again to ${inv.email}.`), onError: fail })}>
                Send again
              </Button>
              <Button variant="ghost" size="sm" busy={revoke.isPending} onClick={() => revoke.mutate(inv.id, { onSuccess: () => toast.success('Invitation withdrawn.'), onError: fail })}>
                Withdraw
              </Button>
            </span>
          </div>
        ))}
        <FormError message={error} />
        <form
          className="flex flex-col gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            setError(null);
            invite.mutate(undefined, { onSuccess: () => toast.success(`Invitation sent to ${email}.`), onError: fail });
          }}
        >
          <label htmlFor={`portal-email-${client.id}`} className="sr-only">
            E-mail to invite
          </label>
          <Input id={`portal-email-${client.id}`} type="email" inputMode="email" value={email} onChange={(e) => setEmail(e.target.value)} placeholder="household@example.com" />
          <Button type="submit" variant="secondary" busy={invite.isPending} disabled={!email.trim()}>
            <Send className="size-4" aria-hidden="true" /> Invite to the portal
          </Button>
        </form>
      </div>
    </Card>
  );
}
