import { Router, type Request, type RequestHandler } from 'express';
import { defineRulesFor } from '@domain/abilities';
import { canSignIn } from '@domain/tenant-states';
import { passwordResetRequestSchema, passwordResetSchema, signInSchema, signUpSchema, tokenParams } from '@domain/schemas/auth';
import { abilityUserOf } from '../../auth/ability-user';
import { BAD_CREDENTIALS, type PassportInstance } from '../../auth/passport';
import type { AppDeps } from '../../deps';
import { errors } from '../../errors';
import type { Csrf } from '../../middlewares/csrf';
import { inputOf, validate } from '../../middlewares/validate';
import type { User } from '../../models/User';
import { presentTenant } from '../../presenters/tenant';
import { presentUser } from '../../presenters/user';
import { firmSignup } from '../../services/firm-signup';
import { completePasswordReset, requestPasswordReset } from '../../services/password-resets';
import { nowOf } from '../helpers';

export function signIn(req: Request, user: User): Promise<void> {
  return new Promise((resolve, reject) => req.login(user, (err) => (err ? reject(err as Error) : resolve())));
}

function presentSession(user: User | null | undefined, now: Date) {
  return {
    user: user ? presentUser(user) : null,
    tenant: user?.tenant ? presentTenant(user.tenant, { audience: user.role === 'client' ? 'client' : 'staff', now }) : null,
    rules: defineRulesFor(user ? abilityUserOf(user) : null),
  };
}

export function sessionRouter(
  deps: AppDeps,
  tools: { passport: PassportInstance; csrf: Csrf; signInLimiter: RequestHandler; resetLimiter: RequestHandler },
): Router {
  const router = Router();

  router.get('/session', (req, res) => {
    const csrfToken = tools.csrf.issue(req, res);
    res.set('Cache-Control', 'no-store');
    res.json({ ...presentSession(req.user, nowOf(deps)), csrfToken });
  });

  router.post('/session', tools.signInLimiter, validate({ body: signInSchema }), (req, res, next) => {
    const authenticate = tools.passport.authenticate('local', (err: Error | null, user: User | false) => {
      (async () => {
        if (err) throw err;
        if (!user) throw errors.unauthenticated(BAD_CREDENTIALS);
        if (user.deactivatedAt) throw errors.userDeactivated();
        if (user.tenant && !canSignIn(user.tenant.state)) throw errors.firmSuspended();
        await signIn(req, user);
        await user.update({ lastSignInAt: nowOf(deps) });
        res.json({ data: presentSession(user, nowOf(deps)) });
      })().catch(next);
    }) as RequestHandler;
    authenticate(req, res, next);
  });

  router.delete('/session', (req, res, next) => {
    req.logout((err) => (err ? next(err) : res.status(204).end()));
  });

  router.post('/signup', validate({ body: signUpSchema }), async (req, res) => {
    const { body } = inputOf(req, { body: signUpSchema });
    const owner = await firmSignup(body, { sequelize: deps.sequelize, now: nowOf(deps), ip: req.ip });
    await signIn(req, owner);
    res.status(201).json({ data: presentSession(owner, nowOf(deps)) });
  });

  router.post('/password-resets', tools.resetLimiter, validate({ body: passwordResetRequestSchema }), (req, res) => {
    const { body } = inputOf(req, { body: passwordResetRequestSchema });
    // Answered before any lookup: the same body at the same speed for every address.
    const now = nowOf(deps);
    deps.background.run('password reset request', () => requestPasswordReset(body.email, { ...deps, now }));
    res.status(202).json({ data: { message: 'If that address has a Mullion sign-in, a reset link is on its way.' } });
  });

  router.post(
    '/password-resets/:token',
    tools.resetLimiter,
    validate({ params: tokenParams, body: passwordResetSchema }),
    async (req, res) => {
      const { params, body } = inputOf(req, { params: tokenParams, body: passwordResetSchema });
      await completePasswordReset(params.token, body.password, { sequelize: deps.sequelize, now: nowOf(deps), ip: req.ip });
      res.json({ data: { message: 'Your password is changed. Sign in with the new one.' } });
    },
  );

  return router;
}
