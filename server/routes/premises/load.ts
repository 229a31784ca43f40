import type { Request } from 'express';
import { type Action } from '@domain/abilities';
import { scoped } from '../../context';
import { errors } from '../../errors';
import { Floor } from '../../models/Floor';
import { Opening } from '../../models/Opening';
import { Room } from '../../models/Room';
import { Site } from '../../models/Site';
import { authorizeRecord } from '../helpers';

/**
 * The premises of a site: 404 unless the user may read the site and its premises (a client
 * may read their own site but not these staff routes), 403 when they may read but not `action`.
 */
export function authorizeSitePremises(req: Request, site: Site, action: Action): void {
  const record = { tenantId: site.tenantId, siteId: site.id };
  authorizeRecord(req, 'read', 'Premises', record, 'site');
  if (action !== 'read') authorizeRecord(req, action, 'Premises', record, 'site');
}

/** A site of the user's firm whose premises they may read (404 otherwise), and may `action` (403 otherwise). */
export async function loadPremisesSite(req: Request, siteId: string, action: Action = 'read'): Promise<Site> {
  const site = await Site.findOne({ where: scoped(req.ctx, { id: siteId }) });
  if (!site) throw errors.notFound('site');
  authorizeRecord(req, 'read', 'Site', site.get({ plain: true }), 'site');
  authorizeSitePremises(req, site, action);
  return site;
}

/** A floor of the user's firm: 404 unless readable, 403 unless `action` is allowed. */
export async function loadFloor(req: Request, floorId: string, action: Action = 'read'): Promise<Floor> {
  const floor = await Floor.findOne({ where: scoped(req.ctx, { id: floorId }) });
  if (!floor) throw errors.notFound('floor');
  authorizeRecord(req, action, 'Premises', floor.get({ plain: true }), 'floor');
  return floor;
}

/** A room of the user's firm: 404 unless readable, 403 unless `action` is allowed. */
export async function loadRoom(req: Request, roomId: string, action: Action = 'read'): Promise<Room> {
  const room = await Room.findOne({ where: scoped(req.ctx, { id: roomId }) });
  if (!room) throw errors.notFound('room');
  authorizeRecord(req, action, 'Premises', room.get({ plain: true }), 'room');
  return room;
}

/** An opening of the user's firm: 404 unless readable, 403 unless `action` is allowed. */
export async function loadOpening(req: Request, openingId: string, action: Action = 'read'): Promise<Opening> {
  const opening = await Opening.findOne({ where: scoped(req.ctx, { id: openingId }) });
  if (!opening) throw errors.notFound('opening');
  authorizeRecord(req, action, 'Premises', opening.get({ plain: true }), 'opening');
  return opening;
}
