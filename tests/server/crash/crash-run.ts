/**
 * The child process of crash.test.ts: starts the real server on a temporary SQLite file with
 * a file-backed mailer (one JSON line per message, written before send() returns), seeds a
 * firm on the first run, then either works (completes jobs and imports a zone list over
 * HTTP, forever, until killed) or recovers (lets the outbox sender send what was left and
 * exits). Run with tsx: `tsx crash-run.ts <dir> work|recover`.
 */
import fs from 'node:fs';
import path from 'node:path';
import { readEnv } from '@server/config/env';
import type { Mailer } from '@server/emails/mailer';
import { openDatabase, startServer } from '@server/index';
import { OutboxMessage } from '@server/models/OutboxMessage';
import { buildFirmWithSite, buildJob, buildPanel, TEST_PASSWORD } from '../../support/factories';

export interface CrashWorld {
  tenantId: string;
  panelId: string;
  ownerEmail: string;
  clientEmail: string;
  jobIds: string[];
}

const [dir, mode] = process.argv.slice(2) as [string, 'work' | 'recover'];
const JOBS = 40;
export const IMPORT_ROWS = 12;

function fileMailer(file: string): Mailer {
  return {
    send(message) {
      fs.appendFileSync(file, JSON.stringify({ to: message.to, subject: message.subject, messageId: message.messageId, attachments: message.attachments?.length ?? 0 }) + '\n');
      return Promise.resolve();
    },
  };
}

/** A zone list whose every description names the round, so a half import would show. */
export function zoneCsv(round: number): string {
  const header = 'number,description,deviceType,zoneType,serial,input,reportsToMonitoring,chime,supervised,status,installedOn,batteryType,batteryChangedOn,manufacturedOn';
  const rows = Array.from({ length: IMPORT_ROWS }, (_, i) => `${9 + i},Round ${round} door ${i + 1},door_contact,entry_exit,SN${round}-${i},1,true,true,true,active,2025-03-14,CR2032,,`);
  return [header, ...rows].join('\n') + '\n';
}

class Http {
  private readonly cookies = new Map<string, string>();
  private csrf = '';
  constructor(private readonly base: string) {}

  private async call(method: string, url: string, body?: BodyInit, type?: string): Promise<Response> {
    const headers: Record<string, string> = { 'X-CSRF-Token': this.csrf };
    if (this.cookies.size) headers.Cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (type) headers['Content-Type'] = type;
    const res = await fetch(this.base + url, { method, headers, ...(body !== undefined ? { body } : {}) });
    for (const line of res.headers.getSetCookie()) {
      const [pair = ''] = line.split(';');
      const at = pair.indexOf('=');
      this.cookies.set(pair.slice(0, at), pair.slice(at + 1));
    }
    return res;
  }
  async session() {
    const res = await this.call('GET', '/api/session');
    this.csrf = ((await res.json()) as { csrfToken: string }).csrfToken;
  }
  async signIn(email: string, password: string) {
    await this.session();
    const res = await this.call('POST', '/api/session', JSON.stringify({ email, password }), 'application/json');
    if (res.status !== 200) throw new Error(`sign-in ${res.status}`);
    await this.session();
  }
  post(url: string, body: object) {
    return this.call('POST', url, JSON.stringify(body), 'application/json');
  }
  upload(url: string, name: string, text: string) {
    const form = new FormData();
    form.append('file', new Blob([text], { type: 'text/csv' }), name);
    return this.call('POST', url, form);
  }
}

async function seed(): Promise<CrashWorld> {
  const f = await buildFirmWithSite();
  const panel = await buildPanel(f.site);
  const jobIds: string[] = [];
  for (let i = 0; i < JOBS; i++) {
    const job = await buildJob(f.site, { kind: 'service_call', state: 'in_progress', technicianId: f.technician.id, scheduledStart: new Date(), startedAt: new Date(), summary: `Visit ${i + 1}` });
    jobIds.push(job.id);
  }
  return { tenantId: f.firm.id, panelId: panel.id, ownerEmail: f.owner.email, clientEmail: f.client.email, jobIds };
}

async function main() {
  const env = readEnv({
    NODE_ENV: 'test',
    PORT: '0',
    APP_URL: 'http://mullion.test',
    DATABASE_URL: `sqlite:${path.join(dir, 'crash.sqlite')}`,
    TENANTS_DIR: path.join(dir, 'tenants'),
    LOG_LEVEL: 'silent',
  });
  const sequelize = await openDatabase(env);
  const worldFile = path.join(dir, 'world.json');
  if (!fs.existsSync(worldFile)) {
    const world = await seed();
    fs.writeFileSync(path.join(dir, 'world.tmp'), JSON.stringify(world));
    fs.renameSync(path.join(dir, 'world.tmp'), worldFile);
  }
  const world = JSON.parse(fs.readFileSync(worldFile, 'utf8')) as CrashWorld;
  // a short claim lease: a message claimed when the process was killed is sent again soon after restart
  const running = await startServer(env, { sequelize, mailer: fileMailer(path.join(dir, 'mail.log')), host: '127.0.0.1', outbox: { claimLeaseMs: 300, pollMs: 100 } });

  if (mode === 'recover') {
    for (;;) {
      const pending = await OutboxMessage.count({ where: { state: 'pending' }, crossTenant: true });
      if (pending === 0) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    await running.close();
    process.stdout.write('RECOVERED\n');
    return;
  }

  const http = new Http(`http://127.0.0.1:${running.port}`);
  await http.signIn(world.ownerEmail, TEST_PASSWORD);
  process.stdout.write('READY\n');
  for (let round = 1; ; round++) {
    for (const jobId of world.jobIds.slice((round - 1) * 2, round * 2)) {
      await http.post(`/api/jobs/${jobId}/transitions`, { to: 'completed' });
    }
    const res = await http.upload(`/api/panels/${world.panelId}/zones/import`, 'zones.csv', zoneCsv(round));
    if (res.status !== 200) throw new Error(`import ${res.status}: ${await res.text()}`);
    if (round * 2 >= world.jobIds.length) await new Promise((r) => setTimeout(r, 50));
  }
}

main().catch((err: unknown) => {
  process.stderr.write(`${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
  process.exit(1);
});
