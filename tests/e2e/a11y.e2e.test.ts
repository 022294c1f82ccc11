/**
 * Accessibility: axe-core 4.14.1 (WCAG 2.0/2.1/2.2 A and AA rules and best practices) run inside Debian's
 * Chromium on every console page, found by walking the console: the pages a signed-out visitor reaches,
 * then, signed in as the demo owner (who sees every section), each section in the menu and every console
 * link inside those pages (so a page added later is scanned without a change here). Also scanned: forms
 * showing their errors, a key's one-time secret, and the 320 px wide layout. No serious or critical
 * violation is allowed; the findings of each page are listed when one appears, and a screenshot is kept.
 */
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './harness.ts';

const axeSource: string = (createRequire(import.meta.url)('axe-core') as { source: string }).source;

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: Array<{ target: string[]; failureSummary?: string }>;
}

let e2e: E2E;
beforeAll(async () => {
  e2e = await startE2E();
}, 180_000);
afterAll(() => e2e?.close());

const scanned: string[] = [];

/**
 * Waits for the page to settle: loaded, its main landmark shown, and no loading indicator left (some pages
 * poll, so "no network activity" never comes).
 */
async function settle(page: Page) {
  await page.waitForLoadState('load');
  await page.locator('main, [role="main"]').first().waitFor();
  await expect.poll(() => page.locator('[aria-busy="true"], [role="status"]:has-text("Loading"), [role="status"]:has-text("…")').count(), { timeout: 20_000 }).toBe(0);
  await page.waitForTimeout(150);
}

/** Runs axe in the page (evaluated through the DevTools protocol, so the console's CSP does not block it). */
async function seriousViolations(page: Page, label: string): Promise<string[]> {
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: unknown[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ['violations'], runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'] } });
    return result.violations;
  });
  scanned.push(label);
  const serious = (violations as Violation[]).filter((v) => v.impact === 'serious' || v.impact === 'critical');
  if (serious.length) await e2e.screenshot(page, `a11y-${label.replace(/[^a-z0-9]+/gi, '-')}`).catch(() => {});
  return serious.flatMap((v) => v.nodes.slice(0, 5).map((n) => `${label}: [${v.impact}] ${v.id} — ${v.help} — ${n.target.join(' ')} ${n.failureSummary?.split('\n').slice(1, 3).join(' ') ?? ''}`));
}

/** Same-origin console links on the page (no API, no downloads, no fragments). */
async function consoleLinks(page: Page): Promise<string[]> {
  const hrefs = await page.locator('a[href^="/"]').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute('href') ?? ''));
  return hrefs.map((h) => h.split('#')[0]!.split('?')[0]!).filter((h) => h && !/^\/(v1|console-api|problems|openapi\.json|widgets\/)/.test(h) && !/\.[a-z0-9]+$/i.test(h));
}

describe('accessibility of every console page', () => {
  it('when a signed-out visitor opens the public pages, then none has a serious or critical violation', async () => {
    const page = await e2e.newPage();
    const problems: string[] = [];
    for (const path of ['/sign-in', '/sign-up', '/forgot-password', '/reset-password', '/verify-email', '/invitations/accept', '/dev/mailbox']) {
      await page.goto(path);
      await settle(page);
      problems.push(...(await seriousViolations(page, path)));
    }
    // A form showing its errors.
    await page.goto('/sign-in');
    await settle(page);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.locator('[aria-invalid="true"]').first().waitFor();
    problems.push(...(await seriousViolations(page, '/sign-in with errors')));
    expect(problems).toEqual([]);
  }, 120_000);

  it('when the demo owner walks every section and every console link inside them, then no page has a serious or critical violation', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page);
    await settle(page);
    const nav = page.getByRole('navigation', { name: 'Console sections' });
    const start = await nav.locator('a[href^="/"]').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).getAttribute('href')!));
    expect(start.length).toBeGreaterThanOrEqual(10);
    const queue = [...new Set([...start, '/account', '/organizations/new', '/no-such-page'])];
    const seen = new Set<string>();
    const problems: string[] = [];
    while (queue.length > 0 && seen.size < 60) {
      const path = queue.shift()!;
      if (seen.has(path)) continue;
      seen.add(path);
      await page.goto(path);
      await settle(page);
      problems.push(...(await seriousViolations(page, path)));
      for (const link of await consoleLinks(page)) if (!seen.has(link) && !link.startsWith('/dev/') && link !== '/sign-in') queue.push(link);
    }
    expect(seen.size).toBeGreaterThanOrEqual(12);
    expect(problems).toEqual([]);
  }, 300_000);

  it('when a key is created and its one-time secret shown, and when the console is 320 px wide, then there is no serious or critical violation', async () => {
    const page = await e2e.newPage();
    await e2e.signIn(page);
    await page.goto('/keys');
    await settle(page);
    await page.getByLabel('Name').fill('Accessibility check key');
    await page.getByRole('button', { name: 'Create key' }).click();
    await page.getByLabel('The new key').waitFor();
    const problems = await seriousViolations(page, '/keys with the new secret');
    // The API reference with an operation opened (parameters, schemas, responses).
    await page.getByRole('button', { name: 'I have stored it' }).click();
    await page.goto('/reference');
    await settle(page);
    await page.locator('.opblock-summary-control').filter({ hasText: '/v1/wires/size' }).first().click();
    await page.locator('.opblock-body').first().waitFor();
    problems.push(...(await seriousViolations(page, '/reference with an operation open')));
    // A playground result: cards, checks, cautions and a chart.
    await page.goto('/playground/wire-size');
    await settle(page);
    await page.getByRole('button', { name: 'Run calculation' }).click();
    await page.getByRole('region', { name: 'Cautions' }).waitFor();
    problems.push(...(await seriousViolations(page, '/playground/wire-size with a result')));
    await page.setViewportSize({ width: 320, height: 800 });
    for (const path of ['/', '/usage', '/team', '/keys', '/audit', '/billing', '/widgets', '/playground/wire-size']) {
      await page.goto(path);
      await settle(page);
      problems.push(...(await seriousViolations(page, `${path} at 320 px`)));
    }
    expect(problems).toEqual([]);
    console.info(`[a11y] axe-core scans without serious or critical violations: ${scanned.length} (${scanned.join(', ')})`);
  }, 120_000);
});
