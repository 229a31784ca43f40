/**
 * What happens to the stand-in's state: customers, checkout, subscriptions, invoices.
 * Each operation changes the store at once and returns the events it causes, as drafts
 * holding snapshots; the caller decides when they are delivered.
 */
import { addMonths, type Clock } from './clock';
import { StripeApiError, stripeErrors } from './errors';
import { mergeMetadata } from './form-body';
import { newId, newInvoicePrefix } from './ids';
import type {
  BillingReason,
  CheckoutSessionObject,
  CustomerObject,
  EventType,
  InvoiceObject,
  Metadata,
  PortalSessionObject,
  PriceObject,
  StripeObject,
  SubscriptionObject,
} from './objects';
import type { CheckoutSessionRecord, StandInStore } from './store';

export interface PriceSpec {
  lookupKey: string;
  nickname: string;
  /** integer cents */
  unitAmount: number;
  currency?: string;
  interval?: 'month';
}

export interface EventDraft {
  type: EventType;
  object: StripeObject;
  previousAttributes?: Record<string, unknown>;
}

/** Where the stand-in's own pages live (known once it listens). */
export interface PageLinks {
  checkout(sessionId: string): string;
  portal(portalSessionId: string): string;
  invoice(invoiceId: string): string;
}

/** A checkout session lives for a day, as Stripe's do by default. */
const CHECKOUT_LIFETIME_SECONDS = 24 * 60 * 60;
/** Failed renewals are retried; after this many attempts the subscription is left unpaid. */
const PAYMENT_ATTEMPTS_BEFORE_UNPAID = 4;
const PORTAL_CONFIGURATION_ID = newId('bpc_');

export type CheckoutOutcome =
  | { paid: true; session: CheckoutSessionObject; subscription: SubscriptionObject; invoice: InvoiceObject; events: EventDraft[] }
  | { paid: false; reason: 'declined' | 'invalid_card' };

export interface SubscriptionChanges {
  itemId?: string;
  price?: string;
  quantity?: number;
  cancelAtPeriodEnd?: boolean;
  metadata?: Metadata;
}

export interface ControlOutcome {
  subscription: SubscriptionObject;
  invoice: InvoiceObject | null;
  events: EventDraft[];
}

export const TEST_CARDS = { pays: '4242424242424242', declines: '4000000000000002' } as const;

export class Billing {
  constructor(
    readonly store: StandInStore,
    private readonly clock: Clock,
    private readonly links: PageLinks,
  ) {}

  now(): number {
    return this.clock.unix();
  }

  // ── prices ──────────────────────────────────────────────────────────────────────────

  addPrice(spec: PriceSpec): PriceObject {
    const now = this.now();
    const product = {
      id: newId('prod_'),
      object: 'product' as const,
      active: true,
      created: now,
      description: null,
      livemode: false as const,
      metadata: {},
      name: spec.nickname,
      type: 'service' as const,
      updated: now,
    };
    const price: PriceObject = {
      id: newId('price_'),
      object: 'price',
      active: true,
      billing_scheme: 'per_unit',
      created: now,
      currency: (spec.currency ?? 'usd').toLowerCase(),
      custom_unit_amount: null,
      livemode: false,
      lookup_key: spec.lookupKey,
      metadata: {},
      nickname: spec.nickname,
      product: product.id,
      recurring: { interval: spec.interval ?? 'month', interval_count: 1, meter: null, trial_period_days: null, usage_type: 'licensed' },
      tax_behavior: 'unspecified',
      tiers_mode: null,
      transform_quantity: null,
      type: 'recurring',
      unit_amount: spec.unitAmount,
      unit_amount_decimal: String(spec.unitAmount),
    };
    this.store.products.set(product.id, product);
    this.store.prices.set(price.id, price);
    return price;
  }

  /** the price's own nickname, else its product's name */
  planName(price: PriceObject): string {
    const productId = typeof price.product === 'string' ? price.product : price.product.id;
    return price.nickname ?? this.store.products.get(productId)?.name ?? price.id;
  }

  // ── customers ───────────────────────────────────────────────────────────────────────

