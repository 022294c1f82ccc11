/**
 * Journey: sign in to the demo → the Overview with its first steps → the playground: size a wire (a
 * field error shown inline, then fixed; the candidates chart renders), run a charge time (the profile
 * chart renders), upload a capacity-test CSV log (the discharge curve renders) → copy the request as
 * code, and check that the copied curl body, sent to the API with the demo key, gives the answer shown.
 * Each run is counted under its v1 endpoint and the chosen key, exactly once.
 */
import { and, eq, sql } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiKeys, usageCounters } from '../../server/db/schema/index.ts';
import { hashApiKey } from '../../server/modules/keys/key-format.ts';
import { keyHashSecret } from '../../server/modules/metering/platform.ts';
import { startE2E, type E2E } from './harness.ts';

let e2e: E2E;
let demoKeyId: string;
beforeAll(async () => {
  e2e = await startE2E();
  const [row] = await e2e.db.select().from(apiKeys).where(eq(apiKeys.keyHash, hashApiKey(e2e.demo.serverKey, keyHashSecret(e2e.env))));
  demoKeyId = row!.id;
}, 180_000);
afterAll(() => e2e?.close());

/** Calls counted for the demo server key under a v1 endpoint (the bill's own table). */
async function counted(endpoint: string): Promise<number> {
  const [row] = await e2e.db
    .select({ calls: sql<number>`coalesce(sum(${usageCounters.calls}), 0)::int` })
    .from(usageCounters)
    .where(and(eq(usageCounters.apiKeyId, demoKeyId), eq(usageCounters.endpoint, endpoint)));
  return row!.calls;
}

/** Picks the demo server key in the playground's key picker. */
async function chooseDemoKey(page: Page) {
  const picker = page.getByLabel('Run under key');
  await picker.waitFor();
  const value = await picker.locator('option', { hasText: 'Demo server key' }).first().getAttribute('value');
  await picker.selectOption(value!);
}

/** Runs the calculation on the page and waits for the result cards. */
async function run(page: Page) {
  await page.getByRole('button', { name: 'Run calculation' }).click();
  await page.getByRole('region', { name: 'Cautions' }).waitFor();
}

