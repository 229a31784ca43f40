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
import { confirmFirmSignup, findUsableSignup, requestFirmSignup } from '../../services/firm-signup';
import type { SignInLimiters } from '../../middlewares/rate-limit';
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
  tools: { passport: PassportInstance; csrf: Csrf; signIn: SignInLimiters; resetLimiter: RequestHandler; signUpLimiters: RequestHandler[] },
): Router {
  const router = Router();

  router.get('/session', (req, res) => {
    const csrfToken = tools.csrf.issue(req, res);
    res.set('Cache-Control', 'no-store');
    res.json({ ...presentSession(req.user, nowOf(deps)), csrfToken });
  });

  router.post('/session', ...tools.signIn.middleware, validate({ body: signInSchema }), (req, res, next) => {
    const authenticate = tools.passport.authenticate('local', (err: Error | null, user: User | false) => {
      (async () => {
        if (err) throw err;
        if (!user) throw errors.unauthenticated(BAD_CREDENTIALS);
        if (user.deactivatedAt) throw errors.userDeactivated();
        if (user.tenant && !canSignIn(user.tenant.state)) throw errors.firmSuspended();
        await signIn(req, user);
        tools.signIn.forgetFailures(user.email);
        await user.update({ lastSignInAt: nowOf(deps) });
        res.json({ data: presentSession(user, nowOf(deps)) });
      })().catch(next);
    }) as RequestHandler;
    authenticate(req, res, next);
  });

  router.delete('/session', (req, res, next) => {
    req.logout((err) => (err ? next(err) : res.status(204).end()));
  });

  // Sign-up answers the same whether or not the address has a sign-in; the e-mail tells its owner which.
  router.post('/signup', ...tools.signUpLimiters, validate({ body: signUpSchema }), (req, res) => {
    const { body } = inputOf(req, { body: signUpSchema });
    // The work (hashing, the e-mail) runs after the answer, so its timing tells nothing either.
    const now = nowOf(deps);
    deps.background.run('sign-up request', () => requestFirmSignup(body, { ...deps, now }));
    res.status(202).json({
      data: { email: body.email, message: `Check your inbox at ${body.email} for a link to finish setting up your firm.` },
    });
  });

  router.get('/signups/:token', validate({ params: tokenParams }), async (req, res) => {
    const { params } = inputOf(req, { params: tokenParams });
    const request = await findUsableSignup(params.token, nowOf(deps));
    res.set('Cache-Control', 'no-store');
    res.json({ data: { firmName: request.firmName, name: request.name, email: request.email, expiresAt: request.expiresAt.toISOString() } });
  });

  router.post('/signups/:token', validate({ params: tokenParams }), async (req, res) => {
    const { params } = inputOf(req, { params: tokenParams });
    const owner = await confirmFirmSignup(params.token, { sequelize: deps.sequelize, now: nowOf(deps), ip: req.ip });
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
      const email = await completePasswordReset(params.token, body.password, { sequelize: deps.sequelize, now: nowOf(deps), ip: req.ip });
      // A new password clears the failed sign-ins counted against the address.
      tools.signIn.forgetFailures(email);
      res.json({ data: { message: 'Your password is changed. Sign in with the new one.' } });
    },
  );

  return router;
}