  createCustomer(fields: { email?: string; name?: string; description?: string; phone?: string; metadata?: Metadata }): CustomerObject {
    const customer: CustomerObject = {
      id: newId('cus_'),
      object: 'customer',
      address: null,
      balance: 0,
      created: this.now(),
      currency: null,
      default_source: null,
      delinquent: false,
      description: fields.description || null,
      email: fields.email || null,
      invoice_prefix: newInvoicePrefix(),
      invoice_settings: { custom_fields: null, default_payment_method: null, footer: null, rendering_options: null },
      livemode: false,
      metadata: mergeMetadata({}, fields.metadata ?? {}),
      name: fields.name || null,
      next_invoice_sequence: 1,
      phone: fields.phone || null,
      preferred_locales: [],
      shipping: null,
      tax_exempt: 'none',
      test_clock: null,
    };
    this.store.customers.set(customer.id, customer);
    return customer;
  }

  /** '' clears a field, as in Stripe */
  updateCustomer(id: string, fields: { email?: string; name?: string; description?: string; phone?: string; metadata?: Metadata }): CustomerObject {
    const customer = this.store.customer(id);
    if (fields.email !== undefined) customer.email = fields.email || null;
    if (fields.name !== undefined) customer.name = fields.name || null;
    if (fields.description !== undefined) customer.description = fields.description || null;
    if (fields.phone !== undefined) customer.phone = fields.phone || null;
    if (fields.metadata !== undefined) customer.metadata = mergeMetadata(customer.metadata, fields.metadata);
    return customer;
  }

  // ── checkout ────────────────────────────────────────────────────────────────────────

  createCheckoutSession(input: {
    customer?: string;
    customerEmail?: string;
    price: string;
    quantity: number;
    successUrl: string;
    cancelUrl?: string;
    clientReferenceId?: string;
    metadata?: Metadata;
    subscriptionMetadata?: Metadata;
    trialEnd?: number;
  }): CheckoutSessionObject {
    if (input.customer !== undefined) this.store.customer(input.customer, 'customer');
    const price = this.store.price(input.price, 'line_items[0][price]');
    if (!price.active) throw stripeErrors.invalidParam('line_items[0][price]', `The price ${price.id} is not active.`);
    if (input.quantity < 1) throw stripeErrors.invalidParam('line_items[0][quantity]', 'Quantity must be at least 1.');
    const now = this.now();
    const trialEnd = input.trialEnd ?? null;
    const amount = trialEnd !== null && trialEnd > now ? 0 : price.unit_amount * input.quantity;
    const id = newId('cs_test_');
    const session: CheckoutSessionObject = {
      id,
      object: 'checkout.session',
      allow_promotion_codes: null,
      amount_subtotal: price.unit_amount * input.quantity,
      amount_total: amount,
      cancel_url: input.cancelUrl ?? null,
      client_reference_id: input.clientReferenceId || null,
      created: now,
      currency: price.currency,
      customer: input.customer ?? null,
      customer_details: null,
      customer_email: input.customer ? null : input.customerEmail || null,
      expires_at: now + CHECKOUT_LIFETIME_SECONDS,
      invoice: null,
      livemode: false,
      metadata: mergeMetadata({}, input.metadata ?? {}),
      mode: 'subscription',
      payment_method_types: ['card'],
      payment_status: 'unpaid',
      status: 'open',
      subscription: null,
      success_url: input.successUrl,
      ui_mode: 'hosted',
      url: this.links.checkout(id),
    };
    this.store.checkoutSessions.set(id, {
      session,
      line: { price: price.id, quantity: input.quantity },
      subscriptionData: { metadata: mergeMetadata({}, input.subscriptionMetadata ?? {}), trialEnd },
    });
    return session;
  }

  /** the session record, marked expired once its day has passed */
  checkoutSession(id: string): CheckoutSessionRecord {
    const record = this.store.checkoutSession(id);
    if (record.session.status === 'open' && this.now() >= record.session.expires_at) {
      record.session.status = 'expired';
      record.session.url = null;
    }
    return record;
  }

  /** Expires an open session at once (Stripe: POST /v1/checkout/sessions/:id/expire); its page stops working. */
  expireCheckoutSession(id: string): CheckoutSessionRecord {
    const record = this.checkoutSession(id);
    if (record.session.status !== 'open') {
      throw stripeErrors.invalidRequest(`Only Checkout Sessions with a status of open can be expired; this one is ${record.session.status}.`);
    }
    record.session.status = 'expired';
    record.session.url = null;
    return record;
  }

