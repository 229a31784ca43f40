/**
 * Backups and the one-firm restore: a backup is a checked, consistent copy; restoring firm A
 * makes A's records equal the backup row for row and leaves firm B exactly as it is now;
 * a corrupted backup, an unknown firm and a failing restore change nothing; retention
 * deletes old backups only.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readEnv } from '@server/config/env';
import { BackupCheckError, backupFileName, checkBackup, listBackups, pruneBackups, sqliteFileOf, takeBackup } from '@server/db/backups';
import { RestoreError, TENANT_COLUMNS_KEPT, firmTablesInOrder, restoreFirm } from '@server/db/restore-firm';
import { SqliteFile, quoteId } from '@server/db/sqlite-file';
import { backupScheduleFor, startBackupSchedule } from '@server/jobs/backup-schedule';
import type { Logger } from '@server/logger';
import { Client } from '@server/models/Client';
import { EmergencyContact } from '@server/models/EmergencyContact';
import { Site } from '@server/models/Site';
import { SubscriptionChange } from '@server/models/SubscriptionChange';
import { Tenant } from '@server/models/Tenant';
import { User } from '@server/models/User';
import {
  TEST_PASSWORD,
  buildClient,
  buildContact,
  buildFirmWithSite,
  buildFloor,
  buildJob,
  buildOpening,
  buildPanel,
  buildRoom,
  buildSite,
  buildUser,
  buildZone,
} from '../support/factories';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';

type Row = Record<string, unknown>;
type Firm = Awaited<ReturnType<typeof seedFirm>>;

let t: TestApp;
let live: string;
let backupsDir: string;
const tempDirs: string[] = [];
/** A fresh folder under the system's temporary folder, removed after the tests. */
const tempDir = (prefix: string) => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  tempDirs.push(dir);
  return dir;
};

async function seedFirm() {
  const f = await buildFirmWithSite();
  await buildContact(f.site, 1);
  await buildContact(f.site, 2);
  const secondClient = await buildClient(f.firm);
  const secondSite = await buildSite(f.firm, secondClient);
  const panel = await buildPanel(f.site);
  const zones = [await buildZone(panel, { number: 1 }), await buildZone(panel, { number: 2 }), await buildZone(panel, { number: 3 })];
  const floor = await buildFloor(f.site);
  const room = await buildRoom(floor);
  await buildOpening(room);
  await buildJob(f.site, { technicianId: f.technician.id, scheduledStart: new Date('2026-12-10T15:00:00Z') });
  return { ...f, secondClient, secondSite, panel, zones };
}

/** Every row of the firm, table by table (the firm's tables of the live schema), ordered by id. */
async function firmRows(file: string, tenantId: string): Promise<Record<string, Row[]>> {
  const db = await SqliteFile.open(file, { readOnly: true });
  try {
    const rows: Record<string, Row[]> = {};
    rows.tenants = await db.all<Row>('SELECT * FROM tenants WHERE id = ?', [tenantId]);
    for (const table of await firmTablesInOrder(db)) {
      rows[table] = await db.all<Row>(`SELECT * FROM ${quoteId(table)} WHERE tenantId = ? ORDER BY id`, [tenantId]);
    }
    for (const table of ['subscription_changes', 'stripe_events']) {
      rows[table] = await db.all<Row>(`SELECT * FROM ${quoteId(table)} WHERE tenantId = ? ORDER BY id`, [tenantId]);
    }
    rows.sessions = await db.all<Row>('SELECT * FROM sessions WHERE userId IN (SELECT id FROM users WHERE tenantId = ?) ORDER BY sid', [tenantId]);
    return rows;
  } finally {
    await db.close();
  }
}

async function everyRow(file: string): Promise<Record<string, Row[]>> {
  const db = await SqliteFile.open(file, { readOnly: true });
  try {
    const tables = await db.all<{ name: string }>("SELECT name FROM sqlite_schema WHERE type = 'table' AND name NOT LIKE 'sqlite_%' ORDER BY name");
    const rows: Record<string, Row[]> = {};
    for (const { name } of tables) rows[name] = await db.all<Row>(`SELECT * FROM ${quoteId(name)} ORDER BY rowid`);
    return rows;
  } finally {
    await db.close();
  }
}

const without = (row: Row | undefined, columns: readonly string[]) => Object.fromEntries(Object.entries(row ?? {}).filter(([k]) => !columns.includes(k)));

