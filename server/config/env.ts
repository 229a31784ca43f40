/**
 * The only reader of process.env. Checked with zod at start; a bad value stops the server
 * with a readable list of what is wrong.
 */
import { isIP } from 'node:net';
import { z } from 'zod';

const DEV_SESSION_SECRET = 'mullion-development-session-secret-not-for-production';
const DEV_DATA_KEY = 'mullion-development-data-key-not-for-production';

/** `NAME=` in a .env file means "not set", never 0. */
const blankAsUnset = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);
/** Express's names for address ranges it understands in `trust proxy`. */
const PROXY_RANGE_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

/**
 * Which proxies in front of Mullion may tell it the visitor's address through
 * X-Forwarded-For. Unset: none, so a forged header cannot change the address that sign-in
 * limits count. A number is the count of proxy hops (1 for one load balancer or reverse
 * proxy); a comma-separated list names the proxies' addresses or subnets.
 */
export type TrustProxy = false | number | string[];

function parseTrustProxy(raw: string | undefined, ctx: z.RefinementCtx): TrustProxy {
  const value = (raw ?? '').trim().toLowerCase();
  if (value === '' || value === 'false' || value === '0') return false;
  if (/^\d+$/.test(value)) return Number(value);
  if (value === 'true') {
    ctx.addIssue({
      code: 'custom',
      message: 'TRUST_PROXY=true would believe any X-Forwarded-For header, so anyone could reset sign-in limits. Set the number of proxies in front of Mullion (usually 1) or their addresses.',
    });
    return false;
  }
  const parts = value.split(',').map((p) => p.trim()).filter(Boolean);
  const bad = parts.filter((p) => {
    if (PROXY_RANGE_NAMES.has(p)) return false;
    const [address, bits, extra] = p.split('/');
    if (extra !== undefined || !address || isIP(address) === 0) return true;
    return bits !== undefined && !/^\d{1,3}$/.test(bits);
  });
  if (bad.length > 0 || parts.length === 0) {
    ctx.addIssue({
      code: 'custom',
      message: `TRUST_PROXY is a number of proxy hops (e.g. 1) or a comma-separated list of proxy addresses or subnets (e.g. 10.0.0.0/8, loopback); not understood: ${bad.join(', ') || value}.`,
    });
    return false;
  }
  return parts;
}

const schema = z
  .object({
    NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
    PORT: z.coerce.number().int().min(0).max(65535).default(3000),
    APP_URL: z.url().optional(),
    DATABASE_URL: z
      .string()
      // Only SQLite is built and tested today; a postgres:// URL would fail later, so refuse it now.
      .refine((v) => v.startsWith('sqlite:'), {
        message: 'DATABASE_URL is sqlite:<path>; this version of Mullion runs on SQLite only.',
      })
      .optional(),
    SESSION_SECRET: z.string().min(32, 'SESSION_SECRET needs at least 32 characters.').optional(),
    DATA_ENCRYPTION_KEY: z.string().min(32, 'DATA_ENCRYPTION_KEY needs at least 32 characters.').optional(),
    TENANTS_DIR: z.string().default('./tenants'),
    SMTP_URL: z.string().optional(),
    MAIL_FROM: z.string().default('Mullion <no-reply@mullion.localhost>'),
    STRIPE_SECRET_KEY: z.string().optional(),
    STRIPE_WEBHOOK_SECRET: z.string().optional(),
    /** the Stripe API base, only to point the SDK at a stand-in in another container (http://stripe:12111) */
    STRIPE_API_BASE: z.url().optional(),
    LOG_LEVEL: z.enum(['debug', 'info', 'warn', 'error', 'silent']).default('info'),
    /** where `npm run db:backup` and the schedule write backups of the SQLite database */
    BACKUP_DIR: z.string().default('./data/backups'),
    /** backups older than this many days are deleted after a successful new one */
    BACKUP_KEEP_DAYS: z.preprocess(blankAsUnset, z.coerce.number().int().min(1, 'BACKUP_KEEP_DAYS is at least 1.').max(3650).default(14)),
    /** hours between scheduled backups in the server process; 0 = none; unset = 24 (0 when NODE_ENV=test) */
    BACKUP_INTERVAL_HOURS: z.preprocess(blankAsUnset, z.coerce.number().min(0).max(24 * 24, 'BACKUP_INTERVAL_HOURS is at most 576 (24 days).').optional()),
    TRUST_PROXY: z.string().optional().transform(parseTrustProxy),
  })
  .superRefine((v, ctx) => {
    if (v.NODE_ENV === 'production') {
      if (!v.SESSION_SECRET) ctx.addIssue({ code: 'custom', path: ['SESSION_SECRET'], message: 'SESSION_SECRET is required in production.' });
      if (!v.DATA_ENCRYPTION_KEY)
        ctx.addIssue({ code: 'custom', path: ['DATA_ENCRYPTION_KEY'], message: 'DATA_ENCRYPTION_KEY is required in production.' });
      if (!v.APP_URL) ctx.addIssue({ code: 'custom', path: ['APP_URL'], message: 'APP_URL is required in production.' });
    }
  });

export interface Env {
  nodeEnv: 'development' | 'test' | 'production';
  isProduction: boolean;
  isTest: boolean;
  port: number;
  appUrl: string;
  databaseUrl: string;
  sessionSecret: string;
  dataEncryptionKey: string;
  tenantsDir: string;
  smtpUrl: string | undefined;
  mailFrom: string;
  stripeSecretKey: string | undefined;
  stripeWebhookSecret: string | undefined;
  stripeApiBase: string | undefined;
  logLevel: 'debug' | 'info' | 'warn' | 'error' | 'silent';
  backupDir: string;
  backupKeepDays: number;
  /** 0 = no scheduled backups */
  backupIntervalHours: number;
  /** Express `trust proxy`: false (the default) trusts no X-Forwarded-For */
  trustProxy: TrustProxy;
}

export function readEnv(source: Record<string, string | undefined> = process.env): Env {
  const parsed = schema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `- ${i.path.join('.') || '(env)'}: ${i.message}`);
    throw new Error(`Configuration is not valid:\n${lines.join('\n')}`);
  }
  const v = parsed.data;
  return {
    nodeEnv: v.NODE_ENV,
    isProduction: v.NODE_ENV === 'production',
    isTest: v.NODE_ENV === 'test',
    port: v.PORT,
    appUrl: (v.APP_URL ?? `http://localhost:${v.PORT}`).replace(/\/+$/, ''),
    databaseUrl: v.DATABASE_URL ?? 'sqlite:data/mullion.sqlite',
    sessionSecret: v.SESSION_SECRET ?? DEV_SESSION_SECRET,
    dataEncryptionKey: v.DATA_ENCRYPTION_KEY ?? DEV_DATA_KEY,
    tenantsDir: v.TENANTS_DIR,
    smtpUrl: v.SMTP_URL || undefined,
    mailFrom: v.MAIL_FROM,
    stripeSecretKey: v.STRIPE_SECRET_KEY || undefined,
    stripeWebhookSecret: v.STRIPE_WEBHOOK_SECRET || undefined,
    stripeApiBase: v.STRIPE_API_BASE || undefined,
    logLevel: v.LOG_LEVEL,
    backupDir: v.BACKUP_DIR || './data/backups',
    backupKeepDays: v.BACKUP_KEEP_DAYS,
    backupIntervalHours: v.BACKUP_INTERVAL_HOURS ?? (v.NODE_ENV === 'test' ? 0 : 24),
    trustProxy: v.TRUST_PROXY,
  };
}
