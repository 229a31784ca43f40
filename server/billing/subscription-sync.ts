/**
 * Stripe's webhooks drive a firm's subscription state. Each event is processed once (its id
 * is recorded in the same transaction as its effect), and each change the firm sees is kept
 * as a row of subscription history for the operator's revenue view.
 */
import type Stripe from 'stripe';
import type { Sequelize, Transaction } from 'sequelize';
import { UniqueConstraintError } from 'sequelize';
import { planByKey } from '@domain/plans';
import { tenantStateFromStripeStatus } from '@domain/subscription-state';
import type { TenantState } from '@domain/tenant-states';
import type { Logger } from '../logger';
import { AuditEvent } from '../models/AuditEvent';
import { StripeEvent } from '../models/StripeEvent';
import { SubscriptionChange } from '../models/SubscriptionChange';
import { Tenant } from '../models/Tenant';
import { planOfPrice, type BillingConfig } from './config';

/** The events Mullion acts on; others are acknowledged and ignored. */
export const HANDLED_EVENTS = [
  'checkout.session.completed',
  'customer.subscription.created',
  'customer.subscription.updated',
  'customer.subscription.deleted',
  'invoice.paid',
  'invoice.payment_failed',
] as const;

export interface SyncDeps {
  sequelize: Sequelize;
  billing: BillingConfig;
  logger: Logger;
}

export type ProcessResult = 'processed' | 'duplicate' | 'ignored';

function idOf(value: string | { id: string } | null | undefined): string | null {
  if (!value) return null;
  return typeof value === 'string' ? value : value.id;
}

/** The firm an object belongs to: by our own metadata first, else by its Stripe customer. */
async function findTenant(input: { tenantId?: string | null | undefined; customerId?: string | null }, transaction: Transaction): Promise<Tenant | null> {
  if (input.tenantId) {
    const byId = await Tenant.findByPk(input.tenantId, { transaction });
    if (byId) return byId;
  }
  if (input.customerId) return Tenant.findOne({ where: { stripeCustomerId: input.customerId }, transaction });
  return null;
}

/** The subscription's period end: on the subscription (older API versions) or its first item. */
function periodEndOf(sub: Stripe.Subscription): Date | null {
  const raw = (sub as unknown as { current_period_end?: number }).current_period_end ?? sub.items?.data?.[0]?.current_period_end;
  return typeof raw === 'number' ? new Date(raw * 1000) : null;
}

/** Stripe never reopens a subscription in these statuses. */
const ENDED_STATUSES: readonly string[] = ['canceled', 'incomplete_expired'];

/**
 * Stripe does not deliver events in order: once the firm's subscription has ended, a late event
 * about that same subscription (a failed retry, an older update) must not bring it back.
 */
function endedAlready(tenant: Tenant, subscriptionId: string | null): boolean {
  return ENDED_STATUSES.includes(tenant.subscriptionStatus ?? '') && (!subscriptionId || subscriptionId === tenant.stripeSubscriptionId);
}

function subscriptionOfInvoice(invoice: Stripe.Invoice): string | null {
  const legacy = (invoice as unknown as { subscription?: string | { id: string } | null }).subscription;
  return idOf(legacy ?? null) ?? idOf(invoice.parent?.subscription_details?.subscription ?? null);
}

/** Writes a history row when what the operator counts (plan, state, amount) changed. */
async function recordChange(tenant: Tenant, from: Date, eventId: string, transaction: Transaction): Promise<void> {
  const plan = tenant.planKey ? planByKey(tenant.planKey) : undefined;
  const monthlyAmountCents = tenant.state === 'active' || tenant.state === 'past_due' ? (plan?.monthlyPriceCents ?? 0) : 0;
  const last = await SubscriptionChange.findOne({ where: { tenantId: tenant.id }, order: [['from', 'DESC'], ['createdAt', 'DESC']], transaction });
  if (last && last.planKey === tenant.planKey && last.state === tenant.state && last.monthlyAmountCents === monthlyAmountCents) return;
  await SubscriptionChange.create({ tenantId: tenant.id, planKey: tenant.planKey, state: tenant.state, monthlyAmountCents, from, stripeEventId: eventId }, { transaction });
}

/** Moves the firm to a new state, unless the operator has suspended it (then the state to restore to changes). */
function moveTo(tenant: Tenant, state: TenantState): void {
  if (tenant.state === 'suspended') tenant.stateBeforeSuspension = state;
  else tenant.state = state;
}

/** The firm follows its subscription: plan from the price, state from the status, grace from the first day past due. */
function applySubscription(tenant: Tenant, sub: Stripe.Subscription, deps: SyncDeps, at: Date): void {
  const planKey = planOfPrice(deps.billing, sub.items?.data?.[0]?.price?.id);
  const state = tenantStateFromStripeStatus(sub.status);
  tenant.stripeSubscriptionId = sub.id;
  tenant.stripeCustomerId = idOf(sub.customer) ?? tenant.stripeCustomerId;
  tenant.subscriptionStatus = sub.status;
  tenant.currentPeriodEnd = periodEndOf(sub);
  tenant.cancelAtPeriodEnd = Boolean(sub.cancel_at_period_end);
  if (planKey) tenant.planKey = planKey;
  if (state) {
    moveTo(tenant, state);
    if (state === 'past_due') tenant.pastDueSince ??= at;
    else tenant.pastDueSince = null;
  }
}

