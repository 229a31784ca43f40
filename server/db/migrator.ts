import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { MIGRATIONS } from './migrations/index';

export function createMigrator(sequelize: Sequelize): Umzug<QueryInterface> {
  return new Umzug({
    migrations: MIGRATIONS.map((m) => ({
      name: m.name,
      up: ({ context }) => m.up(context),
      down: ({ context }) => m.down(context),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await createMigrator(sequelize).up();
  return done.map((m) => m.name);
}
