/**
 * Scheduled backups inside the server process: one backup every `intervalHours`, the first
 * when the newest backup in the folder is that old (or a minute after start when there is
 * none), then older backups past `keepDays` are deleted. A failed backup is logged and
 * deletes nothing. Off when the interval is 0 (the default in tests), for an in-memory
 * database and for a DATABASE_URL that is not SQLite.
 */
import path from 'node:path';
import type { Env } from '../config/env';
import { backupsUnsupportedReason, listBackups, pruneBackups, sqliteFileOf, takeBackup, type BackupResult } from '../db/backups';
import type { Logger } from '../logger';

const HOUR_MS = 60 * 60 * 1000;
const FIRST_RUN_DELAY_MS = 60 * 1000;

export interface BackupSchedule {
  /** Takes a backup now (and prunes after it); null when one is already running. */
  runNow(): Promise<BackupResult | null>;
  /** Cancels the next run and waits for a running backup to finish. */
  stop(): Promise<void>;
}

export function startBackupSchedule({
  databaseFile,
  dir,
  keepDays,
  intervalHours,
  logger,
}: {
  databaseFile: string;
  dir: string;
  keepDays: number;
  intervalHours: number;
  logger: Logger;
}): BackupSchedule {
  const intervalMs = intervalHours * HOUR_MS;
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<BackupResult | null> | undefined;
  let stopped = false;

  const schedule = (delayMs: number) => {
    if (stopped) return;
    timer = setTimeout(() => void runNow().finally(() => schedule(intervalMs)), Math.max(0, delayMs));
    timer.unref();
  };

  const run = async (): Promise<BackupResult | null> => {
    try {
      const started = Date.now();
      const result = await takeBackup({ databaseFile, dir });
      const deleted = pruneBackups({ dir, keepDays });
      logger.info('Backup taken and checked', {
        file: path.basename(result.file),
        bytes: result.bytes,
        ms: Date.now() - started,
        deletedOlderThanDays: keepDays,
        deleted: deleted.map((f) => path.basename(f)),
      });
      return result;
    } catch (err) {
      logger.error('Backup failed; no older backup was deleted', { err });
      return null;
    }
  };

  const runNow = (): Promise<BackupResult | null> => {
    if (running) return Promise.resolve(null);
    running = run().finally(() => (running = undefined));
    return running;
  };

  const newest = listBackups(dir).at(-1);
  const dueIn = newest ? newest.takenAt.getTime() + intervalMs - Date.now() : 0;
  schedule(Math.max(FIRST_RUN_DELAY_MS, dueIn));

  return {
    runNow,
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await running;
    },
  };
}

/** The schedule the environment asks for, or null (with the reason logged when it matters). */
export function backupScheduleFor(env: Env, logger: Logger): BackupSchedule | null {
  if (env.backupIntervalHours <= 0) return null;
  const databaseFile = sqliteFileOf(env.databaseUrl);
  if (!databaseFile) {
    logger.warn(`Scheduled backups are off. ${backupsUnsupportedReason(env.databaseUrl) ?? ''}`);
    return null;
  }
  return startBackupSchedule({
    databaseFile,
    dir: path.resolve(env.backupDir),
    keepDays: env.backupKeepDays,
    intervalHours: env.backupIntervalHours,
    logger,
  });
}
