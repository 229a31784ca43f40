/**
 * Billing under test: the local Stripe stand-in on a free port, a BillingConfig whose stripe
 * SDK is pointed at it, and the test app listening on a free loopback port so the stand-in's
 * signed webhooks reach POST /api/webhooks/stripe as Stripe's would.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { createStripe, resolvePriceIds, type BillingConfig } from '@server/billing/config';
import { DEFAULT_PLAN_PRICES, startStripeStandIn, type StripeStandIn } from '@server/fakes/stripe/index';
import { createTestApp, type TestApp } from './test-app';

export const TEST_WEBHOOK_SECRET = 'whsec_mullion_billing_tests_signing_secret';
export const TEST_STRIPE_KEY = 'sk_test_mullion_billing_tests';

export interface BillingTestApp {
  t: TestApp;
  standIn: StripeStandIn;
  billing: BillingConfig;
  /** where the app listens, e.g. http://127.0.0.1:51234 */
  appUrl: string;
  close(): Promise<void>;
}

export async function createBillingTestApp(): Promise<BillingTestApp> {
  const standIn = await startStripeStandIn({ port: 0, webhookSecret: TEST_WEBHOOK_SECRET, prices: DEFAULT_PLAN_PRICES });
  let t: TestApp | undefined;
  let server: http.Server | undefined;
  try {
    const stripe = createStripe(TEST_STRIPE_KEY, { host: '127.0.0.1', port: standIn.port, protocol: 'http' });
    const billing: BillingConfig = { stripe, webhookSecret: TEST_WEBHOOK_SECRET, priceIds: await resolvePriceIds(stripe) };
    t = await createTestApp({ billing });
    const listening = http.createServer(t.app);
    server = listening;
    await new Promise<void>((resolve, reject) => {
      listening.once('error', reject);
      listening.listen(0, '127.0.0.1', () => {
        listening.off('error', reject);
        resolve();
      });
    });
    const appUrl = `http://127.0.0.1:${(listening.address() as AddressInfo).port}`;
    standIn.setWebhookUrl(`${appUrl}/api/webhooks/stripe`);
    const app = t;
    let closing: Promise<void> | undefined;
    return {
      t: app,
      standIn,
      billing,
      appUrl,
      close: () => {
        closing ??= (async () => {
          await standIn.close();
          listening.closeAllConnections();
          await new Promise<void>((resolve) => listening.close(() => resolve()));
          await app.close();
        })();
        return closing;
      },
    };
  } catch (err) {
    await standIn.close();
    if (server) {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server!.close(() => resolve()));
    }
    if (t) await t.close();
    throw err;
  }
}

/** A webhook body and the Stripe-Signature header Stripe would send with it, signed with `secret`. */
export function signedEvent(payload: object | string, secret: string = TEST_WEBHOOK_SECRET, options: { timestamp?: number } = {}): { body: string; signature: string } {
  const body = typeof payload === 'string' ? payload : JSON.stringify(payload);
  const signature = Stripe.webhooks.generateTestHeaderString({ payload: body, secret, ...(options.timestamp !== undefined ? { timestamp: options.timestamp } : {}) });
  return { body, signature };
}
