import express, { Router } from 'express';
import type Stripe from 'stripe';
import { processStripeEvent } from '../../billing/subscription-sync';
import type { AppDeps } from '../../deps';

/**
 * Stripe's webhook endpoint. Mounted before the JSON parser and CSRF: the signature is
 * computed over the raw bytes, and Stripe carries no session. A missing or wrong signature
 * is a 400 and changes nothing; an event already processed is acknowledged again (200).
 */
export function stripeWebhookRouter(deps: AppDeps): Router {
  const router = Router();
  router.post('/webhooks/stripe', express.raw({ type: () => true, limit: '1mb' }), async (req, res) => {
    const billing = deps.billing;
    if (!billing) {
      res.status(503).json({ error: { code: 'service_unavailable', message: 'Payments are not set up on this Mullion.' } });
      return;
    }
    const signature = req.get('stripe-signature');
    const payload = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
    let event: Stripe.Event;
    try {
      if (!signature) throw new Error('No Stripe-Signature header.');
      event = billing.stripe.webhooks.constructEvent(payload, signature, billing.webhookSecret);
    } catch (err) {
      deps.logger.warn('Refused a Stripe webhook with a missing or wrong signature.', { reason: err instanceof Error ? err.message : String(err) });
      res.status(400).json({ error: { code: 'validation_failed', message: 'The Stripe-Signature header is missing or does not match this endpoint’s secret.' } });
      return;
    }
    const result = await processStripeEvent(event, { sequelize: deps.sequelize, billing, logger: deps.logger });
    res.json({ received: true, result });
  });
  return router;
}
