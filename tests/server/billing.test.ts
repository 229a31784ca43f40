/**
 * Billing: Stripe's webhooks moving a firm's subscription state (each event once), the
 * owner's Checkout and billing portal driven end to end against the local Stripe stand-in,
 * read-only firms, plan limits, and who may reach the billing routes.
 */
import crypto from 'node:crypto';
import request from 'supertest';
import Stripe from 'stripe';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { PLANS, type PlanKey } from '@domain/plans';
import { formatMessageDate, PAST_DUE_GRACE_DAYS } from '@domain/subscription-state';
import { AuditEvent } from '@server/models/AuditEvent';
import { Client } from '@server/models/Client';
import { EmergencyContact } from '@server/models/EmergencyContact';
import { Invitation } from '@server/models/Invitation';
import { Job } from '@server/models/Job';
import { Site } from '@server/models/Site';
import { StripeEvent } from '@server/models/StripeEvent';
import { SubscriptionChange } from '@server/models/SubscriptionChange';
import type { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import {
  buildClient,
  buildClientUser,
  buildFirm,
  buildFirmWithSite,
  buildFirmWithStaff,
  buildSite,
  buildUser,
  TEST_PASSWORD,
} from '../support/factories';
import { createBillingTestApp, signedEvent, type BillingTestApp } from '../support/stripe';
import { visitor, type TestApp, type Visitor } from '../support/test-app';

let b: BillingTestApp;
let t: TestApp;
let realNow: Date;

beforeAll(async () => {
  b = await createBillingTestApp();
  t = b.t;
  realNow = t.clock.now;
});
afterEach(() => {
  t.clock.now = realNow;
});
afterAll(async () => {
  await b?.close();
});

const DAY_MS = 24 * 60 * 60 * 1000;
const PAYS = '4242 4242 4242 4242';
const DECLINES = '4000 0000 0000 0002';
const planOf = (key: PlanKey) => PLANS.find((p) => p.key === key)!;
const short = () => crypto.randomUUID().replace(/-/g, '').slice(0, 14);
const unix = (at: Date) => Math.floor(at.getTime() / 1000);

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  const res = await v.signIn(user.email, TEST_PASSWORD);
  expect(res.status).toBe(200);
  return v;
}

// ---------------------------------------------------------------------------------------------
// Stripe objects and events, shaped as Stripe sends them (API 2025+: periods on the items)
// ---------------------------------------------------------------------------------------------

interface SubscriptionInput {
  id: string;
  customer: string;
  status: Stripe.Subscription.Status;
  plan?: PlanKey;
  priceId?: string;
  tenantId?: string | null;
  cancelAtPeriodEnd?: boolean;
  periodEnd?: Date;
}

function subscriptionObject(input: SubscriptionInput): Record<string, unknown> {
  const plan = planOf(input.plan ?? 'crew');
  const priceId = input.priceId ?? b.billing.priceIds[plan.key];
  const start = unix(realNow) - 3 * 24 * 60 * 60;
  const end = unix(input.periodEnd ?? new Date(realNow.getTime() + 27 * DAY_MS));
  return {
    id: input.id,
    object: 'subscription',
    billing_cycle_anchor: start,
    cancel_at: input.cancelAtPeriodEnd ? end : null,
    cancel_at_period_end: input.cancelAtPeriodEnd ?? false,
    canceled_at: input.status === 'canceled' ? unix(realNow) : null,
    collection_method: 'charge_automatically',
    created: start,
    currency: 'usd',
    customer: input.customer,
    ended_at: input.status === 'canceled' ? unix(realNow) : null,
    items: {
      object: 'list',
      data: [
        {
          id: `si_${short()}`,
          object: 'subscription_item',
          created: start,
          current_period_start: start,
          current_period_end: end,
          metadata: {},
          price: {
            id: priceId,
            object: 'price',
            active: true,
            currency: 'usd',
            lookup_key: `mullion_${plan.key}_monthly`,
            nickname: plan.name,
            recurring: { interval: 'month', interval_count: 1, usage_type: 'licensed' },
            type: 'recurring',
            unit_amount: plan.monthlyPriceCents,
          },
          quantity: 1,
          subscription: input.id,
        },
      ],
      has_more: false,
      total_count: 1,
      url: `/v1/subscription_items?subscription=${input.id}`,
    },
    latest_invoice: null,
    livemode: false,
    metadata: input.tenantId ? { tenantId: input.tenantId, planKey: plan.key } : {},
    start_date: start,
    status: input.status,
    trial_end: null,
    trial_start: null,
  };
}

interface InvoiceInput {
  customer: string;
  /** the subscription it bills, named as API 2025+ does (parent.subscription_details) */
  subscription?: string | null;
  /** the subscription named the older way, on the invoice itself */
  legacySubscription?: string;
  paid: boolean;
  plan?: PlanKey;
}

function invoiceObject(input: InvoiceInput): Record<string, unknown> {
  const amount = planOf(input.plan ?? 'crew').monthlyPriceCents;
  const id = `in_${short()}`;
  return {
    id,
    object: 'invoice',
    amount_due: amount,
    amount_paid: input.paid ? amount : 0,
    amount_remaining: input.paid ? 0 : amount,
    attempt_count: 1,
    attempted: true,
    billing_reason: 'subscription_cycle',
    collection_method: 'charge_automatically',
    created: unix(realNow),
    currency: 'usd',
    customer: input.customer,
    hosted_invoice_url: null,
    invoice_pdf: null,
    livemode: false,
    metadata: {},
    number: `TEST-${short().slice(0, 4).toUpperCase()}-0001`,
    parent: input.subscription
      ? { type: 'subscription_details', quote_details: null, subscription_details: { metadata: {}, subscription: input.subscription } }
      : null,
    period_end: unix(realNow),
    period_start: unix(realNow) - 30 * 24 * 60 * 60,
    status: input.paid ? 'paid' : 'open',
    ...(input.legacySubscription ? { subscription: input.legacySubscription } : {}),
  };
}

interface TestEvent {
  id: string;
  object: 'event';
  type: string;
  created: number;
  [key: string]: unknown;
}

function stripeEvent(type: string, object: Record<string, unknown>, at: Date = realNow): TestEvent {
  return {
    id: `evt_${short()}`,
    object: 'event',
    api_version: Stripe.API_VERSION,
    created: unix(at),
    data: { object },
    livemode: false,
    pending_webhooks: 1,
    request: { id: null, idempotency_key: null },
    type,
  };
}

function postWebhook(body: string, signature?: string) {
  const req = request(t.app).post('/api/webhooks/stripe').set('Content-Type', 'application/json');
  return signature === undefined ? req.send(body) : req.set('Stripe-Signature', signature).send(body);
}

/** Delivers an event signed with the endpoint's secret, as Stripe would; expects 200. */
async function deliver(event: TestEvent): Promise<string> {
  const { body, signature } = signedEvent(event, b.billing.webhookSecret);
  const res = await postWebhook(body, signature);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(res.body.received).toBe(true);
  return res.body.result as string;
}

/** A firm that Stripe has told about a subscription (created with the given status). */
async function firmWithSubscription(status: Stripe.Subscription.Status = 'active', plan: PlanKey = 'crew') {
  const firm = await buildFirm();
  const customer = `cus_${short()}`;
  const subscription = `sub_${short()}`;
  const at = new Date(realNow.getTime() - 10 * DAY_MS);
  expect(await deliver(stripeEvent('customer.subscription.created', subscriptionObject({ id: subscription, customer, status, plan, tenantId: firm.id }), at))).toBe(
    'processed',
  );
  await firm.reload();
  return { firm, customer, subscription };
}

const historyOf = (tenant: Tenant) => SubscriptionChange.findAll({ where: { tenantId: tenant.id }, order: [['from', 'ASC'], ['createdAt', 'ASC']] });

