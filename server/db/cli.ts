/** `npm run db:migrate | db:rollback | db:seed` */
import path from 'node:path';
import { TenantFiles } from '../storage/tenant-files';
import { readEnv } from '../config/env';
import { createSecretBox } from '../crypto/secret-box';
import { createMigrator } from './migrator';
import { createSequelize } from './sequelize';
import { initModels } from '../models/index';
import { isDatabaseEmpty, seedDemo } from './seeders/demo';

async function main(): Promise<void> {
  const env = readEnv();
  const command = process.argv[2];
  const sequelize = createSequelize({ url: env.databaseUrl });
  initModels(sequelize);
  const migrator = createMigrator(sequelize);
  try {
    if (command === 'migrate') {
      const done = await migrator.up();
      console.log(done.length ? `Applied: ${done.map((m) => m.name).join(', ')}` : 'Nothing to apply.');
    } else if (command === 'rollback') {
      const undone = await migrator.down();
      console.log(undone.length ? `Rolled back: ${undone.map((m) => m.name).join(', ')}` : 'Nothing to roll back.');
    } else if (command === 'seed') {
      if (env.isProduction) throw new Error('The demo scenario is never seeded in production; use npm run operator:create.');
      await migrator.up();
      if (!(await isDatabaseEmpty())) throw new Error('The database is not empty; the demo scenario seeds an empty database only.');
      const signIns = await seedDemo(sequelize, { secrets: createSecretBox(env.dataEncryptionKey), files: new TenantFiles(path.resolve(env.tenantsDir)) });
      console.log(`Seeded ${signIns.length} demo sign-ins.`);
    } else {
      throw new Error('Usage: tsx server/db/cli.ts migrate|rollback|seed');
    }
  } finally {
    await sequelize.close();
  }
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
