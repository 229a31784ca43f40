import type { Sequelize } from 'sequelize';
import type { TrustProxy } from './config/env';
import type { BillingConfig } from './billing/config';
import type { SecretBox } from './crypto/secret-box';
import type { BackgroundTasks } from './background-tasks';
import type { MailOutbox } from './emails/outbox';
import type { Logger } from './logger';
import type { Thumbnailer } from './services/thumbnails';
import type { TenantFiles } from './storage/tenant-files';

export type RateLimitName =
  /** sign-in attempts for one address from one network address */
  | 'signIn'
  /** failed sign-ins from one network address, whatever the address typed */
  | 'signInPerIp'
  /** failed sign-ins to one address, from anywhere */
  | 'signInPerAccount'
  | 'passwordReset'
  /** sign-up requests from one network address */
  | 'signUpPerIp'
  /** sign-up requests naming one e-mail address */
  | 'signUpPerAddress'
  /** staff and client invitations (new and sent again) by one signed-in person */
  | 'invitationsPerUser';

/** What the app is built from; tests pass their own (memory mailer, temp folders, clock). */
export interface AppDeps {
  sequelize: Sequelize;
  /** every e-mail goes through the outbox (server/emails/outbox.ts), never straight to a mailer */
  outbox: MailOutbox;
  /** work a request starts without waiting for it (password-reset e-mails) */
  background: BackgroundTasks;
  files: TenantFiles;
  /** makes photo thumbnails in worker threads; createApp starts its own pool when none is given */
  thumbnails: Thumbnailer;
  logger: Logger;
  appUrl: string;
  sessionSecret: string;
  /** encrypts verbal passcodes at rest (DATA_ENCRYPTION_KEY) */
  secrets: SecretBox;
  secureCookies: boolean;
  serveClient?: string | undefined;
  /** Express `trust proxy` (TRUST_PROXY); unset or false: X-Forwarded-For is ignored */
  trustProxy?: TrustProxy;
  /** attempts per window; tests pass small numbers, the app has defaults (server/app.ts) */
  rateLimits?: Partial<Record<RateLimitName, { limit: number; windowMs: number }>>;
  now?: () => Date;
  /** Stripe (or the local stand-in); without it the billing routes answer 503 */
  billing?: BillingConfig | undefined;
}
