import type { Request, RequestHandler } from 'express';
import { ForbiddenError } from '@casl/ability';
import { subject, type Action, type SubjectType } from '@domain/abilities';
import type { Ctx } from '../context';
import type { AppDeps } from '../deps';
import { errors } from '../errors';

/** Runs a mutation in one transaction; services get the transaction through ctx. */
export function inTransaction<T>(req: Request, deps: Pick<AppDeps, 'sequelize'>, fn: (ctx: Ctx) => Promise<T>): Promise<T> {
  return deps.sequelize.transaction((transaction) => fn({ ...req.ctx, transaction }));
}

/**
 * The 404/403 rule: a record this user may not read answers 404 (another firm's anything);
 * one they may read but not change answers 403. A record being created does not exist
 * yet, so there is nothing to hide: a refused create answers 403.
 */
export function authorizeRecord(req: Request, action: Action, type: SubjectType, record: Record<string, unknown>, what: string): void {
  const tagged = subject(type, record);
  if (action !== 'create' && !req.ability.can('read', tagged)) throw errors.notFound(what);
  if (action !== 'read' && !req.ability.can(action, tagged)) throw errors.forbidden();
}

/** 403 unless the ability allows the action on the subject type at all. */
export function requireAbility(action: Action, type: SubjectType): RequestHandler {
  return (req, _res, next) => {
    try {
      ForbiddenError.from(req.ability).throwUnlessCan(action, type);
      next();
    } catch {
      next(errors.forbidden());
    }
  };
}

/** Firm routes: signed in with a firm (an operator has none: 403). */
export const requireFirm: RequestHandler = (req, _res, next) => {
  if (!req.user) return next(errors.unauthenticated());
  if (!req.ctx.tenantId) return next(errors.forbidden('This page belongs to a firm’s workspace; the operator has no firm.'));
  next();
};

export function nowOf(deps: Pick<AppDeps, 'now'>): Date {
  return deps.now ? deps.now() : new Date();
}

export function pageOf(number: number, size: number, total: number) {
  return { number, size, total };
}
