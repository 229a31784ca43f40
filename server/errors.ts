/** Error factories with a stable code (src/domain/errors.ts); one middleware turns them into JSON. */
import { ERROR_STATUS, type ErrorCode } from '@domain/errors';

export class HttpError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string> | undefined;
  /** sent as `Retry-After` (seconds) with a 429 or 503 */
  retryAfterSeconds: number | undefined;

  constructor(status: number, code: string, message: string, fields?: Record<string, string>) {
    super(message);
    this.name = 'HttpError';
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

function make(code: ErrorCode, message: string, fields?: Record<string, string>): HttpError {
  return new HttpError(ERROR_STATUS[code], code, message, fields);
}

export const errors = {
  validation: (message: string, fields?: Record<string, string>) => make('validation_failed', message, fields),
  unauthenticated: (message = 'Sign in to continue.') => make('unauthenticated', message),
  forbidden: (message = 'Your role does not allow this.') => make('forbidden', message),
  notFound: (what = 'record') => make('not_found', `No such ${what}.`),
  conflict: (message: string, fields?: Record<string, string>) => make('conflict', message, fields),
  emailTaken: (
    field: string | null = 'email',
    message = 'That e-mail address already has a Mullion account. Sign in, or use another address.',
    fieldMessage = 'This e-mail address is already in use.',
  ) => make('email_taken', message, field ? { [field]: fieldMessage } : undefined),
  firmSuspended: () =>
    make('firm_suspended', 'This firm’s Mullion account is suspended. The firm owner can contact the Mullion operator.'),
  userDeactivated: () =>
    make('user_deactivated', 'This sign-in has been deactivated by the firm. Ask the firm owner if this is a mistake.'),
  csrf: () => make('csrf_failed', 'This page’s security token is missing or stale. Reload the page and try again.'),
  rateLimited: (message = 'Too many attempts. Wait a few minutes and try again.') => make('rate_limited', message),
  tooLarge: (message: string) => make('too_large', message),
  unsupportedType: (message: string, fields?: Record<string, string>) => make('unsupported_type', message, fields),
  /** the firm may read but not change anything until billing is sorted out (402) */
  readOnly: (message: string) => make('read_only', message),
  /** adding one more would pass the plan's limit (402) */
  planLimitReached: (message: string, fields?: Record<string, string>) => make('plan_limit_reached', message, fields),
  /** a hosted service Mullion needs is not set up or not answering */
  serviceUnavailable: (message: string) => new HttpError(503, 'service_unavailable', message),
  /** too many writes waiting at once: nothing was saved, the same request may be sent again */
  databaseBusy: () => {
    const e = new HttpError(503, 'database_busy', 'Mullion is saving a lot of changes just now and did not save this one. Try again in a moment.');
    e.retryAfterSeconds = 2;
    return e;
  },
};
