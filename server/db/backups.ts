/**
 * Online backups of the SQLite database: a consistent copy taken while the app keeps
 * writing, checked before it counts as a backup, and kept for a number of days.
 *
 * SQLite only. A Postgres DATABASE_URL is backed up with the server's own tools (pg_dump).
 */
import fs from 'node:fs';
import path from 'node:path';
import { SqliteFile, countRows, tableNames } from './sqlite-file';

/** A backup that is not usable: unreadable, failing `PRAGMA integrity_check`, or not matching what was copied. */
export class BackupCheckError extends Error {
  constructor(file: string, problem: string) {
    super(`The backup ${path.basename(file)} failed its check: ${problem}`);
    this.name = 'BackupCheckError';
  }
}

export interface BackupResult {
  file: string;
  takenAt: Date;
  /** rows per table in the copy (equal to the snapshot that was copied) */
  counts: Record<string, number>;
  bytes: number;
}

export interface BackupEntry {
  file: string;
  takenAt: Date;
}

const NAME = /^mullion-(\d{4})-(\d{2})-(\d{2})T(\d{2})-(\d{2})-(\d{2})\.(\d{3})Z\.sqlite$/;

/** `mullion-2026-12-05T03-00-00.000Z.sqlite`: the UTC time the copy was taken. */
export function backupFileName(takenAt: Date): string {
  return `mullion-${takenAt.toISOString().replace(/:/g, '-')}.sqlite`;
}

export function parseBackupFileName(name: string): Date | null {
  const m = NAME.exec(name);
  if (!m) return null;
  const [, y, mo, d, h, mi, s, ms] = m;
  const date = new Date(`${y}-${mo}-${d}T${h}:${mi}:${s}.${ms}Z`);
  return Number.isNaN(date.getTime()) ? null : date;
}

/**
 * The database file a DATABASE_URL names, or null when there is none to back up: an
 * in-memory database, or not SQLite at all (see `backupsUnsupportedReason`).
 */
export function sqliteFileOf(databaseUrl: string): string | null {
  if (!databaseUrl.startsWith('sqlite:')) return null;
  const storage = databaseUrl.slice('sqlite:'.length);
  if (!storage || storage === ':memory:' || storage.startsWith('file::memory:')) return null;
  return path.resolve(storage);
}

/** Why this DATABASE_URL has no built-in backups, or null when it has. */
export function backupsUnsupportedReason(databaseUrl: string): string | null {
  if (!databaseUrl.startsWith('sqlite:'))
    return 'Built-in backups cover SQLite only; this DATABASE_URL is not SQLite: back it up with the database server’s own tools (for Postgres, pg_dump).';
  if (!sqliteFileOf(databaseUrl)) return 'The database is in memory: there is nothing to back up.';
  return null;
}

/** The backups in `dir` (files named by `backupFileName` only), oldest first. */
export function listBackups(dir: string): BackupEntry[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .map((name) => ({ name, takenAt: parseBackupFileName(name) }))
    .filter((e): e is { name: string; takenAt: Date } => e.takenAt !== null)
    .map((e) => ({ file: path.join(dir, e.name), takenAt: e.takenAt }))
    .sort((a, b) => a.takenAt.getTime() - b.takenAt.getTime());
}

function removeWithSidecars(file: string): void {
  for (const f of [file, `${file}-wal`, `${file}-shm`, `${file}-journal`]) fs.rmSync(f, { force: true });
}

/**
 * Checks a backup file: it opens as a database, `PRAGMA integrity_check` answers ok, it has
 * Mullion's tables, and — when `expected` is given — it holds exactly those rows per table.
 * Returns its rows per table; throws BackupCheckError otherwise.
 */
export async function checkBackup(file: string, expected?: Record<string, number>): Promise<Record<string, number>> {
  if (!fs.existsSync(file)) throw new BackupCheckError(file, 'no such file.');
  let db: SqliteFile;
  try {
    db = await SqliteFile.open(file, { readOnly: true });
  } catch (err) {
    throw new BackupCheckError(file, `it cannot be opened (${(err as Error).message}).`);
  }
  try {
    const result = await db.all<{ integrity_check: string }>('PRAGMA integrity_check');
    const messages = result.map((r) => r.integrity_check);
    if (messages.length !== 1 || messages[0] !== 'ok') throw new BackupCheckError(file, `integrity_check reports: ${messages.slice(0, 5).join('; ')}`);
    const tables = await tableNames(db);
    for (const needed of ['tenants', 'users', 'schema_migrations']) {
      if (!tables.includes(needed)) throw new BackupCheckError(file, `it has no ${needed} table; it is not a Mullion database.`);
    }
    const counts = await countRows(db);
    if (expected) {
      const names = new Set([...Object.keys(expected), ...Object.keys(counts)]);
      const differences = [...names]
        .filter((t) => expected[t] !== counts[t])
        .map((t) => `${t}: ${counts[t] ?? 'missing'} rows, ${expected[t] ?? 'none'} copied`);
      if (differences.length) throw new BackupCheckError(file, `row counts differ from what was copied (${differences.join(', ')}).`);
    }
    return counts;
  } catch (err) {
    if (err instanceof BackupCheckError) throw err;
    throw new BackupCheckError(file, (err as Error).message);
  } finally {
    await db.close().catch(() => undefined);
  }
}

/**
 * Takes an online backup of `databaseFile` into `dir`. The copy is made with SQLite's backup
 * API inside one read transaction, so it is the database at one instant even while the app
 * keeps writing (WAL); the rows per table of that same instant are counted. The copy is
 * written as `<name>.partial`, switched out of WAL mode, checked (`checkBackup`), and only
 * then renamed to its final name; a copy that fails its check is deleted and an error thrown.
 */
export async function takeBackup({ databaseFile, dir, now = new Date() }: { databaseFile: string; dir: string; now?: Date }): Promise<BackupResult> {
  if (!fs.existsSync(databaseFile)) throw new Error(`There is no database file at ${databaseFile}.`);
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, backupFileName(now));
  if (fs.existsSync(file)) throw new Error(`A backup named ${path.basename(file)} already exists.`);
  const partial = `${file}.partial`;
  removeWithSidecars(partial);

  try {
    const source = await SqliteFile.open(databaseFile);
    let counts: Record<string, number>;
    try {
      await source.exec('PRAGMA busy_timeout = 5000');
      await source.exec('BEGIN');
      try {
        counts = await countRows(source); // starts the read transaction: the snapshot copied below
        await source.copyTo(partial);
      } finally {
        await source.exec('COMMIT');
      }
    } finally {
      await source.close();
    }

    const copy = await SqliteFile.open(partial);
    try {
      await copy.exec('PRAGMA journal_mode = DELETE'); // one self-contained file
    } finally {
      await copy.close();
    }
    await checkBackup(partial, counts);
    fs.renameSync(partial, file);
    return { file, takenAt: now, counts, bytes: fs.statSync(file).size };
  } catch (err) {
    removeWithSidecars(partial);
    throw err;
  }
}

/**
 * Deletes backups (files named by `backupFileName` in `dir`) taken more than `keepDays` days
 * before `now`; nothing else in the folder is touched. Returns the deleted files.
 */
export function pruneBackups({ dir, keepDays, now = new Date() }: { dir: string; keepDays: number; now?: Date }): string[] {
  const cutoff = now.getTime() - keepDays * 24 * 60 * 60 * 1000;
  const old = listBackups(dir).filter((b) => b.takenAt.getTime() < cutoff);
  for (const b of old) removeWithSidecars(b.file);
  return old.map((b) => b.file);
}