async function signedIn(user: User): Promise<Visitor> {
  const v = await visitor(t.app);
  const res = await v.signIn(user.email, TEST_PASSWORD);
  expect(res.status).toBe(200);
  return v;
}

const silent: Logger = { debug: () => undefined, info: () => undefined, warn: () => undefined, error: () => undefined };

beforeAll(async () => {
  t = await createTestApp();
  live = (t.sequelize as unknown as { options: { storage: string } }).options.storage;
  backupsDir = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-backups-'));
});
afterAll(async () => {
  await t.close();
  for (const dir of [backupsDir, ...tempDirs]) fs.rmSync(dir, { recursive: true, force: true });
});

describe('restoring one firm from a backup', () => {
  let a: Firm;
  let b: Firm;
  let backupFile: string;
  let aOwner: Visitor;
  let bOwner: Visitor;

  beforeAll(async () => {
    a = await seedFirm();
    b = await seedFirm();
    await SubscriptionChange.create({ tenantId: a.firm.id, planKey: null, state: 'trialing', monthlyAmountCents: 0, from: new Date('2026-11-01T00:00:00Z') });
    backupFile = (await takeBackup({ databaseFile: live, dir: backupsDir })).file;
    aOwner = await signedIn(a.owner);
    bOwner = await signedIn(b.owner);
  });

  it('brings firm A back row for row, keeps its billing state, and leaves firm B as it is now', async () => {
    // Firm A after the backup: renamed, a client changed, a site deleted (with what hangs on
    // it), a zone deleted, a new client and staff member, and a subscription bought.
    await Tenant.update({ name: 'Renamed after the backup', state: 'active', planKey: 'team' }, { where: { id: a.firm.id } });
    await Client.update({ notes: 'Changed after the backup' }, { where: { tenantId: a.firm.id, id: a.client.id } });
    await Site.destroy({ where: { tenantId: a.firm.id, id: a.site.id } });
    await buildClient(a.firm, { name: 'Added after the backup' });
    await buildUser(a.firm, 'technician');
    await SubscriptionChange.create({ tenantId: a.firm.id, planKey: 'team', state: 'active', monthlyAmountCents: 4900, from: new Date('2026-12-01T00:00:00Z') });
    // Firm B after the backup: its changes must survive A's restore.
    await Client.update({ name: 'B changed after the backup' }, { where: { tenantId: b.firm.id, id: b.client.id } });
    await EmergencyContact.destroy({ where: { tenantId: b.firm.id, siteId: b.site.id, position: 2 } });
    await buildZone(b.panel, { number: 9 });

    const aBefore = await firmRows(live, a.firm.id);
    const bBefore = await firmRows(live, b.firm.id);
    const aInBackup = await firmRows(backupFile, a.firm.id);
    expect(aBefore.sites).toHaveLength(1);
    expect(aInBackup.sites).toHaveLength(2);
    expect(aBefore.sessions!.length).toBeGreaterThan(0);

    const summary = await restoreFirm({ databaseFile: live, backupFile, tenantId: a.firm.id });

    const aAfter = await firmRows(live, a.firm.id);
    for (const table of Object.keys(aInBackup)) {
      if (['tenants', 'audit_events', 'subscription_changes', 'stripe_events', 'sessions'].includes(table)) continue;
      expect(aAfter[table], table).toEqual(aInBackup[table]);
      expect(summary.tables.find((s) => s.table === table)?.restored, table).toBe(aInBackup[table]!.length);
    }
    // The audit trail is the backup's plus one line saying the firm was restored.
    expect(aAfter.audit_events!.filter((e) => e.action !== 'firm.restored')).toEqual(aInBackup.audit_events);
    expect(aAfter.audit_events!.filter((e) => e.action === 'firm.restored')).toHaveLength(1);
    // The firm's row: its records from the backup, its billing and trial state as now.
    expect(without(aAfter.tenants![0], TENANT_COLUMNS_KEPT)).toEqual(without(aInBackup.tenants![0], TENANT_COLUMNS_KEPT));
    expect(aAfter.tenants![0]).toMatchObject({ name: a.firm.name, state: 'active', planKey: 'team' });
    expect(aAfter.subscription_changes).toEqual(aBefore.subscription_changes);
    // Sessions of A's sign-ins are ended; B's are untouched.
    expect(aAfter.sessions).toEqual([]);
    expect(summary.sessionsEnded).toBe(aBefore.sessions!.length);

    expect(await firmRows(live, b.firm.id)).toEqual(bBefore);

    expect(((await aOwner.get('/api/session')).body as { user: unknown }).user).toBeNull();
    expect(((await bOwner.get('/api/session')).body as { user: { email: string } }).user.email).toBe(b.owner.email);
    // A's owner signs in again and sees the restored records through the app.
    const again = await signedIn(a.owner);
    const sites = await again.get('/api/sites');
    expect(sites.status).toBe(200);
    expect((sites.body as { data: { id: string }[] }).data.map((s) => s.id).sort()).toEqual([a.site.id, a.secondSite.id].sort());
  });

  it('refuses a firm that is not in the backup and changes nothing', async () => {
    const before = await everyRow(live);
    await expect(restoreFirm({ databaseFile: live, backupFile, tenantId: '00000000-0000-4000-8000-000000000000' })).rejects.toThrow(
      /There is no firm with id 00000000-0000-4000-8000-000000000000 in the backup/,
    );
    expect(await everyRow(live)).toEqual(before);
  });

  it('changes nothing when the restore fails half-way (one transaction)', async () => {
    // A's technician was removed after the backup and the address now signs in at firm B:
    // bringing A's technician back would take B's sign-in's e-mail, so the restore fails.
    await User.destroy({ where: { tenantId: a.firm.id, id: a.technician.id } });
    await buildUser(b.firm, 'coordinator', { email: a.technician.email });
    const before = await everyRow(live);
    await expect(restoreFirm({ databaseFile: live, backupFile, tenantId: a.firm.id })).rejects.toThrow(RestoreError);
    await expect(restoreFirm({ databaseFile: live, backupFile, tenantId: a.firm.id })).rejects.toThrow(/Nothing was changed.*UNIQUE constraint failed: users\.email/);
    expect(await everyRow(live)).toEqual(before);
  });
});

