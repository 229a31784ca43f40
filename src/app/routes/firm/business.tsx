import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { formatCents } from '@domain/plans';
import { paths } from '@/config/paths';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';
import { formatDate } from '@/lib/format';
import { firmBusinessQuery } from '@/features/business/api/business-queries';
import { MonthlyMoneyChart } from '@/features/business/components/monthly-money-chart';
import { Stat } from '@/features/business/components/stat';
import type { FirmBusiness } from '@/types/api';

export function loader(queryClient: QueryClient) {
  return queryClient.ensureQueryData(firmBusinessQuery());
}

const count = new Intl.NumberFormat('en-US');
const percent = new Intl.NumberFormat('en-US', { style: 'percent', maximumFractionDigits: 1 });
const averageFormat = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });

/** A calendar date 'YYYY-MM-DD' in words; the date is the firm's own, so no zone may shift it. */
const day = (date: string) => formatDate(date, 'UTC');

function AttritionCard({ attrition }: { attrition: FirmBusiness['attrition'] }) {
  const { rate, cancelled, activeAtStart, activeAtEnd, averageActive, periodStart, periodEnd } = attrition;
  return (
    <Card title="Attrition over the last 12 months">
      <p className="text-2xl font-semibold text-ink tabular-nums">{rate === null ? '—' : percent.format(rate)}</p>
      <p className="mt-2 text-sm">Cancelled in the period ÷ average of active at start and end.</p>
      {rate === null ? (
        <p className="mt-1 text-sm text-slate-500">No contracts were in force in the period, so there is no rate yet.</p>
      ) : (
        <p className="mt-1 text-sm text-slate-500 tabular-nums">
          {count.format(cancelled)} cancelled ÷ {averageFormat.format(averageActive)} (the average of {count.format(activeAtStart)} active on{' '}
          {day(periodStart)} and {count.format(activeAtEnd)} on {day(periodEnd)})
        </p>
      )}
      <p className="mt-3 text-xs text-slate-500">Common practice, no published source.</p>
    </Card>
  );
}

function RenewalsCard({ renewals }: { renewals: FirmBusiness['renewals'] }) {
  return (
    <Card title="Renewals in the next 90 days">
      {renewals.length === 0 ? (
        <p className="text-sm text-slate-500">No contract renews in the next 90 days.</p>
      ) : (
        <div className="-mx-4 -my-4 overflow-x-auto">
          <table className="w-full border-collapse text-sm">
            <caption className="sr-only">Contracts renewing in the next 90 days, soonest first</caption>
            <thead>
              <tr className="border-b border-line text-left text-xs text-slate-500">
                <th scope="col" className="h-9 px-2 pl-4 font-semibold">
                  Site
                </th>
                <th scope="col" className="h-9 px-2 font-semibold">
                  Client
                </th>
                <th scope="col" className="h-9 px-2 font-semibold whitespace-nowrap">
                  Renews on
                </th>
                <th scope="col" className="h-9 px-2 pr-4 text-right font-semibold whitespace-nowrap">
                  Monthly fee
                </th>
              </tr>
            </thead>
            <tbody>
              {renewals.map((r) => (
                <tr key={r.siteId} className="border-b border-line last:border-b-0">
                  <td className="px-2 py-2 pl-4">
                    <Link to={paths.firm.site(r.siteId)} className="text-brass-700 underline-offset-2 hover:underline">
                      {r.siteName}
                    </Link>
                  </td>
                  <td className="px-2 py-2">
                    <Link to={paths.firm.client(r.clientId)} className="text-brass-700 underline-offset-2 hover:underline">
                      {r.clientName}
                    </Link>
                  </td>
                  <td className="px-2 py-2 whitespace-nowrap tabular-nums">{day(r.renewsOn)}</td>
                  <td className="px-2 py-2 pr-4 text-right tabular-nums">{r.monthlyFeeCents === null ? '—' : formatCents(r.monthlyFeeCents)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Card>
  );
}

/** The owner's business numbers from the firm's monitoring contracts: RMR, starts and cancellations, attrition, renewals. */
export default function BusinessPage() {
  const business = useQuery(firmBusinessQuery());

  if (business.isPending) {
    return (
      <>
        <PageHeader title="Business" />
        <div role="status" aria-label="Loading" className="space-y-4">
          <Skeleton className="h-24 w-full" />
          <Skeleton className="h-60 w-full" />
        </div>
      </>
    );
  }
  if (business.isError) {
    return (
      <>
        <PageHeader title="Business" />
        <p role="alert" className="text-sm text-clay-600">
          {business.error.message}
        </p>
      </>
    );
  }

  const data = business.data;
  return (
    <>
      <PageHeader title="Business" context={`Your monitoring contracts as of ${day(data.today)}.`} />

      <dl className="mb-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <Stat big label="RMR" value={formatCents(data.rmrCents)} hint="Recurring monthly revenue from contracts in force" />
        <Stat label="Active contracts" value={count.format(data.activeContracts)} />
        <Stat label="New in the last 12 months" value={count.format(data.newContracts12m)} hint="Contracts started" />
        <Stat label="Cancelled in the last 12 months" value={count.format(data.cancelledContracts12m)} hint="Contracts ended" />
      </dl>

      <div className="grid gap-6 lg:grid-cols-3">
        <Card title="RMR over the last 12 months" className="min-w-0 lg:col-span-2">
          <MonthlyMoneyChart
            title="RMR at the end of each month"
            valueLabel="RMR"
            points={data.series.map((p) => ({ month: p.month, label: p.label, cents: p.rmrCents }))}
            extra={{ header: 'Active contracts', values: data.series.map((p) => p.activeContracts) }}
          />
        </Card>
        <AttritionCard attrition={data.attrition} />
        <div className="min-w-0 lg:col-span-3">
          <RenewalsCard renewals={data.renewals} />
        </div>
      </div>
    </>
  );
}