/** What a firm's billing looks like from the outside, to compare before and after. */
async function snapshot(tenant: Tenant) {
  await tenant.reload();
  const { state, planKey, stateBeforeSuspension, stripeCustomerId, stripeSubscriptionId, subscriptionStatus, pastDueSince, currentPeriodEnd, cancelAtPeriodEnd } = tenant;
  return {
    state,
    planKey,
    stateBeforeSuspension,
    stripeCustomerId,
    stripeSubscriptionId,
    subscriptionStatus,
    pastDueSince: pastDueSince?.toISOString() ?? null,
    currentPeriodEnd: currentPeriodEnd?.toISOString() ?? null,
    cancelAtPeriodEnd,
    history: (await historyOf(tenant)).map((c) => ({ planKey: c.planKey, state: c.state, monthlyAmountCents: c.monthlyAmountCents, stripeEventId: c.stripeEventId })),
  };
}

// ---------------------------------------------------------------------------------------------
// The stand-in's pages, used as a browser would
// ---------------------------------------------------------------------------------------------

interface PageForm {
  action: string;
  fields: Record<string, string>;
  options: Record<string, string[]>;
}

const unescape = (s: string) => s.replaceAll('&amp;', '&').replaceAll('&quot;', '"').replaceAll('&#39;', "'").replaceAll('&lt;', '<').replaceAll('&gt;', '>');
const attr = (tag: string, name: string) => {
  const m = new RegExp(`\\b${name}="([^"]*)"`).exec(tag);
  return m ? unescape(m[1]!) : undefined;
};

function formsOf(html: string): PageForm[] {
  const forms: PageForm[] = [];
  for (const match of html.matchAll(/<form\b([^>]*)>([\s\S]*?)<\/form>/g)) {
    const fields: Record<string, string> = {};
    const options: Record<string, string[]> = {};
    for (const input of match[2]!.matchAll(/<input\b[^>]*>/g)) {
      const name = attr(input[0], 'name');
      if (name) fields[name] = attr(input[0], 'value') ?? '';
    }
    for (const select of match[2]!.matchAll(/<select\b([^>]*)>([\s\S]*?)<\/select>/g)) {
      const name = attr(select[1]!, 'name');
      if (name) options[name] = [...select[2]!.matchAll(/<option\b[^>]*>/g)].map((o) => attr(o[0], 'value') ?? '');
    }
    forms.push({ action: attr(match[1]!, 'action') ?? '', fields, options });
  }
  return forms;
}

function submit(pageUrl: string, form: PageForm, fields: Record<string, string>): Promise<Response> {
  return fetch(new URL(form.action, pageUrl), { method: 'POST', body: new URLSearchParams({ ...form.fields, ...fields }), redirect: 'manual' });
}

async function pageForms(url: string): Promise<{ html: string; forms: PageForm[] }> {
  const res = await fetch(url);
  expect(res.status).toBe(200);
  const html = await res.text();
  return { html, forms: formsOf(html) };
}

/** Pays the checkout page at `url` with `card`, as a browser posts its form. */
async function payCheckout(url: string, card: string): Promise<Response> {
  const { forms } = await pageForms(url);
  const form = forms.find((f) => 'cardNumber' in f.fields);
  expect(form, 'the checkout page has a card form').toBeDefined();
  return submit(url, form!, { cardNumber: card });
}

async function control(subscriptionId: string, action: 'fail-payment' | 'pay' | 'end-trial'): Promise<void> {
  const res = await fetch(`${b.standIn.url}/_stand-in/subscriptions/${subscriptionId}/${action}`, { method: 'POST' });
  expect(res.status).toBe(200);
}

/** A firm whose owner subscribed to `plan` through Checkout with the 4242 card. */
async function subscribedThroughCheckout(plan: PlanKey = 'crew') {
  const staff = await buildFirmWithStaff();
  const owner = await signedIn(staff.owner);
  const start = await owner.post('/api/billing/checkout', { planKey: plan });
  expect(start.status, JSON.stringify(start.body)).toBe(201);
  const paid = await payCheckout(start.body.data.url as string, PAYS);
  expect(paid.status).toBe(303);
  await staff.firm.reload();
  return { ...staff, ownerVisitor: owner, checkoutUrl: start.body.data.url as string, redirect: paid.headers.get('location') };
}

const eventsOfCustomer = (customer: string) =>
  b.standIn.events().filter((r) => (r.event.data.object as { customer?: unknown }).customer === customer);

// =============================================================================================

describe('POST /api/webhooks/stripe: signatures', () => {
  it('refuses a signature made with another secret (400) and changes nothing', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const before = await snapshot(firm);
    const event = stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription, paid: false }));
    const forged = signedEvent(event, 'whsec_someone_else_entirely');
    const res = await postWebhook(forged.body, forged.signature);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.message).toMatch(/Stripe-Signature/);
    expect(await snapshot(firm)).toEqual(before);
    expect(await StripeEvent.findByPk(event.id)).toBeNull();

    // The very same event, signed with the endpoint's secret, is accepted: the refusal was the signature.
    expect(await deliver(event)).toBe('processed');
    expect((await snapshot(firm)).state).toBe('past_due');
  });

  it('refuses a missing signature (400), a body changed after signing, and a stale signature', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const before = await snapshot(firm);
    const event = stripeEvent('customer.subscription.deleted', subscriptionObject({ id: subscription, customer, status: 'canceled', tenantId: firm.id }));
    const { body, signature } = signedEvent(event, b.billing.webhookSecret);

    const missing = await postWebhook(body);
    expect(missing.status).toBe(400);
    expect(missing.body.error.code).toBe('validation_failed');

    const tampered = await postWebhook(body.replace('"canceled"', '"active"'), signature);
    expect(tampered.status).toBe(400);

    const stale = signedEvent(event, b.billing.webhookSecret, { timestamp: unix(new Date()) - 60 * 60 });
    expect((await postWebhook(stale.body, stale.signature)).status).toBe(400);

    expect(await snapshot(firm)).toEqual(before);
    expect(await StripeEvent.findByPk(event.id)).toBeNull();
  });

  it('acknowledges an event type it does not act on without recording it', async () => {
    const firm = await buildFirm();
    const event = stripeEvent('customer.updated', { id: `cus_${short()}`, object: 'customer', metadata: { tenantId: firm.id } });
    expect(await deliver(event)).toBe('ignored');
    expect(await StripeEvent.findByPk(event.id)).toBeNull();
    expect((await snapshot(firm)).state).toBe('trialing');
  });
});

describe('POST /api/webhooks/stripe: each event once', () => {
  it('processes a replayed event once: state, history and the event record are unchanged by the replay', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const failedAt = new Date(realNow.getTime() - 2 * DAY_MS);
    const failed = stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription, paid: false }), failedAt);
    expect(await deliver(failed)).toBe('processed');
    expect((await snapshot(firm)).state).toBe('past_due');

    const paid = stripeEvent('invoice.paid', invoiceObject({ customer, subscription, paid: true }), new Date(realNow.getTime() - DAY_MS));
    expect(await deliver(paid)).toBe('processed');
    const settled = await snapshot(firm);
    expect(settled).toMatchObject({ state: 'active', pastDueSince: null });
    const audits = await AuditEvent.count({ where: { tenantId: firm.id, action: 'billing.payment_failed' } });
    expect(audits).toBe(1);

    // Stripe delivers the failure again (a retry after a timeout, say): nothing moves back.
    expect(await deliver(failed)).toBe('duplicate');
    expect(await deliver(failed)).toBe('duplicate');
    expect(await snapshot(firm)).toEqual(settled);
    expect(await StripeEvent.count({ where: { id: failed.id } })).toBe(1);
    expect(await AuditEvent.count({ where: { tenantId: firm.id, action: 'billing.payment_failed' } })).toBe(1);
    const record = await StripeEvent.findByPk(failed.id);
    expect(record).toMatchObject({ type: 'invoice.payment_failed', tenantId: firm.id });
  });

  it('treats a replay of the subscription event that made the firm active as a duplicate', async () => {
    const firm = await buildFirm();
    const customer = `cus_${short()}`;
    const created = stripeEvent('customer.subscription.created', subscriptionObject({ id: `sub_${short()}`, customer, status: 'active', tenantId: firm.id }));
    expect(await deliver(created)).toBe('processed');
    const after = await snapshot(firm);
    expect(after.history).toHaveLength(1);
    expect(await deliver(created)).toBe('duplicate');
    expect(await snapshot(firm)).toEqual(after);
    expect(await StripeEvent.count({ where: { id: created.id } })).toBe(1);
  });
});

