/**
 * The development stand-in for e-mail: maildev (SMTP, plus a web UI with a REST API under
 * /email), started only when SMTP_URL is not set. The ports asked for are the preferred
 * ones: when one is taken (another `npm start`), a free port is used instead and the URLs
 * say which. Tests start their own on free ports.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { MailDev } from 'maildev';
import { pickPorts } from '../ports';

export const USUAL_SMTP_PORT = 1025;
export const USUAL_MAIL_WEB_PORT = 1080;

export interface MailCatcher {
  smtpUrl: string;
  webUrl: string;
  /** the ports in use, which differ from the ones asked for when those were taken */
  smtpPort: number;
  webPort: number;
  close(): Promise<void>;
}

export async function startMailCatcher(preferred: { smtpPort?: number; webPort?: number } = {}): Promise<MailCatcher> {
  const [smtpPort, webPort] = (await pickPorts([preferred.smtpPort ?? USUAL_SMTP_PORT, preferred.webPort ?? USUAL_MAIL_WEB_PORT], '127.0.0.1')) as [number, number];
  const mailDirectory = fs.mkdtempSync(path.join(os.tmpdir(), 'mullion-mail-'));
  const maildev = new MailDev({ smtp: smtpPort, web: webPort, ip: '127.0.0.1', webIp: '127.0.0.1', silent: true, mailDirectory });
  await maildev.start();
  return {
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    webUrl: `http://127.0.0.1:${webPort}`,
    smtpPort,
    webPort,
    close: async () => {
      await maildev.stop();
      fs.rmSync(mailDirectory, { recursive: true, force: true });
    },
  };
}
