/**
 * The one way the client talks to the API: JSON in and out, the CSRF token on every
 * state-changing request, errors as ApiError with the server's code, message and fields.
 */
import { isApiErrorBody } from '@domain/errors';

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;
  /** the server's reference for a failure on its side (also in its log), for the user to quote */
  readonly requestId: string | undefined;

  constructor(status: number, code: string, message: string, fields: Record<string, string> = {}, requestId?: string) {
    super(requestId ? `${message} (Reference ${requestId}.)` : message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.requestId = requestId;
  }
}

/** Waits before sending again a write the server did not save because the database was busy. */
const BUSY_RETRY_CAP_MS = 5_000;
function waitBeforeRetry(response: Response): Promise<void> {
  const seconds = Number(response.headers.get('Retry-After'));
  const ms = Number.isFinite(seconds) && seconds > 0 ? Math.min(seconds * 1000, BUSY_RETRY_CAP_MS) : 1000;
  return new Promise((resolve) => setTimeout(resolve, ms));
}

let csrfToken: string | null = null;
let tokenRequest: Promise<string> | null = null;

/** Called with the token from every GET /api/session. */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

async function ensureCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  tokenRequest ??= fetch('/api/session', { credentials: 'same-origin', headers: { Accept: 'application/json' } })
    .then((r) => r.json() as Promise<{ csrfToken: string }>)
    .then((body) => {
      csrfToken = body.csrfToken;
      return body.csrfToken;
    })
    .finally(() => {
      tokenRequest = null;
    });
  return tokenRequest;
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

interface RequestOptions {
  body?: unknown;
  formData?: FormData;
  signal?: AbortSignal;
  onUploadProgress?: (fraction: number) => void;
}

async function send(method: Method, url: string, options: RequestOptions, retried: boolean): Promise<unknown> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers['X-CSRF-Token'] = await ensureCsrfToken();
  let body: BodyInit | undefined;
  if (options.formData) body = options.formData;
  else if (options.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(options.body);
  }
  let response: Response;
  try {
    response = await fetch(url, { method, headers, body, credentials: 'same-origin', signal: options.signal });
  } catch (err) {
    if (err instanceof DOMException && err.name === 'AbortError') throw err;
    throw new ApiError(0, 'network', 'Mullion could not be reached. Check the connection and try again.');
  }
  if (response.status === 204) return undefined;
  const text = await response.text();
  let json: unknown = undefined;
  if (text) {
    try {
      json = JSON.parse(text);
    } catch {
      json = undefined;
    }
  }
  if (response.ok) return json;
  if (isApiErrorBody(json)) {
    const e = json.error;
    if (e.code === 'csrf_failed' && !retried) {
      csrfToken = null;
      return send(method, url, options, true);
    }
    // 503 database_busy: nothing was saved, so sending the same request again once is safe.
    if (e.code === 'database_busy' && !retried) {
      await waitBeforeRetry(response);
      return send(method, url, options, true);
    }
    const requestId = 'requestId' in e && typeof e.requestId === 'string' ? e.requestId : undefined;
    throw new ApiError(response.status, e.code, e.message, e.fields ?? {}, requestId);
  }
  throw new ApiError(response.status, 'internal', `The server answered ${response.status}. Try again in a moment.`);
}

export const api = {
  get: <T>(url: string, signal?: AbortSignal) => send('GET', url, { signal }, false) as Promise<T>,
  post: <T>(url: string, body?: unknown) => send('POST', url, { body }, false) as Promise<T>,
  patch: <T>(url: string, body?: unknown) => send('PATCH', url, { body }, false) as Promise<T>,
  put: <T>(url: string, body?: unknown) => send('PUT', url, { body }, false) as Promise<T>,
  delete: <T = void>(url: string) => send('DELETE', url, {}, false) as Promise<T>,
  upload: <T>(url: string, formData: FormData) => send('POST', url, { formData }, false) as Promise<T>,
};

/** Uploads with progress (fetch has no upload progress; XMLHttpRequest does). */
export async function uploadWithProgress<T>(url: string, formData: FormData, onProgress: (fraction: number) => void): Promise<T> {
  const token = await ensureCsrfToken();
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('X-CSRF-Token', token);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload was interrupted. Try again.'));
    xhr.onload = () => {
      let json: unknown;
      try {
        json = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        json = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(json as T);
      else if (isApiErrorBody(json)) reject(new ApiError(xhr.status, json.error.code, json.error.message, json.error.fields ?? {}));
      else reject(new ApiError(xhr.status, 'internal', `The server answered ${xhr.status}.`));
    };
    xhr.send(formData);
  });
}
