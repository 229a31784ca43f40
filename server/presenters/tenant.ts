import { readableAccent } from '@domain/colour';
import { trialDaysLeft } from '@domain/tenant-states';
import type { Tenant } from '../models/Tenant';
import { readOnlyOf } from './billing';

/** The firm as its own people see it. `audience: 'client'` keeps only branding and contact. */
export function presentTenant(tenant: Tenant, { audience, now = new Date() }: { audience: 'staff' | 'client'; now?: Date }) {
  const branding = {
    id: tenant.id,
    name: tenant.name,
    shortName: tenant.shortName,
    accentColor: tenant.accentColor,
    accentColorReadable: readableAccent(tenant.accentColor),
    logoUrl: tenant.logoFileId ? `/api/firm/logo?v=${encodeURIComponent(tenant.logoFileId.slice(0, 8))}` : null,
    phone: tenant.phone ?? '',
    monitoringCenterName: tenant.monitoringCenterName,
    monitoringCenterPhone: tenant.monitoringCenterPhone,
    timeZone: tenant.timeZone,
  };
  if (audience === 'client') return branding;
  return {
    ...branding,
    licenceNumber: tenant.licenceNumber,
    state: tenant.state,
    planKey: tenant.planKey,
    trialEndsAt: tenant.trialEndsAt?.toISOString() ?? null,
    trialDaysLeft: tenant.state === 'trialing' && tenant.trialEndsAt ? trialDaysLeft(tenant.trialEndsAt, now) : null,
    /** why the firm may only read right now (trial over, past due beyond grace, cancelled), or null */
    readOnly: readOnlyOf(tenant, now),
    createdAt: tenant.createdAt.toISOString(),
  };
}
