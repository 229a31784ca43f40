import type { Site } from '../models/Site';
import type { Audience } from './client';

/**
 * A site (api-resources.md, "Site"). The passcode is never presented: only `hasPasscode`;
 * the value is read through the audited reveal route. The client audience also leaves out
 * the access notes, the monitoring contract and the monitoring account number.
 */
export function presentSite(site: Site, { audience, clientName }: { audience: Audience; clientName?: string }) {
  const base = {
    id: site.id,
    clientId: site.clientId,
    ...(clientName !== undefined ? { clientName } : {}),
    name: site.name,
    address: {
      line1: site.addressLine1,
      line2: site.addressLine2,
      city: site.city,
      region: site.region,
      postalCode: site.postalCode,
      country: site.country,
    },
    timeZone: site.timeZone,
    latitude: site.latitude ?? null,
    longitude: site.longitude ?? null,
    permit: {
      number: site.permitNumber,
      authority: site.permitAuthority,
      expiresOn: site.permitExpiresOn ?? null,
    },
    hasPasscode: !!site.passcodeCipher,
    createdAt: site.createdAt.toISOString(),
    updatedAt: site.updatedAt.toISOString(),
  };
  if (audience === 'client') return base;
  return {
    ...base,
    monitoringAccount: site.monitoringAccount,
    accessNotes: site.accessNotes,
    contract: {
      startsOn: site.contractStartsOn ?? null,
      termMonths: site.contractTermMonths ?? null,
      monthlyFeeCents: site.contractMonthlyFeeCents ?? null,
      cancelledOn: site.contractCancelledOn ?? null,
      cancelReason: site.contractCancelReason,
    },
  };
}
export type PresentedSite = ReturnType<typeof presentSite>;
