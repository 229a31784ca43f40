/**
 * The mail outbox API. A service never sends mail itself: it calls `outbox.enqueue(tx, …)`
 * inside the transaction of the change that causes the mail, so the mail exists exactly
 * when the change does. The outbox sender (outbox-sender.ts) delivers it after the commit
 * and retries until it goes out.
 */
import { createHash } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { OutboxMessage, type StoredAttachment } from '../models/OutboxMessage';
import type { MailAttachment, MailMessage } from './mailer';

/** Why a message is sent; limits (mail-limits.ts) count per purpose. */
export type MailPurpose = 'password_reset' | 'sign_up' | 'invitation' | 'service_request' | 'contacts_changed' | 'job_completed';

export interface OutgoingMail {
  /**
   * Unique per message and stable for it: enqueueing the same key twice keeps one row, and
   * the Message-ID is derived from it. Build it from what causes the mail and who gets it,
   * e.g. `job-completed:<jobId>` or `service-request:<jobId>:<userId>`.
   */
  key: string;
  purpose: MailPurpose;
  /** the firm the mail belongs to; null only for mail of no firm (an operator's reset) */
  tenantId: string | null;
  /** the signed-in user whose action causes the mail, when there is one */
  actorId?: string | null;
  message: MailMessage;
}

export interface MailOutbox {
  /** Writes the message in `transaction`; after the commit it is delivered (and retried). */
  enqueue(transaction: Transaction, mail: OutgoingMail): Promise<void>;
  /** Sends every message that is due now; resolves when done (tests, start-up). */
  drain(): Promise<void>;
  /** Starts the retry timer and picks up messages left pending (by a crash, say). */
  start(): void;
  /** Stops the timer and waits for sends in flight. */
  stop(): Promise<void>;
}

/** A Message-ID that is the same on every attempt of one message. */
export function messageIdFor(key: string, domain: string): string {
  return `<${createHash('sha256').update(key).digest('hex').slice(0, 40)}@${domain}>`;
}

export function storeAttachments(attachments: MailAttachment[] | undefined): StoredAttachment[] | null {
  if (!attachments || attachments.length === 0) return null;
  return attachments.map((a) => ({
    filename: a.filename,
    contentType: a.contentType,
    contentBase64: a.content.toString('base64'),
    ...(a.cid ? { cid: a.cid } : {}),
  }));
}

export function restoreAttachments(stored: StoredAttachment[] | null): MailAttachment[] | undefined {
  if (!stored || stored.length === 0) return undefined;
  return stored.map((a) => ({
    filename: a.filename,
    contentType: a.contentType,
    content: Buffer.from(a.contentBase64, 'base64'),
    ...(a.cid ? { cid: a.cid } : {}),
  }));
}

/** Inserts the row; a key already in the outbox is left as it is (INSERT … ON CONFLICT DO NOTHING). */
export async function insertOutboxRow(transaction: Transaction, mail: OutgoingMail, now: Date): Promise<void> {
  await OutboxMessage.bulkCreate(
    [
      {
        tenantId: mail.tenantId,
        key: mail.key,
        purpose: mail.purpose,
        actorId: mail.actorId ?? null,
        to: mail.message.to,
        subject: mail.message.subject,
        text: mail.message.text,
        html: mail.message.html,
        attachments: storeAttachments(mail.message.attachments),
        nextAttemptAt: now,
      },
    ],
    { ignoreDuplicates: true, transaction },
  );
}
