import type { Sequelize } from 'sequelize';
import type { Mailer } from './emails/mailer';
import type { Logger } from './logger';
import type { TenantFiles } from './storage/tenant-files';

/** What the app is built from; tests pass their own (memory mailer, temp folders, clock). */
export interface AppDeps {
  sequelize: Sequelize;
  mailer: Mailer;
  files: TenantFiles;
  logger: Logger;
  appUrl: string;
  sessionSecret: string;
  secureCookies: boolean;
  serveClient?: string | undefined;
  rateLimits?: { signIn?: { limit: number; windowMs: number }; passwordReset?: { limit: number; windowMs: number } };
  now?: () => Date;
}
