import type { SitePatch, SiteValues } from '@domain/schemas/site';
import { scoped, type Ctx } from '../context';
import type { SecretBox } from '../crypto/secret-box';
import { errors, HttpError } from '../errors';
import { Client } from '../models/Client';
import { Document } from '../models/Document';
import { Floor } from '../models/Floor';
import { Site } from '../models/Site';
import { recordAudit } from './audit-recorder';
import { assertWithinPlan } from './plan-limits';

type SiteColumn = keyof ReturnType<Site['get']>;

/** API field paths (api-resources.md) → columns of the sites table. */
const TOP_LEVEL = { name: 'name', timeZone: 'timeZone', latitude: 'latitude', longitude: 'longitude', monitoringAccount: 'monitoringAccount', accessNotes: 'accessNotes' } as const;
const NESTED = {
  address: { line1: 'addressLine1', line2: 'addressLine2', city: 'city', region: 'region', postalCode: 'postalCode', country: 'country' },
  permit: { number: 'permitNumber', authority: 'permitAuthority', expiresOn: 'permitExpiresOn' },
  contract: { startsOn: 'contractStartsOn', termMonths: 'contractTermMonths', monthlyFeeCents: 'contractMonthlyFeeCents', cancelledOn: 'contractCancelledOn', cancelReason: 'contractCancelReason' },
} as const;

/** The columns a site patch sets, each with its API path (for the audit's list of changed fields). */
function columnsOf(input: SitePatch): { column: SiteColumn; path: string; value: unknown }[] {
  const out: { column: SiteColumn; path: string; value: unknown }[] = [];
  for (const [field, column] of Object.entries(TOP_LEVEL)) {
    const value = input[field as keyof typeof TOP_LEVEL];
    if (value !== undefined) out.push({ column: column as SiteColumn, path: field, value });
  }
  for (const [group, map] of Object.entries(NESTED)) {
    const values = input[group as keyof typeof NESTED] as Record<string, unknown> | undefined;
    if (!values) continue;
    for (const [field, column] of Object.entries(map)) {
      if (values[field] !== undefined) out.push({ column: column as SiteColumn, path: `${group}.${field}`, value: values[field] });
    }
  }
  return out;
}

/** The client a new site belongs to must be in the same firm; anything else is a bad clientId (never "another firm's"). */
export async function requireClientOfFirm(ctx: Ctx, clientId: string): Promise<Client> {
  const client = await Client.findOne({ where: scoped(ctx, { id: clientId }), transaction: ctx.transaction });
  if (!client) throw errors.validation('clientId: choose one of your firm’s clients.', { clientId: 'No such client in your firm.' });
  return client;
}

function checkContractDates(site: Site): void {
  if (site.contractCancelledOn && site.contractStartsOn && site.contractCancelledOn < site.contractStartsOn) {
    throw errors.validation('contract.cancelledOn: the contract cannot be cancelled before it starts.', {
      'contract.cancelledOn': 'The contract cannot be cancelled before it starts.',
    });
  }
}

/** Whether `sealed` already holds this passcode (a re-sent form changes nothing). */
function sealsSame(secrets: SecretBox, sealed: string | null | undefined, passcode: string): boolean {
  if (!sealed) return false;
  try {
    return secrets.open(sealed) === passcode;
  } catch {
    return false;
  }
}

