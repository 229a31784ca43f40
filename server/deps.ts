import type { Sequelize } from 'sequelize';
import type { BillingConfig } from './billing/config';
import type { SecretBox } from './crypto/secret-box';
import type { BackgroundTasks } from './background-tasks';
import type { MailOutbox } from './emails/outbox';
import type { Logger } from './logger';
import type { Thumbnailer } from './services/thumbnails';
import type { TenantFiles } from './storage/tenant-files';

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
  rateLimits?: { signIn?: { limit: number; windowMs: number }; passwordReset?: { limit: number; windowMs: number } };
  now?: () => Date;
  /** Stripe (or the local stand-in); without it the billing routes answer 503 */
  billing?: BillingConfig | undefined;
}
