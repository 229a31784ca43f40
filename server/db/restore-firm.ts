/**
 * Brings one firm's records back from a backup into the live database, in one transaction:
 * the firm's current rows are deleted and its rows in the backup copied in, table by table
 * in foreign-key order. Other firms' rows are never touched. On any error nothing changes.
 *
 * What belongs to the firm: every table with a `tenantId` column (found in the live schema,
 * so a new firm-owned table is covered without listing it here), its rows with the firm's
 * id — the firm's staff and client sign-ins included — and the firm's own row in `tenants`.
 * Kept as they are now, because they follow Stripe and the service, not the firm's records:
 * the firm's billing and suspension columns, its subscription history and the Stripe events
 * already processed. The sessions of the firm's sign-ins are ended (never brought back).
 * Files under tenants/<id>/ are outside the database and are not restored.
 */
import crypto from 'node:crypto';
import path from 'node:path';
import { checkBackup } from './backups';
import { SqliteFile, columnNames, quoteId, tableNames } from './sqlite-file';

/** Tables with a `tenantId` that are not the firm's own records (see above). */
export const TABLES_KEPT_AS_THEY_ARE = ['subscription_changes', 'stripe_events'] as const;

/** Columns of the firm's `tenants` row kept as they are now: billing, trial and suspension. */
export const TENANT_COLUMNS_KEPT = [
  'state',
  'planKey',
  'trialEndsAt',
  'suspendedAt',
  'suspendedReason',
  'stateBeforeSuspension',
  'stripeCustomerId',
  'stripeSubscriptionId',
  'subscriptionStatus',
  'pastDueSince',
  'currentPeriodEnd',
  'cancelAtPeriodEnd',
  'pendingCheckoutSessionId',
] as const;

export class RestoreError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'RestoreError';
  }
}

export interface RestoreSummary {
  tenantId: string;
  firmName: string;
  backupFile: string;
  /** parents first; `removed` = the firm's rows deleted, `restored` = rows copied from the backup */
  tables: { table: string; removed: number; restored: number }[];
  sessionsEnded: number;
  /** e.g. columns the live database has and the backup has not (they get their defaults) */
  notes: string[];
}

/** Firm-owned tables ordered parents first by their foreign keys (ties by name). */
export async function firmTablesInOrder(db: SqliteFile): Promise<string[]> {
  const kept = new Set<string>([...TABLES_KEPT_AS_THEY_ARE, 'tenants']);
  const tables: string[] = [];
  for (const t of await tableNames(db)) {
    if (!kept.has(t) && (await columnNames(db, t)).includes('tenantId')) tables.push(t);
  }
  const parents = new Map<string, Set<string>>();
  for (const t of tables) {
    const fks = await db.all<{ table: string }>(`PRAGMA foreign_key_list(${quoteId(t)})`);
    parents.set(t, new Set(fks.map((fk) => fk.table).filter((p) => p !== t && tables.includes(p))));
  }
  const ordered: string[] = [];
  while (ordered.length < tables.length) {
    const ready = tables.filter((t) => !ordered.includes(t) && [...parents.get(t)!].every((p) => ordered.includes(p)));
    if (!ready.length) throw new RestoreError(`The firm's tables refer to each other in a cycle: ${tables.filter((t) => !ordered.includes(t)).join(', ')}.`);
    ordered.push(...ready);
  }
  return ordered;
}

/** Sequelize's way of writing a DATE in SQLite, so the audit row reads like the others. */
function sqliteDate(d: Date): string {
  return `${d.toISOString().replace('T', ' ').replace('Z', '')} +00:00`;
}

