/**
 * The mail outbox: a message exists exactly when the change that causes it is committed,
 * one row per key, delivered after the commit, retried with back-off under a stable
 * Message-ID, given up on (failed, logged) after the last attempt, attachments kept.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MailMessage, Mailer } from '@server/emails/mailer';
import { createMailOutbox, retryDelayMs } from '@server/emails/outbox-sender';
import type { OutgoingMail } from '@server/emails/outbox';
import type { Logger } from '@server/logger';
import { OutboxMessage } from '@server/models/OutboxMessage';
import { createTestApp, type TestApp } from '../support/test-app';
import { buildFirm } from '../support/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

/** A mailer that fails while `down` is true and records every message it accepts. */
function flakyMailer() {
  const delivered: MailMessage[] = [];
  const tried: MailMessage[] = [];
  const state = { down: false };
  const mailer: Mailer = {
    send(message) {
      tried.push(message);
      if (state.down) return Promise.reject(new Error('relay refused the connection'));
      delivered.push(message);
      return Promise.resolve();
    },
  };
  return { mailer, delivered, tried, state };
}

function recordingLogger() {
  const errors: { message: string; details?: Record<string, unknown> }[] = [];
  const logger: Logger = { debug() {}, info() {}, warn() {}, error: (message, details) => void errors.push({ message, details }) };
  return { logger, errors };
}

let n = 0;
function mail(tenantId: string | null, overrides: Partial<OutgoingMail> = {}): OutgoingMail {
  n += 1;
  return {
    key: `test:${n}:${Math.random()}`,
    purpose: 'invitation',
    tenantId,
    message: { to: `person-${n}@test.example`, subject: 'Hello', text: 'Plain words.', html: '<p>Plain words.</p>' },
    ...overrides,
  };
}

function rowsOf(key: string) {
  return OutboxMessage.findAll({ where: { key }, crossTenant: true });
}

