/**
 * `npx tsx server/fakes/stripe/cli.ts`: the Stripe stand-in on 127.0.0.1:12111 with Mullion's
 * plan prices. Reads STRIPE_WEBHOOK_SECRET (the secret Mullion verifies with) and WEBHOOK_URL
 * (where Mullion receives webhooks; unset: events are only recorded).
 */
import { DEFAULT_PLAN_PRICES, startStripeStandIn } from './index';

async function main(): Promise<void> {
  const webhookSecret = process.env.STRIPE_WEBHOOK_SECRET || 'whsec_mullion_local_stand_in';
  const webhookUrl = process.env.WEBHOOK_URL || null;
  // In a container: STAND_IN_HOST=0.0.0.0 and STAND_IN_PUBLIC_URL=http://localhost:12111 (what the browser opens).
  const standIn = await startStripeStandIn({
    port: 12111,
    host: process.env.STAND_IN_HOST || '127.0.0.1',
    ...(process.env.STAND_IN_PUBLIC_URL ? { publicUrl: process.env.STAND_IN_PUBLIC_URL } : {}),
    webhookSecret,
    webhookUrl,
    prices: DEFAULT_PLAN_PRICES,
  });
  const lines = [
    `Stripe stand-in listening on ${standIn.url}`,
    `Webhooks: ${webhookUrl ?? 'not sent (set WEBHOOK_URL); events are recorded at /_stand-in/events'}`,
    process.env.STRIPE_WEBHOOK_SECRET
      ? 'Signing secret: from STRIPE_WEBHOOK_SECRET'
      : `Signing secret: ${webhookSecret} (set STRIPE_WEBHOOK_SECRET to choose one)`,
    'Prices:',
    ...Object.entries(standIn.priceIds).map(([lookupKey, id]) => `  ${lookupKey.padEnd(24)} ${id}`),
  ];
  console.log(lines.join('\n'));

  const stop = () => {
    void standIn.close().then(() => process.exit(0));
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
