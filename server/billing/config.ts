/**
 * How Mullion talks to Stripe: one SDK client, the webhook signing secret, and the price id
 * of each plan. Price ids are configuration: they are found at start by lookup key
 * (`mullion_<plan>_monthly`), so a real Stripe account only needs prices with those keys.
 */
import Stripe from 'stripe';
import { PLAN_KEYS, PLANS, type PlanKey } from '@domain/plans';

export interface BillingConfig {
  stripe: Stripe;
  webhookSecret: string;
  /** plan key -> Stripe price id */
  priceIds: Record<PlanKey, string>;
}

/** The lookup key of a plan's monthly price in Stripe. */
export function planLookupKey(key: PlanKey): string {
  return `mullion_${key}_monthly`;
}

/** Where the SDK sends its requests: Stripe itself, or the local stand-in by host/port/protocol. */
export interface StripeEndpoint {
  host: string;
  port: number;
  protocol: 'http' | 'https';
}

export function createStripe(secretKey: string, endpoint?: StripeEndpoint): Stripe {
  return new Stripe(secretKey, {
    ...(endpoint ? { host: endpoint.host, port: endpoint.port, protocol: endpoint.protocol } : {}),
    maxNetworkRetries: 1,
    timeout: 15_000,
    appInfo: { name: 'Mullion' },
  });
}

/** Finds each plan's price by its lookup key; a missing one stops the start with a clear message. */
export async function resolvePriceIds(stripe: Stripe): Promise<Record<PlanKey, string>> {
  const keys = PLAN_KEYS.map(planLookupKey);
  const prices = await stripe.prices.list({ lookup_keys: keys, active: true, limit: 100 });
  const byLookup = new Map(prices.data.map((p) => [p.lookup_key, p.id]));
  const missing = PLANS.filter((p) => !byLookup.has(planLookupKey(p.key)));
  if (missing.length > 0) {
    throw new Error(
      `Stripe has no active price with the lookup key ${missing.map((p) => `${planLookupKey(p.key)} (${p.name})`).join(', ')}. Create a monthly price for each plan with that lookup key.`,
    );
  }
  return Object.fromEntries(PLAN_KEYS.map((k) => [k, byLookup.get(planLookupKey(k))!])) as Record<PlanKey, string>;
}

/** The plan a Stripe price id belongs to, if any. */
export function planOfPrice(config: Pick<BillingConfig, 'priceIds'>, priceId: string | null | undefined): PlanKey | null {
  if (!priceId) return null;
  return PLAN_KEYS.find((k) => config.priceIds[k] === priceId) ?? null;
}
