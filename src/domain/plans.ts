/**
 * The plan catalogue for firms (product.md, "Billing"). Prices are integer cents per month.
 * Stripe price ids come from configuration, never from here.
 */
export const PLAN_KEYS = ['bench', 'crew', 'fleet'] as const;
export type PlanKey = (typeof PLAN_KEYS)[number];

export interface Plan {
  key: PlanKey;
  name: string;
  monthlyPriceCents: number;
  staffSeats: number;
  activeSites: number;
  trialDays: number;
  pitch: string;
}

export const PLANS: readonly Plan[] = [
  {
    key: 'bench',
    name: 'Bench',
    monthlyPriceCents: 4900,
    staffSeats: 3,
    activeSites: 75,
    trialDays: 14,
    pitch: 'For the owner who still climbs ladders: one office, a van or two.',
  },
  {
    key: 'crew',
    name: 'Crew',
    monthlyPriceCents: 14900,
    staffSeats: 10,
    activeSites: 400,
    trialDays: 14,
    pitch: 'For a firm with an office desk and a few crews on the road every day.',
  },
  {
    key: 'fleet',
    name: 'Fleet',
    monthlyPriceCents: 39900,
    staffSeats: 40,
    activeSites: 2000,
    trialDays: 14,
    pitch: 'For a regional firm with dispatch, several crews and thousands of homes.',
  },
];

export function planByKey(key: string): Plan | undefined {
  return PLANS.find((p) => p.key === key);
}

/** "$49" or "$149.50" from integer cents. */
export function formatCents(cents: number, currency = 'USD'): string {
  const whole = cents % 100 === 0;
  return new Intl.NumberFormat('en-US', {
    style: 'currency',
    currency,
    minimumFractionDigits: whole ? 0 : 2,
    maximumFractionDigits: 2,
  }).format(cents / 100);
}
