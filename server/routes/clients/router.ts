import { Router, type Request } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { clientListQuery, clientPatchSchema, clientSchema } from '@domain/schemas/client';
import { accessibleWhere } from '../../auth/accessible-where';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Client } from '../../models/Client';
import { audienceOf, presentClient } from '../../presenters/client';
import { createClient, deleteClient, siteCountsOf, updateClient } from '../../services/clients';
import { authorizeRecord, inTransaction, pageOf, requireAbility, requireFirm } from '../helpers';
import { clientParams } from './schema';

const SORTABLE = { name: 'name', createdAt: 'createdAt', status: 'status' } as const;

/** `name` or `-name` → [column, direction]; anything else is a 400 naming `sort`. */
function orderOf(sort: string | undefined): [string, 'ASC' | 'DESC'] {
  const key = (sort ?? 'name').replace(/^-/, '');
  const column = SORTABLE[key as keyof typeof SORTABLE];
  if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
  return [column, sort?.startsWith('-') ? 'DESC' : 'ASC'];
}

/** The firm's clients: households and small businesses with one or more sites. */
export function clientsRouter(deps: AppDeps): Router {
  const router = Router();
  router.use('/clients', requireFirm);

  async function loadClient(req: Request, clientId: string): Promise<Client> {
    const client = await Client.findOne({ where: scoped(req.ctx, { id: clientId }) });
    if (!client) throw errors.notFound('client');
    return client;
  }

  router.get('/clients', requireAbility('read', 'Client'), validate({ query: clientListQuery }), async (req, res) => {
    const { query } = inputOf(req, { query: clientListQuery });
    const order = orderOf(query.sort);
    const allowed = accessibleWhere(req.ability, 'read', 'Client');
    if (!allowed) {
      res.json({ data: [], page: pageOf(query.page, query.pageSize, 0) });
      return;
    }
    const conditions: WhereOptions[] = [scoped(req.ctx, query.status ? { status: query.status } : {}), allowed];
    if (query.q) {
      const text = `%${query.q}%`;
      const alternatives: WhereOptions[] = [{ name: { [Op.like]: text } }, { email: { [Op.like]: text } }, { phone: { [Op.like]: text } }, { altPhone: { [Op.like]: text } }];
      // phones are stored as +15550104400: "(555) 010-44" finds them by its digits
      const digits = query.q.replace(/\D/g, '');
      if (digits.length >= 3) alternatives.push({ phone: { [Op.like]: `%${digits}%` } }, { altPhone: { [Op.like]: `%${digits}%` } });
      conditions.push({ [Op.or]: alternatives });
    }
    const { rows, count } = await Client.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [order, ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    const counts = await siteCountsOf(req.ctx, rows.map((c) => c.id));
    const audience = audienceOf(req.user);
    res.json({
      data: rows.map((c) => presentClient(c, { audience, siteCount: counts.get(c.id) ?? 0 })),
      page: pageOf(query.page, query.pageSize, count),
    });
  });

  router.post('/clients', validate({ body: clientSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: clientSchema });
    authorizeRecord(req, 'create', 'Client', { tenantId: req.ctx.tenantId }, 'client');
    const client = await inTransaction(req, deps, (ctx) => createClient(ctx, body));
    res.status(201).json({ data: presentClient(client, { audience: 'staff', siteCount: 0 }) });
  });

  router.get('/clients/:clientId', validate({ params: clientParams }), async (req, res) => {
    const { params } = inputOf(req, { params: clientParams });
    const client = await loadClient(req, params.clientId);
    authorizeRecord(req, 'read', 'Client', client.get({ plain: true }), 'client');
    const counts = await siteCountsOf(req.ctx, [client.id]);
    res.json({ data: presentClient(client, { audience: audienceOf(req.user), siteCount: counts.get(client.id) ?? 0 }) });
  });

  router.patch('/clients/:clientId', validate({ params: clientParams, body: clientPatchSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: clientParams, body: clientPatchSchema });
    const client = await loadClient(req, params.clientId);
    authorizeRecord(req, 'update', 'Client', client.get({ plain: true }), 'client');
    const updated = await inTransaction(req, deps, (ctx) => updateClient(ctx, client, body));
    const counts = await siteCountsOf(req.ctx, [client.id]);
    res.json({ data: presentClient(updated, { audience: 'staff', siteCount: counts.get(client.id) ?? 0 }) });
  });

  router.delete('/clients/:clientId', validate({ params: clientParams }), async (req, res) => {
    const { params } = inputOf(req, { params: clientParams });
    const client = await loadClient(req, params.clientId);
    authorizeRecord(req, 'delete', 'Client', client.get({ plain: true }), 'client');
    await inTransaction(req, deps, (ctx) => deleteClient(ctx, client));
    res.status(204).end();
  });

  return router;
}
