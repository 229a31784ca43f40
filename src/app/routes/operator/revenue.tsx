import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { formatCents } from '@domain/plans';
import { TENANT_STATES, trialDaysLeft } from '@domain/tenant-states';
import { paths } from '@/config/paths';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';
import { formatDate } from '@/lib/format';
import { MonthlyMoneyChart } from '@/features/business/components/monthly-money-chart';
import { Stat } from '@/features/business/components/stat';
import { operatorRevenueQuery } from '@/features/operator/api/operator-queries';
import { TenantStateBadge } from '@/features/operator/components/tenant-state-badge';

export function loader(queryClient: QueryClient) {
  return queryClient.ensureQueryData(operatorRevenueQuery());
}

const count = new Intl.NumberFormat('en-US');

function daysWords(days: number): string {
  return days <= 1 ? 'within a day' : `in ${days} days`;
}

/** The operator's view of the service's revenue: MRR now and over a year, firms by state, trials ending. */
export default function OperatorRevenuePage() {
  const revenue = useQuery(operatorRevenueQuery());

  if (revenue.isPending) {
    return (
      <>
        <PageHeader title="Revenue" />
        <div role="status" aria-label="Loading" className="space-y-4">
          <Skeleton className="h-24 w-full" />
          <Skeleton className="h-60 w-full" />
        </div>
      </>
    );
  }
  if (revenue.isError) {
    return (
      <>
        <PageHeader title="Revenue" />
        <p role="alert" className="text-sm text-clay-600">
          {revenue.error.message}
        </p>
      </>
    );
  }

  const data = revenue.data;
  const firmsTotal = TENANT_STATES.reduce((sum, state) => sum + data.firmsByState[state], 0);
  const now = new Date();

  return (
    <>
      <PageHeader title="Revenue" context="Monthly recurring revenue (MRR) from firms’ subscriptions to Mullion." />

      <dl className="mb-6 grid gap-4 sm:grid-cols-3">
        <Stat big label="MRR" value={formatCents(data.mrrCents)} hint="Active and past-due subscriptions" />
        <Stat label="Active subscriptions" value={count.format(data.activeSubscriptions)} hint="Firms paying now, past due included" />
        <Stat label="Trials ending this week" value={count.format(data.trialsEndingThisWeek.length)} />
      </dl>

      <div className="grid gap-6 lg:grid-cols-3">
        <Card title="MRR over the last 12 months" className="min-w-0 lg:col-span-2">
          <MonthlyMoneyChart
            title="MRR at the end of each month"
            valueLabel="MRR"
            points={data.series.map((p) => ({ month: p.month, label: p.label, cents: p.mrrCents }))}
          />
        </Card>

        <div className="space-y-6">
          <Card title="Firms by state">
            <ul className="space-y-2 text-sm" aria-label="Firms by state">
              {TENANT_STATES.map((state) => (
                <li key={state} className="flex items-center justify-between gap-3">
                  <TenantStateBadge state={state} />
                  <span className="tabular-nums">
                    {count.format(data.firmsByState[state])} {data.firmsByState[state] === 1 ? 'firm' : 'firms'}
                  </span>
                </li>
              ))}
            </ul>
            <p className="mt-3 border-t border-line pt-3 text-sm text-slate-500">
              <span className="tabular-nums">{count.format(firmsTotal)}</span> firms in all
            </p>
          </Card>

          <Card title="Trials ending this week">
            {data.trialsEndingThisWeek.length === 0 ? (
              <p className="text-sm text-slate-500">No trial ends in the next 7 days.</p>
            ) : (
              <ul className="space-y-2 text-sm" aria-label="Trials ending this week">
                {data.trialsEndingThisWeek.map((firm) => (
                  <li key={firm.id}>
                    <Link to={paths.operator.tenant(firm.id)} className="font-medium text-brass-700 underline-offset-2 hover:underline">
                      {firm.name}
                    </Link>
                    <span className="block text-slate-500">
                      Ends {formatDate(firm.trialEndsAt)} ({daysWords(trialDaysLeft(new Date(firm.trialEndsAt), now))})
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </Card>
        </div>
      </div>
    </>
  );
}