  /** The payer submits a card on the checkout page. */
  payCheckout(sessionId: string, cardNumber: string): CheckoutOutcome {
    const record = this.checkoutSession(sessionId);
    const { session } = record;
    if (session.status !== 'open') throw stripeErrors.invalidRequest(`This checkout session is ${session.status}.`);
    const card = cardNumber.replace(/\s+/g, '');
    if (card === TEST_CARDS.declines) return { paid: false, reason: 'declined' };
    if (card !== TEST_CARDS.pays) return { paid: false, reason: 'invalid_card' };

    const now = this.now();
    const customer =
      session.customer !== null ? this.store.customer(idOf(session.customer)) : this.createCustomer({ email: session.customer_email ?? undefined });
    const price = this.store.price(record.line.price);
    const { trialEnd, metadata } = record.subscriptionData;
    const trialing = trialEnd !== null && trialEnd > now;
    const periodEnd = trialing ? trialEnd : addMonths(now, 1);

    const subscriptionId = newId('sub_');
    const subscription: SubscriptionObject = {
      id: subscriptionId,
      object: 'subscription',
      application: null,
      billing_cycle_anchor: periodEnd,
      cancel_at: null,
      cancel_at_period_end: false,
      canceled_at: null,
      cancellation_details: { comment: null, feedback: null, reason: null },
      collection_method: 'charge_automatically',
      created: now,
      currency: price.currency,
      current_period_end: periodEnd,
      current_period_start: now,
      customer: customer.id,
      days_until_due: null,
      default_payment_method: null,
      description: null,
      discounts: [],
      ended_at: null,
      items: {
        object: 'list',
        data: [
          {
            id: newId('si_'),
            object: 'subscription_item',
            created: now,
            current_period_end: periodEnd,
            current_period_start: now,
            discounts: [],
            metadata: {},
            price: structuredClone(price),
            quantity: record.line.quantity,
            subscription: subscriptionId,
            tax_rates: [],
          },
        ],
        has_more: false,
        total_count: 1,
        url: `/v1/subscription_items?subscription=${subscriptionId}`,
      },
      latest_invoice: null,
      livemode: false,
      metadata: { ...metadata },
      pause_collection: null,
      start_date: now,
      status: trialing ? 'trialing' : 'active',
      test_clock: null,
      trial_end: trialing ? trialEnd : null,
      trial_start: trialing ? now : null,
    };
    if (!trialing) subscription.billing_cycle_anchor = now;
    this.store.subscriptions.set(subscription.id, subscription);

    const invoice = this.issueInvoice(subscription, {
      reason: 'subscription_create',
      amount: trialing ? 0 : price.unit_amount * record.line.quantity,
      paid: true,
      periodStart: now,
      periodEnd,
    });
    subscription.latest_invoice = invoice.id;

    session.status = 'complete';
    session.payment_status = trialing ? 'no_payment_required' : 'paid';
    session.customer = customer.id;
    session.customer_details = { email: customer.email, name: customer.name };
    session.subscription = subscription.id;
    session.invoice = invoice.id;
    session.amount_total = invoice.amount_paid;
    session.url = null;

    return {
      paid: true,
      session,
      subscription,
      invoice,
      events: [draft('customer.subscription.created', subscription), draft('invoice.paid', invoice), draft('checkout.session.completed', session)],
    };
  }

  // ── subscriptions ───────────────────────────────────────────────────────────────────

