import { Router, type Request, type Response } from 'express';
import { floorPatchSchema, floorSchema, openingPatchSchema, openingSchema, pinSchema, roomPatchSchema, roomSchema } from '@domain/schemas/premises';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { singleUpload } from '../../middlewares/upload';
import { inputOf, validate } from '../../middlewares/validate';
import { Panel } from '../../models/Panel';
import type { Zone } from '../../models/Zone';
import { presentCoverage, presentFloor, presentOpening, presentPremises, presentRoom } from '../../presenters/premises';
import { presentZone } from '../../presenters/zone';
import { coverageForSite } from '../../services/coverage';
import {
  FLOOR_PLAN_MAX_BYTES,
  clearZonePin,
  createFloor,
  createOpening,
  createRoom,
  deleteFloor,
  deleteOpening,
  deleteRoom,
  removeFloorPlan,
  setFloorPlan,
  setZonePin,
  siteFloors,
  sitePremises,
  updateFloor,
  updateOpening,
  updateRoom,
} from '../../services/premises';
import { zoneViewContext } from '../../services/zones';
import { checkImageHeader } from '../../services/image-header';
import { sniffImage } from '../../storage/tenant-files';
import { authorizeRecord, inTransaction, nowOf, pageOf, requireFirm } from '../helpers';
import { sendStoredFile } from '../send-stored-file';
import { loadZone } from '../panels/load';
import { zoneParams } from '../zones/schema';
import { loadFloor, loadOpening, loadPremisesSite, loadRoom } from './load';
import { floorListQuery, floorParams, openingParams, roomParams, siteParams } from './schema';

const PLAN_MAX_MB = FLOOR_PLAN_MAX_BYTES / (1024 * 1024);

/**
 * The premises of a site (api-resources.md, "Premises"): floors, rooms, openings, the whole
 * tree in one call, floor-plan images, zone pins, and the site's coverage. Owners,
 * coordinators and technicians read and change them; a client reads none of these staff
 * routes (404; the portal has its own); the operator has no firm (403).
 */
