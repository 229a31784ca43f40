import { formatCents } from '@domain/plans';
import { Badge } from '@/components/ui/badge';
import { formatDate } from '@/lib/format';
import type { ApiInvoice } from '@/types/api';
import { invoiceState } from '../billing-words';

const th = 'h-9 px-3 text-left text-xs font-semibold whitespace-nowrap text-slate-500';
const td = 'h-9 px-3 py-1.5 align-middle';
const link = 'font-medium text-brass-700 underline underline-offset-2 hover:text-brass-600';

function period(invoice: ApiInvoice, timeZone?: string): string {
  if (!invoice.periodStart || !invoice.periodEnd) return '—';
  const start = formatDate(invoice.periodStart, timeZone);
  const end = formatDate(invoice.periodEnd, timeZone);
  return start === end ? start : `${start} – ${end}`;
}

/** The firm's invoices, newest first: date, number, period, amount, state, and Stripe's pages for each. */
export function InvoicesTable({ invoices, timeZone }: { invoices: ApiInvoice[]; timeZone?: string | undefined }) {
  return (
    <div className="overflow-x-auto rounded-md border border-line bg-card">
      <table className="w-full border-collapse text-sm tabular-nums">
        <caption className="sr-only">Invoices, newest first</caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className={th}>
              Date
            </th>
            <th scope="col" className={`${th} hidden sm:table-cell`}>
              Number
            </th>
            <th scope="col" className={`${th} hidden md:table-cell`}>
              Period
            </th>
            <th scope="col" className={`${th} text-right`}>
              Amount
            </th>
            <th scope="col" className={th}>
              Status
            </th>
            <th scope="col" className={th}>
              <span className="sr-only">Invoice documents</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {invoices.map((invoice) => {
            const state = invoiceState(invoice.status);
            const name = invoice.number ? `invoice ${invoice.number}` : `invoice of ${formatDate(invoice.createdAt, timeZone)}`;
            return (
              <tr key={invoice.id} className="border-b border-line last:border-b-0">
                <td className={`${td} whitespace-nowrap`}>{formatDate(invoice.createdAt, timeZone)}</td>
                <td className={`${td} hidden font-mono text-xs sm:table-cell`}>{invoice.number ?? '—'}</td>
                <td className={`${td} hidden whitespace-nowrap md:table-cell`}>{period(invoice, timeZone)}</td>
                <td className={`${td} text-right whitespace-nowrap`}>{formatCents(invoice.amountDueCents, invoice.currency.toUpperCase())}</td>
                <td className={td}>
                  <Badge tone={state.tone}>{state.label}</Badge>
                </td>
                <td className={`${td} whitespace-nowrap`}>
                  <span className="flex gap-3">
                    {invoice.hostedInvoiceUrl && (
                      <a href={invoice.hostedInvoiceUrl} target="_blank" rel="noreferrer" className={link} aria-label={`View ${name} (opens in a new tab)`}>
                        View
                      </a>
                    )}
                    {invoice.pdfUrl && (
                      <a href={invoice.pdfUrl} target="_blank" rel="noreferrer" className={link} aria-label={`PDF of ${name} (opens in a new tab)`}>
                        PDF
                      </a>
                    )}
                  </span>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
