import type { Request, RequestHandler } from 'express';
import { doubleCsrf } from 'csrf-csrf';
import { errors } from '../errors';

export interface Csrf {
  protect: RequestHandler;
  issue(req: Request, res: Parameters<RequestHandler>[1]): string;
}

/**
 * Double-submit CSRF tokens bound to the session id. Every state-changing request carries
 * X-CSRF-Token (the Stripe webhook excepted); GET /api/session hands out the token.
 */
export function createCsrf(secret: string, secure: boolean): Csrf {
  const { doubleCsrfProtection, generateCsrfToken } = doubleCsrf({
    getSecret: () => secret,
    getSessionIdentifier: (req) => req.session.id,
    cookieName: secure ? '__Host-mullion.csrf' : 'mullion.csrf',
    cookieOptions: { sameSite: 'lax', path: '/', secure, httpOnly: true },
    getCsrfTokenFromRequest: (req) => req.get('x-csrf-token'),
    skipCsrfProtection: (req) => req.path === '/api/webhooks/stripe',
  });
  return {
    protect: (req, res, next) => {
      doubleCsrfProtection(req, res, (err?: unknown) => next(err ? errors.csrf() : undefined));
    },
    issue: (req, res) => {
      // Bind the token to a saved session, or the next request cannot be checked.
      req.session.csrfIssuedAt = Date.now();
      return generateCsrfToken(req, res, { overwrite: false, validateOnReuse: false });
    },
  };
}
