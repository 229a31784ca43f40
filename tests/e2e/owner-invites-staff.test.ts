/**
 * Journeys 1 and 3 in a real browser: a firm owner signs up and confirms the address from the
 * e-mailed link, picks a plan and pays on the
 * (stand-in) Stripe checkout page, comes back to an active firm and invites a technician, who
 * accepts the e-mailed invitation on a phone and sees only what a technician may; the
 * operator suspends the firm, and the technician's next page load is refused.
 */
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { latestMailTo, launchBrowser, linkIn, mailUrl, newContext, stripeUrl } from './support/browser';
import { expectAccessible } from './support/axe';

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const stamp = Date.now().toString(36);
const firmName = `Copperbeech Alarms ${stamp}`;
const ownerEmail = `owner-${stamp}@copperbeech.example`;
const techEmail = `tech-${stamp}@copperbeech.example`;

describe('owner signs up and invites a technician; operator suspends the firm', () => {
  it('runs end to end', async () => {
    // 1. The owner signs up from the landing page (desktop).
    const ownerContext = await newContext(browser, { viewport: 'desktop' });
    const owner = await ownerContext.newPage();
    await owner.goto('/');
    await expectAccessible(owner);
    await owner.getByRole('link', { name: 'Start free trial' }).click();
    await owner.getByLabel('Firm name').fill(firmName);
    await owner.getByLabel('Your name').fill('Orla Beech');
    await owner.getByLabel('Work e-mail').fill(ownerEmail);
    await owner.getByLabel('Password').fill('copper beech hedge 42');
    const signedUpAt = new Date(Date.now() - 1000);
    await owner.getByRole('button', { name: 'Create my firm' }).click();
    await expect
      .poll(() => owner.getByRole('status').innerText(), { timeout: 10_000 })
      .toContain(`Check your inbox at ${ownerEmail} for a link to finish setting up your firm.`);
    // The confirmation link arrives by e-mail; opening it and pressing the button starts the trial.
    const confirmation = await latestMailTo(mailUrl(), ownerEmail, { after: signedUpAt });
    expect(confirmation.subject).toBe(`Finish setting up ${firmName} on Mullion`);
    await owner.goto(linkIn(confirmation, '/sign-up/confirm/'));
    await expect.poll(() => owner.getByRole('heading', { name: `Finish setting up ${firmName}` }).isVisible()).toBe(true);
    await owner.getByRole('button', { name: 'Start my trial' }).click();
    await owner.waitForURL('**/app');
    await expectAccessible(owner);
    await expect.poll(() => owner.getByText(firmName).first().isVisible()).toBe(true);
    await expect.poll(() => owner.getByText(/Trial · 14 days left/).first().isVisible()).toBe(true);

    // 2. The owner picks a plan and pays on the checkout page; back in Mullion the firm is active.
    await owner.goto('/app/billing');
    await expectAccessible(owner);
    await expect.poll(() => owner.getByText(/Trial — 14 days left/).first().isVisible()).toBe(true);
    await owner.getByRole('button', { name: 'Choose Crew' }).click();
    await owner.waitForURL((url) => url.origin === new URL(stripeUrl()).origin && url.pathname.startsWith('/checkout/'));
    await expectAccessible(owner);
    await expect.poll(() => owner.getByText(firmName).first().isVisible()).toBe(true);
    await expect.poll(() => owner.getByText(/\$149/).first().isVisible()).toBe(true);
    expect(await owner.getByLabel('Card number').inputValue()).toBe('4242 4242 4242 4242');
    await owner.getByRole('button', { name: 'Pay and subscribe' }).click();
    await owner.waitForURL((url) => url.pathname === '/app/billing');
    await expectAccessible(owner);
    await expect.poll(() => owner.getByText('Payment received. Welcome to the Crew plan.').isVisible(), { timeout: 20_000 }).toBe(true);
    await expect.poll(() => owner.getByText(/Crew plan, \$149 a month, renews/).first().isVisible()).toBe(true);
    await expect.poll(() => owner.getByRole('button', { name: 'Manage payment and plan' }).first().isVisible()).toBe(true);
    await expect.poll(() => owner.getByText(/Staff seats\s*1 of 10/).first().isVisible()).toBe(true);

    // 3. The owner invites a technician from the staff page, within the Crew plan's seats.
    const invitedAt = new Date(Date.now() - 1000);
    await owner.getByRole('link', { name: 'Staff' }).first().click();
    await owner.getByRole('button', { name: 'Invite a colleague' }).click();
    const dialog = owner.getByRole('dialog', { name: 'Invite a colleague' });
    await dialog.getByLabel('E-mail').fill(techEmail);
    await dialog.getByLabel('Role').selectOption('technician');
    await dialog.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => owner.getByText(`Invitation sent to ${techEmail}.`).isVisible()).toBe(true);
    await expect.poll(() => owner.getByText('Invitations not yet accepted').isVisible()).toBe(true);

    // 4. The invitation arrives in the mail catcher.
    const mail = await latestMailTo(mailUrl(), techEmail, { after: invitedAt });
    expect(mail.subject).toBe(`${firmName} invited you to Mullion`);
    const link = linkIn(mail, '/invitations/');

    // 5. The technician accepts on a phone and lands signed in as technician.
    const techContext = await newContext(browser, { viewport: 'phone' });
    const tech = await techContext.newPage();
    await tech.goto(link);
    await expectAccessible(tech);
    await expect.poll(() => tech.getByRole('heading', { name: `Join ${firmName}` }).isVisible()).toBe(true);
    await tech.getByLabel('Your name').fill('Tariq Vane');
    await tech.getByLabel('Choose a password').fill('ladder and drill 77');
    await tech.getByRole('button', { name: 'Accept and sign in' }).click();
    await tech.waitForURL('**/app');
    await expectAccessible(tech);

    // A technician's phone bar leads to their day and the jobs, never to firm settings or invitations.
    const nav = tech.getByRole('navigation', { name: 'Workspace' }).last();
    await expect.poll(() => nav.getByRole('link', { name: 'Today' }).isVisible()).toBe(true);
    await expect.poll(() => nav.getByRole('link', { name: 'Jobs' }).isVisible()).toBe(true);
    expect(await nav.getByRole('link', { name: /Settings/ }).count()).toBe(0);
    await tech.goto('/app/staff');
    await expectAccessible(tech);
    await expect.poll(() => tech.getByRole('cell', { name: /^Tariq Vane/ }).isVisible()).toBe(true);
    expect(await tech.getByRole('button', { name: 'Invite a colleague' }).count()).toBe(0);
    expect(await tech.getByRole('button', { name: /Deactivate/ }).count()).toBe(0);
    await tech.goto('/app/settings');
    await expectAccessible(tech);
    await tech.waitForURL((url) => url.pathname === '/app');
    await expectAccessible(tech);

    // The owner sees the technician in the staff table now.
    await owner.reload();
    await expect.poll(() => owner.getByRole('cell', { name: /^Tariq Vane/ }).isVisible()).toBe(true);

    // 6. The operator signs in and suspends the firm.
    const opContext = await newContext(browser, { viewport: 'desktop' });
    const op = await opContext.newPage();
    await op.goto('/sign-in');
    await expectAccessible(op);
    await op.getByLabel('E-mail').fill('operator@mullion.example');
    await op.getByLabel('Password').fill('mullion-demo-2026');
    await op.getByRole('button', { name: 'Sign in' }).click();
    await op.waitForURL('**/operator');
    await expectAccessible(op);
    await op.getByLabel('Search firms').fill(stamp);
    await op.getByRole('link', { name: firmName }).click();
    await op.getByRole('button', { name: 'Suspend firm' }).click();
    const suspend = op.getByRole('dialog', { name: `Suspend ${firmName}?` });
    await suspend.getByLabel(/Reason/).fill('Chargeback under review');
    await suspend.getByRole('button', { name: 'Suspend firm' }).click();
    await expect.poll(() => op.getByText(/Suspended .*: Chargeback under review/).isVisible()).toBe(true);

    // 7. The technician's next page load is refused: back to sign-in, with the reason.
    await tech.goto('/app/staff');
    await expectAccessible(tech);
    await tech.waitForURL((url) => url.pathname === '/sign-in');
    await expectAccessible(tech);
    await expect.poll(() => tech.getByRole('alert').filter({ hasText: 'suspended' }).isVisible()).toBe(true);
    // ...and signing in again is refused too.
    await tech.getByLabel('E-mail').fill(techEmail);
    await tech.getByLabel('Password').fill('ladder and drill 77');
    await tech.getByRole('button', { name: 'Sign in' }).click();
    await expect.poll(() => tech.getByRole('alert').filter({ hasText: 'suspended' }).isVisible()).toBe(true);
    expect(new URL(tech.url()).pathname).toBe('/sign-in');

    // 8. Restoring lets the firm back in; nothing was deleted.
    await op.getByRole('button', { name: 'Restore firm' }).click();
    const restore = op.getByRole('dialog', { name: `Restore ${firmName}?` });
    await restore.getByLabel(/Reason/).fill('Chargeback resolved');
    await restore.getByRole('button', { name: 'Restore firm' }).click();
    await expect.poll(() => op.getByText('Service actions on this firm').isVisible()).toBe(true);
    await expect.poll(() => op.getByText('“Chargeback resolved”').isVisible()).toBe(true);
    await tech.getByRole('button', { name: 'Sign in' }).click();
    // back where the refused page load wanted to go
    await tech.waitForURL((url) => url.pathname === '/app/staff');
    await expectAccessible(tech);
    await expect.poll(() => tech.getByRole('cell', { name: /^Tariq Vane/ }).isVisible()).toBe(true);

    await Promise.all([ownerContext.close(), techContext.close(), opContext.close()]);
  });
});
