/**
 * The local Stripe stand-in, driven as Mullion drives it: the official stripe SDK pointed at
 * it, a browser's plain form posts for its pages, and a webhook receiver that verifies every
 * signature with stripe.webhooks.constructEvent.
 */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PLANS } from '@domain/plans';
import { DEFAULT_PLAN_PRICES, startStripeStandIn, type StripeEventRecord, type StripeStandIn } from '@server/fakes/stripe/index';

const WEBHOOK_SECRET = 'whsec_lanternfield_test_signing_secret';
const API_KEY = 'sk_test_lanternfield_alarms';
const DAY = 24 * 60 * 60;

interface Received {
  event: Stripe.Event;
  raw: string;
}

/** Mullion's side of the webhook, in miniature: verify, record, answer 200. */
class WebhookReceiver {
  readonly received: Received[] = [];
  rejected = 0;
  /** answer 500 to this many deliveries before accepting again */
  failNext = 0;
  private readonly server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      const raw = Buffer.concat(chunks).toString('utf8');
      if (this.failNext > 0) {
        this.failNext -= 1;
        res.writeHead(500).end();
        return;
      }
      try {
        const event = Stripe.webhooks.constructEvent(raw, req.headers['stripe-signature'] ?? '', WEBHOOK_SECRET);
        this.received.push({ event, raw });
        res.writeHead(200, { 'Content-Type': 'application/json' }).end('{"received":true}');
      } catch {
        this.rejected += 1;
        res.writeHead(400).end();
      }
    });
  });
  url = '';

  async start(): Promise<void> {
    await new Promise<void>((resolve) => this.server.listen(0, '127.0.0.1', resolve));
    this.url = `http://127.0.0.1:${(this.server.address() as AddressInfo).port}/api/webhooks/stripe`;
  }

  async close(): Promise<void> {
    this.server.closeAllConnections();
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }

  /** the events about one customer, in arrival order */
  forCustomer(customerId: string): Stripe.Event[] {
    return this.received.map((r) => r.event).filter((e) => (e.data.object as { customer?: unknown }).customer === customerId);
  }
}

let standIn: StripeStandIn;
let receiver: WebhookReceiver;
let stripe: Stripe;

beforeAll(async () => {
  receiver = new WebhookReceiver();
  await receiver.start();
  standIn = await startStripeStandIn({ port: 0, webhookUrl: receiver.url, webhookSecret: WEBHOOK_SECRET, prices: DEFAULT_PLAN_PRICES });
  stripe = new Stripe(API_KEY, { host: '127.0.0.1', port: standIn.port, protocol: 'http' });
});

afterAll(async () => {
  await standIn?.close();
  await receiver?.close();
});

const crewPrice = () => standIn.priceIds.mullion_crew_monthly!;
const fleetPrice = () => standIn.priceIds.mullion_fleet_monthly!;
const unix = () => Math.floor(Date.now() / 1000);

async function newFirm(name = 'Lanternfield Alarms'): Promise<Stripe.Customer> {
  const slug = name.toLowerCase().replace(/[^a-z]+/g, '');
  return stripe.customers.create({ name, email: `owner@${slug}.example`, metadata: { tenantId: `tenant-${slug}` } });
}

async function newCheckout(customer: string, extra: { trialEnd?: number; price?: string } = {}): Promise<Stripe.Checkout.Session> {
  return stripe.checkout.sessions.create({
    mode: 'subscription',
    customer,
    line_items: [{ price: extra.price ?? crewPrice(), quantity: 1 }],
    success_url: 'http://mullion.test/firm/billing?checkout={CHECKOUT_SESSION_ID}',
    cancel_url: 'http://mullion.test/firm/billing?checkout=canceled',
    client_reference_id: 'tenant-42',
    metadata: { tenantId: 'tenant-42' },
    subscription_data: { metadata: { tenantId: 'tenant-42', plan: 'crew' }, ...(extra.trialEnd ? { trial_end: extra.trialEnd } : {}) },
  });
}

