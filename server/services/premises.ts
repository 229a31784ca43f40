/**
 * The premises of a site (api-resources.md, "Premises"): floors, their rooms, the rooms'
 * openings, a floor-plan image per floor, and the zones' pins on those plans. Each write runs
 * inside the caller's transaction and writes an audit event in it.
 *
 * Deleting a floor or a room deletes what is inside it (the database cascades floors → rooms →
 * openings) and, in the same transaction, unlinks the zones that pointed at what is gone
 * (roomId, openingId, and the pin of a deleted floor set to null), each unlinking written to
 * the zone change log. Removing or replacing a floor's image keeps the pins: they are
 * fractions of the image, not pixels.
 */
import { LIMITS } from '@domain/limits';
import { Op, type WhereOptions } from 'sequelize';
import { type floorPatchSchema, type floorSchema, type openingPatchSchema, type openingSchema, type pinSchema, type roomPatchSchema, type roomSchema } from '@domain/schemas/premises';
import { zoneChangeSet } from '@domain/zones';
import { canServeSleepingArea } from '@domain/coverage';
import { ROOM_KIND_LABELS, type RoomKind } from '@domain/premises';
import type { z } from 'zod';
import { type Ctx, scoped } from '../context';
import { errors } from '../errors';
import { Floor } from '../models/Floor';
import { Opening } from '../models/Opening';
import { Panel } from '../models/Panel';
import { Room } from '../models/Room';
import type { Site } from '../models/Site';
import { Zone } from '../models/Zone';
import { recordAudit } from './audit-recorder';
import { floorOfSiteOrRefuse } from './premises-links';
import { ZONE_LOGGED_FIELDS, definedOnly, logZoneChange, zoneValuesOf } from './zones';

export type FloorInput = z.output<typeof floorSchema>;
export type FloorPatch = z.output<typeof floorPatchSchema>;
export type RoomInput = z.output<typeof roomSchema>;
export type RoomPatch = z.output<typeof roomPatchSchema>;
export type OpeningInput = z.output<typeof openingSchema>;
export type OpeningPatch = z.output<typeof openingPatchSchema>;
export type PinInput = z.output<typeof pinSchema>;

/** The largest floor-plan image accepted (5 MB). */
export const FLOOR_PLAN_MAX_BYTES = LIMITS.floorPlanMaxBytes;

const tx = (ctx: Ctx) => ({ transaction: ctx.transaction ?? null });

/** The keys of a patch whose value differs from the record's. */
function changedKeys(before: Record<string, unknown>, patch: Record<string, unknown>): string[] {
  return Object.keys(patch).filter((key) => before[key] !== patch[key]);
}

// ---------------------------------------------------------------------------------------------
// Reading
// ---------------------------------------------------------------------------------------------

