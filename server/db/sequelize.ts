import fs from 'node:fs';
import path from 'node:path';
import { Sequelize, type Options, type Transaction, type TransactionOptions } from 'sequelize';
import { WriteQueue, isWriteStatement } from './write-queue';

export interface DatabaseOptions {
  url: string;
  logging?: boolean;
}

/** How long a writer waits for its turn before the request is answered 503 (Retry-After). */
const WRITE_WAIT_MS = 20_000;

/**
 * Opens the database. SQLite (the default) runs in WAL mode with foreign keys on and a busy
 * timeout; write transactions start IMMEDIATE so two requests never deadlock on upgrade, and
 * every write (a transaction, or a single statement outside one) waits its turn in one
 * in-process queue (write-queue.ts) instead of in SQLite's busy handler. The busy timeout
 * remains for other processes (a backup, the command line).
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
    queueWrites(sequelize, new WriteQueue({ waitMs: WRITE_WAIT_MS }));
    return sequelize;
  }
  return new Sequelize(url, { logging: log, define: { underscored: false } });
}

type TransactionCallback<T> = (t: Transaction) => PromiseLike<T>;

/**
 * Routes every write of this Sequelize instance through the queue: `transaction()` takes a
 * turn before BEGIN and gives it back at COMMIT or ROLLBACK (before any afterCommit hook, so
 * a hook may write); a write statement outside a transaction takes a turn for itself.
 */
function queueWrites(sequelize: Sequelize, queue: WriteQueue): void {
  const begin = sequelize.transaction.bind(sequelize) as (options?: TransactionOptions) => Promise<Transaction>;
  const query = sequelize.query.bind(sequelize) as (sql: unknown, options?: { transaction?: Transaction | null }) => Promise<unknown>;

  async function transaction<T>(
    optionsOrCallback?: TransactionOptions | TransactionCallback<T>,
    maybeCallback?: TransactionCallback<T>,
  ): Promise<T | Transaction> {
    const options = typeof optionsOrCallback === 'function' ? undefined : optionsOrCallback;
    const callback = typeof optionsOrCallback === 'function' ? optionsOrCallback : maybeCallback;
    const release = await queue.acquire();
    let t: Transaction;
    try {
      t = await begin(options);
    } catch (err) {
      release();
      throw err;
    }
    t.afterCommit(release);
    const commit = t.commit.bind(t);
    const rollback = t.rollback.bind(t);
    t.commit = async () => {
      try {
        await commit();
      } catch (err) {
        release();
        throw err;
      }
    };
    t.rollback = async () => {
      try {
        await rollback();
      } finally {
        release();
      }
    };
    if (!callback) return t;
    let result: T;
    try {
      result = await callback(t);
    } catch (err) {
      await t.rollback().catch(() => undefined);
      throw err;
    }
    await t.commit();
    return result;
  }

  Object.assign(sequelize, {
    transaction,
    query(sql: string | { query: string }, options?: { transaction?: Transaction | null }) {
      const text = typeof sql === 'string' ? sql : sql.query;
      if (options?.transaction || !isWriteStatement(text)) return query(sql, options);
      return queue.run(() => query(sql, options));
    },
  });
  queues.set(sequelize, queue);
}

const queues = new WeakMap<Sequelize, WriteQueue>();

/** The write queue of a SQLite database (for health and benchmarks); undefined for other databases. */
export function writeQueueOf(sequelize: Sequelize): WriteQueue | undefined {
  return queues.get(sequelize);
}
