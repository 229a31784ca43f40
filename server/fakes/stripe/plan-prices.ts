/** The monthly prices the stand-in offers by default: Mullion's plans, from the plan catalogue. */
import { PLANS } from '@domain/plans';
import { planLookupKey } from '../../billing/config';
import type { PriceSpec } from './billing';

export const DEFAULT_PLAN_PRICES: readonly PriceSpec[] = PLANS.map((plan) => ({
  lookupKey: planLookupKey(plan.key),
  nickname: plan.name,
  unitAmount: plan.monthlyPriceCents,
  currency: 'usd',
  interval: 'month' as const,
}));