/** A site's floors, lowest level first. */
export async function siteFloors(ctx: Ctx, siteId: string): Promise<Floor[]> {
  return Floor.findAll({
    where: scoped(ctx, { siteId }),
    order: [
      ['level', 'ASC'],
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
    ...tx(ctx),
  });
}

export interface SitePremises {
  floors: Floor[];
  rooms: Room[];
  openings: Opening[];
  zones: Zone[];
  panels: Panel[];
}

/**
 * Everything on a site's premises in a handful of queries: floors by level, rooms and
 * openings in the order they were added, and every zone of every panel of the site.
 */
export async function sitePremises(ctx: Ctx, siteId: string): Promise<SitePremises> {
  const byPosition = [
    ['position', 'ASC'],
    ['createdAt', 'ASC'],
    ['id', 'ASC'],
  ] as [string, string][];
  const [floors, rooms, openings, zones, panels] = await Promise.all([
    siteFloors(ctx, siteId),
    Room.findAll({ where: scoped(ctx, { siteId }), order: byPosition, ...tx(ctx) }),
    Opening.findAll({ where: scoped(ctx, { siteId }), order: byPosition, ...tx(ctx) }),
    Zone.findAll({
      where: scoped(ctx, { siteId }),
      order: [
        ['panelId', 'ASC'],
        ['number', 'ASC'],
        ['id', 'ASC'],
      ],
      ...tx(ctx),
    }),
    Panel.findAll({ where: scoped(ctx, { siteId }), order: [['label', 'ASC']], ...tx(ctx) }),
  ]);
  return { floors, rooms, openings, zones, panels };
}

// ---------------------------------------------------------------------------------------------
// Unlinking zones from what is deleted
// ---------------------------------------------------------------------------------------------

interface Gone {
  siteId: string;
  roomIds: string[];
  openingIds: string[];
  /** a deleted floor: pins on it go too */
  floorId?: string;
}

/**
 * Sets to null the premises links of the site's zones that point at deleted rooms, openings
 * or a deleted floor (its pins). Room and opening changes go to the zone change log (they
 * change nothing programmed on the panel). Returns how many zones changed.
 */
async function unlinkZones(ctx: Ctx, gone: Gone): Promise<number> {
  const pointing: WhereOptions[] = [];
  if (gone.roomIds.length > 0) pointing.push({ roomId: { [Op.in]: gone.roomIds } });
  if (gone.openingIds.length > 0) pointing.push({ openingId: { [Op.in]: gone.openingIds } });
  if (gone.floorId) pointing.push({ pinFloorId: gone.floorId });
  if (pointing.length === 0) return 0;
  const zones = await Zone.findAll({ where: { [Op.and]: [scoped(ctx, { siteId: gone.siteId }), { [Op.or]: pointing }] }, ...tx(ctx) });
  if (zones.length === 0) return 0;
  const panels = await Panel.findAll({ where: scoped(ctx, { id: { [Op.in]: [...new Set(zones.map((z) => z.panelId))] } }), ...tx(ctx) });
  const panelById = new Map(panels.map((p) => [p.id, p]));
  for (const zone of zones) {
    const before = zoneValuesOf(zone);
    const links = {
      roomId: zone.roomId && gone.roomIds.includes(zone.roomId) ? null : zone.roomId,
      openingId: zone.openingId && gone.openingIds.includes(zone.openingId) ? null : zone.openingId,
    };
    const pinGone = Boolean(gone.floorId && zone.pinFloorId === gone.floorId);
    await zone.update({ ...links, ...(pinGone ? { pinFloorId: null, pinX: null, pinY: null } : {}) }, tx(ctx));
    const changes = zoneChangeSet(before, { ...before, ...links }, ZONE_LOGGED_FIELDS);
    const panel = panelById.get(zone.panelId);
    if (panel && Object.keys(changes).length > 0) {
      await logZoneChange(ctx, panel, { zoneId: zone.id, zoneNumber: zone.number, action: 'updated', changes, marksPanel: false });
    }
  }
  return zones.length;
}

/** The position after the last room on a floor (rooms list in the order they were added). */
async function nextRoomPosition(ctx: Ctx, floorId: string): Promise<number> {
  const last = await Room.findOne({ where: scoped(ctx, { floorId }), order: [['position', 'DESC']], attributes: ['id', 'position'], ...tx(ctx) });
  return last ? last.position + 1 : 0;
}

/** The position after the last opening of a room. */
async function nextOpeningPosition(ctx: Ctx, roomId: string): Promise<number> {
  const last = await Opening.findOne({ where: scoped(ctx, { roomId }), order: [['position', 'DESC']], attributes: ['id', 'position'], ...tx(ctx) });
  return last ? last.position + 1 : 0;
}

// ---------------------------------------------------------------------------------------------
// Floors
// ---------------------------------------------------------------------------------------------

export async function createFloor(ctx: Ctx, site: Site, input: FloorInput): Promise<Floor> {
  const floor = await Floor.create(
    { tenantId: scoped(ctx).tenantId, siteId: site.id, name: input.name, level: input.level, belowGrade: input.belowGrade },
    tx(ctx),
  );
  await recordAudit(ctx, { action: 'floor.created', subjectType: 'Floor', subjectId: floor.id, details: { siteId: site.id, name: floor.name, level: floor.level } });
  return floor;
}

export async function updateFloor(ctx: Ctx, floor: Floor, patch: FloorPatch): Promise<Floor> {
  const values = definedOnly(patch);
  const changed = changedKeys(floor.get({ plain: true }), values);
  if (changed.length === 0) return floor;
  await floor.update(values, tx(ctx));
  await recordAudit(ctx, { action: 'floor.updated', subjectType: 'Floor', subjectId: floor.id, details: { siteId: floor.siteId, changed } });
  return floor;
}

/**
 * Deletes a floor with its rooms and openings and unlinks the zones that pointed at them.
 * Returns the floor's plan image file id (null when none) for the caller to remove after the
 * transaction commits.
 */
export async function deleteFloor(ctx: Ctx, floor: Floor): Promise<string | null> {
  const rooms = await Room.findAll({ where: scoped(ctx, { floorId: floor.id }), attributes: ['id'], ...tx(ctx) });
  const roomIds = rooms.map((r) => r.id);
  const openings = roomIds.length
    ? await Opening.findAll({ where: scoped(ctx, { roomId: { [Op.in]: roomIds } }), attributes: ['id'], ...tx(ctx) })
    : [];
  const openingIds = openings.map((o) => o.id);
  const zonesUnlinked = await unlinkZones(ctx, { siteId: floor.siteId, roomIds, openingIds, floorId: floor.id });
  await unlinkRooms(ctx, floor.siteId, { halls: roomIds, bedrooms: roomIds });
  const planImageId = floor.planImageId ?? null;
  await floor.destroy(tx(ctx));
  await recordAudit(ctx, {
    action: 'floor.deleted',
    subjectType: 'Floor',
    subjectId: floor.id,
    details: { siteId: floor.siteId, name: floor.name, rooms: roomIds.length, openings: openingIds.length, zonesUnlinked, planImage: Boolean(planImageId) },
  });
  return planImageId;
}

/**
 * Records an image already stored by the caller as the floor's plan (the pins stay: they are
 * fractions). The floor is read again inside the transaction, so a floor deleted meanwhile is
 * a 404 and the caller removes the stored file. Returns the floor and the file id of the image
 * it replaces (for the caller to remove after the commit).
 */
export async function setFloorPlan(
  ctx: Ctx,
  floorId: string,
  image: { fileId: string; contentType: string; bytes: number },
): Promise<{ floor: Floor; replaced: string | null }> {
  const floor = await Floor.findOne({ where: scoped(ctx, { id: floorId }), ...tx(ctx) });
  if (!floor) throw errors.notFound('floor');
  const replaced = floor.planImageId ?? null;
  await floor.update({ planImageId: image.fileId, planImageContentType: image.contentType }, tx(ctx));
  await recordAudit(ctx, {
    action: replaced ? 'floor.plan_replaced' : 'floor.plan_added',
    subjectType: 'Floor',
    subjectId: floor.id,
    details: { siteId: floor.siteId, contentType: image.contentType, bytes: image.bytes },
  });
  return { floor, replaced };
}

/** Removes the floor's plan image (the pins stay); returns the removed file id, or null when there was none. */
export async function removeFloorPlan(ctx: Ctx, floor: Floor): Promise<string | null> {
  const old = floor.planImageId ?? null;
  if (!old) return null;
  await floor.update({ planImageId: null, planImageContentType: null }, tx(ctx));
  await recordAudit(ctx, { action: 'floor.plan_removed', subjectType: 'Floor', subjectId: floor.id, details: { siteId: floor.siteId } });
  return old;
}

// ---------------------------------------------------------------------------------------------
// Rooms
// ---------------------------------------------------------------------------------------------

const GARAGE_ONLY = 'Only a garage can be an attached garage.';
const BEDROOM_ONLY = 'Only a bedroom is served by a hall or landing.';
const BATH_ONLY = 'Only a bathroom can be attached to a bedroom.';

/** The links of a room to other rooms, as they will be after a create or a change. */
interface RoomLinks {
  servedByHallId: string | null;
  hallWithin21FtConfirmed: boolean;
  attachedToBedroomId: string | null;
}

/** Another room of the same site, or a 400 naming the field. */
async function otherRoomOfSite(ctx: Ctx, siteId: string, selfId: string | null, roomId: string, field: string): Promise<Room> {
  const other = await Room.findOne({ where: scoped(ctx, { id: roomId, siteId }), attributes: ['id', 'kind', 'name'], ...tx(ctx) });
  if (!other || other.id === selfId) {
    const message = other ? 'A room cannot point at itself.' : 'Choose a room of this site.';
    throw errors.validation(`${field}: ${message}`, { [field]: message });
  }
  return other;
}

/**
 * Checks a room's links to other rooms: only a bedroom names the hall serving its sleeping area,
 * and that hall is a room people pass through to the bedrooms (not a kitchen, bathroom, garage,
 * utility room or another bedroom); only a bathroom is attached to a bedroom, and that room is
 * a bedroom. Each refusal is a 400 naming the field. The 21 ft confirmation goes with the hall:
 * without a hall it is false.
 */
async function checkRoomLinks(ctx: Ctx, siteId: string, selfId: string | null, kind: RoomKind, links: RoomLinks): Promise<RoomLinks> {
  if (links.servedByHallId !== null) {
    if (kind !== 'bedroom') throw errors.validation(`servedByHallId: ${BEDROOM_ONLY}`, { servedByHallId: BEDROOM_ONLY });
    const hall = await otherRoomOfSite(ctx, siteId, selfId, links.servedByHallId, 'servedByHallId');
    if (!canServeSleepingArea(hall.kind)) {
      const message = `${hall.name} is a ${ROOM_KIND_LABELS[hall.kind].toLowerCase()}; an alarm there does not stand in for one by the bedrooms. Choose the hall or landing outside them.`;
      throw errors.validation(`servedByHallId: ${message}`, { servedByHallId: message });
    }
  }
  if (links.attachedToBedroomId !== null) {
    if (kind !== 'bath') throw errors.validation(`attachedToBedroomId: ${BATH_ONLY}`, { attachedToBedroomId: BATH_ONLY });
    const bedroom = await otherRoomOfSite(ctx, siteId, selfId, links.attachedToBedroomId, 'attachedToBedroomId');
    if (bedroom.kind !== 'bedroom') {
      const message = `${bedroom.name} is not a bedroom. Choose the bedroom this bathroom opens into.`;
      throw errors.validation(`attachedToBedroomId: ${message}`, { attachedToBedroomId: message });
    }
  }
  return { ...links, hallWithin21FtConfirmed: links.servedByHallId !== null && links.hallWithin21FtConfirmed };
}

/**
 * Clears the links other rooms of the site hold to rooms that are gone or can no longer serve:
 * bedrooms served by them lose their hall (and its 21 ft confirmation), bathrooms attached to
 * them are no longer attached.
 */
async function unlinkRooms(ctx: Ctx, siteId: string, gone: { halls: string[]; bedrooms: string[] }): Promise<void> {
  if (gone.halls.length > 0) {
    await Room.update({ servedByHallId: null, hallWithin21FtConfirmed: false }, { where: scoped(ctx, { siteId, servedByHallId: { [Op.in]: gone.halls } }), ...tx(ctx) });
  }
  if (gone.bedrooms.length > 0) {
    await Room.update({ attachedToBedroomId: null }, { where: scoped(ctx, { siteId, attachedToBedroomId: { [Op.in]: gone.bedrooms } }), ...tx(ctx) });
  }
}

export async function createRoom(ctx: Ctx, floor: Floor, input: RoomInput): Promise<Room> {
  if (input.attachedGarage && input.kind !== 'garage') throw errors.validation(`attachedGarage: ${GARAGE_ONLY}`, { attachedGarage: GARAGE_ONLY });
  const links = await checkRoomLinks(ctx, floor.siteId, null, input.kind, {
    servedByHallId: input.servedByHallId,
    hallWithin21FtConfirmed: input.hallWithin21FtConfirmed,
    attachedToBedroomId: input.attachedToBedroomId,
  });
  const room = await Room.create(
    {
      tenantId: scoped(ctx).tenantId,
      siteId: floor.siteId,
      floorId: floor.id,
      name: input.name,
      kind: input.kind,
      fuelBurningAppliance: input.fuelBurningAppliance,
      attachedGarage: input.attachedGarage,
      ...links,
      position: await nextRoomPosition(ctx, floor.id),
    },
    tx(ctx),
  );
  await recordAudit(ctx, { action: 'room.created', subjectType: 'Room', subjectId: room.id, details: { siteId: room.siteId, floorId: floor.id, name: room.name, kind: room.kind } });
  return room;
}

/**
 * Changes a room; `floorId` moves it (with its openings) to another floor of the same site —
 * any other floor id is a 400 naming `floorId`. A room that stops being a garage stops being
 * an attached garage; one that stops being a bedroom loses its hall (and its bathrooms their
 * link to it); one that can no longer serve a sleeping area stops serving one.
 */
export async function updateRoom(ctx: Ctx, room: Room, patch: RoomPatch): Promise<Room> {
  const values: Partial<RoomPatch> & { position?: number } = definedOnly(patch);
  const kind = values.kind ?? room.kind;
  if (kind !== 'garage') {
    if (values.attachedGarage) throw errors.validation(`attachedGarage: ${GARAGE_ONLY}`, { attachedGarage: GARAGE_ONLY });
    if (room.attachedGarage) values.attachedGarage = false;
  }
  const current: RoomLinks = {
    servedByHallId: room.servedByHallId ?? null,
    hallWithin21FtConfirmed: Boolean(room.hallWithin21FtConfirmed),
    attachedToBedroomId: room.attachedToBedroomId ?? null,
  };
  const hallChanged = values.servedByHallId !== undefined && values.servedByHallId !== current.servedByHallId;
  const wanted: RoomLinks = {
    // links the new kind cannot have fall away unless the patch sets them (then they are refused)
    servedByHallId: values.servedByHallId !== undefined ? values.servedByHallId : kind === 'bedroom' ? current.servedByHallId : null,
    // a new hall needs its own confirmation
    hallWithin21FtConfirmed: values.hallWithin21FtConfirmed ?? (hallChanged ? false : current.hallWithin21FtConfirmed),
    attachedToBedroomId: values.attachedToBedroomId !== undefined ? values.attachedToBedroomId : kind === 'bath' ? current.attachedToBedroomId : null,
  };
  Object.assign(values, await checkRoomLinks(ctx, room.siteId, room.id, kind, wanted));
  if (values.floorId !== undefined && values.floorId !== room.floorId) {
    const floor = await floorOfSiteOrRefuse(ctx, room.siteId, values.floorId);
    values.position = await nextRoomPosition(ctx, floor.id);
  }
  const changed = changedKeys(room.get({ plain: true }), values).filter((key) => key !== 'position');
  if (changed.length === 0) return room;
  await room.update(values, tx(ctx));
  await unlinkRooms(ctx, room.siteId, {
    halls: canServeSleepingArea(kind) ? [] : [room.id],
    bedrooms: kind === 'bedroom' ? [] : [room.id],
  });
  await recordAudit(ctx, { action: 'room.updated', subjectType: 'Room', subjectId: room.id, details: { siteId: room.siteId, changed } });
  return room;
}

/** Deletes a room with its openings and unlinks the zones and rooms that pointed at them. */
export async function deleteRoom(ctx: Ctx, room: Room): Promise<void> {
  const openings = await Opening.findAll({ where: scoped(ctx, { roomId: room.id }), attributes: ['id'], ...tx(ctx) });
  const openingIds = openings.map((o) => o.id);
  const zonesUnlinked = await unlinkZones(ctx, { siteId: room.siteId, roomIds: [room.id], openingIds });
  await unlinkRooms(ctx, room.siteId, { halls: [room.id], bedrooms: [room.id] });
  await room.destroy(tx(ctx));
  await recordAudit(ctx, {
    action: 'room.deleted',
    subjectType: 'Room',
    subjectId: room.id,
    details: { siteId: room.siteId, floorId: room.floorId, name: room.name, openings: openingIds.length, zonesUnlinked },
  });
}

// ---------------------------------------------------------------------------------------------
// Openings
// ---------------------------------------------------------------------------------------------

export async function createOpening(ctx: Ctx, room: Room, input: OpeningInput): Promise<Opening> {
  const opening = await Opening.create(
    {
      tenantId: scoped(ctx).tenantId,
      siteId: room.siteId,
      roomId: room.id,
      kind: input.kind,
      label: input.label,
      groundReachable: input.groundReachable,
      position: await nextOpeningPosition(ctx, room.id),
    },
    tx(ctx),
  );
  await recordAudit(ctx, {
    action: 'opening.created',
    subjectType: 'Opening',
    subjectId: opening.id,
    details: { siteId: opening.siteId, roomId: room.id, kind: opening.kind, label: opening.label },
  });
  return opening;
}

export async function updateOpening(ctx: Ctx, opening: Opening, patch: OpeningPatch): Promise<Opening> {
  const values = definedOnly(patch);
  const changed = changedKeys(opening.get({ plain: true }), values);
  if (changed.length === 0) return opening;
  await opening.update(values, tx(ctx));
  await recordAudit(ctx, { action: 'opening.updated', subjectType: 'Opening', subjectId: opening.id, details: { siteId: opening.siteId, changed } });
  return opening;
}

/** Deletes an opening and unlinks the zones that pointed at it (their room stays). */
export async function deleteOpening(ctx: Ctx, opening: Opening): Promise<void> {
  const zonesUnlinked = await unlinkZones(ctx, { siteId: opening.siteId, roomIds: [], openingIds: [opening.id] });
  await opening.destroy(tx(ctx));
  await recordAudit(ctx, {
    action: 'opening.deleted',
    subjectType: 'Opening',
    subjectId: opening.id,
    details: { siteId: opening.siteId, roomId: opening.roomId, label: opening.label, zonesUnlinked },
  });
}

// ---------------------------------------------------------------------------------------------
// Pins
// ---------------------------------------------------------------------------------------------

async function reloadZone(ctx: Ctx, zoneId: string): Promise<Zone> {
  const zone = await Zone.findOne({ where: scoped(ctx, { id: zoneId }), ...tx(ctx) });
  if (!zone) throw errors.notFound('zone');
  return zone;
}

/** Places (or moves) a zone's pin on a floor of the zone's own site (else 400 naming `floorId`). */
export async function setZonePin(ctx: Ctx, zoneId: string, pin: PinInput): Promise<Zone> {
  const zone = await reloadZone(ctx, zoneId);
  const floor = await floorOfSiteOrRefuse(ctx, zone.siteId, pin.floorId);
  await zone.update({ pinFloorId: floor.id, pinX: pin.x, pinY: pin.y }, tx(ctx));
  await recordAudit(ctx, { action: 'zone.pin_set', subjectType: 'Zone', subjectId: zone.id, details: { floorId: floor.id, x: pin.x, y: pin.y } });
  return zone;
}

/** Takes a zone's pin off the floor plan (nothing written when it had none). */
export async function clearZonePin(ctx: Ctx, zoneId: string): Promise<Zone> {
  const zone = await reloadZone(ctx, zoneId);
  if (!zone.pinFloorId && zone.pinX === null && zone.pinY === null) return zone;
  const floorId = zone.pinFloorId;
  await zone.update({ pinFloorId: null, pinX: null, pinY: null }, tx(ctx));
  await recordAudit(ctx, { action: 'zone.pin_cleared', subjectType: 'Zone', subjectId: zone.id, details: { floorId } });
  return zone;
}
