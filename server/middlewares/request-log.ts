/**
 * Request ids and the request log. Every request gets an id (the caller's `X-Request-Id` when
 * it is a sane value, otherwise a new UUID), every response carries it back in
 * `X-Request-Id`, and each request writes one line when it ends: method, path (no query,
 * tokens in the path masked), status, duration, request id, and the user and firm when
 * signed in. Nothing from the body, the cookies or other headers is logged.
 */
import crypto from 'node:crypto';
import type { RequestHandler } from 'express';
import type { Logger } from '../logger';

export const REQUEST_ID_HEADER = 'X-Request-Id';
const SANE_REQUEST_ID = /^[A-Za-z0-9._:-]{1,128}$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** a single-use token (32 random bytes, base64url) or anything as long and as plain */
const TOKEN_LIKE = /^[A-Za-z0-9_-]{32,}$/;
/** path words followed by a token: API and client pages for password resets and invitations */
const BEFORE_TOKEN = new Set(['password-resets', 'reset-password', 'invitations']);
export const MASKED_TOKEN = ':token';

/** The caller's id when it is safe to echo and log, otherwise a fresh one. */
export function requestIdFrom(incoming: string | undefined): string {
  return incoming !== undefined && SANE_REQUEST_ID.test(incoming) ? incoming : crypto.randomUUID();
}

/** The URL's path without its query, with tokens replaced by `:token` (record ids stay). */
export function loggablePath(originalUrl: string): string {
  const pathOnly = originalUrl.split('?')[0] ?? '';
  const segments = pathOnly.split('/');
  return segments
    .map((segment, i) => {
      if (segment === '' || UUID.test(segment)) return segment;
      if (TOKEN_LIKE.test(segment) || BEFORE_TOKEN.has(segments[i - 1] ?? '')) return MASKED_TOKEN;
      return segment;
    })
    .join('/');
}

export function requestLog(logger: Logger): RequestHandler {
  return (req, res, next) => {
    const started = process.hrtime.bigint();
    const requestId = requestIdFrom(req.get(REQUEST_ID_HEADER));
    req.requestId = requestId;
    res.setHeader(REQUEST_ID_HEADER, requestId);

    let written = false;
    const write = () => {
      if (written) return;
      written = true;
      const durationMs = Math.round(Number(process.hrtime.bigint() - started) / 1e4) / 100;
      const details: Record<string, unknown> = {
        requestId,
        method: req.method,
        path: loggablePath(req.originalUrl),
        status: res.statusCode,
        durationMs,
      };
      if (req.user) {
        details.userId = req.user.id;
        if (req.user.tenantId) details.tenantId = req.user.tenantId;
      }
      if (!res.writableFinished) details.aborted = true;
      if (res.statusCode >= 500) logger.error('request', details);
      else logger.info('request', details);
    };
    res.once('finish', write);
    res.once('close', write);
    next();
  };
}