function postForm(url: string, fields: Record<string, string>): Promise<Response> {
  return fetch(url, { method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' });
}

/** A firm that has paid for Crew through the checkout page. */
async function subscribedFirm(name: string): Promise<{ customer: Stripe.Customer; subscription: Stripe.Subscription }> {
  const customer = await newFirm(name);
  const session = await newCheckout(customer.id);
  const res = await postForm(session.url!, { cardNumber: '4242 4242 4242 4242' });
  expect(res.status).toBe(303);
  const done = await stripe.checkout.sessions.retrieve(session.id);
  const subscription = await stripe.subscriptions.retrieve(done.subscription as string);
  return { customer, subscription };
}

async function waitFor<T>(read: () => T | undefined, what: string): Promise<T> {
  const deadline = Date.now() + 3000;
  for (;;) {
    const value = read();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

interface ControlAnswer {
  subscription: Stripe.Subscription;
  invoice: Stripe.Invoice | null;
  events: string[];
  error?: { code?: string; param?: string; message: string };
}

async function control(subscriptionId: string, action: string): Promise<{ status: number; body: ControlAnswer }> {
  const res = await fetch(`${standIn.url}/_stand-in/subscriptions/${subscriptionId}/${action}`, { method: 'POST' });
  return { status: res.status, body: (await res.json()) as ControlAnswer };
}

describe('API keys and errors', () => {
  it('answers 401 in Stripe’s error shape without a test secret key', async () => {
    const bare = await fetch(`${standIn.url}/v1/customers/cus_anything`);
    expect(bare.status).toBe(401);
    const body = await bare.json();
    expect(body.error.type).toBe('invalid_request_error');
    expect(body.error.message).toMatch(/API key/);

    const live = new Stripe('sk_live_not_allowed', { host: '127.0.0.1', port: standIn.port, protocol: 'http' });
    await expect(live.customers.create({ name: 'Quarrystone Security' })).rejects.toMatchObject({
      type: 'StripeAuthenticationError',
      statusCode: 401,
    });
  });

  it('answers 404 resource_missing for an unknown id', async () => {
    const res = await fetch(`${standIn.url}/v1/customers/cus_missing`, { headers: { Authorization: `Bearer ${API_KEY}` } });
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual({
      error: { type: 'invalid_request_error', code: 'resource_missing', param: 'id', message: "No such customer: 'cus_missing'" },
    });
    await expect(stripe.subscriptions.retrieve('sub_missing')).rejects.toMatchObject({
      type: 'StripeInvalidRequestError',
      statusCode: 404,
      code: 'resource_missing',
      message: "No such subscription: 'sub_missing'",
    });
  });

  it('answers 400 naming the missing or unknown parameter', async () => {
    const customer = await newFirm('Harrowgate Alarm Co');
    await expect(
      stripe.checkout.sessions.create({ mode: 'subscription', customer: customer.id, line_items: [{ price: crewPrice(), quantity: 1 }] }),
    ).rejects.toMatchObject({ statusCode: 400, param: 'success_url' });
    await expect(stripe.billingPortal.sessions.create({ return_url: 'http://mullion.test/firm/billing' })).rejects.toMatchObject({
      statusCode: 400,
      param: 'customer',
    });
    await expect(
      stripe.checkout.sessions.create({
        mode: 'subscription',
        customer: customer.id,
        line_items: [{ price: 'price_nope', quantity: 1 }],
        success_url: 'http://mullion.test/ok',
      }),
    ).rejects.toMatchObject({ statusCode: 400, code: 'resource_missing', param: 'line_items[0][price]' });

    const unknown = await fetch(`${standIn.url}/v1/customers`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${API_KEY}`, 'Content-Type': 'application/x-www-form-urlencoded' },
      body: 'name=Harrowgate&favourite_colour=blue',
    });
    expect(unknown.status).toBe(400);
    expect((await unknown.json()).error.param).toBe('favourite_colour');
  });
});

describe('customers and prices', () => {
  it('creates, retrieves and updates a customer', async () => {
    const created = await newFirm('Lanternfield Alarms');
    expect(created).toMatchObject({ object: 'customer', name: 'Lanternfield Alarms', email: 'owner@lanternfieldalarms.example', livemode: false });
    expect(created.id).toMatch(/^cus_/);
    expect(created.metadata).toEqual({ tenantId: 'tenant-lanternfieldalarms' });

    const fetched = await stripe.customers.retrieve(created.id);
    expect(fetched).toEqual(created);

    const updated = await stripe.customers.update(created.id, { name: 'Lanternfield Alarms Ltd', metadata: { plan: 'crew', tenantId: '' } });
    expect(updated).toMatchObject({ name: 'Lanternfield Alarms Ltd', email: 'owner@lanternfieldalarms.example', metadata: { plan: 'crew' } });
  });

  it('offers the plan catalogue’s monthly prices, found by lookup key', async () => {
    expect(Object.keys(standIn.priceIds).sort()).toEqual(['mullion_bench_monthly', 'mullion_crew_monthly', 'mullion_fleet_monthly']);
    const list = await stripe.prices.list({ lookup_keys: ['mullion_crew_monthly', 'mullion_fleet_monthly'], active: true });
    expect(list.object).toBe('list');
    expect(list.data.map((p) => p.lookup_key).sort()).toEqual(['mullion_crew_monthly', 'mullion_fleet_monthly']);
    const crew = await stripe.prices.retrieve(crewPrice());
    expect(crew).toMatchObject({
      object: 'price',
      nickname: 'Crew',
      currency: 'usd',
      unit_amount: PLANS.find((p) => p.key === 'crew')!.monthlyPriceCents,
      recurring: { interval: 'month' },
      type: 'recurring',
    });
    expect(crew.id).toMatch(/^price_/);
  });
});

describe('checkout', () => {
  it('creates an open session whose url is the stand-in’s own checkout page', async () => {
    const customer = await newFirm('Copperwick Security');
    const session = await newCheckout(customer.id);
    expect(session).toMatchObject({
      object: 'checkout.session',
      status: 'open',
      payment_status: 'unpaid',
      mode: 'subscription',
      customer: customer.id,
    });
    expect(session.id).toMatch(/^cs_test_/);
    expect(session.url).toBe(`${standIn.url}/checkout/${session.id}`);

    const page = await fetch(session.url!);
    expect(page.status).toBe(200);
    const text = await page.text();
    expect(text).toContain('Test payment page — no real money moves');
    expect(text).toContain('Copperwick Security');
    expect(text).toContain('owner@copperwicksecurity.example');
    expect(text).toContain('Crew');
    expect(text).toContain('$149 per month');
    expect(text).toContain('value="4242 4242 4242 4242"');
    expect(text).toContain('Pay and subscribe');
    expect(text).toContain('href="http://mullion.test/firm/billing?checkout=canceled"');
  });

  it('pays with 4242: active subscription, paid invoice, redirect, then three signed events in order', async () => {
    const customer = await newFirm('Brackenridge Alarms');
    const session = await newCheckout(customer.id);
    const res = await postForm(session.url!, { cardNumber: '4242424242424242' });
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`http://mullion.test/firm/billing?checkout=${session.id}`);

    // Delivered before the redirect: no waiting needed.
    const events = receiver.forCustomer(customer.id);
    expect(events.map((e) => e.type)).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
    for (const event of events) {
      expect(event).toMatchObject({ object: 'event', livemode: false, pending_webhooks: 1, api_version: Stripe.API_VERSION });
      expect(event.id).toMatch(/^evt_/);
    }

    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription'] });
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid' });
    const subscription = done.subscription as Stripe.Subscription;
    expect(subscription).toMatchObject({
      object: 'subscription',
      status: 'active',
      customer: customer.id,
      metadata: { tenantId: 'tenant-42', plan: 'crew' },
    });
    expect(subscription.id).toMatch(/^sub_/);
    const item = subscription.items.data[0]!;
    expect(item.id).toMatch(/^si_/);
    expect(item.price.id).toBe(crewPrice());
    expect(item.current_period_end).toBeGreaterThan(item.current_period_start + 27 * DAY);
    expect((subscription as unknown as { current_period_end: number }).current_period_end).toBe(item.current_period_end);

    const withoutExpand = await stripe.checkout.sessions.retrieve(session.id);
    expect(withoutExpand.subscription).toBe(subscription.id);

    const invoices = await stripe.invoices.list({ customer: customer.id });
    expect(invoices.data).toHaveLength(1);
    const invoice = invoices.data[0]!;
    expect(invoice).toMatchObject({
      object: 'invoice',
      status: 'paid',
      amount_due: 14900,
      amount_paid: 14900,
      currency: 'usd',
      customer: customer.id,
    });
    expect(invoice.id).toMatch(/^in_/);
    expect(subscription.latest_invoice).toBe(invoice.id);
    expect((invoice as unknown as { subscription: string }).subscription).toBe(subscription.id);

    const [created, paid, completed] = events;
    expect((created!.data.object as Stripe.Subscription).id).toBe(subscription.id);
    expect((paid!.data.object as Stripe.Invoice).id).toBe(invoice.id);
    expect(completed!.data.object).toMatchObject({ id: session.id, status: 'complete', subscription: subscription.id });

    const again = await fetch(session.url!);
    expect(again.status).toBe(410);
    expect(await postForm(session.url!, { cardNumber: '4242424242424242' }).then((r) => r.status)).toBe(410);
    expect(await stripe.invoices.list({ customer: customer.id }).then((l) => l.data.length)).toBe(1);
  });

  it('declines 4000 0000 0000 0002 and creates nothing', async () => {
    const customer = await newFirm('Fenwick Watch');
    const session = await newCheckout(customer.id);
    const res = await postForm(session.url!, { cardNumber: '4000 0000 0000 0002' });
    expect(res.status).toBe(402);
    expect(await res.text()).toContain('Your card was declined. Try the test card 4242 4242 4242 4242.');

    const after = await stripe.checkout.sessions.retrieve(session.id);
    expect(after).toMatchObject({ status: 'open', payment_status: 'unpaid', subscription: null });
    expect((await stripe.invoices.list({ customer: customer.id })).data).toEqual([]);
    expect(standIn.events().filter((r) => (r.event.data.object as { customer?: string }).customer === customer.id)).toEqual([]);
  });

  it('starts a trial when subscription_data[trial_end] is in the future', async () => {
    const customer = await newFirm('Saltmarsh Systems');
    const trialEnd = unix() + 14 * DAY;
    const session = await newCheckout(customer.id, { trialEnd });
    expect(session.amount_total).toBe(0);
    const page = await fetch(session.url!).then((r) => r.text());
    expect(page).toContain('nothing is charged today');

    expect((await postForm(session.url!, { cardNumber: '4242 4242 4242 4242' })).status).toBe(303);
    const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription'] });
    expect(done.payment_status).toBe('no_payment_required');
    const subscription = done.subscription as Stripe.Subscription;
    expect(subscription).toMatchObject({ status: 'trialing', trial_end: trialEnd });
    expect(subscription.items.data[0]!.current_period_end).toBe(trialEnd);
    const [invoice] = (await stripe.invoices.list({ customer: customer.id })).data;
    expect(invoice).toMatchObject({ status: 'paid', amount_due: 0, amount_paid: 0 });

    const ended = await control(subscription.id, 'end-trial');
    expect(ended.status).toBe(200);
    expect(ended.body.subscription.status).toBe('active');
    expect(ended.body.invoice).toMatchObject({ status: 'paid', amount_paid: 14900 });
    expect(receiver.forCustomer(customer.id).map((e) => e.type)).toEqual([
      'customer.subscription.created',
      'invoice.paid',
      'checkout.session.completed',
      'customer.subscription.updated',
      'invoice.paid',
    ]);
    const update = receiver.forCustomer(customer.id)[3]!;
    expect(update.data.previous_attributes).toMatchObject({ status: 'trialing' });
  });

  it('escapes what it shows on its pages', async () => {
    const customer = await stripe.customers.create({ name: '<script>alert("x")</script> Alarms', email: 'owner@escaping.example' });
    const session = await newCheckout(customer.id);
    const text = await fetch(session.url!).then((r) => r.text());
    expect(text).not.toContain('<script>alert');
    expect(text).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; Alarms');
  });
});

describe('subscriptions', () => {
  it('changes the plan and sends customer.subscription.updated with the previous attributes', async () => {
    const { customer, subscription } = await subscribedFirm('Orchard Lane Alarms');
    const updated = await stripe.subscriptions.update(subscription.id, {
      items: [{ id: subscription.items.data[0]!.id, price: fleetPrice() }],
      proration_behavior: 'none',
    });
    expect(updated.items.data[0]!.price.id).toBe(fleetPrice());
    expect(updated.items.data[0]!.id).toBe(subscription.items.data[0]!.id);
    expect((await stripe.subscriptions.retrieve(subscription.id)).items.data[0]!.price.unit_amount).toBe(39900);

    const event = await waitFor(() => receiver.forCustomer(customer.id).find((e) => e.type === 'customer.subscription.updated'), 'the update event');
    expect(event.data.object.items.data[0]!.price.id).toBe(fleetPrice());
    const previous = event.data.previous_attributes as { items: { data: Array<{ price: { id: string } }> } };
    expect(previous.items.data[0]!.price.id).toBe(crewPrice());

    const scheduled = await stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true });
    expect(scheduled).toMatchObject({ cancel_at_period_end: true, status: 'active', cancel_at: scheduled.items.data[0]!.current_period_end });
    const second = await waitFor(
      () => receiver.forCustomer(customer.id).filter((e) => e.type === 'customer.subscription.updated')[1],
      'the second update event',
    );
    expect(second.data.previous_attributes).toMatchObject({ cancel_at_period_end: false });
  });

  it('cancels at once on delete', async () => {
    const { customer, subscription } = await subscribedFirm('Thistledown Security');
    const canceled = await stripe.subscriptions.cancel(subscription.id);
    expect(canceled.status).toBe('canceled');
    expect(canceled.canceled_at).toBeGreaterThanOrEqual(unix() - 5);
    expect(canceled.ended_at).toBe(canceled.canceled_at);
    const event = await waitFor(() => receiver.forCustomer(customer.id).find((e) => e.type === 'customer.subscription.deleted'), 'the deleted event');
    expect(event.data.object).toMatchObject({ id: subscription.id, status: 'canceled' });
    await expect(stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true })).rejects.toMatchObject({ statusCode: 400 });
  });

  it('moves to past_due with invoice.payment_failed, and back to active when paid', async () => {
    const { customer, subscription } = await subscribedFirm('Marrowby Alarm Services');
    const failed = await control(subscription.id, 'fail-payment');
    expect(failed.status).toBe(200);
    expect(failed.body.subscription.status).toBe('past_due');
    expect(failed.body.invoice).toMatchObject({ status: 'open', amount_due: 14900, amount_paid: 0 });
    expect((await stripe.subscriptions.retrieve(subscription.id)).status).toBe('past_due');

    const types = receiver.forCustomer(customer.id).map((e) => e.type);
    expect(types.slice(3)).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
    const update = receiver.forCustomer(customer.id)[4]!;
    expect(update.data.previous_attributes).toMatchObject({ status: 'active' });

    const paid = await control(subscription.id, 'pay');
    expect(paid.body.subscription.status).toBe('active');
    expect(paid.body.invoice).toMatchObject({ id: failed.body.invoice!.id, status: 'paid', amount_paid: 14900 });
    expect(
      receiver
        .forCustomer(customer.id)
        .map((e) => e.type)
        .slice(5),
    ).toEqual(['invoice.paid', 'customer.subscription.updated']);
  });

  it('refuses test controls for an unknown subscription', async () => {
    const res = await control('sub_missing', 'pay');
    expect(res.status).toBe(404);
    expect(res.body.error).toMatchObject({ code: 'resource_missing', param: 'id' });
  });
});

describe('invoices', () => {
  it('lists a customer’s invoices newest first, a page at a time', async () => {
    const { customer, subscription } = await subscribedFirm('Kestrel Point Alarms');
    await control(subscription.id, 'pay');
    await control(subscription.id, 'pay');
    await subscribedFirm('Someone Else Security');

    const first = await stripe.invoices.list({ customer: customer.id, limit: 2 });
    expect(first).toMatchObject({ object: 'list', has_more: true, url: '/v1/invoices' });
    expect(first.data).toHaveLength(2);
    expect(first.data.every((i) => i.customer === customer.id)).toBe(true);
    expect(first.data[0]!.period_start).toBeGreaterThan(first.data[1]!.period_start);

    const rest = await stripe.invoices.list({ customer: customer.id, limit: 2, starting_after: first.data[1]!.id });
    expect(rest.has_more).toBe(false);
    expect(rest.data).toHaveLength(1);
    expect(rest.data[0]!.billing_reason).toBe('subscription_create');
    const numbers = [...first.data, ...rest.data].map((i) => i.number);
    expect(new Set(numbers).size).toBe(3);

    const one = await stripe.invoices.retrieve(rest.data[0]!.id);
    expect(one.id).toBe(rest.data[0]!.id);
    const hosted = await fetch(one.hosted_invoice_url!);
    expect(hosted.status).toBe(200);
    expect(await hosted.text()).toContain(one.number!);
  });
});

describe('billing portal', () => {
  it('shows the subscription and invoices, and its forms change the plan and cancel', async () => {
    const { customer, subscription } = await subscribedFirm('Ravensgate Alarms');
    const portal = await stripe.billingPortal.sessions.create({ customer: customer.id, return_url: 'http://mullion.test/firm/billing' });
    expect(portal).toMatchObject({ object: 'billing_portal.session', customer: customer.id, return_url: 'http://mullion.test/firm/billing' });
    expect(portal.id).toMatch(/^bps_/);
    expect(portal.url).toBe(`${standIn.url}/billing/${portal.id}`);

    const page = await fetch(portal.url).then((r) => r.text());
    expect(page).toContain('Test payment page — no real money moves');
    expect(page).toContain('Crew');
    expect(page).toContain('Renews on');
    expect(page).toContain('$149 per month');
    const [invoice] = (await stripe.invoices.list({ customer: customer.id })).data;
    expect(page).toContain(invoice!.number!);
    expect(page).toContain('href="http://mullion.test/firm/billing"');
    expect(page).toContain('Return to Mullion');

    const switched = await postForm(`${portal.url}/change-plan`, { subscription: subscription.id, price: fleetPrice() });
    expect(switched.status).toBe(303);
    expect(switched.headers.get('location')).toBe(`/billing/${portal.id}?done=plan-changed`);
    expect((await stripe.subscriptions.retrieve(subscription.id)).items.data[0]!.price.id).toBe(fleetPrice());
    // Delivered before the redirect.
    expect(
      receiver
        .forCustomer(customer.id)
        .map((e) => e.type)
        .at(-1),
    ).toBe('customer.subscription.updated');

    const atEnd = await postForm(`${portal.url}/cancel-at-period-end`, { subscription: subscription.id });
    expect(atEnd.status).toBe(303);
    expect((await stripe.subscriptions.retrieve(subscription.id)).cancel_at_period_end).toBe(true);
    const scheduledPage = await fetch(`${portal.url}?done=cancel-scheduled`).then((r) => r.text());
    expect(scheduledPage).toContain('Ends on');
    expect(scheduledPage).toContain('Keep subscription');
    expect(scheduledPage).toContain('Fleet');

    const now = await postForm(`${portal.url}/cancel-now`, { subscription: subscription.id });
    expect(now.status).toBe(303);
    expect((await stripe.subscriptions.retrieve(subscription.id)).status).toBe('canceled');
    expect(
      receiver
        .forCustomer(customer.id)
        .map((e) => e.type)
        .slice(-3),
    ).toEqual(['customer.subscription.updated', 'customer.subscription.updated', 'customer.subscription.deleted']);
  });

  it('does not touch another firm’s subscription from a portal page', async () => {
    const { customer } = await subscribedFirm('Wychwood Alarms');
    const other = await subscribedFirm('Elderbrook Security');
    const portal = await stripe.billingPortal.sessions.create({ customer: customer.id, return_url: 'http://mullion.test/firm/billing' });
    const res = await postForm(`${portal.url}/cancel-now`, { subscription: other.subscription.id });
    expect(res.status).toBe(404);
    expect((await stripe.subscriptions.retrieve(other.subscription.id)).status).toBe('active');
  });
});

describe('webhook delivery', () => {
  it('signs as Stripe does: a signature made with another secret fails verification', async () => {
    await subscribedFirm('Gullhaven Alarms');
    const { raw } = receiver.received.at(-1)!;
    const good = Stripe.webhooks.generateTestHeaderString({ payload: raw, secret: WEBHOOK_SECRET });
    expect(Stripe.webhooks.constructEvent(raw, good, WEBHOOK_SECRET).id).toMatch(/^evt_/);
    const forged = Stripe.webhooks.generateTestHeaderString({ payload: raw, secret: 'whsec_someone_else' });
    expect(() => Stripe.webhooks.constructEvent(raw, forged, WEBHOOK_SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);

    const rejectedBefore = receiver.rejected;
    const res = await fetch(receiver.url, { method: 'POST', headers: { 'Stripe-Signature': forged }, body: raw });
    expect(res.status).toBe(400);
    expect(receiver.rejected).toBe(rejectedBefore + 1);
  });

  it('retries a failed delivery and records the outcome', async () => {
    receiver.failNext = 2;
    const { customer } = await subscribedFirm('Pennycress Security');
    expect(receiver.forCustomer(customer.id).map((e) => e.type)).toEqual([
      'customer.subscription.created',
      'invoice.paid',
      'checkout.session.completed',
    ]);
    const records = standIn.events().filter((r) => (r.event.data.object as { customer?: string }).customer === customer.id);
    expect(records.map((r) => [r.delivery.status, r.delivery.attempts])).toEqual([
      ['delivered', 3],
      ['delivered', 1],
      ['delivered', 1],
    ]);
    const listed = (await fetch(`${standIn.url}/_stand-in/events?type=customer.subscription.created`).then((r) => r.json())) as {
      data: StripeEventRecord[];
    };
    expect(listed.data.find((r) => (r.event.data.object as { customer?: string }).customer === customer.id)?.delivery).toMatchObject({
      status: 'delivered',
      attempts: 3,
      responseStatus: 200,
    });
  });

  it('only records events when it has no webhook URL, dated by its own clock', async () => {
    const fixed = new Date('2027-03-01T12:00:00Z');
    const quiet = await startStripeStandIn({ port: 0, webhookSecret: WEBHOOK_SECRET, prices: DEFAULT_PLAN_PRICES, now: () => fixed });
    try {
      const client = new Stripe(API_KEY, { host: '127.0.0.1', port: quiet.port, protocol: 'http' });
      const customer = await client.customers.create({ name: 'Stillwater Alarms' });
      expect(customer.created).toBe(fixed.getTime() / 1000);
      const session = await client.checkout.sessions.create({
        mode: 'subscription',
        customer: customer.id,
        line_items: [{ price: quiet.priceIds.mullion_bench_monthly!, quantity: 1 }],
        success_url: 'http://mullion.test/ok',
      });
      expect((await postForm(session.url!, { cardNumber: '4242 4242 4242 4242' })).status).toBe(303);
      expect(quiet.events().map((r) => [r.event.type, r.delivery.status, r.event.created])).toEqual([
        ['customer.subscription.created', 'not_sent', fixed.getTime() / 1000],
        ['invoice.paid', 'not_sent', fixed.getTime() / 1000],
        ['checkout.session.completed', 'not_sent', fixed.getTime() / 1000],
      ]);
      const subscription = await client.subscriptions.retrieve((await client.checkout.sessions.retrieve(session.id)).subscription as string);
      expect(subscription.items.data[0]!.current_period_end).toBe(Date.parse('2027-04-01T12:00:00Z') / 1000);
    } finally {
      await quiet.close();
    }
  });
});