  updateSubscription(id: string, changes: SubscriptionChanges): { subscription: SubscriptionObject; events: EventDraft[] } {
    const subscription = this.store.subscription(id);
    const before = structuredClone(subscription);
    const item = firstItem(subscription);
    const changesBilling = changes.price !== undefined || changes.quantity !== undefined || changes.cancelAtPeriodEnd !== undefined;
    if (subscription.status === 'canceled' && changesBilling) {
      throw stripeErrors.invalidRequest('A canceled subscription can only update its metadata.');
    }
    if ((changes.price !== undefined || changes.quantity !== undefined) && changes.itemId === undefined) {
      throw stripeErrors.missingParam('items[0][id]');
    }
    if (changes.itemId !== undefined && changes.itemId !== item.id) {
      throw stripeErrors.resourceMissing('subscription_item', changes.itemId, 'items[0][id]', 400);
    }
    if (changes.price !== undefined) {
      const price = this.store.price(changes.price, 'items[0][price]');
      if (!price.active) throw stripeErrors.invalidParam('items[0][price]', `The price ${price.id} is not active.`);
      if (price.currency !== subscription.currency) {
        throw stripeErrors.invalidParam(
          'items[0][price]',
          `The price ${price.id} is in ${price.currency}; this subscription bills in ${subscription.currency}.`,
        );
      }
      item.price = structuredClone(price);
    }
    if (changes.quantity !== undefined) {
      if (changes.quantity < 1) throw stripeErrors.invalidParam('items[0][quantity]', 'Quantity must be at least 1.');
      item.quantity = changes.quantity;
    }
    if (changes.cancelAtPeriodEnd !== undefined) {
      subscription.cancel_at_period_end = changes.cancelAtPeriodEnd;
      subscription.cancel_at = changes.cancelAtPeriodEnd ? subscription.current_period_end : null;
      subscription.canceled_at = changes.cancelAtPeriodEnd ? this.now() : null;
      subscription.cancellation_details.reason = changes.cancelAtPeriodEnd ? 'cancellation_requested' : null;
    }
    if (changes.metadata !== undefined) subscription.metadata = mergeMetadata(subscription.metadata, changes.metadata);
    return { subscription, events: updatedEvents(before, subscription) };
  }

  cancelSubscription(id: string): { subscription: SubscriptionObject; events: EventDraft[] } {
    const subscription = this.store.subscription(id);
    if (subscription.status === 'canceled') throw stripeErrors.invalidRequest(`The subscription ${id} is already canceled.`);
    const now = this.now();
    this.endSubscription(subscription, { canceledAt: now, endedAt: now });
    return { subscription, events: [draft('customer.subscription.deleted', subscription)] };
  }

  // ── test controls: what time and the card network would otherwise do ──────────────────

  /** A renewal (or a retry of the open invoice) whose payment fails. */
  failPayment(id: string): ControlOutcome {
    const subscription = this.liveSubscription(id);
    const before = structuredClone(subscription);
    const open = this.openLatestInvoice(subscription);
    let invoice: InvoiceObject;
    if (open) {
      open.attempt_count += 1;
      invoice = open;
      if (open.attempt_count >= PAYMENT_ATTEMPTS_BEFORE_UNPAID) {
        subscription.status = 'unpaid';
        open.next_payment_attempt = null;
      } else {
        open.next_payment_attempt = this.now() + 3 * 24 * 60 * 60;
      }
    } else {
      const ended = this.endIfCancelingAtPeriodEnd(subscription);
      if (ended) return ended;
      const { start, end } = this.nextPeriod(subscription);
      invoice = this.issueInvoice(subscription, {
        reason: 'subscription_cycle',
        amount: amountOf(subscription),
        paid: false,
        periodStart: start,
        periodEnd: end,
      });
      this.setPeriod(subscription, start, end);
      subscription.status = 'past_due';
    }
    subscription.latest_invoice = invoice.id;
    return { subscription, invoice, events: [draft('invoice.payment_failed', invoice), ...updatedEvents(before, subscription)] };
  }

  /** Pays the open invoice if there is one, else renews into the next period with a paid invoice. */
  pay(id: string): ControlOutcome {
    const subscription = this.liveSubscription(id);
    const before = structuredClone(subscription);
    let invoice = this.openLatestInvoice(subscription);
    if (invoice) {
      this.markPaid(invoice);
    } else {
      const ended = this.endIfCancelingAtPeriodEnd(subscription);
      if (ended) return ended;
      const { start, end } = this.nextPeriod(subscription);
      invoice = this.issueInvoice(subscription, {
        reason: 'subscription_cycle',
        amount: amountOf(subscription),
        paid: true,
        periodStart: start,
        periodEnd: end,
      });
      this.setPeriod(subscription, start, end);
    }
    subscription.status = 'active';
    subscription.latest_invoice = invoice.id;
    return { subscription, invoice, events: [draft('invoice.paid', invoice), ...updatedEvents(before, subscription)] };
  }

