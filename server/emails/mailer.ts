import nodemailer from 'nodemailer';

/** A file sent with an e-mail (a completion report, say); handed to nodemailer as is. */
export interface MailAttachment {
  filename: string;
  content: Buffer;
  contentType: string;
  /** set for an image shown inside the HTML (`<img src="cid:…">`) */
  cid?: string;
}

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** optional files; the memory mailer keeps them so tests can read them */
  attachments?: MailAttachment[];
  /**
   * Set by the outbox sender from the message's key: a retried message keeps its
   * Message-ID, so the recipient's mail system can tell a repeat from a new message.
   */
  messageId?: string;
}

export interface Mailer {
  send(message: MailMessage): Promise<void>;
}

/** Sends through any SMTP relay (maildev in development). */
export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const transport = nodemailer.createTransport(smtpUrl);
  return {
    async send(message) {
      await transport.sendMail({ from, ...message });
    },
  };
}

/** Keeps messages in memory: server tests read the outbox. */
export function createMemoryMailer(): Mailer & { outbox: MailMessage[] } {
  const outbox: MailMessage[] = [];
  return {
    outbox,
    send(message) {
      outbox.push(message);
      return Promise.resolve();
    },
  };
}
