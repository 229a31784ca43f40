/**
 * The stand-in's state, in memory: every object kept in the JSON shape the API answers with,
 * plus the few facts a checkout session needs that Stripe does not show on the session.
 */
import { stripeErrors, nounForId } from './errors';
import type {
  CheckoutSessionObject,
  CustomerObject,
  InvoiceObject,
  Metadata,
  PortalSessionObject,
  PriceObject,
  ProductObject,
  StripeList,
  StripeObject,
  SubscriptionObject,
} from './objects';

export interface CheckoutSessionRecord {
  session: CheckoutSessionObject;
  line: { price: string; quantity: number };
  subscriptionData: { metadata: Metadata; trialEnd: number | null };
}

export class StandInStore {
  readonly products = new Map<string, ProductObject>();
  readonly prices = new Map<string, PriceObject>();
  readonly customers = new Map<string, CustomerObject>();
  readonly checkoutSessions = new Map<string, CheckoutSessionRecord>();
  readonly subscriptions = new Map<string, SubscriptionObject>();
  readonly invoices = new Map<string, InvoiceObject>();
  readonly portalSessions = new Map<string, PortalSessionObject>();

  customer(id: string, param?: string): CustomerObject {
    return found(this.customers.get(id), 'customer', id, param);
  }

  price(id: string, param?: string): PriceObject {
    return found(this.prices.get(id), 'price', id, param);
  }

  checkoutSession(id: string): CheckoutSessionRecord {
    return found(this.checkoutSessions.get(id), 'checkout.session', id);
  }

  subscription(id: string, param?: string): SubscriptionObject {
    return found(this.subscriptions.get(id), 'subscription', id, param);
  }

  invoice(id: string): InvoiceObject {
    return found(this.invoices.get(id), 'invoice', id);
  }

  portalSession(id: string): PortalSessionObject {
    return found(this.portalSessions.get(id), 'billing_portal.session', id);
  }

  /** any stored object by id, for `expand` */
  byId(id: string): StripeObject | undefined {
    return (
      this.customers.get(id) ??
      this.products.get(id) ??
      this.prices.get(id) ??
      this.subscriptions.get(id) ??
      this.invoices.get(id) ??
      this.checkoutSessions.get(id)?.session ??
      this.portalSessions.get(id)
    );
  }

  /** the customer's subscriptions, newest first */
  subscriptionsOf(customerId: string): SubscriptionObject[] {
    return [...this.subscriptions.values()].filter((s) => s.customer === customerId).reverse();
  }

  /** the customer's invoices, newest first */
  invoicesOf(customerId: string): InvoiceObject[] {
    return [...this.invoices.values()].filter((i) => i.customer === customerId).reverse();
  }
}

function found<T>(value: T | undefined, noun: string, id: string, param?: string): T {
  if (value === undefined) {
    // An unknown id in the URL is a 404; one named in the body is a 400 on that parameter.
    throw param ? stripeErrors.resourceMissing(noun, id, param, 400) : stripeErrors.resourceMissing(noun, id);
  }
  return value;
}

/**
 * One page of a list, newest first, as Stripe pages: `limit` (1–100, default 10) and
 * `starting_after` (the last id of the previous page).
 */
export function paginate<T extends { id: string }>(
  newestFirst: T[],
  url: string,
  { limit, startingAfter }: { limit: number | undefined; startingAfter: string | undefined },
): StripeList<T> {
  const size = limit ?? 10;
  if (size < 1 || size > 100) throw stripeErrors.invalidParam('limit', 'Invalid limit: must be between 1 and 100.');
  let start = 0;
  if (startingAfter !== undefined) {
    const index = newestFirst.findIndex((item) => item.id === startingAfter);
    if (index === -1) throw stripeErrors.resourceMissing(nounForId(startingAfter), startingAfter, 'starting_after', 400);
    start = index + 1;
  }
  const data = newestFirst.slice(start, start + size);
  return { object: 'list', data, has_more: start + size < newestFirst.length, url };
}
