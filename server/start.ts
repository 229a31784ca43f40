/**
 * `npm start`: the product with demo data. Builds the client when dist/ is missing or stale,
 * migrates, seeds the invented demo scenario into an empty database (not in production),
 * starts maildev when no SMTP server is configured, prints where everything is, serves.
 *
 * Ports: the app keeps its port (PORT, default 3000) and stops at once with a clear message
 * when it is taken, because its address is the one people open, links in e-mails carry and
 * the dev proxy targets. The stand-ins move to free ports when their usual ones are taken
 * (a second `npm start` on the same machine) and the printed URLs say where they are.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readEnv } from './config/env';
import { TenantFiles } from './storage/tenant-files';
import { createSecretBox } from './crypto/secret-box';
import { buildClient, clientBuildIsStale } from './client-build';
import { DEMO_PASSWORD, isDatabaseEmpty, seedDemo, type DemoSignIn } from './db/seeders/demo';
import { startMailCatcher, USUAL_MAIL_WEB_PORT, USUAL_SMTP_PORT, type MailCatcher } from './fakes/mail-catcher';
import { billingFromEnv, startLocalBilling, USUAL_STRIPE_STAND_IN_PORT } from './billing/setup';
import type { StripeStandIn } from './fakes/stripe/index';
import { openDatabase, startServer } from './index';
import { isPortFree } from './ports';

const APP_HOST = '0.0.0.0';

/** Why the app cannot have its port, and what to do about it. */
function appPortTaken(port: number, portWasSet: boolean): string {
  const next = port === 65535 ? 3001 : port + 1;
  return [
    `Port ${port} is already in use${portWasSet ? ' (PORT)' : ''}: perhaps another \`npm start\` of Mullion is running.`,
    `Stop that one, or start this one on another port, e.g. PORT=${next} npm start`,
    'Mail catcher and Stripe stand-in pick free ports on their own when theirs are taken.',
  ].join('\n');
}

function movedFrom(usual: number, actual: number): string {
  return actual === usual ? '' : ` (${usual} was taken)`;
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

async function main(): Promise<void> {
  const source = { ...process.env };
  let env = readEnv(source);
  const portWasSet = Boolean(source.PORT);
  // Before the slow client build and the stand-ins: the app's own port must be free.
  if (env.port !== 0 && !(await isPortFree(env.port, APP_HOST))) throw new Error(appPortTaken(env.port, portWasSet));

  if (clientBuildIsStale(root)) {
    console.log('Building the client (dist/ is missing or older than src/)…');
    await buildClient(root);
  }

  let mail: MailCatcher | undefined;
  if (!env.smtpUrl) {
    mail = await startMailCatcher({ smtpPort: USUAL_SMTP_PORT, webPort: USUAL_MAIL_WEB_PORT });
    env = { ...env, smtpUrl: mail.smtpUrl };
  }

  const sequelize = await openDatabase(env);
  let demo: DemoSignIn[] = [];
  if (!env.isProduction && (await isDatabaseEmpty())) demo = await seedDemo(sequelize, { secrets: createSecretBox(env.dataEncryptionKey), files: new TenantFiles(path.resolve(env.tenantsDir)) });

  let standIn: StripeStandIn | undefined;
  let billing = await billingFromEnv(env);
  if (!billing) {
    const local = await startLocalBilling({ appUrl: env.appUrl, port: USUAL_STRIPE_STAND_IN_PORT });
    billing = local.billing;
    standIn = local.standIn;
  }

  const running = await startServer(env, { sequelize, serveClient: path.join(root, 'dist'), billing, host: APP_HOST }).catch(
    async (err: unknown) => {
      await mail?.close();
      await standIn?.close();
      await sequelize.close();
      if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') throw new Error(appPortTaken(env.port, portWasSet));
      throw err;
    },
  );

  const lines = [
    '',
    `Mullion is running at ${env.appUrl}`,
    mail
      ? `Mail catcher (maildev): ${mail.webUrl}${movedFrom(USUAL_MAIL_WEB_PORT, mail.webPort)}; SMTP ${mail.smtpUrl}${movedFrom(USUAL_SMTP_PORT, mail.smtpPort)}`
      : `Mail goes out through SMTP_URL.`,
    standIn
      ? `Payments: local Stripe stand-in at ${standIn.url}${movedFrom(USUAL_STRIPE_STAND_IN_PORT, standIn.port)}; test card 4242 4242 4242 4242 (4000 0000 0000 0002 declines)`
      : 'Payments: Stripe with STRIPE_SECRET_KEY; webhooks to /api/webhooks/stripe.',
  ];
  if (demo.length > 0) {
    lines.push('', `Demo sign-ins (password for all: ${DEMO_PASSWORD}):`);
    for (const d of demo) lines.push(`  ${d.role.padEnd(12)} ${d.email.padEnd(32)} ${d.firm ?? 'the Mullion service'}`);
  } else if (!env.isProduction) {
    lines.push('', `The database already had data; demo sign-ins use the password ${DEMO_PASSWORD}.`);
  }
  console.log(lines.join('\n') + '\n');

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    console.log('Stopping…');
    await running.close();
    await mail?.close();
    await standIn?.close();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
