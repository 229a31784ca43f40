import type { z } from 'zod';
import type { clientPatchSchema, ClientValues } from '@domain/schemas/client';
import { scoped, type Ctx } from '../context';
import { errors } from '../errors';
import { Client } from '../models/Client';
import { Site } from '../models/Site';
import { recordAudit } from './audit-recorder';

export type ClientPatch = z.output<typeof clientPatchSchema>;

/** Creates a client record in the acting user's firm. */
export async function createClient(ctx: Ctx, input: ClientValues): Promise<Client> {
  const client = await Client.create({ ...input, tenantId: scoped(ctx).tenantId }, { transaction: ctx.transaction });
  await recordAudit(ctx, { action: 'client.created', subjectType: 'Client', subjectId: client.id });
  return client;
}

/** Changes the fields sent; the audit names the fields that changed (not their values). */
export async function updateClient(ctx: Ctx, client: Client, patch: ClientPatch): Promise<Client> {
  const changed = (Object.keys(patch) as (keyof ClientPatch)[]).filter((k) => patch[k] !== undefined && patch[k] !== client.get(k));
  if (changed.length === 0) return client;
  for (const key of changed) client.set(key, patch[key] as never);
  await client.save({ transaction: ctx.transaction });
  await recordAudit(ctx, { action: 'client.updated', subjectType: 'Client', subjectId: client.id, details: { changed } });
  return client;
}

/** Deletes a client without sites; a client with sites is refused (409) so no site is lost by accident. */
export async function deleteClient(ctx: Ctx, client: Client): Promise<void> {
  const sites = await Site.count({ where: scoped(ctx, { clientId: client.id }), transaction: ctx.transaction });
  if (sites > 0) {
    throw errors.conflict(
      `${client.name} still has ${sites} ${sites === 1 ? 'site' : 'sites'}. Delete the ${sites === 1 ? 'site' : 'sites'} first, or mark the client cancelled instead.`,
    );
  }
  await client.destroy({ transaction: ctx.transaction });
  await recordAudit(ctx, { action: 'client.deleted', subjectType: 'Client', subjectId: client.id, details: { name: client.name } });
}

/** How many sites each of these clients has (clients without sites are absent: read 0). */
export async function siteCountsOf(ctx: Ctx, clientIds: string[]): Promise<Map<string, number>> {
  const counts = new Map<string, number>();
  if (clientIds.length === 0) return counts;
  const rows = (await Site.count({
    where: scoped(ctx, { clientId: clientIds }),
    group: ['clientId'],
    transaction: ctx.transaction,
  })) as unknown as { clientId: string; count: number }[];
  for (const row of rows) counts.set(row.clientId, Number(row.count));
  return counts;
}
