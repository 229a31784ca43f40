import { Router, type RequestHandler } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { INVITABLE_STAFF_ROLES, STAFF_ROLES } from '@domain/roles';
import { staffInvitationSchema, staffUpdateSchema } from '@domain/schemas/staff';
import { accessibleWhere } from '../../auth/accessible-where';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Invitation } from '../../models/Invitation';
import { User } from '../../models/User';
import { presentInvitation } from '../../presenters/invitation';
import { presentUser } from '../../presenters/user';
import { inviteToFirm, resendInvitation, revokeInvitation } from '../../services/invitations';
import { updateStaffMember } from '../../services/staff';
import { authorizeRecord, inTransaction, nowOf, pageOf, requireAbility, requireFirm } from '../helpers';
import { invitationParams, staffListQuery, userParams } from './schema';

const SORTABLE = { name: 'name', email: 'email', role: 'role', createdAt: 'createdAt', lastSignInAt: 'lastSignInAt' } as const;

export function staffRouter(deps: AppDeps, tools: { invitationLimiter: RequestHandler }): Router {
  const router = Router();
  router.use('/staff', requireFirm);

  router.get('/staff', requireAbility('read', 'User'), validate({ query: staffListQuery }), async (req, res) => {
    const { query } = inputOf(req, { query: staffListQuery });
    const allowed = accessibleWhere(req.ability, 'read', 'User');
    if (!allowed) {
      res.json({ data: [], page: pageOf(query.page, query.pageSize, 0) });
      return;
    }
    const sortKey = (query.sort ?? 'name').replace(/^-/, '');
    const column = SORTABLE[sortKey as keyof typeof SORTABLE];
    if (!column) throw errors.validation(`sort: use one of ${Object.keys(SORTABLE).join(', ')}.`, { sort: 'Not a sortable field.' });
    const conditions: WhereOptions[] = [scoped(req.ctx, { role: { [Op.in]: [...STAFF_ROLES] } }), allowed];
    if (query.q) conditions.push({ [Op.or]: [{ name: { [Op.like]: `%${query.q}%` } }, { email: { [Op.like]: `%${query.q}%` } }] });
    const { rows, count } = await User.findAndCountAll({
      where: { [Op.and]: conditions },
      order: [[column, query.sort?.startsWith('-') ? 'DESC' : 'ASC'], ['id', 'ASC']],
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    res.json({ data: rows.map(presentUser), page: pageOf(query.page, query.pageSize, count) });
  });

  router.get('/staff/invitations', requireAbility('read', 'Invitation'), async (req, res) => {
    const allowed = accessibleWhere(req.ability, 'read', 'Invitation');
    const rows = allowed
      ? await Invitation.findAll({
          where: { [Op.and]: [scoped(req.ctx, { role: { [Op.in]: [...INVITABLE_STAFF_ROLES] }, acceptedAt: null, revokedAt: null }), allowed] },
          order: [['createdAt', 'DESC']],
          limit: 200,
        })
      : [];
    const now = nowOf(deps);
    res.json({ data: rows.map((r) => presentInvitation(r, now)), page: pageOf(1, 200, rows.length) });
  });

  router.post('/staff/invitations', tools.invitationLimiter, validate({ body: staffInvitationSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: staffInvitationSchema });
    authorizeRecord(req, 'create', 'Invitation', { tenantId: req.ctx.tenantId, role: body.role }, 'invitation');
    const now = nowOf(deps);
    const invitation = await inTransaction(req, deps, (ctx) => inviteToFirm(ctx, body, { ...deps, now }));
    res.status(201).json({ data: presentInvitation(invitation, now) });
  });

  async function loadInvitation(tenantCtx: Parameters<typeof scoped>[0], invitationId: string) {
    const invitation = await Invitation.findOne({ where: scoped(tenantCtx, { id: invitationId }) });
    if (!invitation || !(INVITABLE_STAFF_ROLES as readonly string[]).includes(invitation.role)) throw errors.notFound('invitation');
    return invitation;
  }

  router.post('/staff/invitations/:invitationId/resend', tools.invitationLimiter, validate({ params: invitationParams }), async (req, res) => {
    const { params } = inputOf(req, { params: invitationParams });
    const invitation = await loadInvitation(req.ctx, params.invitationId);
    authorizeRecord(req, 'update', 'Invitation', invitation.get({ plain: true }), 'invitation');
    const now = nowOf(deps);
    await inTransaction(req, deps, (ctx) => resendInvitation(ctx, invitation, { ...deps, now }));
    res.json({ data: presentInvitation(invitation, now) });
  });

  router.delete('/staff/invitations/:invitationId', validate({ params: invitationParams }), async (req, res) => {
    const { params } = inputOf(req, { params: invitationParams });
    const invitation = await loadInvitation(req.ctx, params.invitationId);
    authorizeRecord(req, 'delete', 'Invitation', invitation.get({ plain: true }), 'invitation');
    await inTransaction(req, deps, (ctx) => revokeInvitation(ctx, invitation, nowOf(deps)));
    res.status(204).end();
  });

  async function loadMember(req: Parameters<Parameters<typeof router.get>[1]>[0], userId: string) {
    const member = await User.findOne({ where: scoped(req.ctx, { id: userId, role: { [Op.in]: [...STAFF_ROLES] } }) });
    if (!member) throw errors.notFound('person');
    authorizeRecord(req, 'administer', 'User', member.get({ plain: true }), 'person');
    return member;
  }

  router.patch('/staff/:userId', validate({ params: userParams, body: staffUpdateSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: userParams, body: staffUpdateSchema });
    const member = await loadMember(req, params.userId);
    const updated = await inTransaction(req, deps, (ctx) => updateStaffMember(ctx, member, body, nowOf(deps)));
    res.json({ data: presentUser(updated) });
  });

  router.delete('/staff/:userId', validate({ params: userParams }), async (req, res) => {
    const { params } = inputOf(req, { params: userParams });
    const member = await loadMember(req, params.userId);
    const updated = await inTransaction(req, deps, (ctx) => updateStaffMember(ctx, member, { active: false }, nowOf(deps)));
    res.json({ data: presentUser(updated) });
  });

  return router;
}