describe('the check after writing', () => {
  let good: string;
  beforeAll(async () => {
    await seedFirm();
    good = (await takeBackup({ databaseFile: live, dir: tempDir('mullion-check-') })).file;
  });

  it('passes a backup that equals what was copied, and refuses one whose rows differ', async () => {
    const counts = await checkBackup(good);
    expect(counts.tenants).toBeGreaterThan(0);
    await expect(checkBackup(good, counts)).resolves.toEqual(counts);
    await expect(checkBackup(good, { ...counts, zones: counts.zones! + 1 })).rejects.toThrow(/row counts differ from what was copied \(zones: /);
  });

  it('refuses a corrupted backup, and a restore from it changes nothing', async () => {
    const corrupted = path.join(path.dirname(good), backupFileName(new Date('2026-01-01T00:00:00Z')));
    fs.copyFileSync(good, corrupted);
    const bytes = fs.readFileSync(corrupted);
    const pageSize = bytes.readUInt16BE(16);
    bytes.fill(0xff, pageSize, Math.min(bytes.length, pageSize * 6)); // pages 2–6: tables and indexes
    fs.writeFileSync(corrupted, bytes);

    await expect(checkBackup(corrupted)).rejects.toBeInstanceOf(BackupCheckError);
    await expect(checkBackup(corrupted)).rejects.toThrow(/failed its check/);
    const [tenant] = (await everyRow(good)).tenants!;
    const before = await everyRow(live);
    await expect(restoreFirm({ databaseFile: live, backupFile: corrupted, tenantId: tenant!.id as string })).rejects.toBeInstanceOf(BackupCheckError);
    expect(await everyRow(live)).toEqual(before);
  });

  it('refuses a file that is not a database at all', async () => {
    const junk = path.join(path.dirname(good), 'junk.sqlite');
    fs.writeFileSync(junk, 'not a database '.repeat(500));
    await expect(checkBackup(junk)).rejects.toThrow(/junk\.sqlite failed its check/);
  });
});

describe('a backup taken while the app keeps writing', () => {
  it('is the database at one instant: every client written with its site is there with it, or neither is', async () => {
    const firm = (await buildFirmWithSite()).firm;
    let written = 0;
    let stop = false;
    const writer = (async () => {
      while (!stop) {
        await t.sequelize.transaction(async (transaction) => {
          const client = await Client.create({ tenantId: firm.id, name: `Busy ${written}` }, { transaction });
          await Site.create(
            { tenantId: firm.id, clientId: client.id, name: `Busy home ${written}`, addressLine1: '1 Mill Row', city: 'Ashby Vale', timeZone: 'America/Chicago' },
            { transaction },
          );
        });
        written += 1;
      }
    })();
    while (written < 5) await new Promise((r) => setImmediate(r));
    const result = await takeBackup({ databaseFile: live, dir: tempDir('mullion-busy-') });
    const writtenDuringBackup = written;
    stop = true;
    await writer;

    const inBackup = await firmRows(result.file, firm.id);
    const busyClients = inBackup.clients!.filter((c) => String(c.name).startsWith('Busy '));
    const busySites = inBackup.sites!.filter((s) => String(s.name).startsWith('Busy home '));
    expect(busyClients.length).toBeGreaterThanOrEqual(5);
    expect(busyClients.length).toBeLessThanOrEqual(writtenDuringBackup + 1);
    expect(busySites.map((s) => s.clientId).sort()).toEqual(busyClients.map((c) => c.id).sort());
    await expect(checkBackup(result.file, result.counts)).resolves.toEqual(result.counts);
  });
});

describe('retention', () => {
  it('deletes backups older than the kept days and nothing else', () => {
    const dir = tempDir('mullion-retention-');
    const now = new Date('2026-12-05T03:00:00Z');
    const daysAgo = (d: number) => new Date(now.getTime() - d * 24 * 60 * 60 * 1000);
    const names = [20, 15, 14.5, 13, 1, 0].map((d) => backupFileName(daysAgo(d)));
    const others = ['notes.txt', 'mullion-old.sqlite', `${backupFileName(daysAgo(30))}.partial`];
    for (const name of [...names, ...others]) fs.writeFileSync(path.join(dir, name), '');

    const deleted = pruneBackups({ dir, keepDays: 14, now });

    expect(deleted.map((f) => path.basename(f)).sort()).toEqual(names.slice(0, 3).sort());
    expect(fs.readdirSync(dir).sort()).toEqual([...names.slice(3), ...others].sort());
    expect(listBackups(dir).map((b) => path.basename(b.file))).toEqual(names.slice(3));
  });
});

describe('the schedule and its configuration', () => {
  it('is off in tests unless asked for, every 24 hours otherwise, and never for an in-memory or non-SQLite database', () => {
    expect(readEnv({ NODE_ENV: 'test' }).backupIntervalHours).toBe(0);
    expect(readEnv({ NODE_ENV: 'test', BACKUP_INTERVAL_HOURS: '6' }).backupIntervalHours).toBe(6);
    const dev = readEnv({ NODE_ENV: 'development', BACKUP_INTERVAL_HOURS: '' });
    expect(dev).toMatchObject({ backupIntervalHours: 24, backupKeepDays: 14, backupDir: './data/backups' });
    expect(() => readEnv({ BACKUP_KEEP_DAYS: '0' })).toThrow(/BACKUP_KEEP_DAYS/);

    const warnings: string[] = [];
    const logger = { ...silent, warn: (m: string) => void warnings.push(m) };
    expect(backupScheduleFor({ ...dev, databaseUrl: 'sqlite::memory:' }, logger)).toBeNull();
    expect(backupScheduleFor({ ...dev, databaseUrl: 'postgres://u:p@db/mullion' }, logger)).toBeNull();
    expect(warnings[1]).toMatch(/SQLite only.*pg_dump/);
    expect(backupScheduleFor({ ...dev, databaseUrl: `sqlite:${live}`, backupIntervalHours: 0 }, logger)).toBeNull();
    expect(sqliteFileOf('sqlite:data/x.sqlite')).toBe(path.resolve('data/x.sqlite'));
  });

  it('takes a checked backup and then deletes the old ones', async () => {
    const dir = tempDir('mullion-schedule-');
    const old = path.join(dir, backupFileName(new Date(Date.now() - 30 * 24 * 60 * 60 * 1000)));
    fs.writeFileSync(old, '');
    const schedule = startBackupSchedule({ databaseFile: live, dir, keepDays: 14, intervalHours: 24, logger: silent });
    try {
      const result = await schedule.runNow();
      expect(result).not.toBeNull();
      await expect(checkBackup(result!.file, result!.counts)).resolves.toEqual(result!.counts);
      expect(listBackups(dir).map((b) => b.file)).toEqual([result!.file]);
    } finally {
      await schedule.stop();
    }
  });
});