describe('POST /api/webhooks/stripe: the firm follows its subscription', () => {
  it('created with status active: active on the plan of the price, with customer, subscription, period end and a history row', async () => {
    const firm = await buildFirm();
    const customer = `cus_${short()}`;
    const subscription = `sub_${short()}`;
    const periodEnd = new Date(unix(new Date(realNow.getTime() + 20 * DAY_MS)) * 1000);
    const at = new Date(unix(realNow) * 1000);
    const event = stripeEvent('customer.subscription.created', subscriptionObject({ id: subscription, customer, status: 'active', plan: 'crew', tenantId: firm.id, periodEnd }), at);
    expect(await deliver(event)).toBe('processed');

    expect(await snapshot(firm)).toEqual({
      state: 'active',
      planKey: 'crew',
      stateBeforeSuspension: null,
      stripeCustomerId: customer,
      stripeSubscriptionId: subscription,
      subscriptionStatus: 'active',
      pastDueSince: null,
      currentPeriodEnd: periodEnd.toISOString(),
      cancelAtPeriodEnd: false,
      history: [{ planKey: 'crew', state: 'active', monthlyAmountCents: 14900, stripeEventId: event.id }],
    });
    const [change] = await historyOf(firm);
    expect(change!.from.toISOString()).toBe(at.toISOString());
    expect(await StripeEvent.findByPk(event.id)).toMatchObject({ type: 'customer.subscription.created', tenantId: firm.id });
    const audit = await AuditEvent.findOne({ where: { tenantId: firm.id, action: 'billing.subscription_changed' } });
    expect(audit?.details).toMatchObject({ from: { state: 'trialing', planKey: null }, to: { state: 'active', planKey: 'crew' } });
  });

  it('finds the firm by its Stripe customer when the subscription carries no tenantId', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active', 'bench');
    const event = stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'active', plan: 'fleet', tenantId: null }));
    expect(await deliver(event)).toBe('processed');
    const after = await snapshot(firm);
    expect(after).toMatchObject({ state: 'active', planKey: 'fleet' });
    expect(after.history.map((h) => [h.planKey, h.monthlyAmountCents])).toEqual([
      ['bench', 4900],
      ['fleet', 39900],
    ]);
  });

  it('trialing: the firm is trialing on the chosen plan, paying nothing yet', async () => {
    const { firm } = await firmWithSubscription('trialing', 'bench');
    const after = await snapshot(firm);
    expect(after).toMatchObject({ state: 'trialing', planKey: 'bench', subscriptionStatus: 'trialing' });
    expect(after.history).toEqual([expect.objectContaining({ planKey: 'bench', state: 'trialing', monthlyAmountCents: 0 })]);
  });

  it('updated to past_due: past due from the event’s time, which a later past_due update keeps', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const firstAt = new Date(unix(new Date(realNow.getTime() - 3 * DAY_MS)) * 1000);
    await deliver(stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'past_due', tenantId: firm.id }), firstAt));
    expect(await snapshot(firm)).toMatchObject({ state: 'past_due', subscriptionStatus: 'past_due', pastDueSince: firstAt.toISOString() });

    await deliver(stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'past_due', tenantId: firm.id }), realNow));
    const after = await snapshot(firm);
    expect(after.pastDueSince).toBe(firstAt.toISOString());
    // still paying the plan while past due: one history row for the change, none for the repeat
    expect(after.history.map((h) => [h.state, h.monthlyAmountCents])).toEqual([
      ['active', 14900],
      ['past_due', 14900],
    ]);

    await deliver(stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'active', tenantId: firm.id })));
    expect(await snapshot(firm)).toMatchObject({ state: 'active', pastDueSince: null });
  });

  it('unpaid (Stripe gave up retrying) is still past due', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    await deliver(stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'unpaid', tenantId: firm.id })));
    expect(await snapshot(firm)).toMatchObject({ state: 'past_due', subscriptionStatus: 'unpaid' });
  });

  it('cancel at period end: still active, the end is shown on the billing page', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    await deliver(stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'active', tenantId: firm.id, cancelAtPeriodEnd: true })));
    const after = await snapshot(firm);
    expect(after).toMatchObject({ state: 'active', cancelAtPeriodEnd: true });
    expect(after.history).toHaveLength(1);
  });

  it('deleted (canceled): the firm is cancelled and read-only, paying nothing', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    await deliver(stripeEvent('customer.subscription.deleted', subscriptionObject({ id: subscription, customer, status: 'canceled', tenantId: firm.id })));
    const after = await snapshot(firm);
    expect(after).toMatchObject({ state: 'cancelled', subscriptionStatus: 'canceled', planKey: 'crew' });
    expect(after.history.map((h) => [h.state, h.monthlyAmountCents])).toEqual([
      ['active', 14900],
      ['cancelled', 0],
    ]);
  });

  it('incomplete (first payment under way) does not change the firm’s state', async () => {
    const firm = await buildFirm();
    const customer = `cus_${short()}`;
    await deliver(stripeEvent('customer.subscription.created', subscriptionObject({ id: `sub_${short()}`, customer, status: 'incomplete', tenantId: firm.id })));
    expect(await snapshot(firm)).toMatchObject({ state: 'trialing', subscriptionStatus: 'incomplete', stripeCustomerId: customer });
  });

  it('invoice.payment_failed: past due from the event’s time; invoice.paid: active again and the grace clock cleared', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const failedAt = new Date(unix(new Date(realNow.getTime() - DAY_MS)) * 1000);
    await deliver(stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription, paid: false }), failedAt));
    expect(await snapshot(firm)).toMatchObject({ state: 'past_due', subscriptionStatus: 'past_due', pastDueSince: failedAt.toISOString() });

    // A retry that fails again does not restart the grace period.
    await deliver(stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription, paid: false })));
    expect((await snapshot(firm)).pastDueSince).toBe(failedAt.toISOString());

    await deliver(stripeEvent('invoice.paid', invoiceObject({ customer, subscription, paid: true })));
    const after = await snapshot(firm);
    expect(after).toMatchObject({ state: 'active', subscriptionStatus: 'active', pastDueSince: null });
    expect(after.history.map((h) => h.state)).toEqual(['active', 'past_due', 'active']);
  });

  it('reads the subscription of an invoice named the older way too', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    await deliver(stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription: null, legacySubscription: subscription, paid: false })));
    expect((await snapshot(firm)).state).toBe('past_due');
  });

  it('invoice.paid for a firm in good standing changes nothing', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const before = await snapshot(firm);
    expect(await deliver(stripeEvent('invoice.paid', invoiceObject({ customer, subscription, paid: true })))).toBe('processed');
    expect(await snapshot(firm)).toEqual(before);
  });

  it('ignores events about a subscription that is not the firm’s current one', async () => {
    const { firm, customer } = await firmWithSubscription('active');
    const before = await snapshot(firm);
    const old = `sub_${short()}`;
    await deliver(stripeEvent('customer.subscription.deleted', subscriptionObject({ id: old, customer, status: 'canceled', tenantId: firm.id })));
    await deliver(stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription: old, paid: false })));
    expect(await snapshot(firm)).toEqual(before);
  });

  it('a suspended firm stays suspended; the state it returns to follows the subscription', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    await firm.update({ state: 'suspended', stateBeforeSuspension: 'active', suspendedAt: realNow, suspendedReason: 'Unpaid service invoices' });

    const failedAt = new Date(unix(new Date(realNow.getTime() - DAY_MS)) * 1000);
    await deliver(stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription, paid: false }), failedAt));
    expect(await snapshot(firm)).toMatchObject({ state: 'suspended', stateBeforeSuspension: 'past_due', pastDueSince: failedAt.toISOString() });

    await deliver(stripeEvent('invoice.paid', invoiceObject({ customer, subscription, paid: true })));
    expect(await snapshot(firm)).toMatchObject({ state: 'suspended', stateBeforeSuspension: 'active', pastDueSince: null });

    await deliver(stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'active', plan: 'fleet', tenantId: firm.id })));
    expect(await snapshot(firm)).toMatchObject({ state: 'suspended', stateBeforeSuspension: 'active', planKey: 'fleet' });

    await deliver(stripeEvent('customer.subscription.deleted', subscriptionObject({ id: subscription, customer, status: 'canceled', tenantId: firm.id })));
    expect(await snapshot(firm)).toMatchObject({ state: 'suspended', stateBeforeSuspension: 'cancelled' });
  });

  it('acknowledges events for customers and firms it does not know (200) and changes nothing', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const bystander = await buildFirm();
    const before = await snapshot(firm);
    const bystanderBefore = await snapshot(bystander);
    const changes = await SubscriptionChange.count({ crossTenant: true });
    const stranger = `cus_${short()}`;
    const events = [
      stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer: stranger, status: 'canceled' })),
      stripeEvent('customer.subscription.created', subscriptionObject({ id: `sub_${short()}`, customer: stranger, status: 'active', tenantId: crypto.randomUUID() })),
      stripeEvent('invoice.payment_failed', invoiceObject({ customer: stranger, subscription: `sub_${short()}`, paid: false })),
      stripeEvent('invoice.paid', invoiceObject({ customer: stranger, paid: true })),
    ];
    for (const event of events) {
      const { body, signature } = signedEvent(event, b.billing.webhookSecret);
      const res = await postWebhook(body, signature);
      expect(res.status).toBe(200);
      expect((await StripeEvent.findByPk(event.id))?.tenantId).toBeNull();
    }
    expect(await snapshot(firm)).toEqual(before);
    expect(await snapshot(bystander)).toEqual(bystanderBefore);
    expect(await SubscriptionChange.count({ crossTenant: true })).toBe(changes);
    expect(customer).not.toBe(stranger);
  });

  it('a failure reported after the subscription ended does not make a cancelled firm past due again', async () => {
    // Stripe does not promise order: the last failed retry can arrive after the deletion it caused.
    const { firm, customer, subscription } = await firmWithSubscription('active');
    await deliver(stripeEvent('customer.subscription.deleted', subscriptionObject({ id: subscription, customer, status: 'canceled', tenantId: firm.id })));
    const cancelled = await snapshot(firm);
    expect(cancelled.state).toBe('cancelled');
    await deliver(stripeEvent('invoice.payment_failed', invoiceObject({ customer, subscription, paid: false })));
    expect(await snapshot(firm)).toEqual(cancelled);

    const owner = await signedIn(await buildUser(firm, 'owner'));
    const page = await owner.get('/api/billing');
    expect(page.body.data).toMatchObject({ state: 'cancelled', hasSubscription: false, readOnly: { code: 'cancelled' } });
  });

  it('an older update of a subscription that has since ended does not bring the firm back', async () => {
    const { firm, customer, subscription } = await firmWithSubscription('active');
    const stale = stripeEvent('customer.subscription.updated', subscriptionObject({ id: subscription, customer, status: 'active', tenantId: firm.id, cancelAtPeriodEnd: true }));
    await deliver(stripeEvent('customer.subscription.deleted', subscriptionObject({ id: subscription, customer, status: 'canceled', tenantId: firm.id })));
    const cancelled = await snapshot(firm);
    expect(await deliver(stale)).toBe('processed');
    expect(await snapshot(firm)).toEqual(cancelled);

    // A new subscription for the same customer is followed as usual.
    const next = `sub_${short()}`;
    await deliver(stripeEvent('customer.subscription.created', subscriptionObject({ id: next, customer, status: 'active', plan: 'bench', tenantId: firm.id })));
    expect(await snapshot(firm)).toMatchObject({ state: 'active', planKey: 'bench', stripeSubscriptionId: next, subscriptionStatus: 'active' });
  });
});

