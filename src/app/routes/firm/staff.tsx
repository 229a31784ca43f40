import { useEffect, useMemo, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { ColumnDef } from '@tanstack/react-table';
import { UserPlus } from 'lucide-react';
import { ROLE_LABELS } from '@domain/roles';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { DataTable, useServerTable, type ColumnMeta } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { SearchField } from '@/components/ui/search-field';
import { PageHeader } from '@/components/ui/page-header';
import { TableSkeleton } from '@/components/ui/skeleton';
import { useAppAbility } from '@/lib/ability';
import { useSession } from '@/lib/auth';
import { formatDate } from '@/lib/format';
import { billingKeys, billingQuery } from '@/features/billing/api/billing-queries';
import { usageWords } from '@/features/billing/components/usage-meter';
import { staffListQuery } from '@/features/staff/api/staff-queries';
import { InviteStaffDialog } from '@/features/staff/components/invite-staff-dialog';
import { PendingInvitations } from '@/features/staff/components/pending-invitations';
import { StaffMemberActions } from '@/features/staff/components/staff-member-actions';
import type { ApiUser } from '@/types/api';

const PAGE_SIZE = 25;

const count = new Intl.NumberFormat('en-US');

/**
 * "Staff seats 3 of 10" for those who manage billing. Invitations hold seats too, so the count
 * is asked again after each change on this page; if billing cannot be read, nothing shows.
 */
function useStaffSeats(enabled: boolean) {
  const queryClient = useQueryClient();
  const billing = useQuery({ ...billingQuery(), enabled });
  useEffect(() => {
    if (!enabled) return;
    // Inviting, revoking, deactivating: any change made on this page may free or take a seat.
    return queryClient.getMutationCache().subscribe((event) => {
      if (event.type === 'updated' && event.action.type === 'success') void queryClient.invalidateQueries({ queryKey: billingKeys.detail() });
    });
  }, [enabled, queryClient]);
  return enabled && billing.data ? { used: billing.data.usage.staffSeats, max: billing.data.limits.staffSeats } : null;
}

function StaffSeats({ used, max }: { used: number; max: number }) {
  const state = usageWords(used, max);
  return (
    <p className="self-center text-sm text-slate-500 tabular-nums">
      Staff seats {count.format(used)} of {count.format(max)}
      {state && <span className={state.tone === 'limit' ? 'font-medium text-clay-600' : 'font-medium text-ochre-600'}> · {state.words.toLowerCase()}</span>}
    </p>
  );
}

export default function StaffPage() {
  const { tenant, user } = useSession();
  const ability = useAppAbility();
  const canAdminister = ability.can('administer', 'User');
  const canInvite = ability.can('create', 'Invitation') && canAdminister;
  const seats = useStaffSeats(ability.can('manage', 'Billing'));
  const { sort, page, setPage, table } = useServerTable('name');
  const [q, setQ] = useState('');
  const [inviting, setInviting] = useState(false);
  const filters = { page, pageSize: PAGE_SIZE, sort, q: q.trim() || undefined };
  const list = useQuery(staffListQuery(filters));
  const timeZone = tenant?.timeZone;

  const columns = useMemo<ColumnDef<ApiUser, unknown>[]>(() => {
    const cols: ColumnDef<ApiUser, unknown>[] = [
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Name',
        cell: ({ row }) => (
          <div className="min-w-0">
            <p className="font-medium">
              {row.original.name}
              {row.original.id === user?.id && <span className="ml-1 text-xs font-normal text-slate-500">(you)</span>}
            </p>
            <p className="max-w-[10rem] truncate text-xs text-slate-500 md:hidden">{row.original.email}</p>
          </div>
        ),
      },
      { id: 'email', accessorKey: 'email', header: 'E-mail', meta: { hideOnMobile: true } satisfies ColumnMeta },
      {
        id: 'role',
        accessorKey: 'role',
        header: 'Role',
        cell: ({ row }) => (
          <span className="inline-flex flex-col items-start gap-0.5">
            {ROLE_LABELS[row.original.role]}
            {!row.original.active && (
              <Badge tone="bad" className="md:hidden">
                Deactivated
              </Badge>
            )}
          </span>
        ),
      },
      {
        id: 'state',
        header: 'State',
        enableSorting: false,
        meta: { hideOnMobile: true } satisfies ColumnMeta,
        cell: ({ row }) => (row.original.active ? <Badge tone="ok">Active</Badge> : <Badge tone="bad">Deactivated</Badge>),
      },
      {
        id: 'lastSignInAt',
        accessorKey: 'lastSignInAt',
        header: 'Last sign-in',
        meta: { hideOnMobile: true } satisfies ColumnMeta,
        cell: ({ row }) => (row.original.lastSignInAt ? formatDate(row.original.lastSignInAt, timeZone) : 'Never'),
      },
    ];
    if (canAdminister)
      cols.push({ id: 'actions', header: () => <span className="sr-only">Actions</span>, enableSorting: false, meta: { align: 'right' }, cell: ({ row }) => <StaffMemberActions member={row.original} /> });
    return cols;
  }, [canAdminister, timeZone, user?.id]);

  return (
    <>
      <PageHeader
        title="Staff"
        context={canAdminister ? 'Who works in this firm, with which role. Invite your office and technicians.' : 'Who works in this firm, with which role.'}
        action={
          (canInvite || seats) && (
            <>
              {seats && <StaffSeats used={seats.used} max={seats.max} />}
              {canInvite && (
                <Button onClick={() => setInviting(true)}>
                  <UserPlus className="size-4" aria-hidden="true" /> Invite a colleague
                </Button>
              )}
            </>
          )
        }
      />
      <div className="space-y-6">
        {canInvite && <PendingInvitations timeZone={timeZone} />}
        <div className="space-y-3">
          <div className="max-w-xs">
            <SearchField
              label="Search staff"
              placeholder="Search by name or e-mail"
              value={q}
              onChange={(value) => {
                setQ(value);
                setPage(1);
              }}
            />
          </div>
          {list.isPending ? (
            <TableSkeleton />
          ) : list.isError ? (
            <p className="text-sm text-clay-600">{list.error.message}</p>
          ) : list.data.page.total === 0 && q ? (
            <EmptyState title="Nobody matches that search">Try part of a name or an e-mail address.</EmptyState>
          ) : (
            <DataTable
              caption="Staff of the firm"
              columns={columns}
              data={list.data.data}
              getRowId={(r) => r.id}
              {...table}
              pageSize={PAGE_SIZE}
              total={list.data.page.total}
              busy={list.isPlaceholderData}
            />
          )}
        </div>
      </div>
      {canInvite && <InviteStaffDialog open={inviting} onClose={() => setInviting(false)} />}
    </>
  );
}
