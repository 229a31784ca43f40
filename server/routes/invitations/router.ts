import { Router } from 'express';
import { ROLE_LABELS } from '@domain/roles';
import { acceptInvitationSchema, tokenParams } from '@domain/schemas/auth';
import { defineRulesFor } from '@domain/abilities';
import { abilityUserOf } from '../../auth/ability-user';
import type { AppDeps } from '../../deps';
import { inputOf, validate } from '../../middlewares/validate';
import { presentTenant } from '../../presenters/tenant';
import { presentUser } from '../../presenters/user';
import { acceptInvitation, addressHasSignIn, findUsableInvitation } from '../../services/invitations';
import { User } from '../../models/User';
import { nowOf } from '../helpers';
import { presentPublicFirm } from '../public-firms/router';
import { signIn } from '../session/router';

/** Public: the invitee previews and accepts with the token from the e-mail. */
export function invitationsRouter(deps: AppDeps): Router {
  const router = Router();

  router.get('/invitations/:token', validate({ params: tokenParams }), async (req, res) => {
    const { params } = inputOf(req, { params: tokenParams });
    const { invitation, tenant } = await findUsableInvitation(params.token, nowOf(deps));
    // Only the invitee holds the link, so only they learn that their address cannot join (one address, one sign-in).
    const hasSignIn = (await User.count({ where: { email: invitation.email }, crossTenant: true })) > 0;
    res.json({
      data: {
        firm: presentPublicFirm(tenant),
        email: invitation.email,
        role: invitation.role,
        roleLabel: ROLE_LABELS[invitation.role],
        expiresAt: invitation.expiresAt.toISOString(),
        ...(hasSignIn ? { hasSignIn: true, notice: addressHasSignIn(invitation.email, tenant.name).message } : { hasSignIn: false }),
      },
    });
  });

  router.post('/invitations/:token/accept', validate({ params: tokenParams, body: acceptInvitationSchema }), async (req, res) => {
    const { params, body } = inputOf(req, { params: tokenParams, body: acceptInvitationSchema });
    const user = await acceptInvitation(params.token, body, { sequelize: deps.sequelize, now: nowOf(deps), ip: req.ip });
    await signIn(req, user);
    res.status(201).json({
      data: {
        user: presentUser(user),
        tenant: user.tenant ? presentTenant(user.tenant, { audience: user.role === 'client' ? 'client' : 'staff' }) : null,
        rules: defineRulesFor(abilityUserOf(user)),
      },
    });
  });

  return router;
}
