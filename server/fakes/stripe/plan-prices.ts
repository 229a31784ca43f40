/** The monthly prices the stand-in offers by default: Mullion's plans, from the plan catalogue. */
import { PLANS } from '@domain/plans';
import type { PriceSpec } from './billing';

export const DEFAULT_PLAN_PRICES: readonly PriceSpec[] = PLANS.map((plan) => ({
  lookupKey: `mullion_${plan.key}_monthly`,
  nickname: plan.name,
  unitAmount: plan.monthlyPriceCents,
  currency: 'usd',
  interval: 'month' as const,
}));
