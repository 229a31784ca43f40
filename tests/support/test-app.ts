/**
 * The app under test for server tests: a fresh SQLite file per test file, migrated, with
 * a memory mailer and a temporary tenants/ folder.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import request from 'supertest';
import type { Sequelize } from 'sequelize';
import { createApp } from '@server/app';
import { createBackgroundTasks } from '@server/background-tasks';
import { createSecretBox } from '@server/crypto/secret-box';
import type { AppDeps } from '@server/deps';
import { migrate } from '@server/db/migrator';
import { createSequelize } from '@server/db/sequelize';
import { createMemoryMailer, type Mailer, type MailMessage } from '@server/emails/mailer';
import { createMailOutbox } from '@server/emails/outbox-sender';
import { createLogger } from '@server/logger';
import { initModels } from '@server/models/index';
import { TenantFiles } from '@server/storage/tenant-files';

export interface TestApp {
  app: Express;
  sequelize: Sequelize;
  /** what the memory mailer received */
  outbox: MailMessage[];
  /**
   * Waits for work requests started without waiting (password resets), then sends every
   * outbox message that is due. Other routes deliver their mail before answering.
   */
  flushMail(): Promise<void>;
  tenantsDir: string;
  clock: { now: Date };
  close(): Promise<void>;
}

/** Limits high enough never to stop a test; a test of a limit passes its own small numbers (the rest stay high). */
const RELAXED_LIMITS: NonNullable<AppDeps['rateLimits']> = {
  signIn: { limit: 1000, windowMs: 60_000 },
  signInPerIp: { limit: 1000, windowMs: 60_000 },
  signInPerAccount: { limit: 1000, windowMs: 60_000 },
  passwordReset: { limit: 1000, windowMs: 60_000 },
  signUpPerIp: { limit: 1000, windowMs: 60_000 },
  signUpPerAddress: { limit: 1000, windowMs: 60_000 },
  invitationsPerUser: { limit: 1000, windowMs: 60_000 },
};

export async function createTestApp(
  overrides: Partial<AppDeps> = {},
  options: { mailer?: Mailer & { outbox: MailMessage[] } } = {},
): Promise<TestApp> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-test-'));
  const sequelize = createSequelize({ url: `sqlite:${path.join(dir, 'test.sqlite')}` });
  initModels(sequelize);
  await migrate(sequelize);
  const mailer = options.mailer ?? createMemoryMailer();
  const tenantsDir = path.join(dir, 'tenants');
  const clock = { now: new Date() };
  const logger = createLogger('silent');
  const outbox = createMailOutbox({ mailer, logger, messageIdDomain: 'mullion.test', now: () => clock.now });
  const background = overrides.background ?? createBackgroundTasks(logger);
  const { app, close } = createApp({
    sequelize,
    outbox,
    files: new TenantFiles(tenantsDir),
    logger,
    appUrl: 'http://mullion.test',
    sessionSecret: 'test-session-secret-that-is-long-enough-123',
    secrets: createSecretBox('test-data-encryption-key-that-is-long-enough'),
    secureCookies: false,
    now: () => clock.now,
    ...overrides,
    background,
    rateLimits: { ...RELAXED_LIMITS, ...overrides.rateLimits },
  });
  return {
    app,
    sequelize,
    outbox: mailer.outbox,
    async flushMail() {
      await background.idle();
      await outbox.drain();
    },
    tenantsDir,
    clock,
    async close() {
      await close(); // the session store's timer and the thumbnail workers
      await background.idle();
      await outbox.stop();
      await sequelize.close();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** A browser-like visitor: keeps cookies and sends the CSRF token on every change. */
export class Visitor {
  readonly agent: ReturnType<typeof request.agent>;
  csrfToken = '';

  constructor(app: Express) {
    this.agent = request.agent(app);
  }

  /** GET /api/session, keeping the fresh CSRF token; call after sign-in and sign-out. */
  async session() {
    const res = await this.agent.get('/api/session');
    this.csrfToken = (res.body as { csrfToken: string }).csrfToken;
    return res;
  }

  get(url: string) {
    return this.agent.get(url);
  }
  post(url: string, body?: object) {
    return this.agent.post(url).set('X-CSRF-Token', this.csrfToken).send(body ?? {});
  }
  patch(url: string, body?: object) {
    return this.agent.patch(url).set('X-CSRF-Token', this.csrfToken).send(body ?? {});
  }
  put(url: string, body?: object) {
    return this.agent.put(url).set('X-CSRF-Token', this.csrfToken).send(body ?? {});
  }
  delete(url: string) {
    return this.agent.delete(url).set('X-CSRF-Token', this.csrfToken);
  }

  async signIn(email: string, password: string) {
    await this.session();
    const res = await this.post('/api/session', { email, password });
    await this.session();
    return res;
  }
}

/** A visitor with a fresh CSRF token. */
export async function visitor(app: Express): Promise<Visitor> {
  const v = new Visitor(app);
  await v.session();
  return v;
}

/** The link in the last e-mail to this address whose path contains `marker`, as a path. */
export function linkFromMail(outbox: MailMessage[], to: string, marker: string): string {
  const mail = [...outbox].reverse().find((m) => m.to === to);
  if (!mail) throw new Error(`No e-mail to ${to}`);
  const match = new RegExp(`https?://[^\\s"]*${marker}[^\\s"<]*`).exec(mail.text);
  if (!match) throw new Error(`No ${marker} link in the e-mail to ${to}`);
  return new URL(match[0]).pathname;
}
