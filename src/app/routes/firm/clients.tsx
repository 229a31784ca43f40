import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { UserPlus } from 'lucide-react';
import { formatPhone } from '@domain/phone';
import { paths } from '@/config/paths';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { DataTable, useServerTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Select } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { SearchField } from '@/components/ui/search-field';
import { TableSkeleton } from '@/components/ui/skeleton';
import { useAppAbility } from '@/lib/ability';
import { clientListQuery } from '@/features/clients/api/clients-queries';
import { ClientFormDialog } from '@/features/clients/components/client-form-dialog';
import type { ApiClient } from '@/types/api';

const PAGE_SIZE = 25;

export default function ClientsPage() {
  const ability = useAppAbility();
  const navigate = useNavigate();
  const canCreate = ability.can('create', 'Client');
  const { sort, page, setPage, table } = useServerTable('name');
  const [q, setQ] = useState('');
  const [status, setStatus] = useState<'active' | 'cancelled' | ''>('active');
  const [creating, setCreating] = useState(false);
  const list = useQuery(clientListQuery({ page, pageSize: PAGE_SIZE, sort, q: q.trim() || undefined, status: status || undefined }));

  const columns = useMemo<ColumnDef<ApiClient, unknown>[]>(
    () => [
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Client',
        cell: ({ row }) => (
          <div className="min-w-0">
            <Link to={paths.firm.client(row.original.id)} className="font-medium text-brass-700 underline-offset-2 hover:underline">
              {row.original.name}
            </Link>
            <p className="max-w-[12rem] truncate text-xs text-slate-500 md:hidden">{row.original.email || formatPhone(row.original.phone)}</p>
          </div>
        ),
      },
      { id: 'email', accessorKey: 'email', header: 'E-mail', enableSorting: false, meta: { hideOnMobile: true }, cell: ({ row }) => row.original.email || '—' },
      {
        id: 'phone',
        header: 'Phone',
        enableSorting: false,
        meta: { hideOnMobile: true },
        cell: ({ row }) => <span className="whitespace-nowrap">{row.original.phone ? formatPhone(row.original.phone) : '—'}</span>,
      },
      { id: 'sites', header: 'Sites', enableSorting: false, meta: { align: 'right' }, cell: ({ row }) => row.original.siteCount ?? 0 },
      {
        id: 'status',
        accessorKey: 'status',
        header: 'Status',
        meta: { hideOnMobile: true },
        cell: ({ row }) => (row.original.status === 'active' ? <Badge tone="ok">Active</Badge> : <Badge>Cancelled</Badge>),
      },
    ],
    [],
  );

  return (
    <>
      <PageHeader
        title="Clients"
        context="Households and businesses you look after, with their sites."
        action={
          canCreate && (
            <Button onClick={() => setCreating(true)}>
              <UserPlus className="size-4" aria-hidden="true" /> New client
            </Button>
          )
        }
      />
      <div className="mb-3 flex flex-col gap-2 sm:flex-row">
        <div className="sm:w-80">
          <SearchField
            label="Search clients"
            placeholder="Search by name, e-mail or phone"
            value={q}
            onChange={(value) => {
              setQ(value);
              setPage(1);
            }}
          />
        </div>
        <div className="sm:w-44">
          <label htmlFor="client-status" className="sr-only">
            Show
          </label>
          <Select
            id="client-status"
            value={status}
            onChange={(e) => {
              setStatus(e.target.value as typeof status);
              setPage(1);
            }}
          >
            <option value="active">Active clients</option>
            <option value="cancelled">Cancelled clients</option>
            <option value="">All clients</option>
          </Select>
        </div>
      </div>
      {list.isPending ? (
        <TableSkeleton />
      ) : list.isError ? (
        <p className="text-sm text-clay-600">{list.error.message}</p>
      ) : list.data.page.total === 0 ? (
        q || status !== 'active' ? (
          <EmptyState title="No clients match">Try part of a name, an e-mail address or a phone number.</EmptyState>
        ) : (
          <EmptyState title="No clients yet" action={canCreate && <Button onClick={() => setCreating(true)}>Add your first client</Button>}>
            Add a household, then their site, panel and zones.
          </EmptyState>
        )
      ) : (
        <DataTable
          caption="Clients of the firm"
          columns={columns}
          data={list.data.data}
          getRowId={(r) => r.id}
          {...table}
          pageSize={PAGE_SIZE}
          total={list.data.page.total}
          busy={list.isPlaceholderData}
        />
      )}
      {canCreate && <ClientFormDialog open={creating} onClose={() => setCreating(false)} onSaved={(c) => void navigate(paths.firm.client(c.id))} />}
    </>
  );
}
