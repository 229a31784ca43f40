/**
 * The pages a browser visits: checkout, billing portal, invoices. Events raised here are
 * delivered before the browser is sent on, so Mullion already knows when the person returns.
 */
import { Router, type ErrorRequestHandler, type Request, type Response } from 'express';
import { idOf, type Billing, type EventDraft } from './billing';
import { StripeApiError } from './errors';
import { formBody } from './form-body';
import type { SubscriptionObject } from './objects';
import { checkoutPage, DECLINED_MESSAGE, invoicePage, messagePage, NOT_A_TEST_CARD_MESSAGE, PORTAL_NOTICES, portalPage } from './pages';
import type { WebhookSender } from './webhooks';

export interface PageDeps {
  billing: Billing;
  webhooks: WebhookSender;
}

function sendHtml(res: Response, status: number, body: string): void {
  res.status(status).type('html').set('Cache-Control', 'no-store').send(body);
}

function bodyField(req: Request, name: string): string {
  const body = req.body as Record<string, unknown> | undefined;
  const value = body?.[name];
  return typeof value === 'string' ? value : '';
}

export function pageRouter({ billing, webhooks }: PageDeps): Router {
  const { store } = billing;
  const router = Router();
  router.use(formBody);

  router.get('/', (_req, res) => {
    sendHtml(
      res,
      200,
      messagePage('Billing stand-in', 'This is Mullion’s local stand-in for the payment service. Its pages open from links Mullion gives you.'),
    );
  });

  // ── checkout ──
  const renderCheckout = (res: Response, sessionId: string, status: number, extra: { cardNumber?: string; error?: string } = {}) => {
    const record = store.checkoutSessions.get(sessionId);
    if (!record) {
      sendHtml(res, 404, messagePage('Checkout not found', 'This checkout link is not valid. Start again from Mullion.'));
      return;
    }
    const { session } = record;
    if (billing.checkoutSession(sessionId).session.status === 'expired') {
      sendHtml(
        res,
        410,
        messagePage(
          'Checkout expired',
          'This checkout link has expired. Start again from Mullion.',
          session.cancel_url ? { href: session.cancel_url, label: 'Go back' } : undefined,
        ),
      );
      return;
    }
    if (session.status === 'complete') {
      sendHtml(
        res,
        410,
        messagePage('Already paid', 'This checkout is already complete; nothing more to pay here.', {
          href: successUrl(session.success_url, session.id),
          label: 'Continue to Mullion',
        }),
      );
      return;
    }
    const price = store.price(record.line.price);
    const customer = session.customer !== null ? store.customers.get(idOf(session.customer)) : undefined;
    sendHtml(res, status, checkoutPage({ record, customer, price, planName: billing.planName(price), now: billing.now(), ...extra }));
  };

  router.get('/checkout/:sessionId', (req, res) => {
    renderCheckout(res, req.params.sessionId, 200);
  });

  router.post('/checkout/:sessionId', async (req, res) => {
    const { sessionId } = req.params;
    const record = store.checkoutSessions.get(sessionId);
    if (!record || billing.checkoutSession(sessionId).session.status !== 'open') {
      renderCheckout(res, sessionId, 200);
      return;
    }
    const cardNumber = bodyField(req, 'cardNumber');
    const outcome = billing.payCheckout(sessionId, cardNumber);
    if (!outcome.paid) {
      const declined = outcome.reason === 'declined';
      renderCheckout(res, sessionId, declined ? 402 : 400, { cardNumber, error: declined ? DECLINED_MESSAGE : NOT_A_TEST_CARD_MESSAGE });
      return;
    }
    await webhooks.publish(outcome.events);
    res.redirect(303, successUrl(outcome.session.success_url, outcome.session.id));
  });

  // ── billing portal ──
  router.get('/billing/:portalId', (req, res) => {
    const portal = store.portalSessions.get(req.params.portalId);
    if (!portal) {
      sendHtml(res, 404, messagePage('Billing page not found', 'This billing link is not valid. Open billing again from Mullion.'));
      return;
    }
    const customer = store.customer(portal.customer);
    const subscription = billing.currentSubscriptionOf(customer.id);
    const currentPrice = subscription?.items.data[0]?.price;
    const otherPrices = [...store.prices.values()].filter(
      (p) => p.active && p.id !== currentPrice?.id && (!currentPrice || p.currency === currentPrice.currency),
    );
    const done = typeof req.query.done === 'string' ? req.query.done : undefined;
    sendHtml(
      res,
      200,
      portalPage({
        portal,
        customer,
        subscription,
        invoices: store.invoicesOf(customer.id),
        otherPrices,
        planName: (price) => billing.planName(price),
        notice: done ? PORTAL_NOTICES[done] : undefined,
      }),
    );
  });

  /** the portal's subscription named in the form, which must be the portal customer's own */
  const portalSubscription = (req: Request): { portalId: string; subscription: SubscriptionObject } => {
    const portalId = String(req.params.portalId);
    const portal = store.portalSessions.get(portalId);
    if (!portal) throw new StripeApiError(404, 'This billing link is not valid. Open billing again from Mullion.');
    const subscription = store.subscriptions.get(bodyField(req, 'subscription'));
    if (!subscription || subscription.customer !== portal.customer)
      throw new StripeApiError(404, 'That subscription does not belong to this billing page.');
    return { portalId, subscription };
  };

  const portalAction = (
    path: string,
    notice: keyof typeof PORTAL_NOTICES,
    act: (subscription: SubscriptionObject, req: Request) => { events: EventDraft[] },
  ) => {
    router.post(`/billing/:portalId/${path}`, async (req, res) => {
      const { portalId, subscription } = portalSubscription(req);
      const { events } = act(subscription, req);
      await webhooks.publish(events);
      res.redirect(303, `/billing/${portalId}?done=${notice}`);
    });
  };
  portalAction('change-plan', 'plan-changed', (subscription, req) => {
    const price = bodyField(req, 'price');
    const itemId = subscription.items.data[0]?.id;
    return billing.updateSubscription(subscription.id, { itemId, price });
  });
  portalAction('cancel-at-period-end', 'cancel-scheduled', (subscription) =>
    billing.updateSubscription(subscription.id, { cancelAtPeriodEnd: true }),
  );
  portalAction('keep', 'kept', (subscription) => billing.updateSubscription(subscription.id, { cancelAtPeriodEnd: false }));
  portalAction('cancel-now', 'canceled', (subscription) => billing.cancelSubscription(subscription.id));

  // ── invoices ──
  router.get('/invoices/:invoiceId', (req, res) => {
    const invoice = store.invoices.get(req.params.invoiceId);
    if (!invoice) {
      sendHtml(res, 404, messagePage('Invoice not found', 'There is no such invoice.'));
      return;
    }
    sendHtml(res, 200, invoicePage(invoice));
  });

  router.use(pageErrorHandler);
  return router;
}

/** The address the payer returns to, with the session id filled in where Mullion asked for it. */
export function successUrl(template: string, sessionId: string): string {
  return template.replaceAll('{CHECKOUT_SESSION_ID}', sessionId);
}

const pageErrorHandler: ErrorRequestHandler = (err: unknown, _req, res, _next) => {
  if (err instanceof StripeApiError) {
    sendHtml(res, err.status, messagePage('That did not work', err.message));
    return;
  }
  console.error('Stripe stand-in: page failed', err);
  sendHtml(res, 500, messagePage('Something went wrong', 'The billing stand-in failed unexpectedly; see its log.'));
};
