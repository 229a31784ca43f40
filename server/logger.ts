/**
 * Logs: pino writing one JSON line per event to stdout, behind our small `Logger` interface
 * (call sites pass a message and optional details). Secret fields are redacted by pino
 * wherever they appear in the details, up to three levels deep.
 */
import pino, { type DestinationStream } from 'pino';

export type LogLevel = 'debug' | 'info' | 'warn' | 'error' | 'silent';

export interface Logger {
  debug(message: string, details?: Record<string, unknown>): void;
  info(message: string, details?: Record<string, unknown>): void;
  warn(message: string, details?: Record<string, unknown>): void;
  error(message: string, details?: Record<string, unknown>): void;
}

/**
 * Field names that hold secrets in Mullion: sign-in and reset passwords, stored hashes, the
 * site's verbal passcode (and its cipher), invitation and reset tokens, CSRF tokens, session
 * cookies and authorization headers, Stripe secrets, e-mail bodies.
 */
export const SECRET_FIELDS = [
  'password',
  'newPassword',
  'currentPassword',
  'passwordHash',
  'passcode',
  'verbalPasscode',
  'passcodeCipher',
  'token',
  'tokenHash',
  'csrfToken',
  'x-csrf-token',
  'cookie',
  'cookies',
  'set-cookie',
  'authorization',
  'stripe-signature',
  'secret',
  'sessionSecret',
  'webhookSecret',
  'dataEncryptionKey',
  'html',
  'text',
] as const;

const REDACTED = '[redacted]';

/** pino/fast-redact paths for every secret field at the top level and up to two levels down. */
export function redactPaths(fields: readonly string[] = SECRET_FIELDS): string[] {
  const paths: string[] = [];
  for (const field of fields) {
    const key = /^[A-Za-z_$][\w$]*$/.test(field) ? field : `["${field}"]`;
    const nested = key.startsWith('[') ? key : `.${key}`;
    paths.push(key, `*${nested}`, `*.*${nested}`);
  }
  return paths;
}

export interface LoggerOptions {
  /** where lines go; stdout when not given (tests pass a stream that keeps them) */
  destination?: DestinationStream;
}

/** The pino instance with Mullion's redaction and error serialisation. */
export function createPino(level: LogLevel, options: LoggerOptions = {}): pino.Logger {
  const settings: pino.LoggerOptions = {
    level,
    redact: { paths: redactPaths(), censor: REDACTED },
    serializers: { err: pino.stdSerializers.err, error: pino.stdSerializers.err },
    timestamp: pino.stdTimeFunctions.isoTime,
    formatters: { level: (label) => ({ level: label }) },
  };
  return options.destination ? pino(settings, options.destination) : pino(settings);
}

/** Our Logger interface over pino: `info('message', { details })` becomes one JSON line. */
export function createLogger(level: LogLevel, options: LoggerOptions = {}): Logger {
  return adaptPino(createPino(level, options));
}

export function adaptPino(log: pino.Logger): Logger {
  return {
    debug: (message, details) => log.debug(details ?? {}, message),
    info: (message, details) => log.info(details ?? {}, message),
    warn: (message, details) => log.warn(details ?? {}, message),
    error: (message, details) => log.error(details ?? {}, message),
  };
}
