import { Router, type Request } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { siteListQuery, sitePatchSchema, siteSchema } from '@domain/schemas/site';
import { accessibleWhere } from '../../auth/accessible-where';
import { scoped, type Ctx } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Client } from '../../models/Client';
import { Site } from '../../models/Site';
import { audienceOf } from '../../presenters/client';
import { presentSite } from '../../presenters/site';
import { createSite, deleteSite, revealPasscode, updateSite } from '../../services/sites';
import { authorizeRecord, inTransaction, pageOf, requireAbility, requireFirm, nowOf } from '../helpers';
import { siteParams } from './schema';

const SORTABLE = { name: 'name', city: 'city', createdAt: 'createdAt' } as const;

/** `name` or `-name` → [column, direction]; anything else is a 400 naming `sort`. */
function orderOf(sort: string | undefined): [string, 'ASC' | 'DESC'] {
  const key = (sort ?? 'name').replace(/^-/, '');
  const column = SORTABLE[key as keyof typeof SORTABLE];
  if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
  return [column, sort?.startsWith('-') ? 'DESC' : 'ASC'];
}

/** Names of the firm's clients by id, for the sites shown. */
async function clientNamesOf(ctx: Ctx, clientIds: string[]): Promise<Map<string, string>> {
  const ids = [...new Set(clientIds)];
  if (ids.length === 0) return new Map();
  const clients = await Client.findAll({ where: scoped(ctx, { id: ids }), attributes: ['id', 'name'] });
  return new Map(clients.map((c) => [c.id, c.name]));
}

/** Protected places: address, monitoring account, passcode (write-only, revealed on request), permit, contract. */
export function sitesRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/sites', requireFirm);

  async function loadSite(req: Request, siteId: string): Promise<Site> {
    const site = await Site.findOne({ where: scoped(req.ctx, { id: siteId }) });
    if (!site) throw errors.notFound('site');
    return site;
  }

  async function present(req: Request, site: Site) {
    const names = await clientNamesOf(req.ctx, [site.clientId]);
    return presentSite(site, { audience: audienceOf(req.user), clientName: names.get(site.clientId) ?? '' });
  }

  router.get('/sites', requireAbility('read', 'Site'), validate({ query: siteListQuery }), async (req, res) => {
    const { query } = inputOf(req, { query: siteListQuery });
    const order = orderOf(query.sort);
    const allowed = accessibleWhere(req.ability, 'read', 'Site');
    if (!allowed) {
      res.json({ data: [], page: pageOf(query.page, query.pageSize, 0) });
      return;
    }
    const conditions: WhereOptions[] = [scoped(req.ctx, query.clientId ? { clientId: query.clientId } : {}), allowed];
    if (query.q) {
      const text = `%${query.q}%`;
      conditions.push({
        [Op.or]: [{ name: { [Op.like]: text } }, { addressLine1: { [Op.like]: text } }, { city: { [Op.like]: text } }, { monitoringAccount: { [Op.like]: text } }],
      });
    }
    const { rows, count } = await Site.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [order, ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    const names = await clientNamesOf(req.ctx, rows.map((s) => s.clientId));
    const audience = audienceOf(req.user);
    res.json({
      data: rows.map((s) => presentSite(s, { audience, clientName: names.get(s.clientId) ?? '' })),
      page: pageOf(query.page, query.pageSize, count),
    });
  });

  router.post('/sites', validate({ body: siteSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: siteSchema });
    authorizeRecord(req, 'create', 'Site', { tenantId: req.ctx.tenantId, clientId: body.clientId }, 'site');
    const site = await inTransaction(req, deps, (ctx) => createSite(ctx, body, deps.secrets, nowOf(deps)));
    res.status(201).json({ data: await present(req, site) });
  });

  router.get('/sites/:siteId', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadSite(req, params.siteId);
    authorizeRecord(req, 'read', 'Site', site.get({ plain: true }), 'site');
    res.json({ data: await present(req, site) });
  });

  router.patch('/sites/:siteId', validate({ params: siteParams, body: sitePatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: siteParams, body: sitePatchSchema });
    const site = await loadSite(req, params.siteId);
    authorizeRecord(req, 'update', 'Site', site.get({ plain: true }), 'site');
    const updated = await inTransaction(req, deps, (ctx) => updateSite(ctx, site, body, deps.secrets));
    res.json({ data: await present(req, updated) });
  });

  router.delete('/sites/:siteId', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadSite(req, params.siteId);
    authorizeRecord(req, 'delete', 'Site', site.get({ plain: true }), 'site');
    const fileIds = await inTransaction(req, deps, (ctx) => deleteSite(ctx, site));
    // the records are gone; now their files
    await Promise.all(fileIds.map((fileId) => deps.files.remove(site.tenantId, fileId).catch(() => undefined)));
    res.status(204).end();
  });

  router.post('/sites/:siteId/passcode/reveal', validate({ params: siteParams }), async (req, res) => {
    const { params } = inputOf(req, { params: siteParams });
    const site = await loadSite(req, params.siteId);
    authorizeRecord(req, 'reveal', 'Site', site.get({ plain: true }), 'site');
    const passcode = await inTransaction(req, deps, (ctx) => revealPasscode(ctx, site, deps.secrets));
    res.set('Cache-Control', 'no-store');
    res.json({ data: { passcode } });
  });

  return router;
}
