import { Router, type Request } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { panelPatchSchema, panelSchema } from '@domain/schemas/panel';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Panel } from '../../models/Panel';
import { panelFindings, presentPanel, presentZoneChange } from '../../presenters/panel';
import { createPanel, deletePanel, markPanelProgrammed, panelChanges, settingsOf, updatePanel, zonesByPanel } from '../../services/panels';
import { zoneLocations } from '../../services/premises-links';
import { buildProgrammingSheet } from '../../services/programming-sheet';
import { downloadName } from '../../services/zone-export';
import { panelZones, todayIn, zoneValuesOf } from '../../services/zones';
import { inTransaction, nowOf, pageOf, requireFirm } from '../helpers';
import { authorizePanelZones, authorizeSitePanels, loadPanel, loadSite } from './load';
import { changesQuery, panelListQuery, panelParams, siteParams } from './schema';

const SORTABLE = { label: 'label', createdAt: 'createdAt', installedOn: 'installedOn' } as const;

/**
 * Panels of a site (api-resources.md, "Panel"): list and add under the site, read, change and
 * delete by id, record that the panel was programmed, its change log and its programming sheet.
 * Owners, coordinators and technicians manage panels; a client reads none (404).
 */
export function panelsRouter(deps: AppDeps): Router {
  const router = Router();
  /** Today in the firm's time zone: the standby battery's age is judged on it. */
  const todayOf = (req: Request) => todayIn(req.ctx.tenant?.timeZone, nowOf(deps));

  router.get('/sites/:siteId/panels', requireFirm, validate({ params: siteParams, query: panelListQuery }), async (req, res) => {
    const { params, query } = inputOf(req, { params: siteParams, query: panelListQuery });
    const site = await loadSite(req, params.siteId);
    authorizeSitePanels(req, site, 'read');
    const sortKey = (query.sort ?? 'label').replace(/^-/, '');
    const column = SORTABLE[sortKey as keyof typeof SORTABLE];
    if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
    const conditions: WhereOptions[] = [scoped(req.ctx, { siteId: site.id })];
    if (query.q) conditions.push({ [Op.or]: [{ label: { [Op.like]: `%${query.q}%` } }, { makeModel: { [Op.like]: `%${query.q}%` } }] });
    const { rows, count } = await Panel.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [[column, query.sort?.startsWith('-') ? 'DESC' : 'ASC'], ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    const zones = await zonesByPanel(
      req.ctx,
      rows.map((p) => p.id),
    );
    res.json({ data: rows.map((p) => presentPanel(p, zones.get(p.id) ?? [], todayOf(req))), page: pageOf(query.page, query.pageSize, count) });
  });

  router.post('/sites/:siteId/panels', requireFirm, validate({ params: siteParams, body: panelSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteParams, body: panelSchema });
    const site = await loadSite(req, params.siteId);
    authorizeSitePanels(req, site, 'create');
    const panel = await inTransaction(req, deps, (ctx) => createPanel(ctx, site, body));
    res.status(201).json({ data: presentPanel(panel, [], todayOf(req)) });
  });

  router.get('/panels/:panelId', requireFirm, validate({ params: panelParams }), async (req, res) => {
    const { params } = inputOf(req, { params: panelParams });
    const panel = await loadPanel(req, params.panelId, 'read');
    res.json({ data: presentPanel(panel, await panelZones(req.ctx, panel.id), todayOf(req)) });
  });

  router.patch('/panels/:panelId', requireFirm, validate({ params: panelParams, body: panelPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: panelParams, body: panelPatchSchema });
    const loaded = await loadPanel(req, params.panelId, 'update');
    const panel = await inTransaction(req, deps, (ctx) => updatePanel(ctx, loaded.id, body));
    res.json({ data: presentPanel(panel, await panelZones(req.ctx, panel.id), todayOf(req)) });
  });

  router.delete('/panels/:panelId', requireFirm, validate({ params: panelParams }), async (req, res) => {
    const { params } = inputOf(req, { params: panelParams });
    const panel = await loadPanel(req, params.panelId, 'delete');
    await inTransaction(req, deps, (ctx) => deletePanel(ctx, panel.id));
    res.status(204).end();
  });

  router.post('/panels/:panelId/programmed', requireFirm, validate({ params: panelParams }), async (req, res) => {
    const { params } = inputOf(req, { params: panelParams });
    const loaded = await loadPanel(req, params.panelId, 'update');
    const panel = await inTransaction(req, deps, (ctx) => markPanelProgrammed(ctx, loaded.id, nowOf(deps)));
    res.json({ data: presentPanel(panel, await panelZones(req.ctx, panel.id), todayOf(req)) });
  });

  router.get('/panels/:panelId/changes', requireFirm, validate({ params: panelParams, query: changesQuery }), async (req, res) => {
    const { params, query } = inputOf(req, { params: panelParams, query: changesQuery });
    const panel = await loadPanel(req, params.panelId, 'read');
    authorizePanelZones(req, panel, 'read');
    const { rows, count } = await panelChanges(req.ctx, panel.id, query.page, query.pageSize);
    res.json({ data: rows.map(presentZoneChange), page: pageOf(query.page, query.pageSize, count) });
  });

  router.get('/panels/:panelId/programming-sheet.pdf', requireFirm, validate({ params: panelParams }), async (req, res) => {
    const { params } = inputOf(req, { params: panelParams });
    const panel = await loadPanel(req, params.panelId, 'read');
    authorizePanelZones(req, panel, 'read');
    const site = await loadSite(req, panel.siteId);
    const zones = (await panelZones(req.ctx, panel.id)).filter((z) => z.status !== 'removed');
    const locations = await zoneLocations(req.ctx, zones);
    const settings = settingsOf(panel);
    const sheet = await buildProgrammingSheet({
      firmName: req.ctx.tenant?.name ?? '',
      site: {
        name: site.name,
        addressLines: [
          site.addressLine1,
          site.addressLine2,
          [site.city, [site.region, site.postalCode].filter(Boolean).join(' ')].filter(Boolean).join(', '),
        ].filter((line) => line && line.trim() !== ''),
        timeZone: site.timeZone,
      },
      panel: {
        label: panel.label,
        makeModel: panel.makeModel ?? '',
        commPath: panel.commPath,
        installedOn: panel.installedOn ?? null,
        zoneCapacity: panel.zoneCapacity,
        wirelessZoneFrom: panel.wirelessZoneFrom,
        wirelessZoneTo: panel.wirelessZoneTo,
        programmedAt: panel.programmedAt ?? null,
        changedSinceProgrammed: Boolean(panel.changedSinceProgrammed),
      },
      settings,
      findings: panelFindings(panel, zones, todayOf(req)),
      zones: zones.map((zone) => ({ ...zoneValuesOf(zone), location: locations.get(zone.id) ?? null })),
      generatedAt: nowOf(deps),
    });
    res.set('Content-Type', 'application/pdf');
    res.set('Content-Disposition', `attachment; filename="${downloadName('programming-sheet', panel.label, 'pdf')}"`);
    res.set('Cache-Control', 'private, no-store');
    res.send(sheet.pdf);
  });

  return router;
}
