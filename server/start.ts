/**
 * `npm start`: the product with demo data. Builds the client when dist/ is missing or stale,
 * migrates, seeds the invented demo scenario into an empty database (not in production),
 * starts maildev when no SMTP server is configured, prints where everything is, serves.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { readEnv } from './config/env';
import { TenantFiles } from './storage/tenant-files';
import { createSecretBox } from './crypto/secret-box';
import { buildClient, clientBuildIsStale } from './client-build';
import { DEMO_PASSWORD, isDatabaseEmpty, seedDemo, type DemoSignIn } from './db/seeders/demo';
import { startMailCatcher, type MailCatcher } from './fakes/mail-catcher';
import { billingFromEnv, startLocalBilling } from './billing/setup';
import type { StripeStandIn } from './fakes/stripe/index';
import { openDatabase, startServer } from './index';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

async function main(): Promise<void> {
  const source = { ...process.env };
  let env = readEnv(source);

  if (clientBuildIsStale(root)) {
    console.log('Building the client (dist/ is missing or older than src/)…');
    await buildClient(root);
  }

  let mail: MailCatcher | undefined;
  if (!env.smtpUrl) {
    mail = await startMailCatcher({ smtpPort: 1025, webPort: 1080 });
    env = { ...env, smtpUrl: mail.smtpUrl };
  }

  const sequelize = await openDatabase(env);
  let demo: DemoSignIn[] = [];
  if (!env.isProduction && (await isDatabaseEmpty())) demo = await seedDemo(sequelize, { secrets: createSecretBox(env.dataEncryptionKey), files: new TenantFiles(path.resolve(env.tenantsDir)) });

  let standIn: StripeStandIn | undefined;
  let billing = await billingFromEnv(env);
  if (!billing) {
    const local = await startLocalBilling({ appUrl: env.appUrl });
    billing = local.billing;
    standIn = local.standIn;
  }

  const running = await startServer(env, { sequelize, serveClient: path.join(root, 'dist'), billing });

  const lines = [
    '',
    `Mullion is running at ${env.appUrl}`,
    mail ? `Mail catcher (maildev): ${mail.webUrl} (SMTP ${mail.smtpUrl})` : `Mail goes out through SMTP_URL.`,
    standIn
      ? `Payments: local Stripe stand-in at ${standIn.url} (test card 4242 4242 4242 4242; 4000 0000 0000 0002 declines)`
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
