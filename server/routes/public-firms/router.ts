import { Router } from 'express';
import { z } from 'zod';
import { readableAccent } from '@domain/colour';
import { SHORT_NAME_PATTERN } from '@domain/short-name';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Tenant } from '../../models/Tenant';
import { sendStoredFile } from '../send-stored-file';

const shortNameParams = z.object({
  shortName: z.string().trim().toLowerCase().max(60).regex(SHORT_NAME_PATTERN, 'A portal address uses lowercase letters, digits and hyphens.'),
});

/** The address of a firm's logo on its public portal pages; `v` changes with the logo. */
export function publicLogoUrl(tenant: Pick<Tenant, 'shortName' | 'logoFileId'>): string | null {
  return tenant.logoFileId ? `/api/public/firms/${tenant.shortName}/logo?v=${encodeURIComponent(tenant.logoFileId.slice(0, 8))}` : null;
}

/** What a firm's portal sign-in page shows before anyone signs in: name, colour, logo, phone. */
export function presentPublicFirm(tenant: Tenant) {
  return {
    name: tenant.name,
    shortName: tenant.shortName,
    accentColor: tenant.accentColor,
    accentColorReadable: readableAccent(tenant.accentColor),
    logoUrl: publicLogoUrl(tenant),
    phone: tenant.phone ?? '',
    monitoringCenterPhone: tenant.monitoringCenterPhone,
  };
}

/**
 * Public branding of a firm's portal, found by its short name (the portal's address,
 * /p/:shortName). Only what the firm shows on its sign-in page; a suspended firm's portal
 * is not offered.
 */
export function publicFirmsRouter(deps: AppDeps): Router {
  const router = Router();

  async function findFirm(shortName: string): Promise<Tenant> {
    const tenant = await Tenant.findOne({ where: { shortName } });
    if (!tenant || tenant.state === 'suspended') throw errors.notFound('portal');
    return tenant;
  }

  router.get('/public/firms/:shortName', validate({ params: shortNameParams }), async (req, res) => {
    const { params } = inputOf(req, { params: shortNameParams });
    res.set('Cache-Control', 'public, max-age=300');
    res.json({ data: presentPublicFirm(await findFirm(params.shortName)) });
  });

  router.get('/public/firms/:shortName/logo', validate({ params: shortNameParams }), async (req, res) => {
    const { params } = inputOf(req, { params: shortNameParams });
    const tenant = await findFirm(params.shortName);
    if (!tenant.logoFileId || !tenant.logoContentType) throw errors.notFound('logo');
    await sendStoredFile(res, deps.files, { tenantId: tenant.id, fileId: tenant.logoFileId, contentType: tenant.logoContentType, what: 'logo', caching: 'public-day' });
  });

  return router;
}