export function premisesRouter(deps: AppDeps): Router {
  const router = Router();
  /** Reads the multipart body into memory (nothing touches the disk); over the limit → 413, malformed → 400. */
  const readUpload = singleUpload({
    maxBytes: FLOOR_PLAN_MAX_BYTES,
    tooLargeMessage: `A floor plan may be at most ${PLAN_MAX_MB} MB.`,
    what: 'the image',
    limits: { fields: 5, parts: 6 },
  });

  /** A zone as the zone routes present it. */
  async function presentedZone(req: Request, zone: Zone) {
    const panel = await Panel.findOne({ where: scoped(req.ctx, { id: zone.panelId }) });
    if (!panel) throw errors.notFound('zone');
    return presentZone(zone, await zoneViewContext(req.ctx, panel, [zone], nowOf(deps)));
  }

  // ---- The whole tree and the coverage ----

  router.get('/sites/:siteId/premises', requireFirm, validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadPremisesSite(req, params.siteId, 'read');
    res.json({ data: presentPremises(await sitePremises(req.ctx, site.id)) });
  });

  router.get('/sites/:siteId/coverage', requireFirm, validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadPremisesSite(req, params.siteId, 'read');
    res.json({ data: presentCoverage(await coverageForSite(req.ctx, site.id), { audience: 'staff' }) });
  });

  // ---- Floors ----

  router.get('/sites/:siteId/floors', requireFirm, validate({ params: siteParams, query: floorListQuery }), async (req, res) => {
    const { params, query } = inputOf(req, { params: siteParams, query: floorListQuery });
    const site = await loadPremisesSite(req, params.siteId, 'read');
    const floors = await siteFloors(req.ctx, site.id);
    const rows = floors.slice((query.page - 1) * query.pageSize, query.page * query.pageSize);
    res.json({ data: rows.map(presentFloor), page: pageOf(query.page, query.pageSize, floors.length) });
  });

  router.post('/sites/:siteId/floors', requireFirm, validate({ params: siteParams, body: floorSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteParams, body: floorSchema });
    const site = await loadPremisesSite(req, params.siteId, 'create');
    const floor = await inTransaction(req, deps, (ctx) => createFloor(ctx, site, body));
    res.status(201).json({ data: presentFloor(floor) });
  });

  router.patch('/floors/:floorId', requireFirm, validate({ params: floorParams, body: floorPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: floorParams, body: floorPatchSchema });
    const loaded = await loadFloor(req, params.floorId, 'update');
    const floor = await inTransaction(req, deps, (ctx) => updateFloor(ctx, loaded, body));
    res.json({ data: presentFloor(floor) });
  });

  router.delete('/floors/:floorId', requireFirm, validate({ params: floorParams }), async (req, res) => {
    const { params } = inputOf(req, { params: floorParams });
    const floor = await loadFloor(req, params.floorId, 'delete');
    const planImageId = await inTransaction(req, deps, (ctx) => deleteFloor(ctx, floor));
    // the records are gone; now the image
    if (planImageId) await deps.files.remove(floor.tenantId, planImageId).catch(() => undefined);
    res.status(204).end();
  });

  // ---- Floor-plan images ----

  router.post('/floors/:floorId/plan', requireFirm, validate({ params: floorParams }), async (req: Request, res: Response) => {
    const { params } = inputOf(req, { params: floorParams });
    // authorize before reading the upload
    const loaded = await loadFloor(req, params.floorId, 'update');
    await readUpload(req, res);
    const file = req.file;
    if (!file || file.size === 0) throw errors.validation('file: Choose a PNG, JPEG or WebP image of the floor plan.', { file: 'Choose a PNG, JPEG or WebP image.' });
    const type = sniffImage(file.buffer);
    if (!type) throw errors.unsupportedType('A floor plan must be a PNG, JPEG or WebP image. This file’s content is none of those, whatever its name says.');
    // the plan is drawn in browsers and reports: refuse from the header what is too large to decode
    checkImageHeader(file.buffer, type.extension.toUpperCase());

    const fileId = await deps.files.save(loaded.tenantId, file.buffer, type.extension);
    let saved: Awaited<ReturnType<typeof setFloorPlan>>;
    try {
      saved = await inTransaction(req, deps, (ctx) => setFloorPlan(ctx, loaded.id, { fileId, contentType: type.contentType, bytes: file.size }));
    } catch (e) {
      await deps.files.remove(loaded.tenantId, fileId).catch(() => undefined);
      throw e;
    }
    if (saved.replaced) await deps.files.remove(loaded.tenantId, saved.replaced).catch(() => undefined);
    res.status(201).json({ data: presentFloor(saved.floor) });
  });

  router.get('/floors/:floorId/plan', requireFirm, validate({ params: floorParams }), async (req, res) => {
    const { params } = inputOf(req, { params: floorParams });
    const floor = await loadFloor(req, params.floorId, 'read');
    if (!floor.planImageId || !floor.planImageContentType) throw errors.notFound('floor plan');
    // the address changes with the image (?v=…), so the browser may keep it a while
    await sendStoredFile(res, deps.files, { tenantId: floor.tenantId, fileId: floor.planImageId, contentType: floor.planImageContentType, what: 'floor plan', caching: 'private-hour' });
  });

  router.delete('/floors/:floorId/plan', requireFirm, validate({ params: floorParams }), async (req, res) => {
    const { params } = inputOf(req, { params: floorParams });
    const floor = await loadFloor(req, params.floorId, 'update');
    const removed = await inTransaction(req, deps, (ctx) => removeFloorPlan(ctx, floor));
    if (removed) await deps.files.remove(floor.tenantId, removed).catch(() => undefined);
    res.status(204).end();
  });

  // ---- Rooms ----

  router.post('/floors/:floorId/rooms', requireFirm, validate({ params: floorParams, body: roomSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: floorParams, body: roomSchema });
    const floor = await loadFloor(req, params.floorId, 'read');
    authorizeRecord(req, 'create', 'Premises', { tenantId: floor.tenantId, siteId: floor.siteId }, 'room');
    const room = await inTransaction(req, deps, (ctx) => createRoom(ctx, floor, body));
    res.status(201).json({ data: presentRoom(room) });
  });

  router.patch('/rooms/:roomId', requireFirm, validate({ params: roomParams, body: roomPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: roomParams, body: roomPatchSchema });
    const loaded = await loadRoom(req, params.roomId, 'update');
    const room = await inTransaction(req, deps, (ctx) => updateRoom(ctx, loaded, body));
    res.json({ data: presentRoom(room) });
  });

  router.delete('/rooms/:roomId', requireFirm, validate({ params: roomParams }), async (req, res) => {
    const { params } = inputOf(req, { params: roomParams });
    const room = await loadRoom(req, params.roomId, 'delete');
    await inTransaction(req, deps, (ctx) => deleteRoom(ctx, room));
    res.status(204).end();
  });

  // ---- Openings ----

  router.post('/rooms/:roomId/openings', requireFirm, validate({ params: roomParams, body: openingSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: roomParams, body: openingSchema });
    const room = await loadRoom(req, params.roomId, 'read');
    authorizeRecord(req, 'create', 'Premises', { tenantId: room.tenantId, siteId: room.siteId }, 'opening');
    const opening = await inTransaction(req, deps, (ctx) => createOpening(ctx, room, body));
    res.status(201).json({ data: presentOpening(opening) });
  });

  router.patch('/openings/:openingId', requireFirm, validate({ params: openingParams, body: openingPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: openingParams, body: openingPatchSchema });
    const loaded = await loadOpening(req, params.openingId, 'update');
    const opening = await inTransaction(req, deps, (ctx) => updateOpening(ctx, loaded, body));
    res.json({ data: presentOpening(opening) });
  });

  router.delete('/openings/:openingId', requireFirm, validate({ params: openingParams }), async (req, res) => {
    const { params } = inputOf(req, { params: openingParams });
    const opening = await loadOpening(req, params.openingId, 'delete');
    await inTransaction(req, deps, (ctx) => deleteOpening(ctx, opening));
    res.status(204).end();
  });

  // ---- Zone pins (fractions of the floor's image) ----

  router.put('/zones/:zoneId/pin', requireFirm, validate({ params: zoneParams, body: pinSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: zoneParams, body: pinSchema });
    const loaded = await loadZone(req, params.zoneId, 'update');
    const zone = await inTransaction(req, deps, (ctx) => setZonePin(ctx, loaded.id, body));
    res.json({ data: await presentedZone(req, zone) });
  });

  router.delete('/zones/:zoneId/pin', requireFirm, validate({ params: zoneParams }), async (req, res) => {
    const { params } = inputOf(req, { params: zoneParams });
    const zone = await loadZone(req, params.zoneId, 'update');
    await inTransaction(req, deps, (ctx) => clearZonePin(ctx, zone.id));
    res.status(204).end();
  });

  return router;
}
