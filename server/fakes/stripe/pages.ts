/** The stand-in's hosted pages: checkout, billing portal, invoice, and plain messages. */
import type { CheckoutSessionRecord } from './store';
import type { CustomerObject, InvoiceObject, PortalSessionObject, PriceObject, SubscriptionObject, SubscriptionStatus } from './objects';
import { day, html, money, page, type SafeHtml } from './html';

export const DECLINED_MESSAGE = 'Your card was declined. Try the test card 4242 4242 4242 4242.';
export const NOT_A_TEST_CARD_MESSAGE = 'That is not a test card number. Use 4242 4242 4242 4242 to pay, or 4000 0000 0000 0002 to see a decline.';

export function messagePage(title: string, message: string, link?: { href: string; label: string }): string {
  return page(
    title,
    html`<h1>${title}</h1>
      <p>${message}</p>
      ${link ? html`<p><a href="${link.href}">${link.label}</a></p>` : ''}`,
  );
}

function firmLine(customer: CustomerObject | undefined, fallbackEmail: string | null): SafeHtml {
  if (!customer) return html`${fallbackEmail ?? 'New customer'}`;
  if (customer.name && customer.email) return html`${customer.name} <span class="hint">(${customer.email})</span>`;
  return html`${customer.name ?? customer.email ?? customer.id}`;
}

function perInterval(price: PriceObject, quantity = 1): string {
  return `${money(price.unit_amount * quantity, price.currency)} per ${price.recurring.interval}`;
}

export function checkoutPage(input: {
  record: CheckoutSessionRecord;
  customer: CustomerObject | undefined;
  price: PriceObject;
  planName: string;
  now: number;
  cardNumber?: string;
  error?: string;
}): string {
  const { record, customer, price, planName, now } = input;
  const { session, line, subscriptionData } = record;
  const trialEnd = subscriptionData.trialEnd;
  const trialing = trialEnd !== null && trialEnd > now;
  const body = html`<h1>Start your Mullion subscription</h1>
    <dl>
      <dt>Firm</dt>
      <dd>${firmLine(customer, session.customer_email)}</dd>
      <dt>Plan</dt>
      <dd>${planName}${line.quantity > 1 ? ` × ${line.quantity}` : ''}</dd>
      <dt>Amount</dt>
      <dd>${perInterval(price, line.quantity)}</dd>
      ${
        trialing
          ? html`<dt>Free until</dt>
              <dd>${day(trialEnd)}; nothing is charged today</dd>`
          : ''
      }
      <dt>Due today</dt>
      <dd>${money(trialing ? 0 : price.unit_amount * line.quantity, price.currency)}</dd>
    </dl>
    ${input.error ? html`<p class="alert" role="alert">${input.error}</p>` : ''}
    <form method="post" action="/checkout/${session.id}">
      <label for="cardNumber">Card number</label>
      <input id="cardNumber" name="cardNumber" inputmode="numeric" autocomplete="cc-number" value="${input.cardNumber ?? '4242 4242 4242 4242'}" />
      <p class="hint">Test cards only: 4242 4242 4242 4242 pays, 4000 0000 0000 0002 is declined.</p>
      <button type="submit">Pay and subscribe</button>
    </form>
    ${session.cancel_url ? html`<p><a href="${session.cancel_url}">Go back</a></p>` : ''}`;
  return page(`Subscribe — ${planName}`, body);
}

const STATE_LABELS: Record<SubscriptionStatus, string> = {
  trialing: 'Free trial',
  active: 'Active',
  past_due: 'Payment overdue',
  unpaid: 'Unpaid',
  canceled: 'Ended',
};

const INVOICE_STATE_LABELS: Record<InvoiceObject['status'], string> = { paid: 'Paid', open: 'Due' };

export const PORTAL_NOTICES: Record<string, string> = {
  'plan-changed': 'Your plan has been changed.',
  'cancel-scheduled': 'Your subscription will end at the close of the current period.',
  kept: 'Your subscription will carry on renewing.',
  canceled: 'Your subscription has ended.',
};

function periodLine(subscription: SubscriptionObject): SafeHtml {
  if (subscription.status === 'canceled')
    return html`<dt>Ended on</dt>
      <dd>${day(subscription.ended_at ?? subscription.current_period_end)}</dd>`;
  if (subscription.cancel_at_period_end)
    return html`<dt>Ends on</dt>
      <dd>${day(subscription.current_period_end)}</dd>`;
  if (subscription.status === 'trialing')
    return html`<dt>Trial ends on</dt>
      <dd>${day(subscription.current_period_end)}</dd>`;
  return html`<dt>Renews on</dt>
    <dd>${day(subscription.current_period_end)}</dd>`;
}