describe('the playground', () => {
  it('when a member runs calculations, then results, charts and code appear, and each run is counted once under the chosen key', async () => {
    const page = await e2e.newPage();
    await page.context().grantPermissions(['clipboard-read', 'clipboard-write'], { origin: e2e.baseUrl });
    try {
      await e2e.signIn(page);
      await page.getByRole('heading', { name: /Get started|You are set up/ }).waitFor();
      await expect.poll(() => page.locator('[data-step]').count()).toBe(3);
      await e2e.screenshot(page, 'playground-overview');

      // 1. Wire size: an inline error first, then the run, the result and the candidates chart.
      await page.getByRole('link', { name: 'Playground', exact: true }).click();
      await page.getByRole('link', { name: 'Size a DC conductor' }).first().click();
      await chooseDemoKey(page);
      const current = page.getByLabel('Current (A)', { exact: true });
      await current.fill('-5');
      await page.getByRole('button', { name: 'Run calculation' }).click();
      await expect.poll(() => current.getAttribute('aria-invalid')).toBe('true');
      const describedBy = (await current.getAttribute('aria-describedby'))!.split(' ').find((id) => id.endsWith('-error'))!;
      expect(await page.locator(`[id="${describedBy}"]`).textContent()).toMatch(/>\s*0|greater than 0|too small/i);
      const wiresBefore = await counted('/v1/wires/size');
      await current.fill('60');
      await run(page);
      const recommended = (await page.getByText('Recommended size').locator('xpath=following-sibling::dd[1]').textContent())!.trim();
      await page.locator('figure[data-chart="Voltage drop by size"] .recharts-surface').waitFor();
      await page.locator('figure[data-chart="Ampacity by size"] .recharts-bar-rectangle').first().waitFor();
      await expect.poll(() => counted('/v1/wires/size')).toBe(wiresBefore + 1);
      await e2e.screenshot(page, 'playground-wire-size');

      // The request copied as curl, sent to the API with the demo key, gives the size the page shows.
      await page.getByRole('tab', { name: 'curl' }).click();
      await page.getByRole('tabpanel').getByRole('button', { name: 'Copy' }).click();
      await page.getByRole('tabpanel').getByText('Copied').waitFor();
      const curl = await page.evaluate(() => navigator.clipboard.readText());
      expect(curl).toContain('/v1/wires/size');
      expect(curl).toContain('Authorization: Bearer $OHMSTEAD_API_KEY');
      expect(curl).toMatch(/Demo server key" \(ohs_srv_\w{4}•+\w{4}\)/);
      expect(curl).not.toContain(e2e.demo.serverKey);
      const body = curl.slice(curl.indexOf("<<'JSON'\n") + "<<'JSON'\n".length, curl.lastIndexOf('\nJSON'));
      const direct = await fetch(`${e2e.baseUrl}/v1/wires/size`, {
        method: 'POST',
        headers: { Authorization: `Bearer ${e2e.demo.serverKey}`, 'Content-Type': 'application/json' },
        body,
      });
      expect(direct.status).toBe(200);
      expect(recommended).toBe(((await direct.json()) as { data: { recommended: { size: string } } }).data.recommended.size);

      // 2. Charge time: the profile chart.
      await page.getByRole('link', { name: 'Charge time and profile' }).click();
      await chooseDemoKey(page);
      const chargeBefore = await counted('/v1/charge/time');
      await run(page);
      await page.locator('figure[data-chart="Charge profile"] .recharts-line-curve').first().waitFor();
      await page.getByText('Total time').waitFor();
      await expect.poll(() => counted('/v1/charge/time')).toBe(chargeBefore + 1);
      await page.getByRole('tab', { name: 'Python requests' }).click();
      await page.getByRole('tabpanel').getByRole('button', { name: 'Copy' }).click();
      const python = await page.evaluate(() => navigator.clipboard.readText());
      expect(python).toContain('requests.post(');
      expect(python).toContain('/v1/charge/time');
      expect(python).toContain('"sources": [');
      await e2e.screenshot(page, 'playground-charge-time');

      // 3. A capacity test from an uploaded CSV log: the discharge curve.
      await page.getByRole('link', { name: 'Evaluate a capacity test' }).click();
      await chooseDemoKey(page);
      await page.getByText('CSV log upload').click();
      const rows = ['tS,currentA,voltageV', ...Array.from({ length: 25 }, (_, i) => `${i * 720},20,${(53.4 - i * 0.05).toFixed(2)}`)];
      await page.getByLabel('Capacity-test log (CSV)').setInputFiles({ name: 'unit-0142.csv', mimeType: 'text/csv', buffer: Buffer.from(`${rows.join('\n')}\n`) });
      await page.getByText('unit-0142.csv', { exact: true }).first().waitFor();
      await run(page);
      await page.locator('figure[data-chart="Discharge curve from the log"] .recharts-line-curve').first().waitFor();
      // 20 A for 24 × 720 s = 4.8 h: 96 Ah of a rated 100 Ah (trapezoidal rule on a constant current is exact).
      const measured = await page.getByText('Measured capacity', { exact: true }).locator('xpath=following-sibling::dd[1]').textContent();
      expect(measured!.replace(/\s+/g, '')).toBe('96Ah');
      await e2e.screenshot(page, 'playground-capacity-test');

      // The overview's second step is ticked by the metered calls.
      await page.getByRole('link', { name: 'Overview', exact: true }).click();
      await expect.poll(() => page.locator('[data-step="first-call"]').getAttribute('data-done')).toBe('true');
    } catch (error) {
      await e2e.screenshot(page, 'playground-failure');
      throw error;
    }
  }, 180_000);

  it('when every calculation page is opened, then each shows its form and code, and the API reference renders the document', async () => {
    const page = await e2e.newPage();
    try {
      await e2e.signIn(page);
      await page.goto('/playground');
      await page.getByRole('heading', { name: 'Playground', level: 1 }).waitFor();
      const slugs = await page.getByRole('navigation', { name: 'Calculations' }).locator('a[href^="/playground/"]').evaluateAll((links) => links.map((a) => a.getAttribute('href')!));
      expect(slugs).toHaveLength(10);
      for (const href of slugs) {
        await page.goto(href);
        await page.getByRole('button', { name: 'Run calculation' }).waitFor();
        await page.getByRole('heading', { name: 'Copy as code' }).waitFor();
        await e2e.screenshot(page, `playground-page-${href.split('/').pop()}`);
      }
      await page.getByRole('link', { name: 'API reference', exact: true }).click();
      await page.getByText('POST /v1/wires/size'.split(' ')[1]!).first().waitFor({ timeout: 30_000 });
      await e2e.screenshot(page, 'api-reference');
    } catch (error) {
      await e2e.screenshot(page, 'playground-pages-failure');
      throw error;
    }
  }, 180_000);
});
