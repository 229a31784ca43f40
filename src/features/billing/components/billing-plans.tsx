import { useId } from 'react';
import { Button } from '@/components/ui/button';
import { PlanCard } from '@/features/plans/components/plan-cards';
import type { ApiBilling } from '@/types/api';
import { useStartCheckout } from '../api/billing-queries';
import { planMisfit } from '../billing-words';

/**
 * The three plans on the Billing page. Without a subscription each card chooses its plan
 * (Stripe Checkout); a plan too small for what the firm already uses says why and cannot be
 * chosen. The current plan is marked; with a subscription changes go through the portal, and a
 * firm on a plan Stripe does not bill yet (set up by the operator) can start paying for it by card.
 */
export function BillingPlans({ billing }: { billing: ApiBilling }) {
  const checkout = useStartCheckout();
  const baseId = useId();
  const canChoose = !billing.hasSubscription;
  // From the click until the browser has left for Checkout, the chosen card stays busy.
  const leavingWith = checkout.isPending || checkout.isSuccess ? checkout.variables : undefined;
  const failedWith = checkout.isError ? checkout.variables : undefined;

  return (
    <div className="grid gap-4 md:grid-cols-3">
      {billing.plans.map((plan) => {
        const current = billing.plan?.key === plan.key;
        const misfit = current ? null : planMisfit(plan, billing.usage);
        const reasonId = `${baseId}-${plan.key}-reason`;
        return (
          <PlanCard key={plan.key} plan={plan} highlighted={current} tag={current ? 'Your plan' : undefined}>
            <div className="mt-auto space-y-2 pt-6">
              {misfit && (
                <p id={reasonId} className="text-sm text-slate-500">
                  Not available: {misfit}
                </p>
              )}
              {canChoose && (
                <Button
                  className="w-full"
                  busy={leavingWith === plan.key}
                  disabled={!billing.paymentsConfigured || misfit !== null || leavingWith !== undefined}
                  aria-describedby={misfit ? reasonId : undefined}
                  onClick={() => checkout.mutate(plan.key)}
                >
                  {current ? 'Pay for it by card' : `Choose ${plan.name}`}
                </Button>
              )}
              {failedWith === plan.key && (
                <p role="alert" className="text-sm font-medium text-clay-600">
                  {checkout.error?.message}
                </p>
              )}
            </div>
          </PlanCard>
        );
      })}
    </div>
  );
}