/** Creates a site for one of the firm's clients; a passcode given is sealed before it is stored. */
export async function createSite(ctx: Ctx, input: SiteValues, secrets: SecretBox, now: Date = new Date()): Promise<Site> {
  const client = await requireClientOfFirm(ctx, input.clientId);
  // A cancelled client's sites do not count against the plan, so adding one needs no room.
  if (client.status !== 'cancelled') await assertWithinPlan(ctx, 'site', now);
  const site = await Site.create(
    {
      tenantId: scoped(ctx).tenantId,
      clientId: input.clientId,
      name: input.name,
      addressLine1: input.address.line1,
      addressLine2: input.address.line2,
      city: input.address.city,
      region: input.address.region,
      postalCode: input.address.postalCode,
      country: input.address.country,
      timeZone: input.timeZone,
      latitude: input.latitude,
      longitude: input.longitude,
      monitoringAccount: input.monitoringAccount,
      accessNotes: input.accessNotes,
      permitNumber: input.permit.number,
      permitAuthority: input.permit.authority,
      permitExpiresOn: input.permit.expiresOn,
      contractStartsOn: input.contract.startsOn,
      contractTermMonths: input.contract.termMonths,
      contractMonthlyFeeCents: input.contract.monthlyFeeCents,
      contractCancelledOn: input.contract.cancelledOn,
      contractCancelReason: input.contract.cancelReason,
      passcodeCipher: input.passcode ? secrets.seal(input.passcode) : null,
    },
    { transaction: ctx.transaction },
  );
  await recordAudit(ctx, { action: 'site.created', subjectType: 'Site', subjectId: site.id, details: { clientId: site.clientId } });
  if (input.passcode) await recordAudit(ctx, { action: 'site.passcode_changed', subjectType: 'Site', subjectId: site.id, details: { change: 'set' } });
  return site;
}

/**
 * Changes the fields sent. `passcode`: a string seals and stores it, null clears it; the
 * change is audited as `site.passcode_changed`, never with the value.
 */
export async function updateSite(ctx: Ctx, site: Site, patch: SitePatch, secrets: SecretBox): Promise<Site> {
  const changed: string[] = [];
  for (const { column, path, value } of columnsOf(patch)) {
    if (site.get(column) === value) continue;
    site.set(column, value as never);
    changed.push(path);
  }
  checkContractDates(site);
  let passcodeChange: 'set' | 'cleared' | null = null;
  if (patch.passcode === null && site.passcodeCipher) {
    site.passcodeCipher = null;
    passcodeChange = 'cleared';
  } else if (typeof patch.passcode === 'string' && !sealsSame(secrets, site.passcodeCipher, patch.passcode)) {
    site.passcodeCipher = secrets.seal(patch.passcode);
    passcodeChange = 'set';
  }
  if (changed.length === 0 && !passcodeChange) return site;
  await site.save({ transaction: ctx.transaction });
  if (changed.length > 0) await recordAudit(ctx, { action: 'site.updated', subjectType: 'Site', subjectId: site.id, details: { changed } });
  if (passcodeChange) await recordAudit(ctx, { action: 'site.passcode_changed', subjectType: 'Site', subjectId: site.id, details: { change: passcodeChange } });
  return site;
}

/**
 * Deletes a site with everything recorded for it (contacts, documents, panels, zones go with
 * it through the database's cascades). Returns the stored file ids of its documents, to be
 * removed once the transaction has committed.
 */
export async function deleteSite(ctx: Ctx, site: Site): Promise<string[]> {
  const documents = await Document.findAll({ where: scoped(ctx, { siteId: site.id }), attributes: ['fileId'], transaction: ctx.transaction });
  const plans = await Floor.findAll({ where: scoped(ctx, { siteId: site.id }), attributes: ['planImageId'], transaction: ctx.transaction });
  await site.destroy({ transaction: ctx.transaction });
  await recordAudit(ctx, { action: 'site.deleted', subjectType: 'Site', subjectId: site.id, details: { name: site.name, clientId: site.clientId, documents: documents.length } });
  // files to remove once the transaction commits: documents and floor-plan images
  return [...documents.map((d) => d.fileId), ...plans.map((f) => f.planImageId).filter((id): id is string => !!id)];
}

/** The site's passcode in clear, for a role allowed to reveal it; each reveal is an audit event. */
export async function revealPasscode(ctx: Ctx, site: Site, secrets: SecretBox): Promise<string> {
  if (!site.passcodeCipher) throw new HttpError(404, 'not_found', 'This site has no passcode on file. Set one on the site first.');
  const passcode = secrets.open(site.passcodeCipher);
  await recordAudit(ctx, { action: 'site.passcode_revealed', subjectType: 'Site', subjectId: site.id });
  return passcode;
}