  /** The trial ends now and the first paid period starts. */
  endTrial(id: string): ControlOutcome {
    const subscription = this.liveSubscription(id);
    if (subscription.status !== 'trialing') throw stripeErrors.invalidRequest(`The subscription ${id} is ${subscription.status}, not trialing.`);
    const before = structuredClone(subscription);
    const now = this.now();
    const end = addMonths(now, 1);
    const invoice = this.issueInvoice(subscription, {
      reason: 'subscription_cycle',
      amount: amountOf(subscription),
      paid: true,
      periodStart: now,
      periodEnd: end,
    });
    this.setPeriod(subscription, now, end);
    subscription.trial_end = now;
    subscription.billing_cycle_anchor = now;
    subscription.status = 'active';
    subscription.latest_invoice = invoice.id;
    return { subscription, invoice, events: [...updatedEvents(before, subscription), draft('invoice.paid', invoice)] };
  }

  // ── billing portal ──────────────────────────────────────────────────────────────────

  createPortalSession(customerId: string, returnUrl: string | undefined): PortalSessionObject {
    this.store.customer(customerId, 'customer');
    const id = newId('bps_');
    const session: PortalSessionObject = {
      id,
      object: 'billing_portal.session',
      configuration: PORTAL_CONFIGURATION_ID,
      created: this.now(),
      customer: customerId,
      flow: null,
      livemode: false,
      locale: null,
      on_behalf_of: null,
      return_url: returnUrl ?? null,
      url: this.links.portal(id),
    };
    this.store.portalSessions.set(id, session);
    return session;
  }

  /** the subscription a portal shows: the newest one still running, else the newest one */
  currentSubscriptionOf(customerId: string): SubscriptionObject | undefined {
    const all = this.store.subscriptionsOf(customerId);
    return all.find((s) => s.status !== 'canceled') ?? all[0];
  }

  // ── helpers ─────────────────────────────────────────────────────────────────────────

  private liveSubscription(id: string): SubscriptionObject {
    const subscription = this.store.subscription(id);
    if (subscription.status === 'canceled') throw stripeErrors.invalidRequest(`The subscription ${id} is canceled.`);
    return subscription;
  }

  private openLatestInvoice(subscription: SubscriptionObject): InvoiceObject | undefined {
    if (subscription.latest_invoice === null) return undefined;
    const invoice = this.store.invoices.get(idOf(subscription.latest_invoice));
    return invoice?.status === 'open' ? invoice : undefined;
  }

  private nextPeriod(subscription: SubscriptionObject): { start: number; end: number } {
    const start = subscription.current_period_end;
    return { start, end: addMonths(start, 1) };
  }

  /** A subscription set to cancel at period end ends instead of renewing. */
  private endIfCancelingAtPeriodEnd(subscription: SubscriptionObject): ControlOutcome | undefined {
    if (!subscription.cancel_at_period_end) return undefined;
    const endedAt = subscription.current_period_end;
    this.endSubscription(subscription, { canceledAt: subscription.canceled_at ?? this.now(), endedAt });
    return { subscription, invoice: null, events: [draft('customer.subscription.deleted', subscription)] };
  }

  private endSubscription(subscription: SubscriptionObject, { canceledAt, endedAt }: { canceledAt: number; endedAt: number }): void {
    subscription.status = 'canceled';
    subscription.canceled_at = canceledAt;
    subscription.ended_at = endedAt;
    subscription.cancellation_details.reason = 'cancellation_requested';
  }

  private setPeriod(subscription: SubscriptionObject, start: number, end: number): void {
    subscription.current_period_start = start;
    subscription.current_period_end = end;
    for (const item of subscription.items.data) {
      item.current_period_start = start;
      item.current_period_end = end;
    }
    if (subscription.cancel_at_period_end) subscription.cancel_at = end;
  }

