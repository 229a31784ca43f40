import { Check } from 'lucide-react';
import { Link } from 'react-router-dom';
import { PLANS, formatCents } from '@domain/plans';
import { paths } from '@/config/paths';
import { buttonClass } from '@/components/ui/button';
import { cn } from '@/lib/cn';

/** The plan catalogue (src/domain/plans.ts) with prices and limits. */
export function PlanCards() {
  return (
    <div className="grid gap-4 md:grid-cols-3">
      {PLANS.map((plan) => {
        const featured = plan.key === 'crew';
        return (
          <article
            key={plan.key}
            aria-labelledby={`plan-${plan.key}`}
            className={cn('flex flex-col rounded-md border bg-card p-6', featured ? 'border-brass-600 ring-1 ring-brass-600' : 'border-line')}
          >
            <div className="flex items-center justify-between">
              <h3 id={`plan-${plan.key}`} className="text-lg font-semibold">
                {plan.name}
              </h3>
              {featured && <span className="rounded-md bg-brass-50 px-2 py-0.5 text-xs font-medium text-brass-700">Most firms</span>}
            </div>
            <p className="mt-1 text-sm text-slate-500">{plan.pitch}</p>
            <p className="mt-4">
              <span className="text-2xl font-semibold">{formatCents(plan.monthlyPriceCents)}</span>
              <span className="text-sm text-slate-500"> a month</span>
            </p>
            <ul className="mt-4 space-y-2 text-sm">
              <li className="flex gap-2">
                <Check className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
                Up to {plan.staffSeats} staff sign-ins
              </li>
              <li className="flex gap-2">
                <Check className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
                Up to {plan.activeSites.toLocaleString('en-US')} active sites
              </li>
              <li className="flex gap-2">
                <Check className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
                Client portal for every homeowner, free
              </li>
              <li className="flex gap-2">
                <Check className="mt-0.5 size-4 shrink-0 text-sage-600" aria-hidden="true" />
                {plan.trialDays}-day trial, no card needed to start
              </li>
            </ul>
            <Link to={paths.signUp} className={buttonClass(featured ? 'primary' : 'secondary', 'md', 'mt-6')}>
              Start a {plan.trialDays}-day trial
            </Link>
          </article>
        );
      })}
    </div>
  );
}