describe('Checkout, the billing portal and invoices, end to end on the stand-in', () => {
  it('the owner pays with 4242: redirected back, the firm is active on Crew, with history and a paid invoice', async () => {
    const { firm, ownerVisitor, checkoutUrl, redirect } = await subscribedThroughCheckout('crew');
    expect(checkoutUrl).toMatch(new RegExp(`^${b.standIn.url}/checkout/cs_test_`));
    const sessionId = checkoutUrl.split('/').at(-1)!;
    expect(redirect).toBe(`http://mullion.test/app/billing?checkout=done&session_id=${sessionId}`);

    expect(firm).toMatchObject({ state: 'active', planKey: 'crew', subscriptionStatus: 'active', pastDueSince: null, cancelAtPeriodEnd: false });
    expect(firm.stripeCustomerId).toMatch(/^cus_/);
    expect(firm.stripeSubscriptionId).toMatch(/^sub_/);
    expect(firm.currentPeriodEnd!.getTime()).toBeGreaterThan(Date.now() + 27 * DAY_MS);
    const history = await historyOf(firm);
    expect(history.map((h) => ({ planKey: h.planKey, state: h.state, monthlyAmountCents: h.monthlyAmountCents }))).toEqual([
      { planKey: 'crew', state: 'active', monthlyAmountCents: 14900 },
    ]);

    // every event was delivered to Mullion, verified and recorded against this firm
    const records = eventsOfCustomer(firm.stripeCustomerId!);
    expect(records.map((r) => r.event.type)).toEqual(['customer.subscription.created', 'invoice.paid', 'checkout.session.completed']);
    expect(records.every((r) => r.delivery.status === 'delivered' && r.delivery.responseStatus === 200)).toBe(true);
    for (const { event } of records) expect(await StripeEvent.findByPk(event.id)).toMatchObject({ tenantId: firm.id });
    expect(await AuditEvent.count({ where: { tenantId: firm.id, action: 'billing.checkout_completed' } })).toBe(1);

    const page = await ownerVisitor.get('/api/billing');
    expect(page.status).toBe(200);
    expect(page.body.data).toMatchObject({
      state: 'active',
      stateLabel: 'Active',
      planKey: 'crew',
      plan: { key: 'crew', name: 'Crew', monthlyPriceCents: 14900, staffSeats: 10, activeSites: 400 },
      hasSubscription: true,
      paymentsConfigured: true,
      readOnly: null,
      limits: { activeSites: 400, staffSeats: 10, onTrial: false },
      usage: { activeSites: 0, staffSeats: 3 },
      currentPeriodEnd: firm.currentPeriodEnd!.toISOString(),
    });

    const invoices = await ownerVisitor.get('/api/billing/invoices');
    expect(invoices.status).toBe(200);
    expect(invoices.body.data).toHaveLength(1);
    expect(invoices.body.data[0]).toMatchObject({ status: 'paid', amountDueCents: 14900, amountPaidCents: 14900, currency: 'usd' });
    expect(invoices.body.data[0].id).toMatch(/^in_/);
    expect(invoices.body.data[0].hostedInvoiceUrl).toMatch(new RegExp(`^${b.standIn.url}/invoices/in_`));

    // The operator sees the same invoices on the firm's page; the firm's own owner cannot use that route.
    const operator = await signedIn(await buildUser(null, 'operator'));
    const forOperator = await operator.get(`/api/operator/tenants/${firm.id}/invoices`);
    expect(forOperator.status).toBe(200);
    expect(forOperator.body.data).toEqual(invoices.body.data);
    expect((await ownerVisitor.get(`/api/operator/tenants/${firm.id}/invoices`)).status).toBe(403);

    // A second checkout while subscribed is refused: changes go through the billing portal.
    const again = await ownerVisitor.post('/api/billing/checkout', { planKey: 'fleet' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already has a subscription/);

    // Stripe redelivering one of those events changes nothing.
    const { body, signature } = signedEvent(JSON.stringify(records[0]!.event), b.billing.webhookSecret);
    const replay = await postWebhook(body, signature);
    expect(replay.body.result).toBe('duplicate');
    expect(await historyOf(firm)).toHaveLength(1);
  });

  it('a declined card leaves the firm on its trial with no subscription', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const start = await v.post('/api/billing/checkout', { planKey: 'bench' });
    expect(start.status).toBe(201);
    const res = await payCheckout(start.body.data.url as string, DECLINES);
    expect(res.status).toBe(402);
    expect(await res.text()).toMatch(/declined/);

    await firm.reload();
    expect(firm).toMatchObject({ state: 'trialing', planKey: null, stripeSubscriptionId: null, subscriptionStatus: null });
    expect(firm.stripeCustomerId).toMatch(/^cus_/); // the customer record is kept for the next attempt
    expect(await historyOf(firm)).toEqual([]);
    expect(eventsOfCustomer(firm.stripeCustomerId!)).toEqual([]);
    expect((await v.get('/api/billing/invoices')).body.data).toEqual([]);

    // The next attempt reuses the same customer.
    const retry = await v.post('/api/billing/checkout', { planKey: 'bench' });
    expect(retry.status).toBe(201);
    expect((await payCheckout(retry.body.data.url as string, PAYS)).status).toBe(303);
    const customer = firm.stripeCustomerId;
    await firm.reload();
    expect(firm).toMatchObject({ state: 'active', planKey: 'bench', stripeCustomerId: customer });
  });

  it('a second checkout closes the first, so two open checkouts can never become two subscriptions', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const first = await v.post('/api/billing/checkout', { planKey: 'bench' });
    expect(first.status).toBe(201);
    const second = await v.post('/api/billing/checkout', { planKey: 'crew' });
    expect(second.status).toBe(201);
    expect(second.body.data.url).not.toBe(first.body.data.url);
    // the first checkout page no longer takes a card
    const late = await fetch(first.body.data.url as string);
    expect(late.status).toBe(410);
    expect((await payCheckout(second.body.data.url as string, PAYS)).status).toBe(303);
    await firm.reload();
    expect(firm).toMatchObject({ state: 'active', planKey: 'crew', pendingCheckoutSessionId: null });
    expect(eventsOfCustomer(firm.stripeCustomerId!).filter((r) => r.event.type === 'customer.subscription.created')).toHaveLength(1);
  });

  it('a checkout paid a moment ago (its webhook not here yet) refuses a second one', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const first = await v.post('/api/billing/checkout', { planKey: 'bench' });
    b.standIn.setWebhookUrl(null); // the webhooks of the payment are held back
    try {
      expect((await payCheckout(first.body.data.url as string, PAYS)).status).toBe(303);
    } finally {
      b.standIn.setWebhookUrl(`${b.appUrl}/api/webhooks/stripe`);
    }
    const again = await v.post('/api/billing/checkout', { planKey: 'crew' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/earlier checkout went through/);
    await firm.reload();
    expect(firm.state).toBe('trialing');
  });

  it('refuses a plan that does not exist (400) without calling Stripe', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const v = await signedIn(owner);
    const res = await v.post('/api/billing/checkout', { planKey: 'enterprise' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.fields).toHaveProperty('planKey');
    await firm.reload();
    expect(firm.stripeCustomerId).toBeNull();
  });

  it('the billing portal switches the plan to Fleet; failed and recovered payments move the firm past due and back', async () => {
    const { firm, ownerVisitor } = await subscribedThroughCheckout('crew');
    const portal = await ownerVisitor.post('/api/billing/portal');
    expect(portal.status).toBe(201);
    const portalUrl = portal.body.data.url as string;
    expect(portalUrl).toMatch(new RegExp(`^${b.standIn.url}/billing/bps_`));

    const { html, forms } = await pageForms(portalUrl);
    expect(html).toContain('Crew');
    expect(html).toContain('href="http://mullion.test/app/billing"');
    const changePlan = forms.find((f) => f.action.endsWith('/change-plan'));
    expect(changePlan?.fields.subscription).toBe(firm.stripeSubscriptionId);
    expect(changePlan?.options.price).toContain(b.billing.priceIds.fleet);
    const switched = await submit(portalUrl, changePlan!, { price: b.billing.priceIds.fleet });
    expect(switched.status).toBe(303);

    await firm.reload();
    expect(firm).toMatchObject({ state: 'active', planKey: 'fleet' });
    expect((await historyOf(firm)).map((h) => [h.planKey, h.state, h.monthlyAmountCents])).toEqual([
      ['crew', 'active', 14900],
      ['fleet', 'active', 39900],
    ]);
    expect((await ownerVisitor.get('/api/billing')).body.data.limits).toMatchObject({ activeSites: 2000, staffSeats: 40 });

    await control(firm.stripeSubscriptionId!, 'fail-payment');
    await firm.reload();
    expect(firm).toMatchObject({ state: 'past_due', subscriptionStatus: 'past_due' });
    expect(firm.pastDueSince).toBeInstanceOf(Date);
    const pastDue = await ownerVisitor.get('/api/billing');
    expect(pastDue.body.data).toMatchObject({
      state: 'past_due',
      pastDueSince: firm.pastDueSince!.toISOString(),
      graceEndsAt: new Date(firm.pastDueSince!.getTime() + PAST_DUE_GRACE_DAYS * DAY_MS).toISOString(),
      readOnly: null, // within the grace period
    });

    await control(firm.stripeSubscriptionId!, 'pay');
    await firm.reload();
    expect(firm).toMatchObject({ state: 'active', subscriptionStatus: 'active', pastDueSince: null });
    const invoices = (await ownerVisitor.get('/api/billing/invoices')).body.data as Array<{ status: string; amountPaidCents: number }>;
    expect(invoices).toHaveLength(2);
    expect(invoices.every((i) => i.status === 'paid')).toBe(true);
    expect(invoices.map((i) => i.amountPaidCents).sort()).toEqual([14900, 39900]);
    expect((await historyOf(firm)).map((h) => h.state)).toEqual(['active', 'active', 'past_due', 'active']);
  });

  it('cancelling in the portal makes the firm cancelled and read-only; a new checkout is possible again', async () => {
    const { firm, ownerVisitor } = await subscribedThroughCheckout('bench');
    const portalUrl = (await ownerVisitor.post('/api/billing/portal')).body.data.url as string;
    const { forms } = await pageForms(portalUrl);
    const atEnd = forms.find((f) => f.action.endsWith('/cancel-at-period-end'));
    expect((await submit(portalUrl, atEnd!, {})).status).toBe(303);
    await firm.reload();
    expect(firm).toMatchObject({ state: 'active', cancelAtPeriodEnd: true });
    expect((await ownerVisitor.get('/api/billing')).body.data.cancelAtPeriodEnd).toBe(true);

    const cancelNow = (await pageForms(portalUrl)).forms.find((f) => f.action.endsWith('/cancel-now'));
    expect((await submit(portalUrl, cancelNow!, {})).status).toBe(303);
    await firm.reload();
    expect(firm).toMatchObject({ state: 'cancelled', subscriptionStatus: 'canceled' });

    const write = await ownerVisitor.post('/api/clients', { name: 'Wren Halloway' });
    expect(write.status).toBe(402);
    expect(write.body.error.code).toBe('read_only');

    const restart = await ownerVisitor.post('/api/billing/checkout', { planKey: 'crew' });
    expect(restart.status).toBe(201);
    expect((await payCheckout(restart.body.data.url as string, PAYS)).status).toBe(303);
    const oldSubscription = firm.stripeSubscriptionId;
    await firm.reload();
    expect(firm).toMatchObject({ state: 'active', planKey: 'crew' });
    expect(firm.stripeSubscriptionId).not.toBe(oldSubscription);
    expect((await ownerVisitor.post('/api/clients', { name: 'Wren Halloway' })).status).toBe(201);
  });

  it('a Stripe error becomes a calm 503 and changes nothing', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    await firm.update({ stripeCustomerId: 'cus_gone_from_stripe' });
    const v = await signedIn(owner);
    const portal = await v.post('/api/billing/portal');
    expect(portal.status).toBe(503);
    expect(portal.body.error.code).toBe('service_unavailable');
    expect(portal.body.error.message).toMatch(/billing portal/);
    const invoices = await v.get('/api/billing/invoices');
    expect(invoices.status).toBe(503);
    await firm.reload();
    expect(firm.stripeCustomerId).toBe('cus_gone_from_stripe');
  });
});

