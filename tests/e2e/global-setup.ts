/**
 * Global setup of the `e2e` project: finds Chromium, builds the client into a temporary
 * folder (dist/ is left alone), starts a mail catcher and the app on free loopback ports
 * with a fresh database and tenants/ folder, seeds the demo scenario, and hands the URLs to
 * the tests through `inject('baseUrl' | 'mailUrl' | 'chromiumPath')`.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { TestProject } from 'vitest/node';
import { readEnv } from '../../server/config/env';
import { createSecretBox } from '../../server/crypto/secret-box';
import { seedDemo } from '../../server/db/seeders/demo';
import { TenantFiles } from '../../server/storage/tenant-files';
import { startMailCatcher } from '../../server/fakes/mail-catcher';
import { openDatabase, startServer } from '../../server/index';
import { startLocalBilling } from '../../server/billing/setup';

declare module 'vitest' {
  export interface ProvidedContext {
    /** the app under test, e.g. http://127.0.0.1:41234 (no trailing slash) */
    baseUrl: string;
    /** the mail catcher's web UI and REST API, e.g. http://127.0.0.1:41235 */
    mailUrl: string;
    /** the Chromium binary the browser helpers launch */
    chromiumPath: string;
    /** the local Stripe stand-in (hosted checkout, billing portal, test controls) */
    stripeUrl: string;
  }
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DEBIAN_CHROMIUM = '/usr/bin/chromium';
const HOW_TO_INSTALL =
  'Install Debian\'s chromium ("sudo apt-get install -y chromium") or set CHROMIUM_PATH to a Chromium binary, then run the tests again.';

/** CHROMIUM_PATH, else Debian's chromium, else installs it (root with apt-get), else fails. */
export function findChromium(): string {
  const configured = process.env.CHROMIUM_PATH;
  if (configured) {
    if (!fs.existsSync(configured)) throw new Error(`CHROMIUM_PATH is ${configured}, but no file is there. ${HOW_TO_INSTALL}`);
    return configured;
  }
  if (fs.existsSync(DEBIAN_CHROMIUM)) return DEBIAN_CHROMIUM;

  const isRoot = process.getuid?.() === 0;
  const aptGet = ['/usr/bin/apt-get', '/bin/apt-get'].find((p) => fs.existsSync(p));
  if (isRoot && aptGet) {
    console.log('Chromium is missing: installing Debian\'s chromium for the browser tests (about 30 s)…');
    const options = { stdio: 'inherit' as const, env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } };
    execFileSync(aptGet, ['update'], options);
    execFileSync(aptGet, ['install', '-y', 'chromium'], options);
    if (fs.existsSync(DEBIAN_CHROMIUM)) return DEBIAN_CHROMIUM;
    throw new Error(`apt-get installed chromium, but ${DEBIAN_CHROMIUM} is still missing. ${HOW_TO_INSTALL}`);
  }
  throw new Error(`The browser tests need Chromium and none was found. ${HOW_TO_INSTALL}`);
}

/** Free TCP ports on the loopback interface (held open together, so they differ). */
export async function freePorts(count: number): Promise<number[]> {
  const servers = await Promise.all(
    Array.from(
      { length: count },
      () =>
        new Promise<net.Server>((resolve, reject) => {
          const s = net.createServer();
          s.once('error', reject);
          s.listen(0, '127.0.0.1', () => resolve(s));
        }),
    ),
  );
  const ports = servers.map((s) => (s.address() as net.AddressInfo).port);
  await Promise.all(servers.map((s) => new Promise<void>((resolve) => s.close(() => resolve()))));
  return ports;
}

/** Builds the client as `npm run build` does, but into outDir. */
async function buildClientInto(outDir: string): Promise<void> {
  const { build } = await import('vite');
  // The test runner sets NODE_ENV=test, which would give a development build of React.
  const nodeEnv = process.env.NODE_ENV;
  process.env.NODE_ENV = 'production';
  try {
    await build({
      root,
      configFile: path.join(root, 'vite.config.ts'),
      mode: 'production',
      logLevel: 'warn',
      build: { outDir, emptyOutDir: true },
    });
  } finally {
    if (nodeEnv === undefined) delete process.env.NODE_ENV;
    else process.env.NODE_ENV = nodeEnv;
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const chromiumPath = findChromium();

  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-e2e-'));
  const cleanups: (() => Promise<void> | void)[] = [() => fs.rmSync(tmp, { recursive: true, force: true })];
  const teardown = async () => {
    for (const cleanup of cleanups.splice(0).reverse()) {
      try {
        await cleanup();
      } catch (err) {
        console.error('e2e teardown:', err);
      }
    }
  };

  try {
    const clientDir = path.join(tmp, 'client');
    await buildClientInto(clientDir);

    const [appPort, smtpPort, webPort, stripePort] = (await freePorts(4)) as [number, number, number, number];
    const mail = await startMailCatcher({ smtpPort, webPort });
    cleanups.push(() => mail.close());

    const baseUrl = `http://127.0.0.1:${appPort}`;
    const env = readEnv({
      NODE_ENV: 'test',
      PORT: String(appPort),
      APP_URL: baseUrl,
      DATABASE_URL: `sqlite:${path.join(tmp, 'e2e.sqlite')}`,
      TENANTS_DIR: path.join(tmp, 'tenants'),
      SMTP_URL: mail.smtpUrl,
      LOG_LEVEL: 'warn',
    });

    const sequelize = await openDatabase(env);
    // Until the server runs, teardown closes the database itself; afterwards the server's
    // close() does, in the order that lets open requests finish first.
    let stopApp = () => sequelize.close();
    cleanups.push(() => stopApp());
    await seedDemo(sequelize, { secrets: createSecretBox(env.dataEncryptionKey), files: new TenantFiles(path.resolve(env.tenantsDir)) });

    const local = await startLocalBilling({ appUrl: baseUrl, port: stripePort });
    cleanups.push(() => local.standIn.close());
    const running = await startServer(env, { sequelize, serveClient: clientDir, host: '127.0.0.1', billing: local.billing });
    stopApp = () => running.close();

    project.provide('baseUrl', baseUrl);
    project.provide('mailUrl', mail.webUrl);
    project.provide('chromiumPath', chromiumPath);
    project.provide('stripeUrl', local.standIn.url);
  } catch (err) {
    await teardown();
    throw err;
  }

  return teardown;
}
