/**
 * Browser helpers for the e2e tests: one Chromium per test file, a fresh context (cookies,
 * storage) per test at a phone or desktop viewport, and the mail catcher's REST API for the
 * links Mullion sends by e-mail (invitations, password resets).
 */
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions } from 'playwright-core';
import { inject } from 'vitest';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** Technicians and clients are on phones; staff in the office at desktop width. */
export const VIEWPORTS = {
  phone: { width: 390, height: 844 },
  desktop: { width: 1280, height: 800 },
} as const;

export type ViewportName = keyof typeof VIEWPORTS;

/** The app under test, without a trailing slash. */
export function baseUrl(): string {
  return inject('baseUrl');
}

/** The mail catcher's web UI and REST API. */
export function mailUrl(): string {
  return inject('mailUrl');
}

/** The local Stripe stand-in (its hosted checkout and billing portal pages). */
export function stripeUrl(): string {
  return inject('stripeUrl');
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: inject('chromiumPath'), args: CHROMIUM_ARGS, headless: true });
}

/**
 * A fresh context (no cookies, no storage) whose relative URLs resolve against the app:
 * `page.goto('/sign-in')`.
 */
export function newContext(
  browser: Browser,
  { viewport = 'desktop', ...options }: { viewport?: ViewportName } & Omit<BrowserContextOptions, 'viewport'> = {},
): Promise<BrowserContext> {
  return browser.newContext({
    baseURL: baseUrl(),
    viewport: VIEWPORTS[viewport],
    isMobile: viewport === 'phone',
    hasTouch: viewport === 'phone',
    locale: 'en-US',
    timezoneId: 'UTC',
    ...options,
  });
}

export interface CaughtMail {
  id: string;
  subject: string;
  to: string[];
  time: string;
  text: string;
  html: string;
}

interface MaildevEmail {
  id: string;
  subject: string;
  time: string;
  to?: { address: string; name?: string }[];
  text?: string;
  html?: string;
}

/**
 * The newest e-mail to this address in the mail catcher, polling until one arrives.
 * `after` ignores mail received before that moment (e.g. an earlier invitation).
 */
export async function latestMailTo(
  catcherUrl: string,
  address: string,
  { timeoutMs = 10_000, after }: { timeoutMs?: number; after?: Date } = {},
): Promise<CaughtMail> {
  const wanted = address.toLowerCase();
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await fetch(`${catcherUrl}/api/email`);
    if (!res.ok) throw new Error(`The mail catcher answered ${res.status} at ${catcherUrl}/api/email`);
    const emails = (await res.json()) as MaildevEmail[];
    const matching = emails
      .filter((m) => (m.to ?? []).some((t) => t.address.toLowerCase() === wanted))
      .filter((m) => !after || new Date(m.time).getTime() >= after.getTime())
      .sort((a, b) => new Date(b.time).getTime() - new Date(a.time).getTime());
    const newest = matching[0];
    if (newest) {
      return {
        id: newest.id,
        subject: newest.subject,
        to: (newest.to ?? []).map((t) => t.address),
        time: newest.time,
        text: newest.text ?? '',
        html: newest.html ?? '',
      };
    }
    if (Date.now() > deadline) throw new Error(`No e-mail to ${address} arrived within ${timeoutMs} ms.`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

/** The first absolute URL in the mail (text first, then HTML) whose path contains `marker`. */
export function linkIn(mail: Pick<CaughtMail, 'text' | 'html'>, marker: string): string {
  const escaped = marker.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  const pattern = new RegExp(`https?://[^\\s"'<>]*${escaped}[^\\s"'<>]*`);
  const found = pattern.exec(mail.text) ?? pattern.exec(mail.html.replace(/&amp;/g, '&'));
  if (!found) throw new Error(`No link containing ${marker} in the e-mail.`);
  return found[0];
}
