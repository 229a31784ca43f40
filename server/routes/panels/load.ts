import type { Request } from 'express';
import { type Action } from '@domain/abilities';
import { scoped } from '../../context';
import { errors } from '../../errors';
import { Panel } from '../../models/Panel';
import { Site } from '../../models/Site';
import { Zone } from '../../models/Zone';
import { authorizeRecord } from '../helpers';

/** A site of the signed-in user's firm that they may read; 404 otherwise. */
export async function loadSite(req: Request, siteId: string): Promise<Site> {
  const site = await Site.findOne({ where: scoped(req.ctx, { id: siteId }) });
  if (!site) throw errors.notFound('site');
  authorizeRecord(req, 'read', 'Site', site.get({ plain: true }), 'site');
  return site;
}

/**
 * The panels of a site: 404 unless the user may read the site and its panels (a client may
 * read their own site but never its panels), 403 when they may read but not `action`.
 */
export function authorizeSitePanels(req: Request, site: Site, action: Action): void {
  const record = { tenantId: site.tenantId, siteId: site.id };
  authorizeRecord(req, 'read', 'Panel', record, 'site');
  if (action !== 'read') authorizeRecord(req, action, 'Panel', record, 'panel');
}

/** A panel of the user's firm: 404 unless readable, 403 unless `action` is allowed. */
export async function loadPanel(req: Request, panelId: string, action: Action = 'read'): Promise<Panel> {
  const panel = await Panel.findOne({ where: scoped(req.ctx, { id: panelId }) });
  if (!panel) throw errors.notFound('panel');
  authorizeRecord(req, action, 'Panel', panel.get({ plain: true }), 'panel');
  return panel;
}

/** The zones of a readable panel: 404 unless the user may read them, 403 unless `action` is allowed. */
export function authorizePanelZones(req: Request, panel: Panel, action: Action): void {
  const record = { tenantId: panel.tenantId, siteId: panel.siteId, panelId: panel.id };
  authorizeRecord(req, 'read', 'Zone', record, 'panel');
  if (action !== 'read') authorizeRecord(req, action, 'Zone', record, 'zone');
}

/** A zone of the user's firm: 404 unless readable, 403 unless `action` is allowed. */
export async function loadZone(req: Request, zoneId: string, action: Action = 'read'): Promise<Zone> {
  const zone = await Zone.findOne({ where: scoped(req.ctx, { id: zoneId }) });
  if (!zone) throw errors.notFound('zone');
  authorizeRecord(req, action, 'Zone', zone.get({ plain: true }), 'zone');
  return zone;
}
