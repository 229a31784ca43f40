/**
 * The development stand-in for e-mail: maildev (SMTP, plus a web UI with a REST API under
 * /email), started only when SMTP_URL is not set. Tests start their own on free ports.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { MailDev } from 'maildev';

export interface MailCatcher {
  smtpUrl: string;
  webUrl: string;
  close(): Promise<void>;
}

export async function startMailCatcher({ smtpPort = 1025, webPort = 1080 } = {}): Promise<MailCatcher> {
  const mailDirectory = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-mail-'));
  const maildev = new MailDev({ smtp: smtpPort, web: webPort, ip: '127.0.0.1', webIp: '127.0.0.1', silent: true, mailDirectory });
  await maildev.start();
  return {
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    webUrl: `http://127.0.0.1:${webPort}`,
    close: async () => {
      await maildev.stop();
      fs.rmSync(mailDirectory, { recursive: true, force: true });
    },
  };
}
