/**
 * What a zone may point at on the premises: a room or an opening of the zone's own site, and
 * a pin on a floor of that site. Lookups are scoped to the firm AND the site, so an id of
 * another site or another firm reads exactly like an id that does not exist (400 naming the
 * field; never a hint that the record is elsewhere).
 */
import { Op } from 'sequelize';
import { type Ctx, scoped } from '../context';
import { errors } from '../errors';
import { Floor } from '../models/Floor';
import { Opening } from '../models/Opening';
import { Room } from '../models/Room';

/** The zone fields that link it to the premises. */
export interface PremisesLinks {
  roomId?: string | null | undefined;
  openingId?: string | null | undefined;
}

const NO_ROOM = 'Choose a room of this site.';
const NO_OPENING = 'Choose a door or window of this site.';
const NO_FLOOR = 'Choose a floor of this site.';

/** A room of this site, or null. */
export async function roomOfSite(ctx: Ctx, siteId: string, roomId: string): Promise<Room | null> {
  return Room.findOne({ where: scoped(ctx, { id: roomId, siteId }), transaction: ctx.transaction ?? null });
}

/** An opening of this site, or null. */
export async function openingOfSite(ctx: Ctx, siteId: string, openingId: string): Promise<Opening | null> {
  return Opening.findOne({ where: scoped(ctx, { id: openingId, siteId }), transaction: ctx.transaction ?? null });
}

/** A floor of this site, or a 400 naming `field` (the pin's or a moved room's `floorId`). */
export async function floorOfSiteOrRefuse(ctx: Ctx, siteId: string, floorId: string, field = 'floorId'): Promise<Floor> {
  const floor = await Floor.findOne({ where: scoped(ctx, { id: floorId, siteId }), transaction: ctx.transaction ?? null });
  if (!floor) throw errors.validation(`${field}: ${NO_FLOOR}`, { [field]: NO_FLOOR });
  return floor;
}

/**
 * Checks the premises links a zone write sends (only the ids given and not null are looked
 * up) against the zone's site, and completes them: an opening given without a room puts the
 * zone in the opening's room. Returns the links to write (fields not sent stay undefined).
 * 400 naming `roomId` / `openingId` when an id is not a room / opening of this site.
 */
export async function resolvePremisesLinks(ctx: Ctx, siteId: string, links: PremisesLinks): Promise<PremisesLinks> {
  const fields: Record<string, string> = {};
  const out: PremisesLinks = { ...links };
  if (links.roomId) {
    const room = await roomOfSite(ctx, siteId, links.roomId);
    if (!room) fields.roomId = NO_ROOM;
  }
  if (links.openingId) {
    const opening = await openingOfSite(ctx, siteId, links.openingId);
    if (!opening) fields.openingId = NO_OPENING;
    else if (!links.roomId) out.roomId = opening.roomId;
  }
  const first = Object.entries(fields)[0];
  if (first) throw errors.validation(`${first[0]}: ${first[1]}`, fields);
  return out;
}

/** "Room · Opening" (or the room alone) for each zone linked to the premises. */
export async function zoneLocations(ctx: Ctx, zones: readonly { id: string; roomId: string | null; openingId: string | null }[]): Promise<Map<string, string>> {
  const roomIds = [...new Set(zones.map((z) => z.roomId).filter((id): id is string => !!id))];
  const openingIds = [...new Set(zones.map((z) => z.openingId).filter((id): id is string => !!id))];
  const rooms = roomIds.length ? await Room.findAll({ where: scoped(ctx, { id: { [Op.in]: roomIds } }) }) : [];
  const openings = openingIds.length ? await Opening.findAll({ where: scoped(ctx, { id: { [Op.in]: openingIds } }) }) : [];
  const roomName = new Map(rooms.map((r) => [r.id, r.name]));
  const openingLabel = new Map(openings.map((o) => [o.id, o.label]));
  const out = new Map<string, string>();
  for (const z of zones) {
    const parts = [z.roomId ? roomName.get(z.roomId) : undefined, z.openingId ? openingLabel.get(z.openingId) : undefined].filter((p): p is string => !!p);
    if (parts.length) out.set(z.id, parts.join(' · '));
  }
  return out;
}
