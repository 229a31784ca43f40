/**
 * The owner's side of billing: the firm's Stripe customer, Checkout for a plan, the Stripe
 * billing portal, and the invoices Stripe keeps. State changes come back by webhook
 * (server/billing/subscription-sync.ts), never from these calls.
 */
import type Stripe from 'stripe';
import { planByKey, type PlanKey } from '@domain/plans';
import type { BillingConfig } from '../billing/config';
import { errors } from '../errors';
import { Tenant } from '../models/Tenant';
import type { User } from '../models/User';

function billingOf(config: BillingConfig | undefined): BillingConfig {
  if (!config) throw errors.serviceUnavailable('Payments are not set up on this Mullion. Ask the service operator to configure Stripe.');
  return config;
}

/** Stripe errors become a calm 503 naming what failed; nothing of ours changes. */
async function callStripe<T>(what: string, call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    throw errors.serviceUnavailable(`Stripe did not answer when ${what} (${message}). Try again in a minute.`);
  }
}

/** The firm's Stripe customer, created on first use and remembered. */
export async function ensureCustomer(tenant: Tenant, owner: User, config: BillingConfig | undefined): Promise<string> {
  const { stripe } = billingOf(config);
  if (tenant.stripeCustomerId) return tenant.stripeCustomerId;
  const customer = await callStripe('creating your customer record', () =>
    stripe.customers.create({ name: tenant.name, email: owner.email, metadata: { tenantId: tenant.id, shortName: tenant.shortName } }),
  );
  await Tenant.update({ stripeCustomerId: customer.id }, { where: { id: tenant.id } });
  tenant.stripeCustomerId = customer.id;
  return customer.id;
}

/** Whether the firm has a subscription Stripe is still billing (so a change goes through the billing portal). */
export function hasLiveSubscription(tenant: Pick<Tenant, 'stripeSubscriptionId' | 'subscriptionStatus'>): boolean {
  return Boolean(tenant.stripeSubscriptionId) && !['canceled', 'incomplete_expired'].includes(tenant.subscriptionStatus ?? '');
}

/**
 * Two checkouts open at once could both be paid and leave two subscriptions. So a new checkout
 * first expires the firm's earlier one; if that one was paid meanwhile (its webhook not here
 * yet), the new checkout is refused instead.
 */
async function closeEarlierCheckout(tenant: Tenant, config: BillingConfig): Promise<void> {
  const earlier = tenant.pendingCheckoutSessionId;
  if (!earlier) return;
  const session = await callStripe('checking your earlier checkout', () => config.stripe.checkout.sessions.retrieve(earlier));
  const paidFor = typeof session.subscription === 'string' ? session.subscription : (session.subscription?.id ?? null);
  if (session.status === 'complete' && paidFor !== tenant.stripeSubscriptionId) {
    throw errors.conflict('Your earlier checkout went through a moment ago. Reload the Billing page to see your plan.');
  }
  if (session.status === 'open') await callStripe('closing your earlier checkout', () => config.stripe.checkout.sessions.expire(earlier));
}

/** A Checkout Session in subscription mode for the chosen plan; the browser goes to its URL. */
export async function startCheckout(tenant: Tenant, owner: User, planKey: PlanKey, deps: { billing: BillingConfig | undefined; appUrl: string }): Promise<string> {
  const config = billingOf(deps.billing);
  const plan = planByKey(planKey);
  if (!plan) throw errors.validation(`planKey: No plan called ${planKey}.`, { planKey: 'Choose one of the plans.' });
  if (hasLiveSubscription(tenant)) {
    throw errors.conflict('Your firm already has a subscription. Change plan or card from “Manage payment and plan” instead.');
  }
  const customer = await ensureCustomer(tenant, owner, config);
  await closeEarlierCheckout(tenant, config);
  const session = await callStripe('starting the checkout', () =>
    config.stripe.checkout.sessions.create({
      mode: 'subscription',
      customer,
      client_reference_id: tenant.id,
      line_items: [{ price: config.priceIds[plan.key], quantity: 1 }],
      success_url: `${deps.appUrl}/app/billing?checkout=done&session_id={CHECKOUT_SESSION_ID}`,
      cancel_url: `${deps.appUrl}/app/billing?checkout=cancelled`,
      metadata: { tenantId: tenant.id, planKey: plan.key },
      subscription_data: { metadata: { tenantId: tenant.id, planKey: plan.key } },
    }),
  );
  if (!session.url) throw errors.serviceUnavailable('Stripe did not return a checkout page. Try again in a minute.');
  await Tenant.update({ pendingCheckoutSessionId: session.id }, { where: { id: tenant.id } });
  return session.url;
}

/** The Stripe billing portal, where the owner changes card or plan, or cancels. */
export async function openBillingPortal(tenant: Tenant, owner: User, deps: { billing: BillingConfig | undefined; appUrl: string }): Promise<string> {
  const config = billingOf(deps.billing);
  const customer = await ensureCustomer(tenant, owner, config);
  const session = await callStripe('opening the billing portal', () =>
    config.stripe.billingPortal.sessions.create({ customer, return_url: `${deps.appUrl}/app/billing` }),
  );
  return session.url;
}

export interface PresentedInvoice {
  id: string;
  number: string | null;
  status: string | null;
  amountDueCents: number;
  amountPaidCents: number;
  currency: string;
  createdAt: string;
  periodStart: string | null;
  periodEnd: string | null;
  hostedInvoiceUrl: string | null;
  pdfUrl: string | null;
}

function presentInvoice(invoice: Stripe.Invoice): PresentedInvoice {
  const iso = (s: number | null | undefined) => (typeof s === 'number' ? new Date(s * 1000).toISOString() : null);
  return {
    id: invoice.id ?? '',
    number: invoice.number ?? null,
    status: invoice.status ?? null,
    amountDueCents: invoice.amount_due,
    amountPaidCents: invoice.amount_paid,
    currency: invoice.currency,
    createdAt: iso(invoice.created)!,
    periodStart: iso(invoice.period_start),
    periodEnd: iso(invoice.period_end),
    hostedInvoiceUrl: invoice.hosted_invoice_url ?? null,
    pdfUrl: invoice.invoice_pdf ?? null,
  };
}

/** The firm's invoices, newest first, as Stripe keeps them (none before the first checkout). */
export async function listInvoices(tenant: Pick<Tenant, 'stripeCustomerId'>, config: BillingConfig | undefined, limit = 24): Promise<PresentedInvoice[]> {
  if (!tenant.stripeCustomerId) return [];
  const { stripe } = billingOf(config);
  const list = await callStripe('listing your invoices', () => stripe.invoices.list({ customer: tenant.stripeCustomerId!, limit }));
  return list.data.map(presentInvoice);
}