export async function restoreFirm({
  databaseFile,
  backupFile,
  tenantId,
  now = new Date(),
}: {
  databaseFile: string;
  backupFile: string;
  tenantId: string;
  now?: Date;
}): Promise<RestoreSummary> {
  await checkBackup(backupFile); // throws BackupCheckError: nothing is changed

  const db = await SqliteFile.open(databaseFile);
  try {
    await db.exec('PRAGMA foreign_keys = ON; PRAGMA busy_timeout = 10000;');
    await db.run('ATTACH DATABASE ? AS backup', [backupFile]);
    try {
      const [firm] = await db.all<{ name: string }>('SELECT name FROM backup.tenants WHERE id = ?', [tenantId]);
      if (!firm) throw new RestoreError(`There is no firm with id ${tenantId} in the backup ${path.basename(backupFile)}.`);

      const backupTables = new Set(await tableNames(db, 'backup'));
      const notes: string[] = [];
      const commonColumns = async (table: string): Promise<string[]> => {
        const live = await columnNames(db, table);
        if (!backupTables.has(table)) return [];
        const inBackup = new Set(await columnNames(db, table, 'backup'));
        const missing = live.filter((c) => !inBackup.has(c));
        if (missing.length) notes.push(`${table}: the backup has no ${missing.join(', ')}; restored rows get their defaults.`);
        return live.filter((c) => inBackup.has(c));
      };

      const tables = await firmTablesInOrder(db);
      const summary: RestoreSummary = { tenantId, firmName: firm.name, backupFile, tables: [], sessionsEnded: 0, notes };

      await db.exec('BEGIN IMMEDIATE');
      try {
        // Sessions of the firm's sign-ins, now and in the backup: ended, so everyone signs in
        // again against the restored records and no old session comes back with its user.
        summary.sessionsEnded = await db.run(
          'DELETE FROM main.sessions WHERE userId IN (SELECT id FROM main.users WHERE tenantId = ? UNION SELECT id FROM backup.users WHERE tenantId = ?)',
          [tenantId, tenantId],
        );

        const removed = new Map<string, number>();
        for (const table of [...tables].reverse()) {
          removed.set(table, await db.run(`DELETE FROM main.${quoteId(table)} WHERE tenantId = ?`, [tenantId]));
        }

        // The firm's own row: updated in place (deleting it would cascade to what is kept).
        const tenantColumns = await commonColumns('tenants');
        const [liveFirm] = await db.all<{ id: string }>('SELECT id FROM main.tenants WHERE id = ?', [tenantId]);
        if (liveFirm) {
          const restored = tenantColumns.filter((c) => c !== 'id' && !(TENANT_COLUMNS_KEPT as readonly string[]).includes(c));
          const list = restored.map(quoteId).join(', ');
          await db.run(`UPDATE main.tenants SET (${list}) = (SELECT ${list} FROM backup.tenants WHERE id = ?) WHERE id = ?`, [tenantId, tenantId]);
        } else {
          const list = tenantColumns.map(quoteId).join(', ');
          await db.run(`INSERT INTO main.tenants (${list}) SELECT ${list} FROM backup.tenants WHERE id = ?`, [tenantId]);
          notes.push('The firm was not in the live database: its row, billing state included, comes from the backup.');
        }
        summary.tables.push({ table: 'tenants', removed: 0, restored: 1 });

        for (const table of tables) {
          const columns = await commonColumns(table);
          let restored = 0;
          if (columns.length) {
            const list = columns.map(quoteId).join(', ');
            restored = await db.run(`INSERT INTO main.${quoteId(table)} (${list}) SELECT ${list} FROM backup.${quoteId(table)} WHERE tenantId = ?`, [tenantId]);
          } else {
            notes.push(`${table}: not in the backup; the firm has none after the restore.`);
          }
          summary.tables.push({ table, removed: removed.get(table) ?? 0, restored });
        }

        await db.run(
          `INSERT INTO main.audit_events (id, tenantId, actorId, actorRole, action, subjectType, subjectId, details, ip, createdAt)
           VALUES (?, ?, NULL, NULL, 'firm.restored', 'Tenant', ?, ?, NULL, ?)`,
          [
            crypto.randomUUID(),
            tenantId,
            tenantId,
            JSON.stringify({ backup: path.basename(backupFile), rows: Object.fromEntries(summary.tables.map((t) => [t.table, t.restored])) }),
            sqliteDate(now),
          ],
        );
        await db.exec('COMMIT');
      } catch (err) {
        await db.exec('ROLLBACK').catch(() => undefined);
        if (err instanceof RestoreError) throw err;
        throw new RestoreError(`Nothing was changed: the restore stopped at an error (${(err as Error).message}).`);
      }
      return summary;
    } finally {
      await db.run('DETACH DATABASE backup').catch(() => undefined);
    }
  } finally {
    await db.close();
  }
}
