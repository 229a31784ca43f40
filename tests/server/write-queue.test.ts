import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DataTypes, type Sequelize } from 'sequelize';
import { createSequelize, writeQueueOf } from '@server/db/sequelize';
import { DatabaseBusyError, WriteQueue, isWriteStatement } from '@server/db/write-queue';
import { AuditEvent } from '@server/models/AuditEvent';
import { Client } from '@server/models/Client';
import { createTestApp, visitor, type TestApp, type Visitor } from '../support/test-app';
import { buildFirmWithSite, TEST_PASSWORD } from '../support/factories';

describe('WriteQueue', () => {
  it('gives turns in the order they were asked for, one at a time', async () => {
    const queue = new WriteQueue({ waitMs: 1000 });
    const order: string[] = [];
    let inside = 0;
    let most = 0;
    const writer = (name: string) =>
      queue.run(async () => {
        inside++;
        most = Math.max(most, inside);
        await new Promise((r) => setTimeout(r, 5));
        order.push(name);
        inside--;
      });
    await Promise.all(['a', 'b', 'c', 'd'].map(writer));
    expect(order).toEqual(['a', 'b', 'c', 'd']);
    expect(most).toBe(1);
    expect(queue.busy).toBe(false);
  });

  it('gives up with DatabaseBusyError after the wait, and the turn after it still comes', async () => {
    const queue = new WriteQueue({ waitMs: 30 });
    const release = await queue.acquire();
    await expect(queue.acquire()).rejects.toBeInstanceOf(DatabaseBusyError);
    expect(queue.waiting).toBe(0);
    const later = queue.acquire();
    release();
    release(); // a second release changes nothing
    const releaseLater = await later;
    expect(queue.busy).toBe(true);
    releaseLater();
    expect(queue.busy).toBe(false);
  });

  it('a turn is released when the writer throws', async () => {
    const queue = new WriteQueue({ waitMs: 1000 });
    await expect(queue.run(() => Promise.reject(new Error('boom')))).rejects.toThrow('boom');
    expect(queue.busy).toBe(false);
  });

  it('knows which statements write', () => {
    expect(isWriteStatement('INSERT INTO `Clients` …')).toBe(true);
    expect(isWriteStatement('  update Sessions set expires = 1')).toBe(true);
    expect(isWriteStatement('DELETE FROM x')).toBe(true);
    expect(isWriteStatement('SELECT * FROM Clients')).toBe(false);
    expect(isWriteStatement('PRAGMA foreign_keys = ON')).toBe(false);
  });
});

describe('SQLite writes under concurrency', () => {
  let dir: string;
  let sequelize: Sequelize;

  beforeAll(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-queue-'));
    sequelize = createSequelize({ url: `sqlite:${path.join(dir, 'q.sqlite')}` });
    sequelize.define('Tally', { writer: DataTypes.INTEGER, step: DataTypes.INTEGER }, { tableName: 'Tallies', timestamps: false });
    await sequelize.sync();
  });
  afterAll(async () => {
    await sequelize.close();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('64 transactions that each wait between their statements all commit, and every row is saved', async () => {
    // Without the queue each waiting BEGIN IMMEDIATE holds one of libuv's four threads in the
    // busy handler while the transaction holding the lock needs a thread for its next step.
    const Tally = sequelize.model('Tally');
    const writers = Array.from({ length: 64 }, (_, writer) =>
      sequelize.transaction(async (transaction) => {
        for (let step = 0; step < 3; step++) {
          await Tally.create({ writer, step }, { transaction });
          await new Promise((r) => setImmediate(r));
        }
      }),
    );
    const outcomes = await Promise.allSettled(writers);
    expect(outcomes.filter((o) => o.status === 'rejected')).toEqual([]);
    expect(await Tally.count()).toBe(64 * 3);
  });

  it('single writes outside a transaction wait their turn behind a transaction instead of failing', async () => {
    const Tally = sequelize.model('Tally');
    const before = await Tally.count();
    const tx = sequelize.transaction(async (transaction) => {
      await Tally.create({ writer: -1, step: 0 }, { transaction });
      await new Promise((r) => setTimeout(r, 50));
      await Tally.create({ writer: -1, step: 1 }, { transaction });
    });
    const loose = Array.from({ length: 20 }, (_, i) => Tally.create({ writer: -2, step: i }));
    await Promise.all([tx, ...loose]);
    expect(await Tally.count()).toBe(before + 22);
    expect(writeQueueOf(sequelize)?.busy).toBe(false);
  });

  it('a rolled-back transaction gives its turn back', async () => {
    const Tally = sequelize.model('Tally');
    await expect(
      sequelize.transaction(async (transaction) => {
        await Tally.create({ writer: -3, step: 0 }, { transaction });
        throw new Error('changed my mind');
      }),
    ).rejects.toThrow('changed my mind');
    expect(writeQueueOf(sequelize)?.busy).toBe(false);
    expect(await Tally.count({ where: { writer: -3 } })).toBe(0);
  });
});

describe('PATCH /api/clients/:id from many connections at once', () => {
  let t: TestApp;
  let owner: Visitor;
  let world: Awaited<ReturnType<typeof buildFirmWithSite>>;

  beforeAll(async () => {
    // The default wait (20 s) is what production has: 64 short writes queue well within it.
    t = await createTestApp();
    world = await buildFirmWithSite();
    owner = await visitor(t.app);
    expect((await owner.signIn(world.owner.email, TEST_PASSWORD)).status).toBe(200);
  });
  afterAll(async () => {
    await t.close();
  });

  it('saves every one of 64 concurrent edits (none is a 500), each with its audit event', async () => {
    const before = await AuditEvent.count({ where: { tenantId: world.firm.id } });
    const answers = await Promise.all(
      Array.from({ length: 64 }, (_, i) => owner.patch(`/api/clients/${world.client.id}`, { notes: `Visit note ${i}` })),
    );
    expect(answers.map((a) => a.status).filter((s) => s !== 200)).toEqual([]);
    const after = await AuditEvent.count({ where: { tenantId: world.firm.id } });
    expect(after - before).toBe(64);
    const saved = await Client.findOne({ where: { id: world.client.id, tenantId: world.firm.id } });
    expect(saved?.notes).toMatch(/^Visit note \d+$/);
  });

  it('a write that cannot get its turn is a 503 with Retry-After and saves nothing', async () => {
    const queue = writeQueueOf(t.sequelize)!;
    const usual = queue.waitMs;
    const release = await queue.acquire();
    queue.waitMs = 200;
    try {
      const res = await owner.patch(`/api/clients/${world.client.id}`, { notes: 'Should not be saved' });
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toBe('2');
      expect(res.body.error.code).toBe('database_busy');
    } finally {
      queue.waitMs = usual;
      release();
    }
    const saved = await Client.findOne({ where: { id: world.client.id, tenantId: world.firm.id } });
    expect(saved?.notes).not.toBe('Should not be saved');
  });
});
