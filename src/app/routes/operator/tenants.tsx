import { useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { planByKey } from '@domain/plans';
import { TENANT_STATES, TENANT_STATE_LABELS, type TenantState } from '@domain/tenant-states';
import { paths } from '@/config/paths';
import { DataTable, useServerTable, type ColumnMeta } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Select } from '@/components/ui/input';
import { SearchField } from '@/components/ui/search-field';
import { PageHeader } from '@/components/ui/page-header';
import { TableSkeleton } from '@/components/ui/skeleton';
import { formatDate } from '@/lib/format';
import { tenantListQuery } from '@/features/operator/api/operator-queries';
import { TenantStateBadge } from '@/features/operator/components/tenant-state-badge';
import type { OperatorTenant } from '@/types/api';

const PAGE_SIZE = 25;

export default function OperatorTenantsPage() {
  const { sort, page, setPage, table } = useServerTable('name');
  const [q, setQ] = useState('');
  const [state, setState] = useState<TenantState | ''>('');
  const list = useQuery(tenantListQuery({ page, pageSize: PAGE_SIZE, sort, q: q.trim() || undefined, state: state || undefined }));

  const columns = useMemo<ColumnDef<OperatorTenant, unknown>[]>(
    () => [
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Firm',
        cell: ({ row }) => (
          <Link to={paths.operator.tenant(row.original.id)} className="font-medium text-brass-700 underline-offset-2 hover:underline">
            {row.original.name}
          </Link>
        ),
      },
      { id: 'state', accessorKey: 'state', header: 'State', cell: ({ row }) => <TenantStateBadge state={row.original.state} /> },
      {
        id: 'plan',
        header: 'Plan',
        enableSorting: false,
        meta: { hideOnMobile: true } satisfies ColumnMeta,
        cell: ({ row }) => (row.original.planKey ? (planByKey(row.original.planKey)?.name ?? row.original.planKey) : '—'),
      },
      { id: 'staffCount', accessorKey: 'staffCount', header: 'Staff', enableSorting: false, meta: { align: 'right' } satisfies ColumnMeta },
      {
        id: 'trialEndsAt',
        accessorKey: 'trialEndsAt',
        header: 'Trial ends',
        meta: { hideOnMobile: true } satisfies ColumnMeta,
        cell: ({ row }) => (row.original.state === 'trialing' ? formatDate(row.original.trialEndsAt) : '—'),
      },
      { id: 'createdAt', accessorKey: 'createdAt', header: 'Created', meta: { hideOnMobile: true } satisfies ColumnMeta, cell: ({ row }) => formatDate(row.original.createdAt) },
    ],
    [],
  );

  return (
    <>
      <PageHeader title="Firms" context="Every firm on the Mullion service, with its state and staff. Firms’ client records are never shown here." />
      <div className="mb-3 flex flex-col gap-2 sm:flex-row">
        <div className="sm:w-72">
          <SearchField
            label="Search firms"
            placeholder="Search by name or short name"
            value={q}
            onChange={(value) => {
              setQ(value);
              setPage(1);
            }}
          />
        </div>
        <div className="sm:w-48">
          <label htmlFor="firm-state" className="sr-only">
            Filter by state
          </label>
          <Select
            id="firm-state"
            value={state}
            onChange={(e) => {
              setState(e.target.value as TenantState | '');
              setPage(1);
            }}
          >
            <option value="">All states</option>
            {TENANT_STATES.map((s) => (
              <option key={s} value={s}>
                {TENANT_STATE_LABELS[s]}
              </option>
            ))}
          </Select>
        </div>
      </div>
      {list.isPending ? (
        <TableSkeleton />
      ) : list.isError ? (
        <p className="text-sm text-clay-600">{list.error.message}</p>
      ) : list.data.page.total === 0 ? (
        <EmptyState title="No firms match">Clear the search or the state filter.</EmptyState>
      ) : (
        <DataTable
          caption="Firms on the service"
          columns={columns}
          data={list.data.data}
          getRowId={(r) => r.id}
          {...table}
          pageSize={PAGE_SIZE}
          total={list.data.page.total}
          busy={list.isPlaceholderData}
        />
      )}
    </>
  );
}