describe('read-only firms', () => {
  it('trial over without a plan: staff writes answer 402 read_only naming the Billing page; reads, billing and sign-out still work', async () => {
    const trialEndedAt = new Date(realNow.getTime() - 2 * DAY_MS);
    const staff = await buildFirmWithStaff();
    await staff.firm.update({ trialEndsAt: trialEndedAt });
    const client = await buildClient(staff.firm);
    const owner = await signedIn(staff.owner);

    const create = await owner.post('/api/clients', { name: 'Odile Fernsby' });
    expect(create.status).toBe(402);
    expect(create.body.error.code).toBe('read_only');
    expect(create.body.error.message).toContain('Billing page');
    expect(create.body.error.message).toContain(`Your trial ended on ${formatMessageDate(trialEndedAt, staff.firm.timeZone)}`);
    expect(await Client.count({ where: { tenantId: staff.firm.id } })).toBe(1);

    const settings = await owner.patch('/api/firm', { licenceNumber: 'ALM-00417' });
    expect(settings.status).toBe(402);
    expect(settings.body.error.code).toBe('read_only');
    expect((await owner.patch(`/api/clients/${client.id}`, { notes: 'Dog in the yard.' })).status).toBe(402);
    expect((await owner.delete(`/api/clients/${client.id}`)).status).toBe(402);

    const coordinator = await signedIn(staff.coordinator);
    expect((await coordinator.post('/api/clients', { name: 'Odile Fernsby' })).status).toBe(402);

    const list = await owner.get('/api/clients');
    expect(list.status).toBe(200);
    expect(list.body.data).toHaveLength(1);

    const billing = await owner.get('/api/billing');
    expect(billing.status).toBe(200);
    expect(billing.body.data.readOnly).toMatchObject({ code: 'trial_ended' });
    const checkout = await owner.post('/api/billing/checkout', { planKey: 'bench' });
    expect(checkout.status).toBe(201);
    expect(checkout.body.data.url).toMatch(/\/checkout\/cs_test_/);
    expect((await owner.post('/api/billing/portal')).status).toBe(201);

    const out = await owner.delete('/api/session');
    expect(out.status).toBe(204);
    expect((await owner.session()).body.user).toBeNull();
  });

  it('the trial-over firm becomes writable the moment it pays', async () => {
    const staff = await buildFirmWithStaff();
    await staff.firm.update({ trialEndsAt: new Date(realNow.getTime() - DAY_MS) });
    const owner = await signedIn(staff.owner);
    expect((await owner.post('/api/clients', { name: 'Tamsin Rook' })).status).toBe(402);
    const start = await owner.post('/api/billing/checkout', { planKey: 'bench' });
    expect((await payCheckout(start.body.data.url as string, PAYS)).status).toBe(303);
    expect((await owner.post('/api/clients', { name: 'Tamsin Rook' })).status).toBe(201);
  });

  it('the firm’s households keep using their portal: a service request and their contacts', async () => {
    const a = await buildFirmWithSite();
    await a.firm.update({ state: 'cancelled' });
    const household = await signedIn(a.clientUser);

    const requestRes = await household.post(`/api/portal/sites/${a.site.id}/service-requests`, {
      description: 'The hallway keypad beeps every few minutes.',
      preferredTimes: 'Weekday mornings',
    });
    expect(requestRes.status).toBe(201);
    expect(await Job.count({ where: { tenantId: a.firm.id, siteId: a.site.id } })).toBe(1);

    const contacts = await household.put(`/api/portal/sites/${a.site.id}/contacts`, {
      contacts: [{ name: 'Hollis Brandreth', relation: 'Neighbour', phone: '+1 312 555 0177' }],
    });
    expect(contacts.status).toBe(200);
    expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, siteId: a.site.id } })).toBe(1);

    // …while the firm's own staff may not change the same contacts
    const owner = await signedIn(a.owner);
    const staffWrite = await owner.put(`/api/sites/${a.site.id}/contacts`, { contacts: [] });
    expect(staffWrite.status).toBe(402);
    expect(await EmergencyContact.count({ where: { tenantId: a.firm.id, siteId: a.site.id } })).toBe(1);
  });

  it('past due within the 7-day grace: writes allowed; from the end of the grace: 402 naming the dates and the Billing page', async () => {
    const staff = await buildFirmWithStaff();
    const since = realNow;
    await staff.firm.update({ state: 'past_due', planKey: 'crew', pastDueSince: since });
    const owner = await signedIn(staff.owner);

    t.clock.now = new Date(since.getTime() + 6 * DAY_MS);
    expect((await owner.post('/api/clients', { name: 'Perrin Ashgrove' })).status).toBe(201);
    t.clock.now = new Date(since.getTime() + PAST_DUE_GRACE_DAYS * DAY_MS - 60_000);
    expect((await owner.post('/api/clients', { name: 'Perrin Ashgrove II' })).status).toBe(201);

    t.clock.now = new Date(since.getTime() + PAST_DUE_GRACE_DAYS * DAY_MS);
    const refused = await owner.post('/api/clients', { name: 'Perrin Ashgrove III' });
    expect(refused.status).toBe(402);
    expect(refused.body.error.code).toBe('read_only');
    expect(refused.body.error.message).toContain(`past due since ${formatMessageDate(since, staff.firm.timeZone)}`);
    expect(refused.body.error.message).toContain('Billing page');

    t.clock.now = new Date(since.getTime() + 30 * DAY_MS);
    expect((await owner.patch('/api/firm', { licenceNumber: 'ALM-00418' })).status).toBe(402);
    expect((await owner.get('/api/clients')).status).toBe(200);
    expect((await owner.get('/api/billing')).body.data.readOnly).toMatchObject({ code: 'past_due' });
  });

  it('cancelled: 402; active and a trial still running: writes allowed', async () => {
    const cancelled = await buildFirmWithStaff({ state: 'cancelled' });
    const refused = await (await signedIn(cancelled.owner)).post('/api/clients', { name: 'Bryony Caskell' });
    expect(refused.status).toBe(402);
    expect(refused.body.error.code).toBe('read_only');
    expect(refused.body.error.message).toMatch(/cancelled.*Billing page/);

    const active = await buildFirmWithStaff({ state: 'active' });
    await active.firm.update({ planKey: 'crew' });
    expect((await (await signedIn(active.owner)).post('/api/clients', { name: 'Bryony Caskell' })).status).toBe(201);

    const trial = await buildFirmWithStaff();
    await trial.firm.update({ trialEndsAt: new Date(realNow.getTime() + DAY_MS) });
    expect((await (await signedIn(trial.owner)).post('/api/clients', { name: 'Bryony Caskell' })).status).toBe(201);
  });

  it('GET /api/session tells the firm’s staff why it is read-only (or null); households are not told', async () => {
    const fine = await buildFirmWithSite();
    const session = (await (await signedIn(fine.owner)).session()).body;
    expect(session.tenant.readOnly).toBeNull();

    const trialEndedAt = new Date(realNow.getTime() - 3 * DAY_MS);
    const over = await buildFirmWithSite();
    await over.firm.update({ trialEndsAt: trialEndedAt });
    const technician = (await (await signedIn(over.technician)).session()).body;
    expect(technician.tenant.readOnly).toEqual({
      code: 'trial_ended',
      message: expect.stringContaining(`Your trial ended on ${formatMessageDate(trialEndedAt, over.firm.timeZone)}`) as string,
    });
    expect(technician.tenant.readOnly.message).toContain('Billing page');

    await over.firm.update({ state: 'past_due', pastDueSince: new Date(realNow.getTime() - 10 * DAY_MS) });
    expect((await (await signedIn(over.owner)).session()).body.tenant.readOnly).toMatchObject({ code: 'past_due' });

    const household = (await (await signedIn(over.clientUser)).session()).body;
    expect(household.tenant).not.toHaveProperty('readOnly');
  });
});

