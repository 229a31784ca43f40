import { Router } from 'express';
import { DEFAULT_UPKEEP_SETTINGS } from '@domain/device-life';
import { upkeepSettingsSchema } from '@domain/schemas/upkeep';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Tenant } from '../../models/Tenant';
import { recordAudit } from '../../services/audit-recorder';
import { upkeepOf } from '../../services/zones';
import { authorizeRecord, inTransaction, requireFirm } from '../helpers';

/** The firm's device-life model: every staff role reads it; the owner changes it. */
export function upkeepSettingsRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/firm/upkeep-settings', requireFirm);

  async function load(tenantId: string): Promise<Tenant> {
    const tenant = await Tenant.findOne({ where: { id: tenantId } });
    if (!tenant) throw errors.notFound('firm');
    return tenant;
  }

  router.get('/firm/upkeep-settings', async (req, res) => {
    const tenant = await load(req.ctx.tenantId!);
    authorizeRecord(req, 'read', 'Tenant', { id: tenant.id }, 'firm');
    if (req.user?.role === 'client') throw errors.forbidden();
    res.json({ data: { settings: upkeepOf(tenant), defaults: DEFAULT_UPKEEP_SETTINGS } });
  });

  router.put('/firm/upkeep-settings', validate({ body: upkeepSettingsSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: upkeepSettingsSchema });
    const tenant = await load(req.ctx.tenantId!);
    authorizeRecord(req, 'update', 'Tenant', { id: tenant.id }, 'firm');
    const before = upkeepOf(tenant);
    await inTransaction(req, deps, async (ctx) => {
      await tenant.update({ upkeepSettings: body }, { transaction: ctx.transaction });
      await recordAudit(ctx, { action: 'firm.upkeep_settings_changed', subjectType: 'Tenant', subjectId: tenant.id, details: { before, after: body } });
    });
    res.json({ data: { settings: upkeepOf(tenant), defaults: DEFAULT_UPKEEP_SETTINGS } });
  });

  return router;
}
