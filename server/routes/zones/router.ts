import { Router, type NextFunction, type Request, type Response } from 'express';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { zoneCreateSchema, zonePatchSchema } from '@domain/schemas/zone';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { singleUpload } from '../../middlewares/upload';
import { inputOf, validate } from '../../middlewares/validate';
import { presentZone } from '../../presenters/zone';
import { downloadName, zonesToCsv } from '../../services/zone-export';
import { importZones, type ImportRow } from '../../services/zone-import';
import { createZone, deleteZone, panelZones, updateZone, zoneViewContext } from '../../services/zones';
import { Panel } from '../../models/Panel';
import { scoped } from '../../context';
import { inTransaction, nowOf, pageOf, requireFirm } from '../helpers';
import { authorizePanelZones, loadPanel, loadZone } from '../panels/load';
import { panelParams } from '../panels/schema';
import { importQuery, zoneListQuery, zoneParams } from './schema';

/** The largest zone-list file an import accepts. */
export const ZONE_IMPORT_MAX_BYTES = 1024 * 1024;
/** What browsers and spreadsheets call a CSV file; the content must be text whatever the label. */
const CSV_CONTENT_TYPES = ['text/csv', 'text/plain', 'application/csv', 'text/comma-separated-values', 'application/vnd.ms-excel', 'application/octet-stream'];

/** An uploaded file's text: UTF-8 (a byte-order mark is dropped later), else Windows-1252 as spreadsheets save it; 415 for binary. */
function textOf(file: Express.Multer.File): string {
  const type = file.mimetype.split(';')[0]?.trim().toLowerCase() ?? '';
  if (!CSV_CONTENT_TYPES.includes(type) || file.buffer.includes(0)) {
    throw errors.unsupportedType('Upload the zone list as a CSV file (text, comma-separated).');
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(file.buffer);
  } catch {
    return new TextDecoder('windows-1252').decode(file.buffer);
  }
}

function presentImportRow(row: ImportRow) {
  return {
    row: row.row,
    action: row.action,
    zoneId: row.zoneId,
    ...row.values,
    changes: Object.entries(row.changes).map(([field, [from, to]]) => ({ field, from, to })),
    warnings: row.warnings.map((w) => ({ code: w.code, field: w.field, message: w.message })),
  };
}

/**
 * Zones of a panel (api-resources.md, "Zone"): list and add under the panel, read, change and
 * delete by id, and the panel's zone list as CSV (export, import with dry run).
 */
export function zonesRouter(deps: AppDeps): Router {
  const router = Router();
  const readUpload = singleUpload({
    maxBytes: ZONE_IMPORT_MAX_BYTES,
    tooLargeMessage: `A zone list may be at most ${ZONE_IMPORT_MAX_BYTES / 1024 / 1024} MB.`,
    what: 'the CSV file',
    limits: { fields: 5, parts: 6 },
  });

  router.get('/panels/:panelId/zones', requireFirm, validate({ params: panelParams, query: zoneListQuery }), async (req, res) => {
    const { params, query } = inputOf(req, { params: panelParams, query: zoneListQuery });
    const panel = await loadPanel(req, params.panelId, 'read');
    authorizePanelZones(req, panel, 'read');
    const zones = await panelZones(req.ctx, panel.id);
    const pageRows = zones.slice((query.page - 1) * query.pageSize, query.page * query.pageSize);
    const view = await zoneViewContext(req.ctx, panel, pageRows, nowOf(deps));
    res.json({
      data: pageRows.map((zone) => presentZone(zone, view)),
      page: pageOf(query.page, query.pageSize, zones.length),
      caution: LIFE_SAFETY_CAUTION,
    });
  });

  router.post('/panels/:panelId/zones', requireFirm, validate({ params: panelParams, body: zoneCreateSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: panelParams, body: zoneCreateSchema });
    const loaded = await loadPanel(req, params.panelId, 'read');
    authorizePanelZones(req, loaded, 'create');
    const { zone, panel } = await inTransaction(req, deps, (ctx) => createZone(ctx, loaded.id, body));
    const view = await zoneViewContext(req.ctx, panel, [zone], nowOf(deps));
    res.status(201).json({ data: presentZone(zone, view) });
  });

  router.get('/zones/:zoneId', requireFirm, validate({ params: zoneParams }), async (req, res) => {
    const { params } = inputOf(req, { params: zoneParams });
    const zone = await loadZone(req, params.zoneId, 'read');
    const panel = await Panel.findOne({ where: scoped(req.ctx, { id: zone.panelId }) });
    if (!panel) throw errors.notFound('zone');
    const view = await zoneViewContext(req.ctx, panel, [zone], nowOf(deps));
    res.json({ data: presentZone(zone, view) });
  });

  router.patch('/zones/:zoneId', requireFirm, validate({ params: zoneParams, body: zonePatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: zoneParams, body: zonePatchSchema });
    const loaded = await loadZone(req, params.zoneId, 'update');
    const { zone, panel } = await inTransaction(req, deps, (ctx) => updateZone(ctx, loaded.id, body));
    const view = await zoneViewContext(req.ctx, panel, [zone], nowOf(deps));
    res.json({ data: presentZone(zone, view) });
  });

  router.delete('/zones/:zoneId', requireFirm, validate({ params: zoneParams }), async (req, res) => {
    const { params } = inputOf(req, { params: zoneParams });
    const zone = await loadZone(req, params.zoneId, 'delete');
    await inTransaction(req, deps, (ctx) => deleteZone(ctx, zone.id));
    res.status(204).end();
  });

  router.get('/panels/:panelId/zones.csv', requireFirm, validate({ params: panelParams }), async (req, res) => {
    const { params } = inputOf(req, { params: panelParams });
    const panel = await loadPanel(req, params.panelId, 'read');
    authorizePanelZones(req, panel, 'read');
    const csv = zonesToCsv(await panelZones(req.ctx, panel.id));
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${downloadName('zones', panel.label, 'csv')}"`);
    res.set('Cache-Control', 'private, no-store');
    res.send(csv);
  });

  // All or nothing; `?dryRun=true` checks and previews without saving (see services/zone-import.ts
  // for how rows match zones: by number, adding and updating, never deleting).
  router.post(
    '/panels/:panelId/zones/import',
    requireFirm,
    validate({ params: panelParams, query: importQuery }),
    async (req: Request, _res: Response, next: NextFunction) => {
      // authorize before reading the upload
      const { params } = inputOf(req, { params: panelParams, query: importQuery });
      const panel = await loadPanel(req, params.panelId, 'read');
      authorizePanelZones(req, panel, 'create');
      authorizePanelZones(req, panel, 'update');
      next();
    },
    async (req, res) => {
      await readUpload(req, res);
      const { params, query } = inputOf(req, { params: panelParams, query: importQuery });
      const file = req.file;
      if (!file) throw errors.validation('Choose the CSV file to import.', { file: 'Choose a CSV file.' });
      const text = textOf(file);
      const result = await inTransaction(req, deps, (ctx) => importZones(ctx, params.panelId, text, { dryRun: query.dryRun }));
      const { creates, updates, unchanged, rows } = result.plan;
      res.json({
        data: result.dryRun ? { dryRun: true, creates, updates, unchanged, rows: rows.map(presentImportRow) } : { dryRun: false, creates, updates, unchanged },
      });
    },
  );

  return router;
}
