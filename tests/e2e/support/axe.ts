/**
 * Accessibility on every page the journeys visit: axe-core runs in the page and any
 * violation of impact "serious" or "critical" fails the test, naming the rule, the elements
 * and the help text.
 *
 * The app's Content-Security-Policy allows no inline script, so axe's source is evaluated
 * through the browser's debugging protocol (page.evaluate) rather than added as a script tag.
 */
import axe from 'axe-core';
import type { Page } from 'playwright-core';
import { baseUrl } from './browser';

interface AxeViolation {
  id: string;
  impact?: string | null;
  help: string;
  helpUrl: string;
  nodes: { target: unknown[]; failureSummary?: string }[];
}

/** Serious and critical violations of this page, one line each (empty when there are none). */
export async function seriousViolations(page: Page): Promise<string[]> {
  await page.waitForLoadState('networkidle').catch(() => undefined);
  const loaded = await page.evaluate(() => 'axe' in window);
  if (!loaded) await page.evaluate(axe.source);
  const violations = await page.evaluate(async () => {
    const run = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: unknown[] }> } }).axe.run;
    const result = await run(document, { resultTypes: ['violations'] });
    return result.violations;
  });
  return (violations as AxeViolation[])
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.map((n) => JSON.stringify(n.target)).slice(0, 5).join(', ')}${v.nodes.length > 5 ? ` and ${v.nodes.length - 5} more` : ''}`);
}

/** Fails when the page (one of the app's own) has a serious or critical violation. */
export async function expectAccessible(page: Page): Promise<void> {
  if (new URL(page.url()).origin !== new URL(baseUrl()).origin) return; // not our page (the payment stand-in)
  const found = await seriousViolations(page);
  if (found.length > 0) throw new Error(`Accessibility: ${new URL(page.url()).pathname} has ${found.length} serious or critical violation(s):\n${found.join('\n')}`);
}
