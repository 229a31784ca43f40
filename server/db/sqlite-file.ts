/**
 * A plain sqlite3 connection to a database file, with promises: what backups and the firm
 * restore use, apart from the app's Sequelize pool. SQLite only.
 */
import sqlite3 from 'sqlite3';

type Param = string | number | null;

/** node-sqlite3's online backup (sqlite3_backup_*), which its type definitions leave out. */
interface NativeBackup {
  step(pages: number, callback: (err: Error | null) => void): void;
  finish(callback: (err: Error | null) => void): void;
  completed: boolean;
  failed: boolean;
}

export class SqliteFile {
  private constructor(
    private readonly db: sqlite3.Database,
    readonly file: string,
  ) {}

  /** Opens an existing file (never creates one); `readOnly` for backups being checked. */
  static open(file: string, { readOnly = false }: { readOnly?: boolean } = {}): Promise<SqliteFile> {
    const mode = readOnly ? sqlite3.OPEN_READONLY : sqlite3.OPEN_READWRITE;
    return new Promise((resolve, reject) => {
      const db = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(new SqliteFile(db, file))));
    });
  }

  run(sql: string, params: Param[] = []): Promise<number> {
    return new Promise((resolve, reject) =>
      this.db.run(sql, params, function (err) {
        if (err) reject(err);
        else resolve(this.changes);
      }),
    );
  }

  all<T>(sql: string, params: Param[] = []): Promise<T[]> {
    return new Promise((resolve, reject) => this.db.all<T>(sql, params, (err, rows) => (err ? reject(err) : resolve(rows))));
  }

  exec(sql: string): Promise<void> {
    return new Promise((resolve, reject) => this.db.exec(sql, (err) => (err ? reject(err) : resolve())));
  }

  close(): Promise<void> {
    return new Promise((resolve, reject) => this.db.close((err) => (err ? reject(err) : resolve())));
  }

  /**
   * Copies this database into `dest` in one backup step: the copy is the snapshot of the
   * read transaction this connection holds (or of the moment the step runs, if none).
   */
  async copyTo(dest: string): Promise<void> {
    const open = (this.db as unknown as { backup(file: string, cb: (err: Error | null) => void): NativeBackup }).backup.bind(this.db);
    const backup = await new Promise<NativeBackup>((resolve, reject) => {
      const b = open(dest, (err) => (err ? reject(err) : resolve(b)));
    });
    try {
      await new Promise<void>((resolve, reject) => backup.step(-1, (err) => (err ? reject(err) : resolve())));
      if (!backup.completed || backup.failed) throw new Error('The online backup did not complete.');
    } finally {
      await new Promise<void>((resolve) => backup.finish(() => resolve()));
    }
  }
}

/** A table or column name as an SQL identifier. */
export function quoteId(name: string): string {
  return `"${name.replace(/"/g, '""')}"`;
}

/** The user tables of a database (`schema` = main or an attached name), sorted. */
export async function tableNames(db: SqliteFile, schema = 'main'): Promise<string[]> {
  const rows = await db.all<{ name: string }>(
    `SELECT name FROM ${quoteId(schema)}.sqlite_schema WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name`,
  );
  return rows.map((r) => r.name);
}

export async function columnNames(db: SqliteFile, table: string, schema = 'main'): Promise<string[]> {
  const rows = await db.all<{ name: string }>(`PRAGMA ${quoteId(schema)}.table_info(${quoteId(table)})`);
  return rows.map((r) => r.name);
}

/** Rows per table, as the connection sees them now. */
export async function countRows(db: SqliteFile): Promise<Record<string, number>> {
  const counts: Record<string, number> = {};
  for (const table of await tableNames(db)) {
    const [row] = await db.all<{ n: number }>(`SELECT count(*) AS n FROM ${quoteId(table)}`);
    counts[table] = row?.n ?? 0;
  }
  return counts;
}
