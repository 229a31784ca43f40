import type { RequestHandler } from 'express';
import type { AppDeps } from '../deps';
import { errors } from '../errors';
import { readOnlyOf } from '../presenters/billing';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Writes a read-only firm may still make: signing in and out, and sorting out billing. */
const ALWAYS_ALLOWED = [/^\/session$/, /^\/signups?(\/|$)/, /^\/billing(\/|$)/, /^\/password-resets(\/|$)/];

/**
 * A firm whose trial ended without a plan, or that is past due beyond the grace period, or
 * cancelled, is read-only: every write by its staff answers 402 with what to do; reads and
 * the billing page keep working. Its clients' portal keeps working for the households.
 */
export function readOnlyGuard(deps: Pick<AppDeps, 'now'>): RequestHandler {
  return (req, _res, next) => {
    const user = req.user;
    const tenant = req.ctx?.tenant;
    if (!user || !tenant || SAFE_METHODS.has(req.method) || user.role === 'client') return next();
    if (ALWAYS_ALLOWED.some((pattern) => pattern.test(req.path))) return next();
    const reason = readOnlyOf(tenant, deps.now ? deps.now() : new Date());
    next(reason ? errors.readOnly(reason.message) : undefined);
  };
}
