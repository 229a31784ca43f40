/**
 * Premises and coverage in a real browser: a coordinator builds two floors with rooms and
 * openings from the keyboard, links zones to openings, sees the coverage summary change,
 * places a pin on a floor plan and finds it there after a reload.
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

/** A small plain PNG (a 200×120 plan drawing stand-in). */
function png(width: number, height: number): Buffer {
  const raw = Buffer.alloc((width * 3 + 1) * height, 0xee);
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

/** Calls the API from the signed-in page (same cookies, CSRF token from the session). */
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

describe('premises and coverage', () => {
  it('build the layout, link zones, watch coverage change, pin a zone on the plan', async () => {
    const context = await newContext(browser, { viewport: 'desktop' });
    const page = await context.newPage();
    await page.goto('/sign-in');
    await expectAccessible(page);
    await page.getByLabel('E-mail').fill('luis@tamsworthvale.example');
    await page.getByLabel('Password').fill('mullion-demo-2026');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL('**/app');
    await expectAccessible(page);

    // A new client, site, panel and two zones (set up through the API; the installed-base test drives those screens).
    const client = await apiCall<{ id: string }>(page, 'POST', '/api/clients', { name: `Odile Ferrant ${stamp}` });
    const site = await apiCall<{ id: string }>(page, 'POST', '/api/sites', { clientId: client.id, name: 'Home', address: { line1: '5 Weir Street', city: 'Cobble Ferry' }, timeZone: 'America/Denver' });
    const panel = await apiCall<{ id: string }>(page, 'POST', `/api/sites/${site.id}/panels`, { label: 'Main panel', zoneCapacity: 32, wirelessZoneFrom: 1, wirelessZoneTo: 32, commPath: 'cellular' });
    await apiCall(page, 'POST', `/api/panels/${panel.id}/zones`, { description: 'Den window', deviceType: 'window_contact', serial: '0610001' });
    await apiCall(page, 'POST', `/api/panels/${panel.id}/zones`, { description: 'Front door', deviceType: 'door_contact', serial: '0610002' });

    // Two floors with rooms and openings, typed with Enter.
    await page.goto(`/app/sites/${site.id}/premises`);
    await expectAccessible(page);
    const floorForm = page.getByRole('form', { name: 'Add a floor' });
    await floorForm.getByLabel('Floor name', { exact: true }).fill('Ground floor');
    await floorForm.getByLabel('Floor name', { exact: true }).press('Enter');
    const groundRooms = page.getByRole('form', { name: 'Add a room to Ground floor' });
    await groundRooms.getByLabel('Room name', { exact: true }).fill('Den');
    await groundRooms.getByLabel('Room name', { exact: true }).press('Enter');
    const denOpenings = page.getByRole('form', { name: 'Add an opening to Den' });
    await denOpenings.getByLabel('Opening', { exact: true }).fill('Den window');
    await denOpenings.getByLabel('Opening', { exact: true }).press('Enter');
    await expect.poll(() => page.getByRole('list', { name: 'Doors and windows of Den' }).getByText('Den window').isVisible()).toBe(true);
    await denOpenings.getByLabel('Opening', { exact: true }).fill('Front door');
    await denOpenings.getByLabel('Opening', { exact: true }).press('Enter');
    await expect.poll(() => page.getByRole('list', { name: 'Doors and windows of Den' }).getByText('Front door').isVisible()).toBe(true);

    await floorForm.getByLabel('Floor name', { exact: true }).fill('Upstairs');
    await floorForm.getByLabel('Level', { exact: true }).fill('1');
    await floorForm.getByLabel('Floor name', { exact: true }).press('Enter');
    const upRooms = page.getByRole('form', { name: 'Add a room to Upstairs' });
    await upRooms.getByLabel('Room name', { exact: true }).fill('Main bedroom');
    await upRooms.getByLabel('Room name', { exact: true }).press('Enter');
    const bedOpenings = page.getByRole('form', { name: 'Add an opening to Main bedroom' });
    await bedOpenings.getByLabel('Opening', { exact: true }).fill('Bedroom window');
    await bedOpenings.getByLabel('Opening', { exact: true }).press('Enter');
    await expect.poll(() => page.getByRole('list', { name: 'Doors and windows of Main bedroom' }).getByText('Bedroom window').isVisible()).toBe(true);

    // Coverage before any zone is linked.
    await page.goto(`/app/sites/${site.id}/coverage`);
    await expectAccessible(page);
    await expect.poll(() => page.getByText(/^0 of 3 openings protected/).first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText('NFPA 72: a smoke alarm in every sleeping room').first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText(/Local codes and the authority having jurisdiction decide what is required/).first().isVisible()).toBe(true);

    // Link the den window zone to its opening in the zone form.
    await page.goto(`/app/panels/${panel.id}`);
    await expectAccessible(page);
    await page.getByRole('button', { name: 'Edit zone 1, Den window' }).first().click();
    const zoneDialog = page.getByRole('dialog', { name: 'Edit zone 1' });
    await zoneDialog.getByLabel('Door or window').selectOption({ label: 'Den · Den window' });
    await zoneDialog.getByRole('button', { name: 'Save zone' }).click();
    await expect.poll(() => page.getByRole('dialog', { name: 'Edit zone 1' }).isVisible()).toBe(false);

    await page.goto(`/app/sites/${site.id}/coverage`);
    await expectAccessible(page);
    await expect.poll(() => page.getByText(/^1 of 3 openings protected/).first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Protected — Den window').first().isVisible()).toBe(true);

    // A plan image for the ground floor, and a pin for the front door zone.
    await page.goto(`/app/sites/${site.id}/premises`);
    await expectAccessible(page);
    await page.locator('input[type=file]').first().setInputFiles({ name: 'plan.png', mimeType: 'image/png', buffer: png(200, 120) });
    const plan = page.getByRole('img', { name: 'Floor plan of Ground floor' });
    await expect.poll(() => plan.isVisible()).toBe(true);
    await page.getByRole('button', { name: 'Place zone 2 Front door' }).click();
    const box = (await plan.boundingBox())!;
    await page.mouse.click(box.x + box.width * 0.25, box.y + box.height * 0.5);
    await expect.poll(async () => (await apiCall<{ pin: { x: number; y: number } | null }>(page, 'GET', `/api/zones/${(await apiCall<{ id: string; number: number }[]>(page, 'GET', `/api/panels/${panel.id}/zones`)).find((z) => z.number === 2)!.id}`)).pin !== null).toBe(true);

    await page.reload();
    const pin = page.getByRole('button', { name: /^Zone 2/ }).first();
    await expect.poll(() => pin.isVisible()).toBe(true);
    const planBox = (await page.getByRole('img', { name: 'Floor plan of Ground floor' }).boundingBox())!;
    const pinBox = (await pin.boundingBox())!;
    const fx = (pinBox.x + pinBox.width / 2 - planBox.x) / planBox.width;
    const fy = (pinBox.y + pinBox.height / 2 - planBox.y) / planBox.height;
    expect(Math.abs(fx - 0.25)).toBeLessThan(0.05);
    expect(Math.abs(fy - 0.5)).toBeLessThan(0.08);

    await context.close();
  });
});
