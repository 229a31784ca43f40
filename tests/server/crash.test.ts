/**
 * kill -9: the real server runs in a child process on a temporary SQLite file, completing
 * jobs and importing a zone list, and is killed with SIGKILL at random moments. After a
 * restart the database is consistent — each import whole or absent, each completion whole
 * (report document and outbox row) — and every committed completion's e-mail has been sent.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Op } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { createSequelize } from '@server/db/sequelize';
import { messageIdFor } from '@server/emails/outbox';
import { Document, initModels, Job, OutboxMessage, Zone } from '@server/models/index';
import type { CrashWorld } from './crash/crash-run';

const SCRIPT = path.join(__dirname, 'crash', 'crash-run.ts');
const TSX = path.resolve(__dirname, '../../node_modules/.bin/tsx');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-crash-'));
const IMPORT_ROWS = 12;

afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
});

function run(mode: 'work' | 'recover'): { child: ChildProcess; said: (word: string) => Promise<void>; exited: Promise<number | null> } {
  const child = spawn(TSX, [SCRIPT, dir, mode], { cwd: path.resolve(__dirname, '../..'), stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  let err = '';
  child.stdout.on('data', (d: Buffer) => (out += d.toString()));
  child.stderr.on('data', (d: Buffer) => (err += d.toString()));
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  const said = (word: string) =>
    new Promise<void>((resolve, reject) => {
      const check = () => (out.includes(word) ? resolve() : undefined);
      child.stdout.on('data', check);
      check();
      void exited.then((code) => (out.includes(word) ? resolve() : reject(new Error(`child exited ${code} before ${word}: ${err}`))));
    });
  return { child, said, exited };
}

describe('killed with SIGKILL while completing jobs and importing zones', () => {
  it('restarts consistent, and every committed completion has its e-mail sent', async () => {
    // Two kill points in the work (a completion, an import or a send in flight); each start
    // costs seconds of module loading, so two kills keep the test short.
    for (const waitMs of [250 + Math.floor(Math.random() * 500), 900 + Math.floor(Math.random() * 900)]) {
      const worker = run('work');
      await worker.said('READY');
      await new Promise((r) => setTimeout(r, waitMs));
      worker.child.kill('SIGKILL');
      expect(await worker.exited).toBeNull();
    }
    const recovery = run('recover');
    await recovery.said('RECOVERED');
    expect(await recovery.exited).toBe(0);

    const sequelize = createSequelize({ url: `sqlite:${path.join(dir, 'crash.sqlite')}` });
    initModels(sequelize);
    try {
      const world = JSON.parse(fs.readFileSync(path.join(dir, 'world.json'), 'utf8')) as CrashWorld;
      const where = { tenantId: world.tenantId };

      // imports: all or nothing — the imported zones all come from one round
      const zones = await Zone.findAll({ where: { ...where, panelId: world.panelId, number: { [Op.between]: [9, 8 + IMPORT_ROWS] } } });
      const rounds = new Set(zones.map((z) => /^Round (\d+) /.exec(z.description)?.[1] ?? 'other'));
      expect(zones.length === 0 || (zones.length === IMPORT_ROWS && rounds.size === 1 && !rounds.has('other'))).toBe(true);

      // completions: whole (report document, outbox row) and their e-mails sent
      const completed = await Job.findAll({ where: { ...where, id: { [Op.in]: world.jobIds }, state: 'completed' } });
      const open = await Job.count({ where: { ...where, id: { [Op.in]: world.jobIds }, state: 'in_progress' } });
      expect(completed.length + open).toBe(world.jobIds.length);
      expect(completed.length).toBeGreaterThan(0);
      const mails = fs
        .readFileSync(path.join(dir, 'mail.log'), 'utf8')
        .trim()
        .split('\n')
        .map((line) => JSON.parse(line) as { to: string; messageId: string; attachments: number });
      const sentIds = new Set(mails.map((m) => m.messageId));
      for (const job of completed) {
        expect(job.reportFileId, `job ${job.id} has its report`).toBeTruthy();
        expect(await Document.count({ where: { ...where, jobId: job.id, fileId: job.reportFileId! } })).toBe(1);
        const key = `job-completed:${job.id}:${job.reportFileId}`;
        const row = await OutboxMessage.findOne({ where: { ...where, key } });
        expect(row?.state, `outbox row of job ${job.id}`).toBe('sent');
        expect(sentIds.has(messageIdFor(key, 'mullion.test')), `e-mail of job ${job.id}`).toBe(true);
      }
      expect(mails.every((m) => m.to === world.clientEmail && m.attachments === 1)).toBe(true);
      // at least once, never for a completion that was rolled back
      expect(sentIds.size).toBe(completed.length);
      expect(await OutboxMessage.count({ where: { ...where, state: { [Op.ne]: 'sent' } } })).toBe(0);
    } finally {
      await sequelize.close();
    }
  }, 90_000);
});
