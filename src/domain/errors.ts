/** Error codes of the API (architecture.md, "API conventions") and their HTTP status. */
export const ERROR_STATUS = {
  validation_failed: 400,
  unauthenticated: 401,
  read_only: 402,
  plan_limit_reached: 402,
  csrf_failed: 403,
  forbidden: 403,
  firm_suspended: 403,
  user_deactivated: 403,
  not_found: 404,
  conflict: 409,
  email_taken: 409,
  zone_number_taken: 409,
  too_large: 413,
  unsupported_type: 415,
  rate_limited: 429,
  internal: 500,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

export interface ApiErrorBody {
  /** one of ErrorCode, or a newer code this client does not know yet */
  error: { code: string; message: string; fields?: Record<string, string> };
}

export function isApiErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const e = (value).error;
  return typeof e === 'object' && e !== null && 'code' in e && 'message' in e;
}