async function audit(tenant: Tenant, action: string, details: Record<string, unknown>, transaction: Transaction): Promise<void> {
  await AuditEvent.create(
    { tenantId: tenant.id, actorId: null, actorRole: null, action, subjectType: 'Tenant', subjectId: tenant.id, details, ip: null },
    { transaction },
  );
}

/**
 * Processes one verified event. The event id is claimed first inside the transaction: a
 * replay finds it taken and changes nothing.
 */
export async function processStripeEvent(event: Stripe.Event, deps: SyncDeps): Promise<ProcessResult> {
  if (!(HANDLED_EVENTS as readonly string[]).includes(event.type)) return 'ignored';
  if (await StripeEvent.findByPk(event.id)) return 'duplicate';
  // Ask Stripe before the transaction, so no database write waits on the network.
  const checkoutSubscriptionId = event.type === 'checkout.session.completed' ? idOf(event.data.object.subscription) : null;
  const checkoutSubscription = checkoutSubscriptionId ? await deps.billing.stripe.subscriptions.retrieve(checkoutSubscriptionId) : null;
  try {
    return await deps.sequelize.transaction(async (transaction) => {
      await StripeEvent.create({ id: event.id, type: event.type, tenantId: null }, { transaction });
      const at = new Date(event.created * 1000);
      const tenant = await handle(event, deps, at, transaction, checkoutSubscription);
      if (tenant) {
        await StripeEvent.update({ tenantId: tenant.id }, { where: { id: event.id }, transaction });
        await tenant.save({ transaction });
        await recordChange(tenant, at, event.id, transaction);
      }
      return 'processed' as const;
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError) return 'duplicate';
    throw err;
  }
}

async function handle(event: Stripe.Event, deps: SyncDeps, at: Date, transaction: Transaction, checkoutSubscription: Stripe.Subscription | null): Promise<Tenant | null> {
  switch (event.type) {
    case 'checkout.session.completed': {
      const session = event.data.object;
      const tenant = await findTenant({ tenantId: session.client_reference_id ?? session.metadata?.tenantId, customerId: idOf(session.customer) }, transaction);
      if (!tenant) return unknownFirm(event, deps);
      tenant.stripeCustomerId = idOf(session.customer) ?? tenant.stripeCustomerId;
      if (tenant.pendingCheckoutSessionId === session.id) tenant.pendingCheckoutSessionId = null;
      const subscriptionId = idOf(session.subscription);
      if (checkoutSubscription) applySubscription(tenant, checkoutSubscription, deps, at);
      await audit(tenant, 'billing.checkout_completed', { plan: tenant.planKey, subscription: subscriptionId }, transaction);
      return tenant;
    }
    case 'customer.subscription.created':
    case 'customer.subscription.updated':
    case 'customer.subscription.deleted': {
      const sub = event.data.object;
      const tenant = await findTenant({ tenantId: sub.metadata?.tenantId, customerId: idOf(sub.customer) }, transaction);
      if (!tenant) return unknownFirm(event, deps);
      // An event about an older subscription than the firm's current one changes nothing.
      if (tenant.stripeSubscriptionId && tenant.stripeSubscriptionId !== sub.id && event.type !== 'customer.subscription.created') return null;
      if (endedAlready(tenant, sub.id) && !ENDED_STATUSES.includes(sub.status)) return null;
      const before = { state: tenant.state, planKey: tenant.planKey };
      applySubscription(tenant, sub, deps, at);
      await audit(tenant, 'billing.subscription_changed', { event: event.type, status: sub.status, from: before, to: { state: tenant.state, planKey: tenant.planKey } }, transaction);
      return tenant;
    }
    case 'invoice.paid':
    case 'invoice.payment_failed': {
      const invoice = event.data.object;
      const tenant = await findTenant({ customerId: idOf(invoice.customer) }, transaction);
      if (!tenant) return unknownFirm(event, deps);
      const subscriptionId = subscriptionOfInvoice(invoice);
      if (subscriptionId && tenant.stripeSubscriptionId && subscriptionId !== tenant.stripeSubscriptionId) return null;
      if (endedAlready(tenant, subscriptionId)) return null;
      if (event.type === 'invoice.payment_failed') {
        moveTo(tenant, 'past_due');
        tenant.subscriptionStatus = 'past_due';
        tenant.pastDueSince ??= at;
      } else if (tenant.state === 'past_due' || (tenant.state === 'suspended' && tenant.stateBeforeSuspension === 'past_due')) {
        moveTo(tenant, 'active');
        tenant.subscriptionStatus = 'active';
        tenant.pastDueSince = null;
      }
      await audit(tenant, event.type === 'invoice.paid' ? 'billing.invoice_paid' : 'billing.payment_failed', { invoice: invoice.id, amountCents: invoice.amount_due }, transaction);
      return tenant;
    }
    default:
      return null;
  }
}

function unknownFirm(event: Stripe.Event, deps: SyncDeps): null {
  deps.logger.warn(`Stripe event ${event.id} (${event.type}) names no firm Mullion knows; acknowledged and ignored.`);
  return null;
}
