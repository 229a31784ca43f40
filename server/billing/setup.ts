/**
 * Billing at start: real Stripe when STRIPE_SECRET_KEY is set, otherwise the local stand-in
 * (server/fakes/stripe) started beside the app, with the same SDK pointed at it by
 * host/port/protocol. Either way the app gets one BillingConfig.
 */
import type { Env } from '../config/env';
import { DEFAULT_PLAN_PRICES, startStripeStandIn, type StripeStandIn } from '../fakes/stripe/index';
import { pickPort } from '../ports';
import { createStripe, resolvePriceIds, type BillingConfig, type StripeEndpoint } from './config';

export const USUAL_STRIPE_STAND_IN_PORT = 12111;

/** The stand-in's signing secret in development; never used with real Stripe. */
export const LOCAL_WEBHOOK_SECRET = 'whsec_mullion_local_development_only';
const LOCAL_SECRET_KEY = 'sk_test_mullion_local_stand_in';

function endpointOf(base: string): StripeEndpoint {
  const url = new URL(base);
  const protocol = url.protocol === 'http:' ? 'http' : 'https';
  return { host: url.hostname, port: Number(url.port || (protocol === 'http' ? 80 : 443)), protocol };
}

/** Real Stripe from the environment (or a stand-in at STRIPE_API_BASE); both secrets are needed together. */
export async function billingFromEnv(env: Pick<Env, 'stripeSecretKey' | 'stripeWebhookSecret' | 'stripeApiBase'>): Promise<BillingConfig | undefined> {
  if (!env.stripeSecretKey) return undefined;
  if (!env.stripeWebhookSecret) {
    throw new Error('STRIPE_SECRET_KEY is set but STRIPE_WEBHOOK_SECRET is not. Add the signing secret of the endpoint /api/webhooks/stripe.');
  }
  const stripe = createStripe(env.stripeSecretKey, env.stripeApiBase ? endpointOf(env.stripeApiBase) : undefined);
  return { stripe, webhookSecret: env.stripeWebhookSecret, priceIds: await resolvePriceIds(stripe) };
}

/**
 * Starts the stand-in and returns the billing config pointed at it; its webhooks go to the
 * app. `port` is the preferred port (12111): when it is taken a free one is used, and the
 * SDK and `standIn.url` follow.
 */
export async function startLocalBilling(options: { appUrl: string; port?: number; host?: string }): Promise<{ billing: BillingConfig; standIn: StripeStandIn }> {
  const host = options.host ?? '127.0.0.1';
  const standIn = await startStripeStandIn({
    port: await pickPort(options.port ?? USUAL_STRIPE_STAND_IN_PORT, host),
    host,
    webhookSecret: LOCAL_WEBHOOK_SECRET,
    webhookUrl: `${options.appUrl}/api/webhooks/stripe`,
    prices: DEFAULT_PLAN_PRICES,
  });
  const stripe = createStripe(LOCAL_SECRET_KEY, { host: standIn.host, port: standIn.port, protocol: 'http' });
  return { billing: { stripe, webhookSecret: LOCAL_WEBHOOK_SECRET, priceIds: await resolvePriceIds(stripe) }, standIn };
}
