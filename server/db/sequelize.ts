import fs from 'node:fs';
import path from 'node:path';
import { Sequelize, type Options } from 'sequelize';

export interface DatabaseOptions {
  url: string;
  logging?: boolean;
}

/**
 * Opens the database. SQLite (the default) runs in WAL mode with foreign keys on and a busy
 * timeout; write transactions start IMMEDIATE so two requests never deadlock on upgrade.
 */
export function createSequelize({ url, logging = false }: DatabaseOptions): Sequelize {
  const log = logging ? (sql: string) => console.log(sql) : false;
  if (url.startsWith('sqlite:')) {
    const storage = url.slice('sqlite:'.length) || ':memory:';
    if (storage !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(storage)), { recursive: true });
    const options: Options = {
      dialect: 'sqlite',
      storage,
      logging: log,
      transactionType: 'IMMEDIATE' as Options['transactionType'],
      retry: { max: 5, match: [/SQLITE_BUSY/] },
      define: { underscored: false },
    };
    const sequelize = new Sequelize(options);
    sequelize.addHook('afterConnect', async (connection: unknown) => {
      const db = connection as { exec(sql: string, cb: (err: Error | null) => void): void };
      await new Promise<void>((resolve, reject) =>
        db.exec('PRAGMA journal_mode = WAL; PRAGMA foreign_keys = ON; PRAGMA busy_timeout = 5000;', (err) =>
          err ? reject(err) : resolve(),
        ),
      );
    });
    return sequelize;
  }
  return new Sequelize(url, { logging: log, define: { underscored: false } });
}
