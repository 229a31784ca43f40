import { Router, type Request, type RequestHandler } from 'express';
import { z } from 'zod';
import { email, uuid } from '@domain/schemas/common';
import { scoped } from '../../context';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import { inputOf, validate } from '../../middlewares/validate';
import { Client } from '../../models/Client';
import { Invitation } from '../../models/Invitation';
import { presentInvitation } from '../../presenters/invitation';
import { inviteToFirm, resendInvitation, revokeInvitation } from '../../services/invitations';
import { authorizeRecord, inTransaction, nowOf, pageOf, requireFirm } from '../helpers';

const clientParams = z.object({ clientId: uuid });
const invitationParams = z.object({ clientId: uuid, invitationId: uuid });
const clientInvitationSchema = z.object({ email });

/** Invitations of homeowners (role `client`) to the portal, each linked to one client record. */
export function clientInvitationsRouter(deps: AppDeps, tools: { invitationLimiter: RequestHandler }): Router {
  const router = Router();
  router.use('/clients/:clientId/invitations', requireFirm);

  /** The client record, scoped to the firm; one the caller cannot read is a 404. */
  async function loadClient(req: Request, clientId: string): Promise<Client> {
    const client = await Client.findOne({ where: scoped(req.ctx, { id: clientId }) });
    if (!client) throw errors.notFound('client');
    authorizeRecord(req, 'read', 'Client', client.get({ plain: true }), 'client');
    return client;
  }

  async function loadInvitation(req: Request, clientId: string, invitationId: string): Promise<Invitation> {
    await loadClient(req, clientId);
    const invitation = await Invitation.findOne({ where: scoped(req.ctx, { id: invitationId, clientId, role: 'client' }) });
    if (!invitation) throw errors.notFound('invitation');
    return invitation;
  }

  router.get('/clients/:clientId/invitations', validate({ params: clientParams }), async (req, res) => {
    const { params } = inputOf(req, { params: clientParams });
    await loadClient(req, params.clientId);
    authorizeRecord(req, 'read', 'Invitation', { tenantId: req.ctx.tenantId, role: 'client' }, 'invitation');
    const rows = await Invitation.findAll({
      where: scoped(req.ctx, { clientId: params.clientId, role: 'client', acceptedAt: null, revokedAt: null }),
      order: [['createdAt', 'DESC']],
      limit: 200,
    });
    const now = nowOf(deps);
    res.json({ data: rows.map((r) => presentClientInvitation(r, now)), page: pageOf(1, 200, rows.length) });
  });

  router.post('/clients/:clientId/invitations', tools.invitationLimiter, validate({ params: clientParams, body: clientInvitationSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: clientParams, body: clientInvitationSchema });
    const client = await loadClient(req, params.clientId);
    authorizeRecord(req, 'create', 'Invitation', { tenantId: req.ctx.tenantId, role: 'client' }, 'invitation');
    const now = nowOf(deps);
    const invitation = await inTransaction(req, deps, (ctx) =>
      inviteToFirm(ctx, { email: body.email, role: 'client', clientId: client.id }, { ...deps, now }),
    );
    res.status(201).json({ data: presentClientInvitation(invitation, now) });
  });

  router.post('/clients/:clientId/invitations/:invitationId/resend', tools.invitationLimiter, validate({ params: invitationParams }), async (req, res) => {
    const { params } = inputOf(req, { params: invitationParams });
    const invitation = await loadInvitation(req, params.clientId, params.invitationId);
    authorizeRecord(req, 'update', 'Invitation', invitation.get({ plain: true }), 'invitation');
    const now = nowOf(deps);
    await inTransaction(req, deps, (ctx) => resendInvitation(ctx, invitation, { ...deps, now }));
    res.json({ data: presentClientInvitation(invitation, now) });
  });

  router.delete('/clients/:clientId/invitations/:invitationId', validate({ params: invitationParams }), async (req, res) => {
    const { params } = inputOf(req, { params: invitationParams });
    const invitation = await loadInvitation(req, params.clientId, params.invitationId);
    authorizeRecord(req, 'delete', 'Invitation', invitation.get({ plain: true }), 'invitation');
    await inTransaction(req, deps, (ctx) => revokeInvitation(ctx, invitation, nowOf(deps)));
    res.status(204).end();
  });

  return router;
}

function presentClientInvitation(invitation: Invitation, now: Date) {
  return { ...presentInvitation(invitation, now), clientId: invitation.clientId ?? null };
}