describe('plan limits', () => {
  const newSiteBody = (clientId: string) => ({
    clientId,
    name: 'Orchard cottage',
    address: { line1: '9 Millrace Row', city: 'Ashby Vale' },
    timeZone: 'America/Chicago',
  });

  async function addSites(firm: Tenant, client: Client, count: number): Promise<void> {
    await Site.bulkCreate(
      Array.from({ length: count }, (_, i) => ({
        tenantId: firm.id,
        clientId: client.id,
        name: `Home ${i + 1}`,
        addressLine1: `${i + 1} Quarry Lane`,
        city: 'Ashby Vale',
        region: 'NE',
        postalCode: '68001',
        timeZone: 'America/Chicago',
      })),
    );
  }

  async function benchFirm() {
    const staff = await buildFirmWithStaff({ state: 'active' });
    await staff.firm.update({ planKey: 'bench' });
    return staff;
  }

  it('a Bench firm with 75 active sites cannot add a 76th (402 naming “75 active sites”)', async () => {
    const { firm, owner } = await benchFirm();
    const client = await buildClient(firm);
    await addSites(firm, client, 75);
    const v = await signedIn(owner);
    expect((await v.get('/api/billing')).body.data.usage.activeSites).toBe(75);

    const res = await v.post('/api/sites', newSiteBody(client.id));
    expect(res.status).toBe(402);
    expect(res.body.error.code).toBe('plan_limit_reached');
    expect(res.body.error.message).toContain('Bench plan allows 75 active sites');
    expect(res.body.error.message).toContain('Billing page');
    expect(res.body.error.fields).toEqual({ activeSites: 'Limit 75' });
    expect(await Site.count({ where: { tenantId: firm.id } })).toBe(75);

    // One below the limit still allows one more.
    await Site.destroy({ where: { tenantId: firm.id, name: 'Home 75' } });
    expect((await v.post('/api/sites', newSiteBody(client.id))).status).toBe(201);
    expect((await v.post('/api/sites', newSiteBody(client.id))).status).toBe(402);
  });

  it('a cancelled client’s sites do not count', async () => {
    const { firm, owner } = await benchFirm();
    const active = await buildClient(firm);
    const gone = await buildClient(firm, { status: 'cancelled' });
    await addSites(firm, active, 74);
    await addSites(firm, gone, 12);
    const v = await signedIn(owner);
    expect((await v.get('/api/billing')).body.data.usage.activeSites).toBe(74);

    expect((await v.post('/api/sites', newSiteBody(active.id))).status).toBe(201);
    expect((await v.post('/api/sites', newSiteBody(active.id))).status).toBe(402);

    // Marking a client who left as cancelled frees their sites.
    const leaving = await buildClient(firm);
    await buildSite(firm, leaving);
    expect((await v.get('/api/billing')).body.data.usage.activeSites).toBe(76);
    expect((await v.patch(`/api/clients/${leaving.id}`, { status: 'cancelled' })).status).toBe(200);
    await Site.destroy({ where: { tenantId: firm.id, clientId: active.id, name: 'Home 1' } });
    expect((await v.post('/api/sites', newSiteBody(active.id))).status).toBe(201);
  });

  it('a firm on trial without a plan has the largest plan’s limits', async () => {
    const { firm, owner } = await buildFirmWithStaff();
    const client = await buildClient(firm);
    await addSites(firm, client, 75);
    const v = await signedIn(owner);
    expect((await v.get('/api/billing')).body.data.limits).toEqual({ activeSites: 2000, staffSeats: 40, onTrial: true });
    expect((await v.post('/api/sites', newSiteBody(client.id))).status).toBe(201);
  });

  it('3 staff seats (owner + 2): inviting a 4th answers 402 naming “3 staff seats”', async () => {
    const { firm, owner } = await benchFirm();
    const v = await signedIn(owner);
    expect((await v.get('/api/billing')).body.data.usage.staffSeats).toBe(3);
    const fourth = `fourth-${short()}@staff.example`;
    const res = await v.post('/api/staff/invitations', { email: fourth, role: 'technician' });
    expect(res.status).toBe(402);
    expect(res.body.error.code).toBe('plan_limit_reached');
    expect(res.body.error.message).toContain('Bench plan allows 3 staff seats and you have 3');
    expect(res.body.error.fields).toEqual({ staffSeats: 'Limit 3' });
    expect(await Invitation.count({ where: { tenantId: firm.id } })).toBe(0);
    expect(t.outbox.some((m) => m.to === fourth)).toBe(false);
  });

  it('a pending staff invitation holds a seat; sending it again does not take another; revoking frees it', async () => {
    const firm = await buildFirm({ state: 'active', planKey: 'bench' });
    const owner = await buildUser(firm, 'owner');
    await buildUser(firm, 'coordinator');
    const v = await signedIn(owner);
    const pending = `pending-${short()}@staff.example`;
    const first = await v.post('/api/staff/invitations', { email: pending, role: 'technician' });
    expect(first.status).toBe(201);
    expect((await v.get('/api/billing')).body.data.usage.staffSeats).toBe(3);

    const another = await v.post('/api/staff/invitations', { email: `another-${short()}@staff.example`, role: 'technician' });
    expect(another.status).toBe(402);
    expect(another.body.error.message).toContain('3 staff seats');

    // the same address again replaces the pending invitation; so does the resend button
    const again = await v.post('/api/staff/invitations', { email: pending, role: 'coordinator' });
    expect(again.status).toBe(201);
    const resend = await v.post(`/api/staff/invitations/${again.body.data.id as string}/resend`);
    expect(resend.status).toBe(200);
    expect((await v.get('/api/billing')).body.data.usage.staffSeats).toBe(3);

    expect((await v.delete(`/api/staff/invitations/${again.body.data.id as string}`)).status).toBe(204);
    expect((await v.post('/api/staff/invitations', { email: `another-${short()}@staff.example`, role: 'technician' })).status).toBe(201);
  });

  it('sending a withdrawn staff invitation again takes a seat, so it is refused at the limit', async () => {
    const firm = await buildFirm({ state: 'active', planKey: 'bench' });
    const owner = await buildUser(firm, 'owner');
    await buildUser(firm, 'coordinator');
    const v = await signedIn(owner);
    const a = await v.post('/api/staff/invitations', { email: `a-${short()}@staff.example`, role: 'technician' });
    expect(a.status).toBe(201);
    expect((await v.delete(`/api/staff/invitations/${a.body.data.id as string}`)).status).toBe(204);
    expect((await v.post('/api/staff/invitations', { email: `b-${short()}@staff.example`, role: 'technician' })).status).toBe(201);
    const again = await v.post(`/api/staff/invitations/${a.body.data.id as string}/resend`);
    expect(again.status).toBe(402);
    expect(again.body.error.code).toBe('plan_limit_reached');
    expect((await v.get('/api/billing')).body.data.usage.staffSeats).toBe(3);
  });

  it('a pending client invitation to the same address does not let a staff invitation skip the seat check', async () => {
    const { firm, owner } = await benchFirm();
    const household = await buildClient(firm);
    const v = await signedIn(owner);
    const shared = `shared-${short()}@example.test`;
    expect((await v.post(`/api/clients/${household.id}/invitations`, { email: shared })).status).toBe(201);
    const staff = await v.post('/api/staff/invitations', { email: shared, role: 'technician' });
    expect(staff.status).toBe(402);
    expect((await v.get('/api/billing')).body.data.usage.staffSeats).toBe(3);
  });

  it('an invitation that has expired no longer holds a seat', async () => {
    const firm = await buildFirm({ state: 'active', planKey: 'bench' });
    const owner = await buildUser(firm, 'owner');
    await buildUser(firm, 'technician');
    const v = await signedIn(owner);
    expect((await v.post('/api/staff/invitations', { email: `soon-stale-${short()}@staff.example`, role: 'technician' })).status).toBe(201);
    expect((await v.post('/api/staff/invitations', { email: `waiting-${short()}@staff.example`, role: 'technician' })).status).toBe(402);
    t.clock.now = new Date(realNow.getTime() + 8 * DAY_MS);
    expect((await v.post('/api/staff/invitations', { email: `waiting-${short()}@staff.example`, role: 'technician' })).status).toBe(201);
  });

  it('a client (homeowner) invitation never takes a seat', async () => {
    const { firm, owner } = await benchFirm();
    const household = await buildClient(firm);
    const v = await signedIn(owner);
    const res = await v.post(`/api/clients/${household.id}/invitations`, { email: `homeowner-${short()}@clients.example` });
    expect(res.status).toBe(201);
    const usage = (await v.get('/api/billing')).body.data.usage;
    expect(usage.staffSeats).toBe(3);
    // and the homeowner who accepted (a client sign-in) takes none either
    await buildClientUser(firm, household);
    expect((await v.get('/api/billing')).body.data.usage.staffSeats).toBe(3);
  });

  it('reactivating a deactivated staff member past the limit answers 402; within it, 200', async () => {
    const firm = await buildFirm({ state: 'active', planKey: 'bench' });
    const owner = await buildUser(firm, 'owner');
    await buildUser(firm, 'coordinator');
    const former = await buildUser(firm, 'technician', { deactivatedAt: new Date(realNow.getTime() - 30 * DAY_MS) });
    const v = await signedIn(owner);
    const invitation = await v.post('/api/staff/invitations', { email: `replacement-${short()}@staff.example`, role: 'technician' });
    expect(invitation.status).toBe(201);

    const refused = await v.patch(`/api/staff/${former.id}`, { active: true });
    expect(refused.status).toBe(402);
    expect(refused.body.error.code).toBe('plan_limit_reached');
    expect(refused.body.error.message).toContain('3 staff seats');
    const stillFormer = () => User.findOne({ where: { tenantId: firm.id, id: former.id } });
    expect((await stillFormer())?.deactivatedAt).not.toBeNull();

    // a role change of the deactivated person is not a reactivation
    expect((await v.patch(`/api/staff/${former.id}`, { role: 'coordinator' })).status).toBe(200);

    expect((await v.delete(`/api/staff/invitations/${invitation.body.data.id as string}`)).status).toBe(204);
    expect((await v.patch(`/api/staff/${former.id}`, { active: true })).status).toBe(200);
    expect((await stillFormer())?.deactivatedAt).toBeNull();
  });
});

