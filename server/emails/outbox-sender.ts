/**
 * The outbox sender: claims due messages, sends them through the Mailer, marks them sent,
 * and on failure waits longer each time before the next attempt, giving up after
 * `maxAttempts` into the `failed` state (logged as an error). Delivery is at least once: a
 * crash between sending and marking sends the message again after the claim lapses, with
 * the same Message-ID.
 */
import { Op, type Transaction } from 'sequelize';
import type { Logger } from '../logger';
import { OutboxMessage } from '../models/OutboxMessage';
import type { Mailer } from './mailer';
import { insertOutboxRow, messageIdFor, restoreAttachments, type MailOutbox, type OutgoingMail } from './outbox';

export interface OutboxSenderOptions {
  mailer: Mailer;
  logger: Logger;
  /** the host part of every Message-ID (the app's host name) */
  messageIdDomain: string;
  now?: () => Date;
  /** attempts before a message is given up on; 10 spans about 4 hours with the delays below */
  maxAttempts?: number;
  /**
   * How long a claimed message is left to its sender before another may take it. Longer
   * than a slow SMTP exchange, so two senders rarely send the same message; a message
   * claimed when the process died goes out once this lapses.
   */
  claimLeaseMs?: number;
  /** how often due retries are looked for */
  pollMs?: number;
}

// Exponential back-off from 30 s, doubling, capped at an hour: common practice for mail
// retries (no published source).
const FIRST_RETRY_MS = 30_000;
const LONGEST_RETRY_MS = 60 * 60_000;
const BATCH = 20;

export function retryDelayMs(attemptsMade: number): number {
  return Math.min(FIRST_RETRY_MS * 2 ** Math.max(0, attemptsMade - 1), LONGEST_RETRY_MS);
}

function reasonOf(err: unknown): string {
  const text = err instanceof Error ? err.message : String(err);
  return text.slice(0, 2000);
}

export function createMailOutbox(options: OutboxSenderOptions): MailOutbox & { kick(): void } {
  const now = options.now ?? (() => new Date());
  const maxAttempts = options.maxAttempts ?? 10;
  const leaseMs = options.claimLeaseMs ?? 2 * 60_000;
  const pollMs = options.pollMs ?? 30_000;
  const { logger, mailer } = options;

  let timer: NodeJS.Timeout | null = null;
  let stopped = false;
  let draining: Promise<void> | null = null;
  let drainAgain = false;
  const inFlight = new Set<Promise<void>>();
  const keysOf = new WeakMap<Transaction, string[]>();

  /** Takes the message for this sender: one claimant wins (attempts and due time must still match). */
  async function claim(row: OutboxMessage): Promise<boolean> {
    const at = now();
    const [count] = await OutboxMessage.update(
      { attempts: row.attempts + 1, nextAttemptAt: new Date(at.getTime() + leaseMs) },
      { where: { id: row.id, state: 'pending', attempts: row.attempts, nextAttemptAt: { [Op.lte]: at } }, crossTenant: true },
    );
    return count === 1;
  }

  /** Sends one due message; false when another sender had already claimed it. */
  async function sendOne(row: OutboxMessage): Promise<boolean> {
    if (!(await claim(row))) return false;
    const attempt = row.attempts + 1;
    const mine = { where: { id: row.id, attempts: attempt }, crossTenant: true };
    try {
      await mailer.send({
        to: row.to,
        subject: row.subject,
        text: row.text,
        html: row.html,
        messageId: messageIdFor(row.key, options.messageIdDomain),
        ...(row.attachments ? { attachments: restoreAttachments(row.attachments) } : {}),
      });
    } catch (err) {
      const lastError = reasonOf(err);
      if (attempt >= maxAttempts) {
        await OutboxMessage.update({ state: 'failed', lastError }, mine);
        logger.error('E-mail given up after its last attempt', { outboxId: row.id, key: row.key, purpose: row.purpose, attempts: attempt, lastError });
      } else {
        await OutboxMessage.update({ lastError, nextAttemptAt: new Date(now().getTime() + retryDelayMs(attempt)) }, mine);
        logger.warn('E-mail not sent; will retry', { outboxId: row.id, key: row.key, attempts: attempt, lastError });
      }
      return true;
    }
    await OutboxMessage.update({ state: 'sent', sentAt: now(), lastError: null }, mine);
    return true;
  }

  function track(work: Promise<void>): Promise<void> {
    const done = work.catch((err: unknown) => logger.error('Outbox sender failed', { err }));
    inFlight.add(done);
    void done.finally(() => inFlight.delete(done));
    return done;
  }

  async function drainDue(): Promise<void> {
    for (;;) {
      const due = await OutboxMessage.findAll({
        where: { state: 'pending', nextAttemptAt: { [Op.lte]: now() } },
        order: [['nextAttemptAt', 'ASC']],
        limit: BATCH,
        crossTenant: true,
      });
      let claimedAny = false;
      for (const row of due) {
        if (stopped) return;
        if (await sendOne(row)) claimedAny = true;
      }
      if (due.length < BATCH || !claimedAny) return;
    }
  }

  function drain(): Promise<void> {
    if (stopped) return Promise.resolve();
    if (draining) {
      drainAgain = true;
      return draining;
    }
    draining = track(
      (async () => {
        do {
          drainAgain = false;
          await drainDue();
        } while (drainAgain && !stopped);
      })(),
    ).finally(() => {
      draining = null;
    });
    return draining;
  }

  /** The messages of one committed transaction, sent at once (the request waits for them). */
  function deliver(keys: string[]): Promise<void> {
    if (stopped) return Promise.resolve();
    return track(
      (async () => {
        const rows = await OutboxMessage.findAll({ where: { key: { [Op.in]: keys }, state: 'pending' }, crossTenant: true });
        for (const row of rows) await sendOne(row);
      })(),
    );
  }

  return {
    async enqueue(transaction: Transaction, mail: OutgoingMail) {
      await insertOutboxRow(transaction, mail, now());
      const keys = keysOf.get(transaction);
      if (keys) {
        keys.push(mail.key);
        return;
      }
      const fresh = [mail.key];
      keysOf.set(transaction, fresh);
      // Never throws: a failed send leaves the row pending for the retry timer.
      transaction.afterCommit(() => deliver(fresh));
    },
    drain,
    kick() {
      void drain();
    },
    start() {
      stopped = false;
      if (!timer) {
        timer = setInterval(() => void drain(), pollMs);
        timer.unref();
      }
      void drain();
    },
    async stop() {
      stopped = true;
      if (timer) clearInterval(timer);
      timer = null;
      while (inFlight.size > 0) await Promise.allSettled([...inFlight]);
    },
  };
}
