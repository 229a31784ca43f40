import { Router } from 'express';
import { Op } from 'sequelize';
import { LIMITS } from '@domain/limits';
import { firmSettingsPatchSchema } from '@domain/schemas/firm';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { singleUpload } from '../../middlewares/upload';
import { inputOf, validate } from '../../middlewares/validate';
import { Tenant } from '../../models/Tenant';
import { presentTenant } from '../../presenters/tenant';
import { recordAudit } from '../../services/audit-recorder';
import { checkImageHeader } from '../../services/image-header';
import { sniffImage } from '../../storage/tenant-files';
import { authorizeRecord, inTransaction, nowOf, requireFirm } from '../helpers';
import { sendStoredFile } from '../send-stored-file';

/** The signed-in user's own firm: profile, portal branding, logo. */
export function firmRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/firm', requireFirm);
  const readUpload = singleUpload({
    maxBytes: LIMITS.logoMaxBytes,
    tooLargeMessage: `A logo may be at most ${LIMITS.logoMaxBytes / 1024} KB.`,
    what: 'the logo image',
    limits: { fields: 5, parts: 6 },
  });

  async function loadFirm(tenantId: string): Promise<Tenant> {
    const tenant = await Tenant.findOne({ where: { id: tenantId } });
    if (!tenant) throw errors.notFound('firm');
    return tenant;
  }

  router.get('/firm', async (req, res) => {
    const tenant = await loadFirm(req.ctx.tenantId!);
    authorizeRecord(req, 'read', 'Tenant', { id: tenant.id }, 'firm');
    res.json({ data: presentTenant(tenant, { audience: req.user?.role === 'client' ? 'client' : 'staff', now: nowOf(deps) }) });
  });

  router.patch('/firm', validate({ body: firmSettingsPatchSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: firmSettingsPatchSchema });
    const tenant = await loadFirm(req.ctx.tenantId!);
    authorizeRecord(req, 'update', 'Tenant', { id: tenant.id }, 'firm');
    if (body.shortName && body.shortName !== tenant.shortName) {
      const clash = await Tenant.count({ where: { shortName: body.shortName, id: { [Op.ne]: tenant.id } } });
      if (clash > 0)
        throw errors.conflict(`The short name ${body.shortName} is taken by another firm. Choose another.`, {
          shortName: 'Taken by another firm.',
        });
    }
    const before = { ...tenant.get({ plain: true }) }; // a copy: get() hands out the live values
    await inTransaction(req, deps, async (ctx) => {
      await tenant.update(body, { transaction: ctx.transaction });
      const changed = Object.keys(body).filter((k) => before[k as keyof typeof before] !== tenant.get(k as keyof typeof before));
      await recordAudit(ctx, { action: 'firm.updated', subjectType: 'Tenant', subjectId: tenant.id, details: { changed } });
    });
    res.json({ data: presentTenant(tenant, { audience: 'staff', now: nowOf(deps) }) });
  });

  router.post('/firm/logo', async (req, res) => {
    // authorize before reading the upload
    authorizeRecord(req, 'update', 'Tenant', { id: req.ctx.tenantId }, 'firm');
    await readUpload(req, res);
    const file = req.file;
    if (!file || file.size === 0) throw errors.validation('file: Choose a PNG, JPEG or WebP image.', { file: 'Choose a PNG, JPEG or WebP image.' });
    const kind = sniffImage(file.buffer);
    if (!kind) throw errors.unsupportedType('A logo must be a PNG, JPEG or WebP image.', { file: 'Choose a PNG, JPEG or WebP image.' });
    // pages, e-mails and reports show the logo: refuse from the header what is too large to decode
    checkImageHeader(file.buffer, kind.extension.toUpperCase());
    const tenant = await loadFirm(req.ctx.tenantId!);
    const fileId = await deps.files.save(tenant.id, file.buffer, kind.extension);
    const old = tenant.logoFileId;
    try {
      await inTransaction(req, deps, async (ctx) => {
        await tenant.update({ logoFileId: fileId, logoContentType: kind.contentType }, { transaction: ctx.transaction });
        await recordAudit(ctx, { action: 'firm.logo_changed', subjectType: 'Tenant', subjectId: tenant.id, details: { bytes: file.size } });
      });
    } catch (e) {
      await deps.files.remove(tenant.id, fileId);
      throw e;
    }
    if (old) await deps.files.remove(tenant.id, old).catch(() => undefined);
    res.status(201).json({ data: presentTenant(tenant, { audience: 'staff', now: nowOf(deps) }) });
  });

  router.delete('/firm/logo', async (req, res) => {
    const tenant = await loadFirm(req.ctx.tenantId!);
    authorizeRecord(req, 'update', 'Tenant', { id: tenant.id }, 'firm');
    const old = tenant.logoFileId;
    await inTransaction(req, deps, async (ctx) => {
      await tenant.update({ logoFileId: null, logoContentType: null }, { transaction: ctx.transaction });
      await recordAudit(ctx, { action: 'firm.logo_removed', subjectType: 'Tenant', subjectId: tenant.id });
    });
    if (old) await deps.files.remove(tenant.id, old).catch(() => undefined);
    res.status(204).end();
  });

  router.get('/firm/logo', async (req, res) => {
    const tenant = await loadFirm(req.ctx.tenantId!);
    authorizeRecord(req, 'read', 'Tenant', { id: tenant.id }, 'firm');
    if (!tenant.logoFileId || !tenant.logoContentType) throw errors.notFound('logo');
    await sendStoredFile(res, deps.files, { tenantId: tenant.id, fileId: tenant.logoFileId, contentType: tenant.logoContentType, what: 'logo', caching: 'private-hour' });
  });

  return router;
}
