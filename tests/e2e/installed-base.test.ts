/**
 * The installed base in a real browser: a coordinator creates a client, a site and a panel,
 * adds zones (next number and device-type defaults prefilled), sees a duplicate serial
 * refused, imports a CSV of zones and downloads the programming sheet.
 */
import fs from 'node:fs';
import type { Browser } from 'playwright-core';
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

const stamp = Date.now().toString(36);
const clientName = `Wilhelmina Sedge ${stamp}`;

describe('a coordinator records a new installation', () => {
  it('client → site → panel → zones → CSV import → programming sheet', async () => {
    const context = await newContext(browser, { viewport: 'desktop', acceptDownloads: true });
    const page = await context.newPage();
    await page.goto('/sign-in');
    await expectAccessible(page);
    await page.getByLabel('E-mail').fill('marek@lanternfield.example');
    await page.getByLabel('Password').fill('mullion-demo-2026');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL('**/app');
    await expectAccessible(page);

    // Client
    await page.getByRole('link', { name: 'Clients' }).first().click();
    await page.getByRole('button', { name: 'New client' }).click();
    const clientDialog = page.getByRole('dialog', { name: 'New client' });
    await clientDialog.getByLabel('Name').fill(clientName);
    await clientDialog.getByLabel('E-mail').fill(`w.sedge.${stamp}@homes.example`);
    await clientDialog.getByLabel('Phone', { exact: true }).fill('(555) 010-3344');
    await clientDialog.getByRole('button', { name: 'Add client' }).click();
    await expect.poll(() => page.getByRole('heading', { name: clientName }).isVisible()).toBe(true);

    // Site
    await page.getByRole('link', { name: 'Add site' }).first().click();
    await page.getByLabel('Street address').fill('12 Tannery Close');
    await page.getByLabel('City').fill('Sedgebrook');
    await page.getByLabel('Monitoring account number').fill('730155');
    await page.getByLabel('Verbal passcode').fill('copperkettle');
    await page.getByRole('button', { name: 'Add site' }).click();
    await expect.poll(() => page.getByRole('heading', { name: 'Home' }).isVisible()).toBe(true);
    expect(await page.getByText('copperkettle').count()).toBe(0);

    // Panel
    await page.getByRole('button', { name: 'Add panel' }).click();
    const panelDialog = page.getByRole('dialog', { name: 'Add panel' });
    await panelDialog.getByLabel('Name').fill('Main panel');
    await panelDialog.getByLabel('Make and model').fill('Wireless hub, series 4');
    await panelDialog.getByRole('button', { name: 'Add panel' }).click();
    await page.waitForURL('**/app/panels/**');
    await expectAccessible(page);

    // First zone: the next free wireless number is prefilled; window contact defaults apply.
    await page.getByRole('button', { name: 'Add zone' }).first().click();
    const zoneDialog = page.getByRole('dialog', { name: 'Add zone' });
    expect(await zoneDialog.getByLabel('Zone number').inputValue()).toBe('9');
    await zoneDialog.getByLabel('Description').fill('Den window');
    await zoneDialog.getByLabel('Device type').selectOption('window_contact');
    expect(await zoneDialog.getByLabel('Zone type').inputValue()).toBe('perimeter');
    expect(await zoneDialog.getByLabel('Chime', { exact: true }).isChecked()).toBe(true);
    await zoneDialog.getByLabel('Serial').fill('0412877');
    await zoneDialog.getByRole('button', { name: 'Add zone' }).click();
    await expect.poll(() => page.getByRole('dialog', { name: 'Add zone' }).isVisible()).toBe(false);
    await expect.poll(() => page.getByText('0412877').first().isVisible()).toBe(true);

    // Second zone: number 10 prefilled; smoke defaults; the same serial + input is refused.
    await page.getByRole('button', { name: 'Add zone' }).first().click();
    const second = page.getByRole('dialog', { name: 'Add zone' });
    expect(await second.getByLabel('Zone number').inputValue()).toBe('10');
    await second.getByLabel('Description').fill('Hall smoke');
    await second.getByLabel('Device type').selectOption('smoke');
    expect(await second.getByLabel('Zone type').inputValue()).toBe('fire_24h');
    expect(await second.getByLabel('Chime', { exact: true }).isChecked()).toBe(false);
    await second.getByLabel('Serial').fill('0412877');
    await second.getByRole('button', { name: 'Add zone' }).click();
    await expect.poll(() => second.getByText('Serial 0412877 input 1 is already zone 9 on this panel. Choose another input or edit zone 9.').isVisible()).toBe(true);
    await second.getByLabel('Serial').fill('0412878');
    await second.getByRole('button', { name: 'Add zone' }).click();
    await expect.poll(() => page.getByRole('dialog', { name: 'Add zone' }).isVisible()).toBe(false);
    await expect.poll(() => page.getByText(/Local codes and the authority having jurisdiction decide what is required/).isVisible()).toBe(true);

    // CSV import: a dry run previews, then the import adds the zones.
    const csv = [
      'number,description,deviceType,zoneType,serial,input,reportsToMonitoring,chime,supervised,status,installedOn,batteryType,batteryChangedOn,manufacturedOn',
      '11,Back door,door_contact,entry_exit,0733120,1,true,true,true,active,2026-11-02,CR2032,,',
      '12,Basement water,water,water_24h,0733121,1,true,false,true,active,2026-11-02,CR2450,,',
    ].join('\n');
    await page.getByRole('button', { name: 'Import zones (CSV)' }).first().click();
    const importDialog = page.getByRole('dialog', { name: 'Import zones (CSV)' });
    await importDialog.getByLabel('CSV file of zones').setInputFiles({ name: 'zones.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    await importDialog.getByRole('button', { name: 'Import 2 zones' }).click();
    await expect.poll(() => page.getByText('0733121').first().isVisible()).toBe(true);
    await expect.poll(() => page.getByText('Basement water').first().isVisible()).toBe(true);

    // Programming sheet
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: /Programming sheet/ }).click()]);
    const file = await download.path();
    expect(download.suggestedFilename()).toMatch(/\.pdf$/);
    expect(fs.readFileSync(file).subarray(0, 5).toString('ascii')).toBe('%PDF-');

    await context.close();
  });
});
