import type { RequestHandler } from 'express';
import { canSignIn } from '@domain/tenant-states';
import { abilityFor } from '@domain/abilities';
import { abilityUserOf } from '../auth/ability-user';
import { errors } from '../errors';

/**
 * Runs on every request after the session is read: a deactivated user's or a suspended
 * firm's session stops working at once (signed out, 403 with the reason), and every
 * request gets its ability and service context.
 */
export const sessionGuard: RequestHandler = (req, _res, next) => {
  const user = req.user;
  if (user) {
    const refusal = user.deactivatedAt
      ? errors.userDeactivated()
      : user.tenant && !canSignIn(user.tenant.state)
        ? errors.firmSuspended()
        : null;
    if (refusal) {
      req.logout({ keepSessionInfo: false }, (err) => next(err ?? refusal));
      return;
    }
  }
  req.ability = abilityFor(user ? abilityUserOf(user) : null);
  req.ctx = {
    user: user ?? null,
    tenant: user?.tenant ?? null,
    tenantId: user?.tenantId ?? null,
    ability: req.ability,
    ip: req.ip,
  };
  next();
};

/** 401 unless signed in. */
export const requireUser: RequestHandler = (req, _res, next) => {
  next(req.user ? undefined : errors.unauthenticated());
};
