/**
 * Journey 2 in a real browser, at phone width: the firm's coordinator invites a household to
 * the portal → the invitation arrives in the mail catcher → the homeowner sets a password in
 * the firm-branded portal → sees the protection summary and the windows without a sensor,
 * named → asks for a visit → the coordinator finds the request among the firm's jobs.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { latestMailTo, launchBrowser, linkIn, mailUrl, newContext } from './support/browser';
import { expectAccessible } from './support/axe';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const stamp = Date.now().toString(36);
const homeEmail = `yara-${stamp}@homes.example`;
/** A household of the demo firm Lanternfield Alarm Co. (invented), without a portal sign-in yet. */
const household = 'Yara Ashdown';

interface CoverageOpening {
  label: string;
  kind: string;
  protected: boolean;
  groundReachable: boolean;
}
interface Coverage {
  summary: string;
  floors: { rooms: { openings: CoverageOpening[] }[] }[];
}

describe('a homeowner checks which windows are covered and asks for a visit', () => {
  it('runs end to end at phone width', async () => {
    // 1. The coordinator opens the household's client page and invites them to the portal.
    const officeContext = await newContext(browser, { viewport: 'desktop' });
    const office = await officeContext.newPage();
    await office.goto('/sign-in');
    await expectAccessible(office);
    await office.getByLabel('E-mail').fill('marek@lanternfield.example');
    await office.getByLabel('Password').fill('mullion-demo-2026');
    await office.getByRole('button', { name: 'Sign in' }).click();
    await office.waitForURL('**/app');
    await expectAccessible(office);
    await office.goto('/app/clients');
    await expectAccessible(office);
    await office.getByLabel('Search clients').fill('Ashdown');
    await office.getByRole('link', { name: household }).first().click();
    await office.waitForURL('**/app/clients/*');
    await expectAccessible(office);
    const invitedAt = new Date(Date.now() - 1000);
    await office.getByLabel('E-mail to invite').fill(homeEmail);
    await office.getByRole('button', { name: 'Invite to the portal' }).click();
    await expect.poll(() => office.getByText(`Invitation sent to ${homeEmail}.`).isVisible()).toBe(true);

    // 2. The invitation names the firm and opens its own portal address.
    const mail = await latestMailTo(mailUrl(), homeEmail, { after: invitedAt });
    expect(mail.subject).toContain('Lanternfield Alarm Co.');
    const link = linkIn(mail, '/invitations/');
    expect(new URL(link).pathname).toMatch(/^\/p\/lanternfield\/invitations\/[A-Za-z0-9_-]+$/);

    // 3. The homeowner sets a password on a phone, in the firm's colours.
    const homeContext = await newContext(browser, { viewport: 'phone' });
    const home = await homeContext.newPage();
    await home.goto(link);
    await expectAccessible(home);
    await expect.poll(() => home.getByRole('heading', { name: /Welcome to the Lanternfield Alarm Co\. client portal/ }).isVisible()).toBe(true);
    const accent = await home.evaluate(() => getComputedStyle(document.querySelector('[style*="--color-brass-600"]')!).getPropertyValue('--color-brass-600').trim());
    expect(accent.toLowerCase()).not.toBe('#8f5c17'); // the firm's own colour, not Mullion's brass
    await home.getByLabel('Your name').fill('Yara Ashdown');
    await home.getByLabel('Choose a password').fill('kitchen window latch 9');
    await home.getByRole('button', { name: 'Create my sign-in' }).click();
    await home.waitForURL(/\/portal\/sites\/[0-9a-f-]+$/);
    await expectAccessible(home);
    const siteId = new URL(home.url()).pathname.split('/').pop()!;

    // 4. The home page states the protection summary the server computed.
    const coverage = (await (await home.request.get(`/api/portal/sites/${siteId}/coverage`)).json()) as { data: Coverage };
    await expect.poll(() => home.getByText(coverage.data.summary).first().isVisible()).toBe(true);
    expect(coverage.data.summary).toMatch(/^\d+ of \d+ openings protected/);

    // 5. Doors and windows: every window without a sensor is named.
    await home.getByRole('link', { name: 'Doors & windows' }).click();
    await home.waitForURL(`**/portal/sites/${siteId}/coverage`);
    await expectAccessible(home);
    const missing = home.getByRole('list', { name: 'Doors and windows without a sensor' });
    await expect.poll(() => missing.isVisible()).toBe(true);
    const unprotectedWindows = coverage.data.floors
      .flatMap((f) => f.rooms.flatMap((r) => r.openings))
      .filter((o) => !o.protected && o.kind === 'window');
    expect(unprotectedWindows.length).toBeGreaterThan(0);
    for (const window of unprotectedWindows) {
      await expect.poll(() => missing.getByText(window.label).first().isVisible()).toBe(true);
    }
    expect(await missing.getByText(/reachable from the ground/).count()).toBe(unprotectedWindows.filter((o) => o.groundReachable).length);
    const overflow = await home.evaluate(() => document.documentElement.scrollWidth > window.innerWidth);
    expect(overflow).toBe(false);

    // 6. The homeowner asks for a visit about one of those windows.
    await home.getByRole('link', { name: 'Visits' }).click();
    await home.waitForURL(`**/portal/sites/${siteId}/service`);
    await expectAccessible(home);
    const request = `Please add a sensor to the ${unprotectedWindows[0]!.label.toLowerCase()} (${stamp}).`;
    await home.getByLabel('What needs attention?').fill(request);
    await home.getByLabel('When suits you?').fill('Weekday mornings');
    await home.getByRole('button', { name: 'Send request' }).click();
    await expect.poll(() => home.getByText(/Request sent\./).isVisible()).toBe(true);
    const upcoming = home.getByRole('list', { name: 'Upcoming visits' });
    await expect.poll(() => upcoming.getByText('Requested — not booked yet').first().isVisible()).toBe(true);

    // 7. The coordinator finds the request among the firm's requested jobs.
    await office.goto('/app/jobs');
    await expectAccessible(office);
    await office.getByRole('button', { name: /requested jobs? waits? for a time/ }).click();
    const jobLink = office.getByRole('link', { name: new RegExp(stamp) });
    await expect.poll(() => jobLink.first().isVisible()).toBe(true);
    await jobLink.first().click();
    await office.waitForURL('**/app/jobs/*');
    await expectAccessible(office);
    await expect.poll(() => office.getByText('Asked for by the client').isVisible()).toBe(true);
    await expect.poll(() => office.getByRole('link', { name: new RegExp(household) }).first().isVisible()).toBe(true);
    await expect.poll(() => office.getByRole('heading', { name: request }).isVisible()).toBe(true);

    await Promise.all([officeContext.close(), homeContext.close()]);
  });
});