export function portalPage(input: {
  portal: PortalSessionObject;
  customer: CustomerObject;
  subscription: SubscriptionObject | undefined;
  invoices: InvoiceObject[];
  otherPrices: PriceObject[];
  planName: (price: PriceObject) => string;
  notice?: string;
}): string {
  const { portal, customer, subscription, invoices, otherPrices, planName } = input;
  const item = subscription?.items.data[0];
  const base = `/billing/${portal.id}`;
  const running = subscription !== undefined && subscription.status !== 'canceled';

  const subscriptionSection =
    subscription && item
      ? html`<dl>
          <dt>Plan</dt>
          <dd>${planName(item.price)}</dd>
          <dt>State</dt>
          <dd>${STATE_LABELS[subscription.status]}${subscription.cancel_at_period_end && running ? ' (set to end)' : ''}</dd>
          <dt>Amount</dt>
          <dd>${perInterval(item.price, item.quantity)}</dd>
          ${periodLine(subscription)}
        </dl>`
      : html`<p>There is no subscription for this firm yet.</p>`;

  const actions =
    running && subscription
      ? html`${
            otherPrices.length > 0
              ? html`<form method="post" action="${base}/change-plan">
                  <input type="hidden" name="subscription" value="${subscription.id}" />
                  <div class="row">
                    <div>
                      <label for="price">Switch to another plan</label>
                      <select id="price" name="price">
                        ${otherPrices.map((p) => html`<option value="${p.id}">${planName(p)} — ${perInterval(p)}</option>`)}
                      </select>
                    </div>
                    <button type="submit">Switch plan</button>
                  </div>
                </form>`
              : ''
          }
          <div class="row">
            ${
              subscription.cancel_at_period_end
                ? html`<form method="post" action="${base}/keep">
                    <input type="hidden" name="subscription" value="${subscription.id}" /><button type="submit" class="secondary">
                      Keep subscription
                    </button>
                  </form>`
                : html`<form method="post" action="${base}/cancel-at-period-end">
                    <input type="hidden" name="subscription" value="${subscription.id}" /><button type="submit" class="secondary">
                      Cancel at period end
                    </button>
                  </form>`
            }
            <form method="post" action="${base}/cancel-now">
              <input type="hidden" name="subscription" value="${subscription.id}" /><button type="submit" class="danger">Cancel now</button>
            </form>
          </div>`
      : '';

  const invoiceSection =
    invoices.length > 0
      ? html`<table>
          <thead>
            <tr>
              <th scope="col">Invoice</th>
              <th scope="col">Date</th>
              <th scope="col">Amount</th>
              <th scope="col">State</th>
            </tr>
          </thead>
          <tbody>
            ${invoices.map(
              (inv) =>
                html`<tr>
                  <td><a href="${inv.hosted_invoice_url}">${inv.number}</a></td>
                  <td>${day(inv.created)}</td>
                  <td>${money(inv.amount_due, inv.currency)}</td>
                  <td>${INVOICE_STATE_LABELS[inv.status]}</td>
                </tr>`,
            )}
          </tbody>
        </table>`
      : html`<p>No invoices yet.</p>`;

  const body = html`<h1>Billing for ${customer.name ?? customer.email ?? customer.id}</h1>
    ${input.notice ? html`<p class="notice" role="status">${input.notice}</p>` : ''}
    <h2>Subscription</h2>
    ${subscriptionSection} ${actions}
    <h2>Invoices</h2>
    ${invoiceSection} ${portal.return_url ? html`<p><a href="${portal.return_url}">Return to Mullion</a></p>` : ''}`;
  return page('Billing', body);
}

export function invoicePage(invoice: InvoiceObject): string {
  const body = html`<h1>Invoice ${invoice.number}</h1>
    <dl>
      <dt>Billed to</dt>
      <dd>${invoice.customer_name ?? invoice.customer_email ?? ''}</dd>
      <dt>Issued</dt>
      <dd>${day(invoice.created)}</dd>
      <dt>Period</dt>
      <dd>${day(invoice.period_start)} to ${day(invoice.period_end)}</dd>
      <dt>Amount</dt>
      <dd>${money(invoice.amount_due, invoice.currency)}</dd>
      <dt>State</dt>
      <dd>
        ${INVOICE_STATE_LABELS[invoice.status]}${invoice.status === 'paid' && invoice.status_transitions.paid_at ? ` on ${day(invoice.status_transitions.paid_at)}` : ''}
      </dd>
    </dl>
    <table>
      <thead>
        <tr>
          <th scope="col">Description</th>
          <th scope="col">Amount</th>
        </tr>
      </thead>
      <tbody>
        ${invoice.lines.data.map(
          (line) =>
            html`<tr>
              <td>${line.description}</td>
              <td>${money(line.amount, line.currency)}</td>
            </tr>`,
        )}
      </tbody>
    </table>`;
  return page(`Invoice ${invoice.number}`, body);
}
