/**
 * A technician's visit on a phone: opens today's job, ticks the checklist, records the
 * walk test, uploads a photo (progress bar visible), completes the job; the coordinator
 * then finds it in the site's service history.
 */
import zlib from 'node:zlib';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, newContext } from './support/browser';
import { expectAccessible } from './support/axe';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

/** A noisy PNG large enough (~1.2 MB) that a slowed upload shows its progress bar. */
function noisyPng(width: number, height: number): Buffer {
  const raw = Buffer.alloc((width * 3 + 1) * height);
  let seed = 12345;
  for (let i = 0; i < raw.length; i++) {
    seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
    raw[i] = seed >>> 24;
  }
  for (let y = 0; y < height; y++) raw[y * (width * 3 + 1)] = 0;
  const chunk = (type: string, body: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(body.length);
    const typed = Buffer.concat([Buffer.from(type), body]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(zlib.crc32(typed) >>> 0);
    return Buffer.concat([len, typed, crc]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 8;
  header[9] = 2;
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', header), chunk('IDAT', zlib.deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

async function signIn(page: Page, email: string) {
  await page.goto('/sign-in');
  await expectAccessible(page);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('mullion-demo-2026');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => url.pathname.startsWith('/app'));
  await expectAccessible(page);
}

async function apiCall<T>(page: Page, method: string, url: string, body?: unknown): Promise<T> {
  return page.evaluate(
    async ({ method, url, body }) => {
      const session = (await (await fetch('/api/session')).json()) as { csrfToken: string };
      const res = await fetch(url, { method, headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken }, body: body === undefined ? undefined : JSON.stringify(body) });
      if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
      return ((await res.json()) as { data: T }).data;
    },
    { method, url, body },
  );
}

const stamp = Date.now().toString(36);
const summary = `Back-door contact reports open ${stamp}`;

describe('a technician’s visit on a phone', () => {
  it('today’s job → checklist → walk test → photo → complete → service history', async () => {
    // The office books the visit for now (so it is today wherever the site is).
    const office = await newContext(browser, { viewport: 'desktop' });
    const coordinator = await office.newPage();
    await signIn(coordinator, 'marek@lanternfield.example');
    const client = await apiCall<{ id: string }>(coordinator, 'POST', '/api/clients', { name: `Soren Kell ${stamp}` });
    const site = await apiCall<{ id: string }>(coordinator, 'POST', '/api/sites', { clientId: client.id, name: 'Home', address: { line1: '9 Orchard Rise', city: 'Ashby Cross' }, timeZone: 'America/Chicago' });
    const panel = await apiCall<{ id: string }>(coordinator, 'POST', `/api/sites/${site.id}/panels`, { label: 'Main panel', zoneCapacity: 32, wirelessZoneFrom: 1, wirelessZoneTo: 32, commPath: 'cellular' });
    const zone = await apiCall<{ id: string }>(coordinator, 'POST', `/api/panels/${panel.id}/zones`, { description: 'Back door', deviceType: 'door_contact', serial: '0770001' });
    const staff = await coordinator.evaluate(async () => ((await (await fetch('/api/staff?q=priya')).json()) as { data: { id: string }[] }).data);
    const start = new Date();
    const end = new Date(start.getTime() + 60 * 60 * 1000);
    const job = await apiCall<{ id: string }>(coordinator, 'POST', '/api/jobs', {
      siteId: site.id,
      kind: 'service_call',
      summary,
      technicianId: staff[0]!.id,
      scheduledStart: start.toISOString(),
      scheduledEnd: end.toISOString(),
      touchedZoneIds: [zone.id],
    });

    // The technician, on a phone, opens today's list and the job.
    const phone = await newContext(browser, { viewport: 'phone' });
    const tech = await phone.newPage();
    await signIn(tech, 'priya@lanternfield.example');
    await tech.goto('/app/today');
    await expectAccessible(tech);
    const card = tech.getByRole('button', { name: new RegExp(summary) });
    await expect.poll(() => card.isVisible()).toBe(true);
    if ((await card.getAttribute('aria-expanded')) !== 'true') await card.click();
    const article = tech.getByRole('article').filter({ hasText: summary });
    await article.getByRole('button', { name: 'Start job' }).click();
    await expect.poll(() => article.getByRole('button', { name: 'Complete job' }).isVisible()).toBe(true);
    await article.getByText('Read the panel’s trouble and alarm memory').click();
    await expect.poll(() => article.getByRole('checkbox', { name: 'Read the panel’s trouble and alarm memory' }).isChecked()).toBe(true);
    await article.getByRole('link', { name: /Open the job/ }).click();
    await tech.waitForURL(`**/app/jobs/${job.id}**`);
    await expectAccessible(tech);

    // Completing before the walk test is refused with the reason.
    await tech.getByRole('button', { name: 'Complete job' }).first().click();
    await tech.getByRole('dialog', { name: 'Complete job' }).getByRole('button', { name: 'Complete job' }).click();
    await expect.poll(() => tech.getByText(/1 zone this job touched has no walk-test result yet/).first().isVisible()).toBe(true);
    await tech.keyboard.press('Escape');

    // Walk test: passed, confirmed by the monitoring center.
    const row = tech.getByRole('listitem', { name: 'Zone 1 Back door' });
    await row.getByRole('group', { name: 'Result for Zone 1 Back door' }).getByRole('button', { name: 'Passed' }).click();
    await row.getByText('Monitoring center confirmed').click();
    await tech.getByRole('button', { name: 'Save walk test' }).click();
    await expect.poll(async () => (await apiCall<{ walkTest: { zoneId: string; result: string | null; monitoringConfirmed: boolean }[] }>(tech, 'GET', `/api/jobs/${job.id}`)).walkTest.find((w) => w.zoneId === zone.id)?.result).toBe('passed');

    // A photo, uploaded over a slow link so the progress bar shows.
    const cdp = await phone.newCDPSession(tech);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 20, downloadThroughput: 4_000_000, uploadThroughput: 400_000 });
    await tech.getByLabel(/Photo or PDF/).setInputFiles({ name: 'back-door.png', mimeType: 'image/png', buffer: noisyPng(600, 600) });
    await tech.getByRole('button', { name: 'Upload', exact: true }).click();
    await expect.poll(() => tech.getByRole('progressbar', { name: 'Upload progress' }).isVisible(), { timeout: 10_000 }).toBe(true);
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    await expect.poll(async () => (await apiCall<{ files: unknown[] }>(tech, 'GET', `/api/jobs/${job.id}`)).files.length, { timeout: 30_000 }).toBe(1);

    // Complete.
    await tech.getByRole('button', { name: 'Complete job' }).first().click();
    await tech.getByRole('dialog', { name: 'Complete job' }).getByRole('button', { name: 'Complete job' }).click();
    await expect.poll(async () => (await apiCall<{ state: string }>(tech, 'GET', `/api/jobs/${job.id}`)).state).toBe('completed');

    // The coordinator sees it in the site's service history.
    await coordinator.goto(`/app/sites/${site.id}`);
    await expectAccessible(coordinator);
    await expect.poll(() => coordinator.getByText(summary).first().isVisible()).toBe(true);

    await Promise.all([office.close(), phone.close()]);
  });
});
