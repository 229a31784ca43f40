import { Router, type Request } from 'express';
import { z } from 'zod';
import { PLAN_KEYS } from '@domain/plans';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Tenant } from '../../models/Tenant';
import { presentBilling } from '../../presenters/billing';
import { listInvoices, openBillingPortal, startCheckout } from '../../services/billing';
import { usageOf } from '../../services/plan-usage';
import { nowOf, requireAbility, requireFirm } from '../helpers';

const checkoutSchema = z.object({
  planKey: z.enum(PLAN_KEYS, { error: `Choose one of the plans: ${PLAN_KEYS.join(', ')}.` }),
});

/** The owner's billing: plan and usage, Checkout, the Stripe billing portal, invoices. Owners only. */
export function billingRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/billing', requireFirm, requireAbility('manage', 'Billing'));

  async function ownFirm(req: Request): Promise<Tenant> {
    const tenant = await Tenant.findByPk(req.ctx.tenantId!);
    if (!tenant) throw errors.notFound('firm');
    return tenant;
  }

  router.get('/billing', async (req, res) => {
    const tenant = await ownFirm(req);
    const now = nowOf(deps);
    res.json({ data: presentBilling(tenant, await usageOf(tenant.id, now), { now, paymentsConfigured: Boolean(deps.billing) }) });
  });

  router.post('/billing/checkout', validate({ body: checkoutSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: checkoutSchema });
    const tenant = await ownFirm(req);
    const url = await startCheckout(tenant, req.user!, body.planKey, { billing: deps.billing, appUrl: deps.appUrl });
    res.status(201).json({ data: { url } });
  });

  router.post('/billing/portal', async (req, res) => {
    const tenant = await ownFirm(req);
    const url = await openBillingPortal(tenant, req.user!, { billing: deps.billing, appUrl: deps.appUrl });
    res.status(201).json({ data: { url } });
  });

  router.get('/billing/invoices', async (req, res) => {
    const tenant = await ownFirm(req);
    res.json({ data: await listInvoices(tenant, deps.billing) });
  });

  return router;
}
