import { useState } from 'react';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ArrowLeft, MapPin, Pencil, Plus, Trash2 } from 'lucide-react';
import { formatPhone } from '@domain/phone';
import { paths } from '@/config/paths';
import { Badge } from '@/components/ui/badge';
import { Button, ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { EmptyState } from '@/components/ui/empty-state';
import { FormError } from '@/components/ui/form-field';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { useAppAbility } from '@/lib/ability';
import { ApiError } from '@/lib/api-client';
import { clientQuery, useDeleteClient } from '@/features/clients/api/clients-queries';
import { ClientFormDialog } from '@/features/clients/components/client-form-dialog';
import { PortalInvitation } from '@/features/clients/components/portal-invitation';
import { siteListQuery } from '@/features/sites/api/sites-queries';

export function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  return queryClient.ensureQueryData(clientQuery(params.clientId ?? ''));
}

export default function ClientPage() {
  const { clientId = '' } = useParams();
  const { data: client } = useSuspenseQuery(clientQuery(clientId));
  const sites = useQuery(siteListQuery({ page: 1, pageSize: 100, clientId }));
  const ability = useAppAbility();
  const navigate = useNavigate();
  const toast = useToast();
  const remove = useDeleteClient(clientId);
  const [editing, setEditing] = useState(false);
  const [deleting, setDeleting] = useState(false);
  const [deleteError, setDeleteError] = useState<string | null>(null);
  const canEdit = ability.can('update', 'Client');
  const canAddSite = ability.can('create', 'Site');

  return (
    <>
      <Link to={paths.firm.clients} className="mb-4 inline-flex items-center gap-1 text-sm text-slate-500 hover:text-ink">
        <ArrowLeft className="size-4" aria-hidden="true" /> Clients
      </Link>
      <PageHeader
        title={client.name}
        context={
          <span className="inline-flex flex-wrap items-center gap-2">
            {client.status === 'active' ? <Badge tone="ok">Active</Badge> : <Badge>Cancelled</Badge>}
            {client.email && <span>{client.email}</span>}
            {client.phone && <span className="whitespace-nowrap">{formatPhone(client.phone)}</span>}
          </span>
        }
        action={
          canEdit && (
            <>
              <Button variant="secondary" onClick={() => setEditing(true)}>
                <Pencil className="size-4" aria-hidden="true" /> Edit
              </Button>
              <Button variant="ghost" onClick={() => setDeleting(true)} aria-label="Delete client">
                <Trash2 className="size-4" aria-hidden="true" />
              </Button>
            </>
          )
        }
      />
      <div className="grid gap-6 lg:grid-cols-3">
        <div className="space-y-3 lg:col-span-2">
          <div className="flex items-center justify-between">
            <h2 className="text-base font-semibold">Sites</h2>
            {canAddSite && (
              <ButtonLink to={paths.firm.newSite(client.id)} variant="secondary" size="sm">
                <Plus className="size-4" aria-hidden="true" /> Add site
              </ButtonLink>
            )}
          </div>
          {sites.isPending ? (
            <Skeleton className="h-24 w-full" />
          ) : sites.isError ? (
            <p className="text-sm text-clay-600">{sites.error.message}</p>
          ) : sites.data.data.length === 0 ? (
            <EmptyState title="No sites yet" action={canAddSite && <ButtonLink to={paths.firm.newSite(client.id)}>Add the first site</ButtonLink>}>
              A site is a protected place: its address, panel and zones.
            </EmptyState>
          ) : (
            <ul className="space-y-2">
              {sites.data.data.map((site) => (
                <li key={site.id}>
                  <Link
                    to={paths.firm.site(site.id)}
                    className="flex items-start gap-3 rounded-md border border-line bg-card p-4 hover:border-brass-600"
                  >
                    <MapPin className="mt-0.5 size-5 shrink-0 text-brass-600" aria-hidden="true" />
                    <span className="min-w-0">
                      <span className="block font-medium">{site.name}</span>
                      <span className="block text-sm text-slate-500">
                        {site.address.line1}
                        {site.address.line2 ? `, ${site.address.line2}` : ''}, {site.address.city}
                        {site.address.region ? `, ${site.address.region}` : ''} {site.address.postalCode}
                      </span>
                      {site.monitoringAccount && (
                        <span className="mt-1 block font-mono text-xs text-slate-500">Account {site.monitoringAccount}</span>
                      )}
                    </span>
                  </Link>
                </li>
              ))}
            </ul>
          )}
        </div>
        <div className="space-y-6">
          <Card title="Contact">
            <dl className="space-y-2 text-sm">
              <div>
                <dt className="text-slate-500">E-mail</dt>
                <dd>
                  {client.email ? (
                    <a href={`mailto:${client.email}`} className="text-brass-700 underline">
                      {client.email}
                    </a>
                  ) : (
                    '—'
                  )}
                </dd>
              </div>
              <div>
                <dt className="text-slate-500">Phone</dt>
                <dd>
                  {client.phone ? (
                    <a href={`tel:${client.phone}`} className="text-brass-700 underline">
                      {formatPhone(client.phone)}
                    </a>
                  ) : (
                    '—'
                  )}
                </dd>
              </div>
              {client.altPhone && (
                <div>
                  <dt className="text-slate-500">Other phone</dt>
                  <dd>
                    <a href={`tel:${client.altPhone}`} className="text-brass-700 underline">
                      {formatPhone(client.altPhone)}
                    </a>
                  </dd>
                </div>
              )}
              {client.notes && (
                <div>
                  <dt className="text-slate-500">Internal notes</dt>
                  <dd className="whitespace-pre-line">{client.notes}</dd>
                </div>
              )}
            </dl>
          </Card>
          {ability.can('create', 'Invitation') && client.status === 'active' && <PortalInvitation client={client} />}
        </div>
      </div>
      {canEdit && <ClientFormDialog open={editing} onClose={() => setEditing(false)} client={client} />}
      <Dialog
        open={deleting}
        onClose={() => {
          setDeleting(false);
          setDeleteError(null);
        }}
        title={`Delete ${client.name}?`}
        description="A client can be deleted once they have no sites. To stop service but keep the history, set the client to cancelled instead."
      >
        <div className="space-y-4">
          <FormError message={deleteError} />
          <div className="flex justify-end gap-2">
            <Button variant="secondary" onClick={() => setDeleting(false)}>
              Keep client
            </Button>
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={() =>
                remove.mutate(undefined, {
                  onSuccess: () => {
                    toast.success(`${client.name} deleted.`);
                    void navigate(paths.firm.clients);
                  },
                  onError: (err) => setDeleteError(err instanceof ApiError ? err.message : 'Something went wrong.'),
                })
              }
            >
              Delete client
            </Button>
          </div>
        </div>
      </Dialog>
    </>
  );
}
