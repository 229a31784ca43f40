/**
 * What a household's e-mail shows of its firm: name, phone, colour and logo. The household
 * knows the firm, not Mullion, so its invitation and its password reset look like the firm.
 */
import { readableAccent } from '@domain/colour';
import type { Tenant } from '../models/Tenant';
import type { TenantFiles } from '../storage/tenant-files';

export interface FirmBrand {
  name: string;
  phone: string;
  /** the firm's accent colour, already darkened for white text */
  accent: string;
  logo: { content: Buffer; contentType: string } | null;
}

export async function firmBrandOf(tenant: Tenant, files: TenantFiles): Promise<FirmBrand> {
  const logo =
    tenant.logoFileId && tenant.logoContentType
      ? await files
          .read(tenant.id, tenant.logoFileId)
          .then((content) => ({ content, contentType: tenant.logoContentType! }))
          .catch(() => null)
      : null;
  return { name: tenant.name, phone: tenant.phone || tenant.monitoringCenterPhone, accent: readableAccent(tenant.accentColor), logo };
}
