/**
 * The local stand-in for Stripe: a small stateful server speaking the parts of Stripe's API
 * that Mullion calls (customers, prices, Checkout, subscriptions, invoices, billing portal),
 * serving its own test checkout and billing pages, and sending webhooks signed as Stripe
 * signs them. Point the stripe SDK at it with `{ host, port, protocol: 'http' }`.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { apiRouter } from './api-routes';
import { Billing, type PageLinks, type PriceSpec } from './billing';
import { createClock } from './clock';
import { controlRouter } from './control-routes';
import { parseForm } from './form-body';
import { messagePage } from './pages';
import { pageRouter } from './page-routes';
import { StandInStore } from './store';
import { WebhookSender, type StripeEventRecord } from './webhooks';

export type { StripeEventRecord, DeliveryRecord } from './webhooks';
export type { PriceSpec } from './billing';
export type { StripeEvent } from './objects';
export { DEFAULT_PLAN_PRICES } from './plan-prices';

export interface StripeStandInOptions {
  /** 0 = a free port (tests); default 12111 */
  port?: number;
  /** default 127.0.0.1 */
  host?: string;
  /** where the browser reaches the stand-in's pages, when not http://host:port (e.g. behind Docker) */
  publicUrl?: string;
  /** where events are POSTed; null or unset: events are only recorded */
  webhookUrl?: string | null;
  /** the signing secret the receiver verifies with (whsec_…) */
  webhookSecret: string;
  /** created at start, each with its own product */
  prices: ReadonlyArray<PriceSpec>;
  /** the stand-in's clock, for tests */
  now?: () => Date;
}

export interface StripeStandIn {
  /** base URL of the stand-in, e.g. http://127.0.0.1:12111 */
  url: string;
  port: number;
  host: string;
  /** lookup key -> price id */
  priceIds: Record<string, string>;
  setWebhookUrl(url: string | null): void;
  /** every event raised, oldest first, with its delivery */
  events(): readonly StripeEventRecord[];
  close(): Promise<void>;
}

export async function startStripeStandIn(options: StripeStandInOptions): Promise<StripeStandIn> {
  if (!options.webhookSecret) throw new Error('The Stripe stand-in needs a webhook signing secret (whsec_…).');
  const host = options.host ?? '127.0.0.1';
  let baseUrl = '';
  const links: PageLinks = {
    checkout: (id) => `${baseUrl}/checkout/${id}`,
    portal: (id) => `${baseUrl}/billing/${id}`,
    invoice: (id) => `${baseUrl}/invoices/${id}`,
  };
  const clock = createClock(options.now);
  const billing = new Billing(new StandInStore(), clock, links);
  const webhooks = new WebhookSender({ url: options.webhookUrl ?? null, secret: options.webhookSecret, clock });

  const priceIds: Record<string, string> = {};
  for (const spec of options.prices) {
    if (!Number.isInteger(spec.unitAmount) || spec.unitAmount < 0) throw new Error(`Price ${spec.lookupKey}: unitAmount must be whole cents.`);
    if (priceIds[spec.lookupKey]) throw new Error(`Price lookup key ${spec.lookupKey} is given twice.`);
    priceIds[spec.lookupKey] = billing.addPrice(spec).id;
  }

  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', (query: string) => parseForm(query));
  app.use('/v1', apiRouter({ billing, webhooks }));
  app.use('/_stand-in', controlRouter({ billing, webhooks }));
  app.use(pageRouter({ billing, webhooks }));
  app.use((_req, res) => {
    res.status(404).type('html').send(messagePage('Not found', 'There is no page here.'));
  });

  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 12111, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  const urlHost = host === '0.0.0.0' || host === '::' ? '127.0.0.1' : host.includes(':') ? `[${host}]` : host;
  baseUrl = (options.publicUrl ?? `http://${urlHost}:${port}`).replace(/\/+$/, '');

  let closing: Promise<void> | undefined;
  return {
    url: baseUrl,
    port,
    host,
    priceIds,
    setWebhookUrl: (url) => webhooks.setUrl(url),
    events: () => webhooks.events(),
    close: () => {
      closing ??= (async () => {
        await webhooks.stop();
        server.closeAllConnections();
        await new Promise<void>((resolve, reject) => server.close((err) => (err ? reject(err) : resolve())));
      })();
      return closing;
    },
  };
}
