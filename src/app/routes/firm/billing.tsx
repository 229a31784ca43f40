import { useEffect, useRef, useState } from 'react';
import { useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useSearchParams } from 'react-router-dom';
import { AlertTriangle, CheckCircle2, CreditCard, Info } from 'lucide-react';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { TableSkeleton } from '@/components/ui/skeleton';
import { sessionQuery, useSession } from '@/lib/auth';
import { billingKeys, billingQuery, invoicesQuery, useOpenBillingPortal } from '@/features/billing/api/billing-queries';
import { billingContext, isSubscribed, stateBadge } from '@/features/billing/billing-words';
import { BillingPlans } from '@/features/billing/components/billing-plans';
import { InvoicesTable } from '@/features/billing/components/invoices-table';
import { UsageMeter } from '@/features/billing/components/usage-meter';
import type { ApiBilling } from '@/types/api';

/** After Checkout, how often and how long the page asks again while Stripe's webhook is on its way. */
const POLL_EVERY_MS = 1500;
const POLL_FOR_MS = 15_000;

export function loader(queryClient: QueryClient) {
  // Invoices come from Stripe and may fail on their own; they never hold the page back.
  void queryClient.prefetchQuery(invoicesQuery());
  return queryClient.ensureQueryData(billingQuery());
}

function largestPlanName(billing: ApiBilling): string {
  const largest = billing.plans.reduce<ApiBilling['plans'][number] | undefined>((a, p) => (!a || p.activeSites > a.activeSites ? p : a), undefined);
  return largest?.name ?? 'largest';
}

