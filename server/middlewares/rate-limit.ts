/**
 * Attempt limits, answered 429 `rate_limited` with `RateLimit`, `RateLimit-Policy` (IETF
 * draft 8, one named policy per limit) and `Retry-After` headers.
 *
 * The network address is `req.ip`, which believes X-Forwarded-For only as far as
 * TRUST_PROXY allows (server/config/env.ts); by default it does not, so a forged header
 * cannot start a fresh count. Counts live in this process's memory: with several app
 * instances each counts on its own (see the README's scale-out notes).
 */
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type RateLimitInfo } from 'express-rate-limit';
import { errors } from '../errors';

export interface RateLimitOptions {
  /** attempts per window */
  limit: number;
  windowMs: number;
}

/** The e-mail address in the body, written one way (as the schemas write it). */
export function emailOf(req: Request): string {
  const body = req.body as { email?: unknown } | undefined;
  return typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
}

function ipOf(req: Request): string {
  return ipKeyGenerator(req.ip ?? '');
}

function minutesUntil(info: RateLimitInfo | undefined, windowMs: number): number {
  const ms = info?.resetTime ? info.resetTime.getTime() - Date.now() : windowMs;
  return Math.max(1, Math.ceil(ms / 60_000));
}

function waitWords(minutes: number): string {
  return minutes === 1 ? '1 minute' : `${minutes} minutes`;
}

interface LimiterSpec extends RateLimitOptions {
  /** the policy's name in the RateLimit headers, and where express-rate-limit keeps its count on req */
  name: string;
  key: (req: Request) => string;
  /** what the person reads; `wait` is "12 minutes" */
  message: (wait: string) => string;
  /** count only answers of 400 and above (failed sign-ins), not successful ones */
  failuresOnly?: boolean;
}

export type Limiter = RequestHandler & { resetKey: (key: string) => void };

function createLimiter(spec: LimiterSpec): Limiter {
  const property = `rateLimit_${spec.name.replace(/[^a-z0-9]/gi, '_')}`;
  return rateLimit({
    windowMs: spec.windowMs,
    limit: spec.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    identifier: spec.name,
    requestPropertyName: property,
    skipSuccessfulRequests: spec.failuresOnly ?? false,
    keyGenerator: (req) => `${spec.name}|${spec.key(req)}`,
    handler: (req, _res, next) => {
      const info = (req as unknown as Record<string, RateLimitInfo | undefined>)[property];
      next(errors.rateLimited(spec.message(waitWords(minutesUntil(info, spec.windowMs)))));
    },
  }) as Limiter;
}

/** Password reset (requests and token use): per network address and e-mail. */
export function createAttemptLimiter({ limit, windowMs }: RateLimitOptions): RequestHandler {
  return createLimiter({
    name: 'attempts',
    limit,
    windowMs,
    key: (req) => `${ipOf(req)}|${emailOf(req)}`,
    message: (wait) => `Too many attempts. Wait ${wait} and try again.`,
  });
}

export interface SignInLimiters {
  /** the three limits, in the order they are checked */
  middleware: RequestHandler[];
  /**
   * Clears the count of failed sign-ins to one address after the right password or a
   * completed password reset, so the per-address limit counts consecutive failures.
   */
  forgetFailures(email: string): void;
}

/**
 * Sign-in:
 * - per network address and e-mail: every attempt counts (the limit this app always had);
 * - per network address, whatever address is typed: failed attempts only; catches one
 *   password tried against many addresses;
 * - per e-mail address, from any network address: failed attempts only, cleared by a
 *   successful sign-in or password reset; catches a guess spread over many machines. It
 *   counts addresses without a sign-in exactly like those with one, so it tells nothing.
 */
export function createSignInLimiters(options: {
  perAddressFromIp: RateLimitOptions;
  perIp: RateLimitOptions;
  perAccount: RateLimitOptions;
}): SignInLimiters {
  const perAddressFromIp = createLimiter({
    name: 'sign-in',
    ...options.perAddressFromIp,
    key: (req) => `${ipOf(req)}|${emailOf(req)}`,
    message: (wait) => `Too many attempts. Wait ${wait} and try again.`,
  });
  const perIp = createLimiter({
    name: 'sign-in-network',
    ...options.perIp,
    failuresOnly: true,
    key: ipOf,
    message: (wait) =>
      `Too many attempts to sign in from your network. Wait ${wait} and try again; if you have forgotten your password, reset it.`,
  });
  const perAccount = createLimiter({
    name: 'sign-in-address',
    ...options.perAccount,
    failuresOnly: true,
    key: emailOf,
    message: (wait) =>
      `Too many wrong passwords for this address. Wait ${wait}, or reset your password to sign in now.`,
  });
  return {
    middleware: [perAddressFromIp, perIp, perAccount],
    forgetFailures: (email) => perAccount.resetKey(`sign-in-address|${email.trim().toLowerCase()}`),
  };
}

/** Sign-up requests: per network address, and per e-mail address (so nobody's inbox is flooded). */
export function createSignUpLimiters(options: { perIp: RateLimitOptions; perAddress: RateLimitOptions }): RequestHandler[] {
  return [
    createLimiter({
      name: 'sign-up-network',
      ...options.perIp,
      key: ipOf,
      message: (wait) => `Too many sign-ups from your network. Wait ${wait} and try again.`,
    }),
    createLimiter({
      name: 'sign-up-address',
      ...options.perAddress,
      key: emailOf,
      message: (wait) =>
        `We have already sent several e-mails to this address. Check its inbox and spam folder, or wait ${wait} and try again.`,
    }),
  ];
}

/** Invitations (staff and households, new and sent again): per signed-in person. */
export function createInvitationLimiter(options: RateLimitOptions): RequestHandler {
  return createLimiter({
    name: 'invitations',
    ...options,
    key: (req) => (req.user ? `user:${req.user.id}` : `ip:${ipOf(req)}`),
    message: (wait) => `You have sent a lot of invitations in a short time. Wait ${wait} and send the rest.`,
  });
}
