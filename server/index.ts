/**
 * Opens the database, runs migrations, builds the app and listens. Returns a handle whose
 * close() shuts down in the order that avoids "connection manager was closed".
 */
import type { Server } from 'node:http';
import path from 'node:path';
import type { Sequelize } from 'sequelize';
import { createApp } from './app';
import { createBackgroundTasks } from './background-tasks';
import type { BillingConfig } from './billing/config';
import { createSecretBox } from './crypto/secret-box';
import type { Env } from './config/env';
import { migrate } from './db/migrator';
import { createSequelize } from './db/sequelize';
import { createSmtpMailer, type Mailer } from './emails/mailer';
import { backupScheduleFor } from './jobs/backup-schedule';
import { createMailOutbox, type OutboxSenderOptions } from './emails/outbox-sender';
import { createLogger, type Logger } from './logger';
import { initModels } from './models/index';
import { TenantFiles } from './storage/tenant-files';

export interface RunningServer {
  server: Server;
  port: number;
  sequelize: Sequelize;
  logger: Logger;
  close(): Promise<void>;
}

export async function openDatabase(env: Env): Promise<Sequelize> {
  const sequelize = createSequelize({ url: env.databaseUrl, logging: env.logLevel === 'debug' });
  await sequelize.authenticate();
  initModels(sequelize);
  await migrate(sequelize);
  return sequelize;
}

export async function startServer(
  env: Env,
  options: {
    mailer?: Mailer;
    serveClient?: string;
    sequelize?: Sequelize;
    host?: string;
    billing?: BillingConfig;
    /** retry tuning for the outbox sender (the crash test shortens the claim lease) */
    outbox?: Pick<OutboxSenderOptions, 'claimLeaseMs' | 'pollMs' | 'maxAttempts'>;
  } = {},
): Promise<RunningServer> {
  const logger = createLogger(env.logLevel);
  const sequelize = options.sequelize ?? (await openDatabase(env));
  if (!env.smtpUrl && !options.mailer) throw new Error('SMTP_URL is not set and no mailer was given.');
  const mailer = options.mailer ?? createSmtpMailer(env.smtpUrl!, env.mailFrom);
  const outbox = createMailOutbox({ mailer, logger, messageIdDomain: new URL(env.appUrl).hostname, ...options.outbox });
  const background = createBackgroundTasks(logger);
  if (env.isProduction && env.trustProxy === false) {
    logger.warn(
      'TRUST_PROXY is not set: every request is counted under the address that connects to Mullion. Behind a reverse proxy or load balancer, set TRUST_PROXY to the number of proxy hops (usually 1).',
    );
  }
  const { app, close: closeApp } = createApp({
    sequelize,
    outbox,
    background,
    files: new TenantFiles(path.resolve(env.tenantsDir)),
    logger,
    appUrl: env.appUrl,
    sessionSecret: env.sessionSecret,
    secrets: createSecretBox(env.dataEncryptionKey),
    secureCookies: env.isProduction,
    trustProxy: env.trustProxy,
    serveClient: options.serveClient,
    billing: options.billing,
  });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(env.port, options.host ?? '0.0.0.0', (err?: Error) => (err ? reject(err) : resolve(s)));
  });
  const backups = backupScheduleFor(env, logger);
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : env.port;
  // Sends what a previous run left pending (a crash, a relay that was down), then retries on a timer.
  outbox.start();
  return {
    server,
    port,
    sequelize,
    logger,
    async close() {
      await backups?.stop();
      // Stop accepting, let requests in flight finish (up to a grace period), then cut the
      // rest and only then close the database, so no handler meets a closed pool.
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeIdleConnections();
      const grace = new Promise<void>((resolve) => setTimeout(resolve, 5000).unref());
      await Promise.race([closed, grace]);
      server.closeAllConnections();
      await closed;
      // requests are done: stop the session store's timer and end the thumbnail workers;
      // work started by requests, then sends in flight, finish before the database closes.
      await closeApp();
      await background.idle();
      await outbox.stop();
      await sequelize.close();
    },
  };
}
