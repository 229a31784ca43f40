/** Errors in Stripe's shape: `{ error: { type, code?, param?, message } }` with Stripe's statuses. */
export type StripeErrorType = 'invalid_request_error' | 'idempotency_error' | 'api_error';

export class StripeApiError extends Error {
  readonly status: number;
  readonly type: StripeErrorType;
  readonly code: string | undefined;
  readonly param: string | undefined;

  constructor(status: number, message: string, details: { type?: StripeErrorType; code?: string; param?: string } = {}) {
    super(message);
    this.name = 'StripeApiError';
    this.status = status;
    this.type = details.type ?? 'invalid_request_error';
    this.code = details.code;
    this.param = details.param;
  }

  toBody(): { error: { type: StripeErrorType; code?: string; param?: string; message: string } } {
    return {
      error: {
        type: this.type,
        ...(this.code ? { code: this.code } : {}),
        ...(this.param ? { param: this.param } : {}),
        message: this.message,
      },
    };
  }
}

/** The noun Stripe uses in "No such …" messages, by id prefix. */
const NOUN_BY_PREFIX: Array<[string, string]> = [
  ['cus_', 'customer'],
  ['price_', 'price'],
  ['prod_', 'product'],
  ['cs_', 'checkout.session'],
  ['sub_', 'subscription'],
  ['si_', 'subscription_item'],
  ['in_', 'invoice'],
  ['bps_', 'billing_portal.session'],
];

export const stripeErrors = {
  unauthenticated: (message: string) => new StripeApiError(401, message),
  /** an unknown id in the URL (param "id") or in a body field */
  resourceMissing: (noun: string, id: string, param = 'id', status = 404) =>
    new StripeApiError(status, `No such ${noun}: '${id}'`, { code: 'resource_missing', param }),
  missingParam: (param: string) => new StripeApiError(400, `Missing required param: ${param}.`, { code: 'parameter_missing', param }),
  invalidParam: (param: string, message: string) => new StripeApiError(400, message, { code: 'parameter_invalid', param }),
  invalidRequest: (message: string, param?: string) => new StripeApiError(400, message, param ? { param } : {}),
  unknownUrl: (method: string, path: string) => new StripeApiError(404, `Unrecognized request URL (${method}: ${path}).`),
};

export function nounForId(id: string): string {
  return NOUN_BY_PREFIX.find(([prefix]) => id.startsWith(prefix))?.[1] ?? 'object';
}