export default function BillingPage() {
  const { tenant } = useSession();
  const timeZone = tenant?.timeZone;
  const queryClient = useQueryClient();
  const [searchParams, setSearchParams] = useSearchParams();
  // How the owner came back from Stripe Checkout, read once: the address is tidied afterwards.
  const [checkoutReturn] = useState(() => searchParams.get('checkout'));
  const [timedOut, setTimedOut] = useState(false);
  const waiting = checkoutReturn === 'done' && !timedOut;

  const { data: billing } = useSuspenseQuery({
    ...billingQuery(),
    // Stripe's webhook may land a moment after the owner is back: ask again until the plan shows.
    refetchInterval: (query) => (waiting && !isSubscribed(query.state.data) ? POLL_EVERY_MS : false),
  });
  const invoices = useQuery(invoicesQuery());
  const portal = useOpenBillingPortal();
  const plansHeading = useRef<HTMLHeadingElement>(null);
  const subscribed = isSubscribed(billing);
  const confirmed = checkoutReturn === 'done' && subscribed;

  useEffect(() => {
    if (checkoutReturn !== 'done') return;
    const timer = window.setTimeout(() => setTimedOut(true), POLL_FOR_MS);
    return () => window.clearTimeout(timer);
  }, [checkoutReturn]);

  // Once the plan is in place, the session (read-only banner, trial days) and invoices are out of date.
  useEffect(() => {
    if (!confirmed) return;
    void queryClient.invalidateQueries({ queryKey: sessionQuery.queryKey });
    void queryClient.invalidateQueries({ queryKey: billingKeys.invoices() });
  }, [confirmed, queryClient]);

  // The return is settled (confirmed, given up waiting, or cancelled): take ?checkout off the address.
  const settled = checkoutReturn === 'cancelled' || confirmed || (checkoutReturn === 'done' && timedOut);
  useEffect(() => {
    if (!settled) return;
    setSearchParams(
      (params) => {
        if (!params.has('checkout') && !params.has('session_id')) return params;
        const next = new URLSearchParams(params);
        next.delete('checkout');
        next.delete('session_id');
        return next;
      },
      { replace: true },
    );
  }, [settled, setSearchParams]);

  const badge = stateBadge(billing);
  const readOnly = billing.readOnly;
  const portalButton = (label: string, variant: 'primary' | 'secondary' = 'primary') => (
    <Button variant={variant} busy={portal.isPending || portal.isSuccess} disabled={!billing.paymentsConfigured} onClick={() => portal.mutate()}>
      <CreditCard className="size-4" aria-hidden="true" /> {label}
    </Button>
  );
  const goToPlans = () => {
    const heading = plansHeading.current;
    if (!heading) return;
    if (typeof heading.scrollIntoView === 'function') heading.scrollIntoView({ behavior: 'smooth', block: 'start' });
    heading.focus({ preventScroll: true });
  };

  let checkoutNote: { tone: 'ok' | 'neutral'; text: string } | null = null;
  if (checkoutReturn === 'cancelled') checkoutNote = { tone: 'neutral', text: 'Checkout cancelled; nothing was charged.' };
  else if (confirmed && billing.plan) checkoutNote = { tone: 'ok', text: `Payment received. Welcome to the ${billing.plan.name} plan.` };
  else if (checkoutReturn === 'done' && timedOut)
    checkoutNote = {
      tone: 'neutral',
      text: 'Your checkout is finished, but Stripe’s confirmation has not reached Mullion yet. It usually arrives within a minute: reload this page to see your plan.',
    };
  else if (checkoutReturn === 'done') checkoutNote = { tone: 'neutral', text: 'Finishing your checkout: waiting for Stripe to confirm your plan…' };

  return (
    <>
      <PageHeader
        title="Billing"
        context={
          <span className="inline-flex flex-wrap items-center gap-x-2 gap-y-1">
            <Badge tone={badge.tone}>{badge.label}</Badge>
            <span>{billingContext(billing, timeZone)}</span>
          </span>
        }
        action={billing.hasSubscription && !readOnly ? portalButton('Manage payment and plan') : undefined}
      />

      <div className="space-y-6">
        {checkoutNote && (
          <div
            role="status"
            className={
              checkoutNote.tone === 'ok'
                ? 'flex items-start gap-2 rounded-md border border-sage-600/40 bg-sage-50 px-4 py-3 text-sm text-ink'
                : 'flex items-start gap-2 rounded-md border border-line bg-card px-4 py-3 text-sm text-ink'
            }
          >
            {checkoutNote.tone === 'ok' ? (
              <CheckCircle2 className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
            ) : (
              <Info className="mt-0.5 size-4 shrink-0 text-slate-500" aria-hidden="true" />
            )}
            <span>{checkoutNote.text}</span>
          </div>
        )}

        {readOnly && (
          <section aria-labelledby="billing-read-only" className="rounded-md border border-clay-600 bg-clay-50 p-4">
            <h2 id="billing-read-only" className="flex items-center gap-2 font-semibold text-clay-600">
              <AlertTriangle className="size-4 shrink-0" aria-hidden="true" /> Your firm is read-only
            </h2>
            <p className="mt-1 text-sm text-ink">{readOnly.message}</p>
            <div className="mt-3">
              {billing.hasSubscription ? (
                portalButton('Update payment details')
              ) : (
                <Button onClick={goToPlans} disabled={!billing.paymentsConfigured}>
                  Choose a plan
                </Button>
              )}
            </div>
          </section>
        )}

        {portal.isError && (
          <p role="alert" className="rounded-md border border-clay-600 bg-clay-50 px-3 py-2 text-sm text-clay-600">
            {portal.error.message}
          </p>
        )}

        {!billing.paymentsConfigured && (
          <p className="rounded-md border border-ochre-600/40 bg-ochre-50 px-4 py-3 text-sm text-ink">
            Payments are not set up on this Mullion yet, so plans cannot be chosen or changed here. Ask the service operator to set them up; your records are not
            affected.
          </p>
        )}

        <Card title="Usage">
          <div className="grid gap-4 sm:grid-cols-2">
            <UsageMeter label="Active sites" used={billing.usage.activeSites} max={billing.limits.activeSites} />
            <UsageMeter label="Staff seats" used={billing.usage.staffSeats} max={billing.limits.staffSeats} />
          </div>
          <p className="mt-4 text-sm text-slate-500">
            {billing.limits.onTrial
              ? billing.state === 'trialing'
                ? `Your trial uses the largest plan’s limits (${largestPlanName(billing)}), so nothing stops you while you try Mullion. Choose a plan that fits what you use.`
                : `Without a plan, the largest plan’s limits (${largestPlanName(billing)}) are shown.`
              : `The limits of your ${billing.plan?.name ?? ''} plan.`}{' '}
            Active sites are the sites of clients not marked cancelled; staff seats are everyone on staff who can sign in, plus invitations waiting for an answer.
            Client portal sign-ins never count.
          </p>
        </Card>

        <section aria-labelledby="billing-plans" className="space-y-3">
          <div>
            <h2 id="billing-plans" ref={plansHeading} tabIndex={-1} className="text-base font-semibold text-ink focus:outline-none">
              Plans
            </h2>
            <p className="mt-1 text-sm text-slate-500">
              {billing.hasSubscription
                ? `To change plan or card, or to cancel, use “${readOnly ? 'Update payment details' : 'Manage payment and plan'}”: Stripe’s billing portal opens and brings you back here.`
                : 'Priced per firm, each month. Choosing a plan opens Stripe’s secure checkout; you come back here when it is done.'}
            </p>
          </div>
          <BillingPlans billing={billing} />
        </section>

        <section aria-labelledby="billing-invoices" className="space-y-3">
          <h2 id="billing-invoices" className="text-base font-semibold text-ink">
            Invoices
          </h2>
          {invoices.isPending ? (
            <TableSkeleton rows={3} />
          ) : invoices.isError ? (
            <p role="alert" className="text-sm text-clay-600">
              {invoices.error.message}
            </p>
          ) : invoices.data.length === 0 ? (
            <EmptyState title="No invoices yet — your first appears after you choose a plan." />
          ) : (
            <InvoicesTable invoices={invoices.data} timeZone={timeZone} />
          )}
        </section>
      </div>
    </>
  );
}