describe('enqueue', () => {
  it('writes the row in the caller’s transaction and delivers it after the commit, with a Message-ID from the key', async () => {
    const firm = await buildFirm();
    const { mailer, delivered } = flakyMailer();
    const outbox = createMailOutbox({ mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test' });
    const m = mail(firm.id);
    await t.sequelize.transaction(async (transaction) => {
      await outbox.enqueue(transaction, m);
      expect(delivered).toHaveLength(0);
    });
    expect(delivered.map((d) => d.to)).toEqual([m.message.to]);
    expect(delivered[0]!.messageId).toMatch(/^<[0-9a-f]{40}@mullion\.test>$/);
    const [row] = await rowsOf(m.key);
    expect(row!.state).toBe('sent');
    expect(row!.tenantId).toBe(firm.id);
    expect(row!.attempts).toBe(1);
  });

  it('keeps nothing when the transaction rolls back', async () => {
    const firm = await buildFirm();
    const { mailer, delivered } = flakyMailer();
    const outbox = createMailOutbox({ mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test' });
    const m = mail(firm.id);
    await expect(
      t.sequelize.transaction(async (transaction) => {
        await outbox.enqueue(transaction, m);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    await outbox.drain();
    expect(await rowsOf(m.key)).toHaveLength(0);
    expect(delivered).toHaveLength(0);
  });

  it('enqueueing one key twice keeps one row and sends one message', async () => {
    const firm = await buildFirm();
    const { mailer, delivered } = flakyMailer();
    const outbox = createMailOutbox({ mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test' });
    const m = mail(firm.id);
    await t.sequelize.transaction(async (transaction) => {
      await outbox.enqueue(transaction, m);
      await outbox.enqueue(transaction, m);
    });
    await t.sequelize.transaction((transaction) => outbox.enqueue(transaction, m));
    await outbox.drain();
    expect(await rowsOf(m.key)).toHaveLength(1);
    expect(delivered).toHaveLength(1);
  });

  it('keeps attachments (bytes, type, name, inline id) through the outbox', async () => {
    const firm = await buildFirm();
    const { mailer, delivered } = flakyMailer();
    const outbox = createMailOutbox({ mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test' });
    const pdf = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.from([0, 255, 1, 254, 10, 13])]);
    const m = mail(firm.id);
    m.message.attachments = [
      { filename: 'report.pdf', content: pdf, contentType: 'application/pdf' },
      { filename: 'logo.png', content: Buffer.from([137, 80, 78, 71]), contentType: 'image/png', cid: 'firm-logo' },
    ];
    await t.sequelize.transaction((transaction) => outbox.enqueue(transaction, m));
    const sent = delivered[0]!.attachments!;
    expect(sent[0]!.content.equals(pdf)).toBe(true);
    expect(sent[0]).toMatchObject({ filename: 'report.pdf', contentType: 'application/pdf' });
    expect(sent[1]).toMatchObject({ filename: 'logo.png', contentType: 'image/png', cid: 'firm-logo' });
  });
});

describe('the sender', () => {
  it('leaves a failed send pending with the error, retries only when due, and sends under the same Message-ID', async () => {
    const firm = await buildFirm();
    const clock = { now: new Date('2027-03-01T10:00:00Z') };
    const { mailer, delivered, tried, state } = flakyMailer();
    const outbox = createMailOutbox({ mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test', now: () => clock.now });
    const m = mail(firm.id);
    state.down = true;
    await t.sequelize.transaction((transaction) => outbox.enqueue(transaction, m));
    let [row] = await rowsOf(m.key);
    expect(row).toMatchObject({ state: 'pending', attempts: 1, lastError: 'relay refused the connection' });
    expect(row!.nextAttemptAt.getTime()).toBe(clock.now.getTime() + retryDelayMs(1));

    state.down = false;
    await outbox.drain();
    expect(tried).toHaveLength(1); // not due yet

    clock.now = new Date(clock.now.getTime() + retryDelayMs(1));
    await outbox.drain();
    expect(delivered).toHaveLength(1);
    expect(delivered[0]!.messageId).toBe(tried[0]!.messageId);
    [row] = await rowsOf(m.key);
    expect(row).toMatchObject({ state: 'sent', attempts: 2, lastError: null });
  });

  it('waits longer after each failure, up to an hour', () => {
    expect([1, 2, 3, 4].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(retryDelayMs(20)).toBe(60 * 60_000);
  });

  it('gives up after the last attempt: the row is failed and the failure is logged as an error', async () => {
    const firm = await buildFirm();
    const clock = { now: new Date('2027-03-02T10:00:00Z') };
    const { mailer, tried, state } = flakyMailer();
    const { logger, errors } = recordingLogger();
    const outbox = createMailOutbox({ mailer, logger, messageIdDomain: 'mullion.test', now: () => clock.now, maxAttempts: 3 });
    const m = mail(firm.id);
    state.down = true;
    await t.sequelize.transaction((transaction) => outbox.enqueue(transaction, m));
    for (let i = 0; i < 5; i++) {
      clock.now = new Date(clock.now.getTime() + 2 * 60 * 60_000);
      await outbox.drain();
    }
    expect(tried).toHaveLength(3);
    const [row] = await rowsOf(m.key);
    expect(row).toMatchObject({ state: 'failed', attempts: 3, lastError: 'relay refused the connection' });
    expect(errors).toHaveLength(1);
    expect(errors[0]!.details).toMatchObject({ key: m.key, attempts: 3 });
  });

  it('on start sends what was left pending (committed, never sent)', async () => {
    const firm = await buildFirm();
    const crashed = flakyMailer();
    crashed.state.down = true;
    const before = createMailOutbox({ mailer: crashed.mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test', now: () => new Date(0) });
    const m = mail(firm.id);
    // the row is committed but the process "dies" before any send succeeds
    await t.sequelize.transaction((transaction) => before.enqueue(transaction, m));
    await before.stop();
    expect((await rowsOf(m.key))[0]!.state).toBe('pending');

    const after = flakyMailer();
    const restarted = createMailOutbox({ mailer: after.mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test' });
    restarted.start();
    await restarted.drain();
    await restarted.stop();
    expect(after.delivered.map((d) => d.to)).toContain(m.message.to);
    expect((await rowsOf(m.key))[0]!.state).toBe('sent');
  });

  it('one message claimed by two senders at once goes out once', async () => {
    const firm = await buildFirm();
    const clock = { now: new Date('2027-03-03T10:00:00Z') };
    const slow = flakyMailer();
    slow.state.down = true;
    const seed = createMailOutbox({ mailer: slow.mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test', now: () => clock.now });
    const m = mail(firm.id);
    await t.sequelize.transaction((transaction) => seed.enqueue(transaction, m));
    clock.now = new Date(clock.now.getTime() + retryDelayMs(1));
    const shared = flakyMailer();
    const a = createMailOutbox({ mailer: shared.mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test', now: () => clock.now });
    const b = createMailOutbox({ mailer: shared.mailer, logger: recordingLogger().logger, messageIdDomain: 'mullion.test', now: () => clock.now });
    await Promise.all([a.drain(), b.drain()]);
    expect(shared.delivered.filter((d) => d.to === m.message.to)).toHaveLength(1);
  });
});
