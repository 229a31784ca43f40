import { Router } from 'express';
import { DEFAULT_CHECKLISTS, JOB_KINDS } from '@domain/jobs';
import { checklistTemplatesSchema, type ChecklistTemplates } from '@domain/schemas/job';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Tenant } from '../../models/Tenant';
import { recordAudit } from '../../services/audit-recorder';
import { authorizeRecord, inTransaction, requireFirm } from '../helpers';

/** The checklists new jobs start from, per kind: the firm's own where set, else our defaults. */
function effective(saved: ChecklistTemplates | null | undefined): Record<string, string[]> {
  return Object.fromEntries(JOB_KINDS.map((kind) => [kind, saved?.[kind] ?? DEFAULT_CHECKLISTS[kind]]));
}

/** Firm settings: job checklists. Staff read them; the owner changes them. */
export function checklistTemplatesRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/firm/checklists', requireFirm);

  async function load(tenantId: string): Promise<Tenant> {
    const tenant = await Tenant.findOne({ where: { id: tenantId } });
    if (!tenant) throw errors.notFound('firm');
    return tenant;
  }

  router.get('/firm/checklists', async (req, res) => {
    const tenant = await load(req.ctx.tenantId!);
    authorizeRecord(req, 'read', 'Tenant', { id: tenant.id }, 'firm');
    if (req.user?.role === 'client') throw errors.forbidden();
    res.json({ data: { checklists: effective(tenant.checklistTemplates as ChecklistTemplates | null), defaults: DEFAULT_CHECKLISTS } });
  });

  router.put('/firm/checklists', validate({ body: checklistTemplatesSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: checklistTemplatesSchema });
    const tenant = await load(req.ctx.tenantId!);
    authorizeRecord(req, 'update', 'Tenant', { id: tenant.id }, 'firm');
    await inTransaction(req, deps, async (ctx) => {
      await tenant.update({ checklistTemplates: body }, { transaction: ctx.transaction });
      await recordAudit(ctx, { action: 'firm.checklists_changed', subjectType: 'Tenant', subjectId: tenant.id, details: { kinds: Object.keys(body) } });
    });
    res.json({ data: { checklists: effective(body), defaults: DEFAULT_CHECKLISTS } });
  });

  return router;
}
