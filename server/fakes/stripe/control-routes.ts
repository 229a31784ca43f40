/**
 * Test controls under /_stand-in (JSON, no key): what the passing of time and the card
 * network would do — a renewal that fails, a payment, a trial that ends — and the event log.
 * Each answers after its events are delivered.
 */
import express, { Router } from 'express';
import type { Billing, ControlOutcome } from './billing';
import { apiErrorHandler } from './api-routes';
import { stripeErrors } from './errors';
import type { WebhookSender } from './webhooks';

export function controlRouter({ billing, webhooks }: { billing: Billing; webhooks: WebhookSender }): Router {
  const router = Router();
  router.use(express.json());

  const control = (path: string, act: (subscriptionId: string) => ControlOutcome) => {
    router.post(`/subscriptions/:id/${path}`, async (req, res) => {
      const { subscription, invoice, events } = act(req.params.id);
      await webhooks.publish(events);
      res.json({ subscription, invoice, events: events.map((e) => e.type) });
    });
  };
  control('fail-payment', (id) => billing.failPayment(id));
  control('pay', (id) => billing.pay(id));
  control('end-trial', (id) => billing.endTrial(id));

  router.get('/events', (req, res) => {
    const type = typeof req.query.type === 'string' ? req.query.type : undefined;
    const data = webhooks.events().filter((record) => !type || record.event.type === type);
    res.json({ object: 'list', data });
  });

  router.use((req, _res, next) => {
    next(stripeErrors.unknownUrl(req.method, req.originalUrl));
  });
  router.use(apiErrorHandler);
  return router;
}
