/**
 * `npm run db:backup`: an online backup of the SQLite database into BACKUP_DIR, checked,
 * then backups older than BACKUP_KEEP_DAYS deleted. Safe while the server runs.
 *
 * `npm run db:restore -- --firm <tenantId> [--from <backup file>]`: brings one firm's records
 * back from a backup (default: the newest in BACKUP_DIR) into the live database, in one
 * transaction; other firms are not touched. Safe while the server runs.
 */
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { readEnv } from '../config/env';
import { backupsUnsupportedReason, listBackups, pruneBackups, sqliteFileOf, takeBackup } from '../db/backups';
import { restoreFirm, TABLES_KEPT_AS_THEY_ARE } from '../db/restore-firm';

const USAGE = 'Usage: npm run db:backup | npm run db:restore -- --firm <tenantId> [--from <backup file>]';

function liveDatabaseFile(databaseUrl: string): string {
  const reason = backupsUnsupportedReason(databaseUrl);
  if (reason) throw new Error(reason);
  const file = sqliteFileOf(databaseUrl)!;
  if (!fs.existsSync(file)) throw new Error(`There is no database at ${file} (DATABASE_URL).`);
  return file;
}

async function backup(): Promise<void> {
  const env = readEnv();
  const databaseFile = liveDatabaseFile(env.databaseUrl);
  const dir = path.resolve(env.backupDir);
  const started = Date.now();
  const result = await takeBackup({ databaseFile, dir });
  const rows = Object.values(result.counts).reduce((a, b) => a + b, 0);
  console.log(`Backup written and checked (integrity ok, ${rows} rows in ${Object.keys(result.counts).length} tables as copied): ${result.file}`);
  console.log(`${(result.bytes / 1024).toFixed(0)} KiB in ${Date.now() - started} ms.`);
  const deleted = pruneBackups({ dir, keepDays: env.backupKeepDays });
  console.log(deleted.length ? `Deleted ${deleted.length} backup(s) older than ${env.backupKeepDays} days: ${deleted.map((f) => path.basename(f)).join(', ')}` : `No backup older than ${env.backupKeepDays} days to delete.`);
}

async function restore(args: string[]): Promise<void> {
  const { values } = parseArgs({ args, options: { firm: { type: 'string' }, from: { type: 'string' } } });
  if (!values.firm) throw new Error(`Name the firm to restore with --firm <tenantId>.\n${USAGE}`);
  const env = readEnv();
  const databaseFile = liveDatabaseFile(env.databaseUrl);
  let backupFile: string;
  if (values.from) {
    backupFile = path.resolve(values.from);
  } else {
    const newest = listBackups(path.resolve(env.backupDir)).at(-1);
    if (!newest) throw new Error(`There is no backup in ${path.resolve(env.backupDir)} (BACKUP_DIR); name one with --from <file>.`);
    backupFile = newest.file;
  }
  console.log(`Restoring firm ${values.firm} from ${backupFile} …`);
  const started = Date.now();
  const summary = await restoreFirm({ databaseFile, backupFile, tenantId: values.firm });
  const ms = Date.now() - started;

  console.log(`Restored “${summary.firmName}” (${summary.tenantId}) in ${ms} ms, in one transaction:`);
  const width = Math.max(...summary.tables.map((t) => t.table.length));
  console.log(`  ${'table'.padEnd(width)}  restored  (were)`);
  for (const t of summary.tables) console.log(`  ${t.table.padEnd(width)}  ${String(t.restored).padStart(8)}  (${t.removed})`);
  const total = summary.tables.reduce((a, t) => a + t.restored, 0);
  console.log(`  ${'total'.padEnd(width)}  ${String(total).padStart(8)}`);
  console.log(`Sessions of the firm's sign-ins ended: ${summary.sessionsEnded} (everyone signs in again).`);
  console.log(`Kept as they are now: the firm's billing, trial and suspension state, and ${TABLES_KEPT_AS_THEY_ARE.join(', ')}.`);
  for (const note of summary.notes) console.log(`Note: ${note}`);
  console.log(
    `Files are not in the database and were not restored: uploads under ${path.join(path.resolve(env.tenantsDir), summary.tenantId)} ` +
      'stay as they are (a restored record whose file was deleted since the backup shows as missing).',
  );
}

async function main(): Promise<void> {
  const [command, ...rest] = process.argv.slice(2);
  if (command === 'backup') await backup();
  else if (command === 'restore') await restore(rest);
  else throw new Error(USAGE);
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