describe('who reaches the billing routes', () => {
  const routes = [
    ['get', '/api/billing'],
    ['post', '/api/billing/checkout'],
    ['post', '/api/billing/portal'],
    ['get', '/api/billing/invoices'],
  ] as const;

  async function call(v: Visitor, method: 'get' | 'post', url: string) {
    return method === 'get' ? v.get(url) : v.post(url, { planKey: 'crew' });
  }

  it('only the owner: coordinators, technicians, households and the operator 403; signed out 401', async () => {
    const a = await buildFirmWithSite();
    const operator = await buildUser(null, 'operator');
    const people: Array<[string, Visitor, number]> = [
      ['coordinator', await signedIn(a.coordinator), 403],
      ['technician', await signedIn(a.technician), 403],
      ['client', await signedIn(a.clientUser), 403],
      ['operator', await signedIn(operator), 403],
      ['signed out', await visitor(t.app), 401],
    ];
    for (const [who, v, status] of people) {
      for (const [method, url] of routes) {
        const res = await call(v, method, url);
        expect(res.status, `${who} ${method} ${url}`).toBe(status);
        expect(res.body.error.code).toBe(status === 401 ? 'unauthenticated' : 'forbidden');
      }
    }
    await a.firm.reload();
    expect(a.firm.stripeCustomerId).toBeNull();

    const owner = await signedIn(a.owner);
    expect((await owner.get('/api/billing')).status).toBe(200);
  });

  it('another firm’s owner sees only their own firm’s billing: never firm A’s plan, customer or invoices', async () => {
    const a = await subscribedThroughCheckout('crew');
    const aInvoices = (await a.ownerVisitor.get('/api/billing/invoices')).body.data as Array<{ id: string }>;
    expect(aInvoices).toHaveLength(1);

    const other = await buildFirmWithStaff();
    const ownerB = await signedIn(other.owner);
    const page = await ownerB.get('/api/billing');
    expect(page.body.data).toMatchObject({ state: 'trialing', planKey: null, hasSubscription: false, usage: { staffSeats: 3 } });
    expect((await ownerB.get('/api/billing/invoices')).body.data).toEqual([]);

    const portal = await ownerB.post('/api/billing/portal');
    expect(portal.status).toBe(201);
    await other.firm.reload();
    expect(other.firm.stripeCustomerId).toMatch(/^cus_/);
    expect(other.firm.stripeCustomerId).not.toBe(a.firm.stripeCustomerId);
    const { html } = await pageForms(portal.body.data.url as string);
    expect(html).toContain(other.firm.name);
    expect(html).not.toContain(a.firm.name);
    expect(html).toContain('There is no subscription for this firm yet.');

    // B subscribes too: each owner lists their own invoice only
    const start = await ownerB.post('/api/billing/checkout', { planKey: 'fleet' });
    expect((await payCheckout(start.body.data.url as string, PAYS)).status).toBe(303);
    const bInvoices = (await ownerB.get('/api/billing/invoices')).body.data as Array<{ id: string; amountPaidCents: number }>;
    expect(bInvoices).toHaveLength(1);
    expect(bInvoices[0]!.amountPaidCents).toBe(39900);
    expect(bInvoices.map((i) => i.id)).not.toContain(aInvoices[0]!.id);
    expect((await a.ownerVisitor.get('/api/billing/invoices')).body.data).toEqual(aInvoices);
    expect((await a.ownerVisitor.get('/api/billing')).body.data.planKey).toBe('crew');
    await a.firm.reload();
    expect(a.firm.planKey).toBe('crew');
  });
});
