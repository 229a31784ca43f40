import type { ReactNode } from 'react';
import { Check } from 'lucide-react';
import { Link } from 'react-router-dom';
import { PLANS, formatCents } from '@domain/plans';
import { paths } from '@/config/paths';
import { buttonClass } from '@/components/ui/button';
import { cn } from '@/lib/cn';

/** What a plan card shows: the catalogue's fields (src/domain/plans.ts, or the billing API's copy). */
export interface PlanCardPlan {
  key: string;
  name: string;
  monthlyPriceCents: number;
  staffSeats: number;
  activeSites: number;
  pitch: string;
}

function Feature({ children }: { children: ReactNode }) {
  return (
    <li className="flex gap-2">
      <Check className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
      {children}
    </li>
  );
}

/**
 * One plan: name, pitch, price, seats and sites, then any extra lines and the card's own
 * footer (a sign-up link on the pricing page, a choose button on the Billing page).
 */
export function PlanCard({
  plan,
  highlighted = false,
  tag,
  extras = [],
  children,
}: {
  plan: PlanCardPlan;
  highlighted?: boolean;
  /** a short label beside the name ("Most firms", "Your plan") */
  tag?: ReactNode;
  extras?: ReactNode[];
  children?: ReactNode;
}) {
  return (
    <article
      aria-labelledby={`plan-${plan.key}`}
      className={cn('flex flex-col rounded-md border bg-card p-6', highlighted ? 'border-brass-600 ring-1 ring-brass-600' : 'border-line')}
    >
      <div className="flex items-center justify-between">
        <h3 id={`plan-${plan.key}`} className="text-lg font-semibold">
          {plan.name}
        </h3>
        {tag && <span className="rounded-md bg-brass-50 px-2 py-0.5 text-xs font-medium text-brass-700">{tag}</span>}
      </div>
      <p className="mt-1 text-sm text-slate-500">{plan.pitch}</p>
      <p className="mt-4">
        <span className="text-2xl font-semibold">{formatCents(plan.monthlyPriceCents)}</span>
        <span className="text-sm text-slate-500"> a month</span>
      </p>
      <ul className="mt-4 space-y-2 text-sm">
        <Feature>Up to {plan.staffSeats} staff sign-ins</Feature>
        <Feature>Up to {plan.activeSites.toLocaleString('en-US')} active sites</Feature>
        {extras.map((extra, i) => (
          <Feature key={i}>{extra}</Feature>
        ))}
      </ul>
      {children}
    </article>
  );
}

/** The plan catalogue (src/domain/plans.ts) with prices and limits. */
export function PlanCards() {
  return (
    <div className="grid gap-4 md:grid-cols-3">
      {PLANS.map((plan) => {
        const featured = plan.key === 'crew';
        return (
          <PlanCard
            key={plan.key}
            plan={plan}
            highlighted={featured}
            tag={featured ? 'Most firms' : undefined}
            extras={['Client portal for every homeowner, free', `${plan.trialDays}-day trial, no card needed to start`]}
          >
            <Link to={paths.signUp} className={buttonClass(featured ? 'primary' : 'secondary', 'md', 'mt-6')}>
              Start a {plan.trialDays}-day trial
            </Link>
          </PlanCard>
        );
      })}
    </div>
  );
}
