/**
 * One writer at a time, in order, inside this process.
 *
 * SQLite allows one write transaction at a time. Without a queue every waiting writer parks
 * a libuv thread in `busy_timeout` (there are four), so under load the transaction that holds
 * the lock cannot get a thread to run its next statement and every writer times out together.
 * Waiting here costs no thread: writers wait as promises and take the lock in turn.
 */
export class DatabaseBusyError extends Error {
  constructor(message = 'The database is busy.') {
    super(message);
    this.name = 'DatabaseBusyError';
  }
}

export interface WriteQueueOptions {
  /** how long a writer waits for its turn before giving up with DatabaseBusyError */
  waitMs: number;
}

interface Waiter {
  grant: () => void;
  timer: NodeJS.Timeout;
}

export class WriteQueue {
  private held = false;
  private readonly waiters: Waiter[] = [];
  /** how long a writer waits for its turn (tests shorten it on a running app) */
  waitMs: number;

  constructor(options: WriteQueueOptions) {
    this.waitMs = options.waitMs;
  }

  /** writers waiting for their turn (not counting the one writing) */
  get waiting(): number {
    return this.waiters.length;
  }

  get busy(): boolean {
    return this.held;
  }

  /** Resolves with a release function once it is this caller's turn. */
  acquire(): Promise<() => void> {
    if (!this.held) {
      this.held = true;
      return Promise.resolve(this.releaser());
    }
    return new Promise((resolve, reject) => {
      const waiter: Waiter = {
        grant: () => {
          clearTimeout(waiter.timer);
          resolve(this.releaser());
        },
        timer: setTimeout(() => {
          const at = this.waiters.indexOf(waiter);
          if (at >= 0) this.waiters.splice(at, 1);
          reject(new DatabaseBusyError(`Waited ${this.waitMs} ms for the database.`));
        }, this.waitMs),
      };
      this.waiters.push(waiter);
    });
  }

  /** Runs fn when it is this caller's turn and releases the turn however fn ends. */
  async run<T>(fn: () => Promise<T>): Promise<T> {
    const release = await this.acquire();
    try {
      return await fn();
    } finally {
      release();
    }
  }

  private releaser(): () => void {
    let released = false;
    return () => {
      if (released) return;
      released = true;
      const next = this.waiters.shift();
      if (next) next.grant();
      else this.held = false;
    };
  }
}

/** Statements that take SQLite's write lock when run outside a transaction. */
const WRITE_STATEMENT = /^\s*(?:INSERT|UPDATE|DELETE|REPLACE|CREATE|DROP|ALTER|VACUUM)\b/i;

export function isWriteStatement(sql: string): boolean {
  return WRITE_STATEMENT.test(sql);
}
