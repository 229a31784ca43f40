import { useState } from 'react';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ArrowLeft } from 'lucide-react';
import { formatCents } from '@domain/plans';
import { paths } from '@/config/paths';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { formatDate, formatDateTime } from '@/lib/format';
import { UsageBar } from '@/features/business/components/usage-bar';
import { tenantDetailQuery, tenantInvoicesQuery } from '@/features/operator/api/operator-queries';
import { InvoicesTable } from '@/features/billing/components/invoices-table';
import { Skeleton } from '@/components/ui/skeleton';
import { SuspendDialog } from '@/features/operator/components/suspend-dialog';
import { TenantStateBadge } from '@/features/operator/components/tenant-state-badge';

export function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  return queryClient.ensureQueryData(tenantDetailQuery(params.tenantId ?? ''));
}

const ACTION_LABELS: Record<string, string> = { 'firm.suspended': 'Suspended', 'firm.restored': 'Restored' };

export default function OperatorTenantPage() {
  const { tenantId = '' } = useParams();
  const { data: firm } = useSuspenseQuery(tenantDetailQuery(tenantId));
  const [dialog, setDialog] = useState(false);
  const suspended = firm.state === 'suspended';
  const { billing } = firm;

  return (
    <>
      <Link to={paths.operator.tenants} className="mb-4 inline-flex items-center gap-1 text-sm text-slate-500 hover:text-ink">
        <ArrowLeft className="size-4" aria-hidden="true" /> All firms
      </Link>
      <PageHeader
        title={firm.name}
        context={
          <span className="inline-flex flex-wrap items-center gap-2">
            <TenantStateBadge state={firm.state} />
            <span className="font-mono">{firm.shortName}</span>
          </span>
        }
        action={
          <Button variant={suspended ? 'primary' : 'danger'} onClick={() => setDialog(true)}>
            {suspended ? 'Restore firm' : 'Suspend firm'}
          </Button>
        }
      />
      {suspended && (
        <div role="status" className="mb-6 rounded-md border border-clay-600/40 bg-clay-50 px-4 py-3 text-sm text-clay-600">
          Suspended {formatDateTime(firm.suspendedAt)}: {firm.suspendedReason}
        </div>
      )}
      <div className="grid gap-6 lg:grid-cols-2">
        <Card title="Firm">
          <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 text-sm">
            <dt className="text-slate-500">Owner</dt>
            <dd>{firm.owner ? `${firm.owner.name} · ${firm.owner.email}` : '—'}</dd>
            <dt className="text-slate-500">Trial ends</dt>
            <dd>{firm.state === 'trialing' ? formatDate(firm.trialEndsAt) : '—'}</dd>
            <dt className="text-slate-500">Created</dt>
            <dd>{formatDate(firm.createdAt)}</dd>
          </dl>
        </Card>
        <Card title="Plan and usage">
          <p className="text-sm">
            {billing.planName ? (
              <>
                <span className="font-medium">{billing.planName}</span>
                {billing.monthlyPriceCents !== null && <span className="tabular-nums"> · {formatCents(billing.monthlyPriceCents)}/month</span>}
              </>
            ) : billing.planKey ? (
              <>
                Unknown plan <span className="font-mono">{billing.planKey}</span>
              </>
            ) : (
              'No plan chosen yet'
            )}
          </p>
          {billing.limits.onTrial && <p className="mt-1 text-xs text-slate-500">On trial: the largest plan’s limits apply until the firm chooses a plan.</p>}
          <div className="mt-4 space-y-4">
            <UsageBar label="Sites" used={billing.usage.activeSites} max={billing.limits.activeSites} />
            <UsageBar label="Staff seats" used={billing.usage.staffSeats} max={billing.limits.staffSeats} />
          </div>
          <p className="mt-3 text-xs text-slate-500">Sites of cancelled clients do not count; pending staff invitations hold a seat.</p>
        </Card>
        <Card title="Invoices">
          <FirmInvoices tenantId={firm.id} />
        </Card>
        <Card title="Service actions on this firm">
          {firm.actions.length === 0 ? (
            <p className="text-sm text-slate-500">No suspensions or restorations so far.</p>
          ) : (
            <ol className="space-y-3">
              {firm.actions.map((a) => (
                <li key={a.id} className="text-sm">
                  <p>
                    <span className="font-medium">{ACTION_LABELS[a.action] ?? a.action}</span> by {a.by} · <span className="text-slate-500">{formatDateTime(a.at)}</span>
                  </p>
                  {a.reason && <p className="text-slate-500">“{a.reason}”</p>}
                </li>
              ))}
            </ol>
          )}
        </Card>
      </div>
      <SuspendDialog tenantId={firm.id} firmName={firm.name} suspend={!suspended} open={dialog} onClose={() => setDialog(false)} />
    </>
  );
}

/** The firm's invoices from Stripe; the page stands even when Stripe cannot be reached. */
function FirmInvoices({ tenantId }: { tenantId: string }) {
  const invoices = useQuery(tenantInvoicesQuery(tenantId));
  if (invoices.isPending) return <Skeleton className="h-16 w-full" />;
  if (invoices.isError) return <p className="text-sm text-clay-600">{invoices.error.message}</p>;
  if (invoices.data.length === 0) return <p className="text-sm text-slate-500">No invoices yet: the firm has not paid through Stripe.</p>;
  return <InvoicesTable invoices={invoices.data} />;
}
