/**
 * The Stripe API endpoints Mullion calls, under /v1, answering in Stripe's JSON shapes.
 * Events raised by an API call are delivered in the background, as Stripe does: the caller
 * may still be inside its own database transaction while the webhook arrives.
 */
import { randomUUID } from 'node:crypto';
import { Router, type ErrorRequestHandler, type Request, type RequestHandler, type Response } from 'express';
import type { Billing, EventDraft } from './billing';
import { StripeApiError, stripeErrors } from './errors';
import { expand } from './expand';
import { FormParams, formBody } from './form-body';
import { newId } from './ids';
import { paginate } from './store';
import type { WebhookSender } from './webhooks';

declare module 'express-serve-static-core' {
  interface Locals {
    stripeRequestId?: string;
    stripeApiKey?: string;
  }
}

export interface ApiDeps {
  billing: Billing;
  webhooks: WebhookSender;
}

const PRORATION_BEHAVIORS = ['create_prorations', 'none', 'always_invoice'];

/** Test keys only: `Authorization: Bearer sk_test_…`. */
const requireTestKey: RequestHandler = (req, res, next) => {
  const header = req.get('authorization') ?? '';
  const match = /^Bearer\s+(\S+)$/i.exec(header);
  if (!match?.[1]) {
    next(stripeErrors.unauthenticated("No API key provided. Send it as 'Authorization: Bearer sk_test_…'."));
    return;
  }
  const key = match[1];
  if (!key.startsWith('sk_test_')) {
    next(stripeErrors.unauthenticated('Invalid API key: this stand-in accepts test secret keys only (sk_test_…).'));
    return;
  }
  res.locals.stripeApiKey = key;
  next();
};

/** Stripe's idempotency: a repeated POST with the same Idempotency-Key gets the first answer again. */
function idempotency(): RequestHandler {
  const answers = new Map<string, { fingerprint: string; status: number; body: unknown }>();
  return (req, res, next) => {
    const key = req.get('idempotency-key');
    if (req.method !== 'POST' || !key) {
      next();
      return;
    }
    const cacheKey = `${res.locals.stripeApiKey ?? ''}\u0000${key}`;
    const fingerprint = `${req.method} ${req.path} ${JSON.stringify(req.body)}`;
    const earlier = answers.get(cacheKey);
    if (earlier) {
      if (earlier.fingerprint !== fingerprint) {
        next(
          new StripeApiError(400, `Keys for idempotent requests can only be used with the same parameters they were first used with (key ${key}).`, {
            type: 'idempotency_error',
          }),
        );
        return;
      }
      res.set('Idempotent-Replayed', 'true').status(earlier.status).json(earlier.body);
      return;
    }
    const send = res.json.bind(res);
    res.json = ((body: unknown) => {
      if (res.statusCode < 500) answers.set(cacheKey, { fingerprint, status: res.statusCode, body });
      return send(body);
    }) as typeof res.json;
    next();
  };
}

/** Stripe refuses parameters it does not know; so does the stand-in, naming the first one. */
function onlyParams(params: FormParams, allowed: readonly string[]): void {
  for (const name of params.names()) {
    if (name !== 'expand' && !allowed.includes(name)) throw stripeErrors.invalidRequest(`Received unknown parameter: ${name}`, name);
  }
}

