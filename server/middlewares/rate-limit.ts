import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { errors } from '../errors';

export interface RateLimitOptions {
  /** attempts per window */
  limit: number;
  windowMs: number;
}

function emailOf(req: Request): string {
  const body = req.body as { email?: unknown } | undefined;
  return typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
}

/** Sign-in and password reset: per address and e-mail, answered 429 `rate_limited`. */
export function createAttemptLimiter({ limit, windowMs }: RateLimitOptions): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${emailOf(req)}`,
    handler: (_req, _res, next) => next(errors.rateLimited()),
  });
}
