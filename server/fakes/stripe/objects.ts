/**
 * The JSON shapes the stand-in answers with: the fields of Stripe's objects that Mullion
 * reads, plus enough of the rest that the stripe SDK's types describe them faithfully.
 */
export type Metadata = Record<string, string>;

export interface StripeList<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

export interface ProductObject {
  id: string;
  object: 'product';
  active: boolean;
  created: number;
  description: string | null;
  livemode: false;
  metadata: Metadata;
  name: string;
  type: 'service';
  updated: number;
}

export interface PriceObject {
  id: string;
  object: 'price';
  active: boolean;
  billing_scheme: 'per_unit';
  created: number;
  currency: string;
  custom_unit_amount: null;
  livemode: false;
  lookup_key: string | null;
  metadata: Metadata;
  nickname: string | null;
  product: string | ProductObject;
  recurring: { interval: 'month'; interval_count: number; meter: null; trial_period_days: null; usage_type: 'licensed' };
  tax_behavior: 'unspecified';
  tiers_mode: null;
  transform_quantity: null;
  type: 'recurring';
  unit_amount: number;
  unit_amount_decimal: string;
}

export interface CustomerObject {
  id: string;
  object: 'customer';
  address: null;
  balance: number;
  created: number;
  currency: string | null;
  default_source: null;
  delinquent: boolean;
  description: string | null;
  email: string | null;
  invoice_prefix: string;
  invoice_settings: { custom_fields: null; default_payment_method: null; footer: null; rendering_options: null };
  livemode: false;
  metadata: Metadata;
  name: string | null;
  next_invoice_sequence: number;
  phone: string | null;
  preferred_locales: string[];
  shipping: null;
  tax_exempt: 'none';
  test_clock: null;
}

export type SubscriptionStatus = 'trialing' | 'active' | 'past_due' | 'canceled' | 'unpaid';

export interface SubscriptionItemObject {
  id: string;
  object: 'subscription_item';
  created: number;
  current_period_end: number;
  current_period_start: number;
  discounts: string[];
  metadata: Metadata;
  price: PriceObject;
  quantity: number;
  subscription: string;
  tax_rates: never[];
}

export interface SubscriptionObject {
  id: string;
  object: 'subscription';
  application: null;
  billing_cycle_anchor: number;
  cancel_at: number | null;
  cancel_at_period_end: boolean;
  canceled_at: number | null;
  cancellation_details: { comment: null; feedback: null; reason: 'cancellation_requested' | null };
  collection_method: 'charge_automatically';
  created: number;
  currency: string;
  /** Stripe moved the period to the items; the stand-in keeps a copy here too */
  current_period_end: number;
  current_period_start: number;
  customer: string | CustomerObject;
  days_until_due: null;
  default_payment_method: null;
  description: null;
  discounts: string[];
  ended_at: number | null;
  items: StripeList<SubscriptionItemObject> & { total_count: number };
  latest_invoice: string | InvoiceObject | null;
  livemode: false;
  metadata: Metadata;
  pause_collection: null;
  start_date: number;
  status: SubscriptionStatus;
  test_clock: null;
  trial_end: number | null;
  trial_start: number | null;
}

export type InvoiceStatus = 'paid' | 'open';
export type BillingReason = 'subscription_create' | 'subscription_cycle';

export interface InvoiceLineObject {
  id: string;
  object: 'line_item';
  amount: number;
  currency: string;
  description: string;
  invoice: string;
  livemode: false;
  metadata: Metadata;
  period: { start: number; end: number };
  pricing: { type: 'price_details'; price_details: { price: string; product: string }; unit_amount_decimal: string };
  quantity: number;
}

export interface InvoiceObject {
  id: string;
  object: 'invoice';
  account_country: string;
  account_name: string;
  amount_due: number;
  amount_paid: number;
  amount_remaining: number;
  attempt_count: number;
  attempted: boolean;
  billing_reason: BillingReason;
  collection_method: 'charge_automatically';
  created: number;
  currency: string;
  customer: string | CustomerObject;
  customer_email: string | null;
  customer_name: string | null;
  description: null;
  due_date: null;
  effective_at: number;
  hosted_invoice_url: string;
  invoice_pdf: null;
  lines: StripeList<InvoiceLineObject> & { total_count: number };
  livemode: false;
  metadata: Metadata;
  next_payment_attempt: number | null;
  number: string;
  parent: {
    type: 'subscription_details';
    quote_details: null;
    subscription_details: { metadata: Metadata; subscription: string };
  };
  period_end: number;
  period_start: number;
  status: InvoiceStatus;
  status_transitions: { finalized_at: number; marked_uncollectible_at: null; paid_at: number | null; voided_at: null };
  /** older API versions had it here; newer ones under parent.subscription_details — the stand-in gives both */
  subscription: string | SubscriptionObject;
  subtotal: number;
  total: number;
}

export interface CheckoutSessionObject {
  id: string;
  object: 'checkout.session';
  allow_promotion_codes: null;
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  created: number;
  currency: string;
  customer: string | CustomerObject | null;
  customer_details: { email: string | null; name: string | null } | null;
  customer_email: string | null;
  expires_at: number;
  invoice: string | InvoiceObject | null;
  livemode: false;
  metadata: Metadata;
  mode: 'subscription';
  payment_method_types: string[];
  payment_status: 'unpaid' | 'paid' | 'no_payment_required';
  status: 'open' | 'complete' | 'expired';
  subscription: string | SubscriptionObject | null;
  success_url: string;
  ui_mode: 'hosted';
  url: string | null;
}

export interface PortalSessionObject {
  id: string;
  object: 'billing_portal.session';
  configuration: string;
  created: number;
  customer: string;
  flow: null;
  livemode: false;
  locale: null;
  on_behalf_of: null;
  return_url: string | null;
  url: string;
}

export type StripeObject =
  ProductObject | PriceObject | CustomerObject | SubscriptionObject | InvoiceObject | CheckoutSessionObject | PortalSessionObject;

export type EventType =
  | 'customer.subscription.created'
  | 'customer.subscription.updated'
  | 'customer.subscription.deleted'
  | 'invoice.paid'
  | 'invoice.payment_failed'
  | 'checkout.session.completed';

export interface StripeEvent {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  data: { object: StripeObject; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: EventType;
}