  private markPaid(invoice: InvoiceObject): void {
    const now = this.now();
    invoice.status = 'paid';
    invoice.amount_paid = invoice.amount_due;
    invoice.amount_remaining = 0;
    invoice.attempt_count += 1;
    invoice.attempted = true;
    invoice.next_payment_attempt = null;
    invoice.status_transitions.paid_at = now;
  }

  private issueInvoice(
    subscription: SubscriptionObject,
    input: { reason: BillingReason; amount: number; paid: boolean; periodStart: number; periodEnd: number },
  ): InvoiceObject {
    const customer = this.store.customer(idOf(subscription.customer));
    const item = firstItem(subscription);
    const now = this.now();
    const id = newId('in_');
    const number = `${customer.invoice_prefix}-${String(customer.next_invoice_sequence).padStart(4, '0')}`;
    customer.next_invoice_sequence += 1;
    const planName = this.planName(item.price);
    const invoice: InvoiceObject = {
      id,
      object: 'invoice',
      account_country: 'US',
      account_name: 'Mullion',
      amount_due: input.amount,
      amount_paid: input.paid ? input.amount : 0,
      amount_remaining: input.paid ? 0 : input.amount,
      attempt_count: 1,
      attempted: true,
      billing_reason: input.reason,
      collection_method: 'charge_automatically',
      created: now,
      currency: subscription.currency,
      customer: customer.id,
      customer_email: customer.email,
      customer_name: customer.name,
      description: null,
      due_date: null,
      effective_at: now,
      hosted_invoice_url: this.links.invoice(id),
      invoice_pdf: null,
      lines: {
        object: 'list',
        data: [
          {
            id: newId('il_'),
            object: 'line_item',
            amount: input.amount,
            currency: subscription.currency,
            description:
              input.amount === 0 && subscription.status === 'trialing'
                ? `Trial period for ${planName}`
                : `${item.quantity} × ${planName} (per ${item.price.recurring.interval})`,
            invoice: id,
            livemode: false,
            metadata: {},
            period: { start: input.periodStart, end: input.periodEnd },
            pricing: {
              type: 'price_details',
              price_details: { price: item.price.id, product: idOf(item.price.product) },
              unit_amount_decimal: item.price.unit_amount_decimal,
            },
            quantity: item.quantity,
          },
        ],
        has_more: false,
        total_count: 1,
        url: `/v1/invoices/${id}/lines`,
      },
      livemode: false,
      metadata: {},
      next_payment_attempt: input.paid ? null : now + 3 * 24 * 60 * 60,
      number,
      parent: {
        type: 'subscription_details',
        quote_details: null,
        subscription_details: { metadata: { ...subscription.metadata }, subscription: subscription.id },
      },
      period_end: input.periodEnd,
      period_start: input.periodStart,
      status: input.paid ? 'paid' : 'open',
      status_transitions: { finalized_at: now, marked_uncollectible_at: null, paid_at: input.paid ? now : null, voided_at: null },
      subscription: subscription.id,
      subtotal: input.amount,
      total: input.amount,
    };
    this.store.invoices.set(id, invoice);
    return invoice;
  }
}

export function idOf(value: string | { id: string }): string {
  return typeof value === 'string' ? value : value.id;
}

function firstItem(subscription: SubscriptionObject) {
  const item = subscription.items.data[0];
  if (!item) throw new StripeApiError(500, `Subscription ${subscription.id} has no items.`, { type: 'api_error' });
  return item;
}

function amountOf(subscription: SubscriptionObject): number {
  const item = firstItem(subscription);
  return item.price.unit_amount * item.quantity;
}

function draft(type: EventType, object: StripeObject, previousAttributes?: Record<string, unknown>): EventDraft {
  // A snapshot: later changes to the object must not show in an event already raised.
  return { type, object: structuredClone(object), ...(previousAttributes ? { previousAttributes: structuredClone(previousAttributes) } : {}) };
}

/** `customer.subscription.updated` with the old values of the changed fields, or nothing if none changed. */
function updatedEvents(before: SubscriptionObject, after: SubscriptionObject): EventDraft[] {
  const previous: Record<string, unknown> = {};
  for (const key of Object.keys(after) as Array<keyof SubscriptionObject>) {
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) previous[key] = before[key];
  }
  return Object.keys(previous).length === 0 ? [] : [draft('customer.subscription.updated', after, previous)];
}
