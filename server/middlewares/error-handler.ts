import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ForbiddenError } from '@casl/ability';
import { TimeoutError as SequelizeTimeoutError, UniqueConstraintError, ValidationError as SequelizeValidationError } from 'sequelize';
import { DatabaseBusyError } from '../db/write-queue';
import multer from 'multer';
import { HttpError, errors } from '../errors';
import type { Logger } from '../logger';
import { loggablePath } from './request-log';

export const apiNotFound: RequestHandler = (_req, _res, next) => {
  next(errors.notFound('API route'));
};

export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err: unknown, req, res, _next) => {
    let e: HttpError;
    if (err instanceof HttpError) e = err;
    else if (err instanceof ForbiddenError) e = errors.forbidden();
    else if (err instanceof DatabaseBusyError || err instanceof SequelizeTimeoutError) {
      // SQLITE_BUSY (another process held the lock past the busy timeout) or too long a wait
      // in the write queue: the transaction was rolled back, so the client may simply retry.
      logger.warn('Database busy', { method: req.method, path: req.originalUrl, reason: err.message });
      e = errors.databaseBusy();
    }
    else if (err instanceof UniqueConstraintError) e = errors.conflict('That value is already taken.');
    else if (err instanceof SequelizeValidationError) {
      const fields: Record<string, string> = {};
      for (const item of err.errors) if (item.path) fields[item.path] = item.message;
      e = errors.validation('Check the highlighted fields.', fields);
    } else if (err instanceof multer.MulterError) {
      e =
        err.code === 'LIMIT_FILE_SIZE'
          ? errors.tooLarge('The file is too large.')
          : errors.validation(`Upload not accepted: ${err.message}.`, { [err.field ?? 'file']: err.message });
    } else if (isBodyParserError(err)) {
      e =
        err.type === 'entity.too.large'
          ? errors.tooLarge('The request is too large.')
          : errors.validation('The request body is not valid JSON.', { body: 'Not valid JSON.' });
    } else {
      logger.error('Unhandled error', { requestId: req.requestId, method: req.method, path: loggablePath(req.originalUrl), err });
      e = new HttpError(500, 'internal', 'Something went wrong on our side. Nothing you entered was lost; try again.');
    }
    if (res.headersSent) return;
    if (e.retryAfterSeconds !== undefined) res.set('Retry-After', String(e.retryAfterSeconds));
    // A 500 names its request id so the user can quote it; the same id is in X-Request-Id and the log.
    const requestId = e.status >= 500 && req.requestId ? { requestId: req.requestId } : {};
    res.status(e.status).json({ error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}), ...requestId } });
  };
}

function isBodyParserError(err: unknown): err is { type: string; status: number } {
  return typeof err === 'object' && err !== null && 'type' in err && 'status' in err && typeof (err as { type: unknown }).type === 'string';
}