export function apiRouter({ billing, webhooks }: ApiDeps): Router {
  const { store } = billing;
  const router = Router();

  router.use((req, res, next) => {
    const id = newId('req_');
    res.locals.stripeRequestId = id;
    res.set('Request-Id', id);
    next();
  });
  router.use(requireTestKey);
  router.use(formBody);
  router.use(idempotency());

  const paramsOf = (req: Request) => new FormParams(req.query, req.body);
  const expansions = (params: FormParams) => params.list('expand');
  const raise = (req: Request, res: Response, events: EventDraft[]) => {
    void webhooks.publish(events, { id: res.locals.stripeRequestId ?? null, idempotencyKey: req.get('idempotency-key') ?? null });
  };

  // ── customers ──
  router.post('/customers', (req, res) => {
    const p = paramsOf(req);
    onlyParams(p, ['email', 'name', 'description', 'phone', 'metadata']);
    const customer = billing.createCustomer({
      email: p.string('email'),
      name: p.string('name'),
      description: p.string('description'),
      phone: p.string('phone'),
      metadata: p.metadata(),
    });
    res.json(expand(customer, expansions(p), store));
  });

  router.get('/customers/:id', (req, res) => {
    res.json(expand(store.customer(req.params.id), expansions(paramsOf(req)), store));
  });

  router.post('/customers/:id', (req, res) => {
    const p = paramsOf(req);
    onlyParams(p, ['email', 'name', 'description', 'phone', 'metadata']);
    const customer = billing.updateCustomer(req.params.id, {
      email: p.string('email'),
      name: p.string('name'),
      description: p.string('description'),
      phone: p.string('phone'),
      metadata: p.metadata(),
    });
    res.json(expand(customer, expansions(p), store));
  });

  // ── prices ──
  router.get('/prices/:id', (req, res) => {
    res.json(expand(store.price(req.params.id), expansions(paramsOf(req)), store));
  });

  router.get('/prices', (req, res) => {
    const p = paramsOf(req);
    const lookupKeys = p.list('lookup_keys');
    const active = p.boolean('active');
    const prices = [...store.prices.values()]
      .reverse()
      .filter((price) => lookupKeys.length === 0 || (price.lookup_key !== null && lookupKeys.includes(price.lookup_key)))
      .filter((price) => active === undefined || price.active === active);
    const list = paginate(prices, '/v1/prices', { limit: p.integer('limit'), startingAfter: p.string('starting_after') });
    res.json(expand(list, expansions(p), store));
  });

  // ── checkout ──
  router.post('/checkout/sessions', (req, res) => {
    const p = paramsOf(req);
    onlyParams(p, [
      'mode',
      'customer',
      'customer_email',
      'line_items',
      'success_url',
      'cancel_url',
      'client_reference_id',
      'metadata',
      'subscription_data',
    ]);
    const mode = p.requiredString('mode');
    if (mode !== 'subscription') throw stripeErrors.invalidParam('mode', `The stand-in supports mode=subscription only, not ${mode}.`);
    if (!p.has('line_items')) throw stripeErrors.missingParam('line_items');
    if (p.count('line_items') !== 1) throw stripeErrors.invalidParam('line_items', 'The stand-in supports exactly one line item.');
    const price = p.requiredString('line_items[0][price]');
    const quantity = p.integer('line_items[0][quantity]');
    if (quantity === undefined) throw stripeErrors.missingParam('line_items[0][quantity]');
    const successUrl = p.url('success_url');
    if (successUrl === undefined) throw stripeErrors.missingParam('success_url');
    const customer = p.string('customer') || undefined;
    const customerEmail = p.string('customer_email') || undefined;
    if (customer && customerEmail) throw stripeErrors.invalidParam('customer_email', 'Give either customer or customer_email, not both.');
    const session = billing.createCheckoutSession({
      customer,
      customerEmail,
      price,
      quantity,
      successUrl,
      cancelUrl: p.url('cancel_url'),
      clientReferenceId: p.string('client_reference_id'),
      metadata: p.metadata(),
      subscriptionMetadata: p.metadata('subscription_data[metadata]'),
      trialEnd: p.integer('subscription_data[trial_end]'),
    });
    res.json(expand(session, expansions(p), store));
  });

  router.get('/checkout/sessions/:id', (req, res) => {
    const { session } = billing.checkoutSession(req.params.id);
    res.json(expand(session, expansions(paramsOf(req)), store));
  });

  router.post('/checkout/sessions/:id/expire', (req, res) => {
    const { session } = billing.expireCheckoutSession(req.params.id);
    res.json(expand(session, expansions(paramsOf(req)), store));
  });

  // ── subscriptions ──
  router.get('/subscriptions/:id', (req, res) => {
    res.json(expand(store.subscription(req.params.id), expansions(paramsOf(req)), store));
  });

  router.post('/subscriptions/:id', (req, res) => {
    const p = paramsOf(req);
    onlyParams(p, ['items', 'cancel_at_period_end', 'metadata', 'proration_behavior']);
    const proration = p.string('proration_behavior');
    if (proration !== undefined && !PRORATION_BEHAVIORS.includes(proration)) {
      throw stripeErrors.invalidParam('proration_behavior', `Invalid proration_behavior: must be one of ${PRORATION_BEHAVIORS.join(', ')}.`);
    }
    if (p.count('items') > 1) {
      throw stripeErrors.invalidParam('items', 'The stand-in keeps one item per subscription; change items[0] only.');
    }
    const { subscription, events } = billing.updateSubscription(req.params.id, {
      itemId: p.string('items[0][id]'),
      price: p.string('items[0][price]'),
      quantity: p.integer('items[0][quantity]'),
      cancelAtPeriodEnd: p.boolean('cancel_at_period_end'),
      metadata: p.metadata(),
    });
    raise(req, res, events);
    res.json(expand(subscription, expansions(p), store));
  });

  router.delete('/subscriptions/:id', (req, res) => {
    const p = paramsOf(req);
    onlyParams(p, ['invoice_now', 'prorate']);
    const { subscription, events } = billing.cancelSubscription(req.params.id);
    raise(req, res, events);
    res.json(expand(subscription, expansions(p), store));
  });

  // ── invoices ──
  router.get('/invoices', (req, res) => {
    const p = paramsOf(req);
    const customer = p.string('customer');
    const subscription = p.string('subscription');
    const status = p.string('status');
    if (customer) store.customer(customer, 'customer');
    const invoices = [...store.invoices.values()]
      .reverse()
      .filter((inv) => !customer || inv.customer === customer)
      .filter((inv) => !subscription || inv.subscription === subscription)
      .filter((inv) => !status || inv.status === status);
    const list = paginate(invoices, '/v1/invoices', { limit: p.integer('limit'), startingAfter: p.string('starting_after') });
    res.json(expand(list, expansions(p), store));
  });

  router.get('/invoices/:id', (req, res) => {
    res.json(expand(store.invoice(req.params.id), expansions(paramsOf(req)), store));
  });

  // ── billing portal ──
  router.post('/billing_portal/sessions', (req, res) => {
    const p = paramsOf(req);
    onlyParams(p, ['customer', 'return_url']);
    const session = billing.createPortalSession(p.requiredString('customer'), p.url('return_url'));
    res.json(expand(session, expansions(p), store));
  });

  router.use((req, _res, next) => {
    next(stripeErrors.unknownUrl(req.method, req.originalUrl.split('?')[0] ?? req.originalUrl));
  });
  router.use(apiErrorHandler);
  return router;
}

/** Every failure in Stripe's error shape; a bug in the stand-in is an api_error 500. */
export const apiErrorHandler: ErrorRequestHandler = (err: unknown, _req, res, _next) => {
  if (err instanceof StripeApiError) {
    res.status(err.status).json(err.toBody());
    return;
  }
  const status = typeof err === 'object' && err !== null && 'status' in err && typeof err.status === 'number' ? err.status : 500;
  if (status >= 400 && status < 500) {
    res.status(status).json(new StripeApiError(status, err instanceof Error ? err.message : 'Invalid request.').toBody());
    return;
  }
  const reference = randomUUID();
  console.error(`Stripe stand-in: unexpected error ${reference}`, err);
  res.status(500).json(new StripeApiError(500, `The stand-in failed unexpectedly (reference ${reference}).`, { type: 'api_error' }).toBody());
};
