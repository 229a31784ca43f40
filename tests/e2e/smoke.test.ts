/**
 * The built client loads in a real browser under the strict Content-Security-Policy, and the
 * API behind it answers.
 */
import type { Browser, BrowserContext } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { baseUrl, launchBrowser, newContext } from './support/browser';
import { expectAccessible, seriousViolations } from './support/axe';

let browser: Browser;
let context: BrowserContext;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});
beforeEach(async () => {
  context = await newContext(browser);
});
afterEach(async () => {
  await context?.close();
});

describe('smoke', () => {
  it('serves the client with its title and no Content-Security-Policy violations', async () => {
    const page = await context.newPage();
    const cspConsoleErrors: string[] = [];
    page.on('console', (msg) => {
      if (msg.type() === 'error' && /content security policy/i.test(msg.text())) cspConsoleErrors.push(msg.text());
    });
    // Violations the console might not show (e.g. reported ones) still fire this event.
    await page.addInitScript(() => {
      const seen: string[] = [];
      (window as unknown as { __cspViolations: string[] }).__cspViolations = seen;
      document.addEventListener('securitypolicyviolation', (e) => seen.push(`${e.violatedDirective} ${e.blockedURI}`));
    });

    const response = await page.goto('/', { waitUntil: 'load' });
    await expectAccessible(page);
    expect(response?.status()).toBe(200);
    expect(response?.headers()['content-security-policy']).toContain("default-src 'self'");
    await page.waitForLoadState('networkidle');

    expect(await page.title()).toContain('Mullion');
    const violations = await page.evaluate(() => (window as unknown as { __cspViolations: string[] }).__cspViolations);
    expect(violations).toEqual([]);
    expect(cspConsoleErrors).toEqual([]);
  });

  it('the accessibility check runs under the strict policy and names what it finds', async () => {
    const page = await context.newPage();
    await page.goto('/', { waitUntil: 'load' });
    await expectAccessible(page);
    // an icon-only button without a name and an image without a text alternative
    await page.evaluate(() => {
      const main = document.querySelector('main') ?? document.body;
      main.insertAdjacentHTML('beforeend', '<button id="bare-button"><svg width="10" height="10"></svg></button><img id="bare-image" src="/favicon.svg">');
    });
    const found = await seriousViolations(page);
    expect(found.some((v) => v.includes('button-name') && v.includes('#bare-button'))).toBe(true);
    expect(found.some((v) => v.includes('image-alt') && v.includes('#bare-image'))).toBe(true);
    await expect(expectAccessible(page)).rejects.toThrow(/button-name/);
  });

  it('answers GET /api/health with { ok: true }', async () => {
    const res = await fetch(`${baseUrl()}/api/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true });
  });
});
