/**
 * The widgets on a third-party page, in Chromium: a sample page served from another origin, under a strict
 * Content-Security-Policy (nonce + 'strict-dynamic', no 'unsafe-inline', Trusted Types required), loads the
 * bundle from our server; the compatibility widget lists the demo organization's catalog and a check returns
 * a verdict. The same page on an origin the embed key does not list shows a clear refusal in the widget.
 * No CSP violation is reported on either page; loading the bundle twice does no harm; 320 px wide works.
 */
import type { ConsoleMessage, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startSampleSite, type SampleSite } from '../../server/fakes/sample-site.ts';
import { eq } from 'drizzle-orm';
import { apiKeys } from '../../server/db/schema/index.ts';
import { generateApiKey, hashApiKey } from '../../server/modules/keys/key-format.ts';
import { keyHashSecret } from '../../server/modules/metering/platform.ts';
import { seedDemoEmbedKey } from '../../server/modules/widgets/widgets.seed.ts';
import { startE2E, type E2E } from './harness.ts';

let e2e: E2E;
let listed: SampleSite;
let unlisted: SampleSite;
let embedKey: string;

beforeAll(async () => {
  e2e = await startE2E();
  embedKey = generateApiKey('embed');
  listed = await startSampleSite({ port: 0, apiUrl: e2e.baseUrl, embedKey });
  unlisted = await startSampleSite({ port: 0, apiUrl: e2e.baseUrl, embedKey });
  // The demo organization's embed key lists the first page's origin only (the second differs by its port).
  await seedDemoEmbedKey(e2e.db, { embedKey, hashSecret: keyHashSecret(e2e.env), origins: [listed.origin] });
}, 180_000);
afterAll(async () => {
  // Other browser tests share the demo organization in this run's database: leave its key count as it was.
  if (e2e && embedKey) await e2e.db.update(apiKeys).set({ revokedAt: new Date() }).where(eq(apiKeys.keyHash, hashApiKey(embedKey, keyHashSecret(e2e.env))));
  await listed?.close();
  await unlisted?.close();
  await e2e?.close();
});

/** Console errors and uncaught exceptions on a page, and CSP or Trusted Types complaints among them. */
function watch(page: Page) {
  const problems: string[] = [];
  page.on('console', (m: ConsoleMessage) => {
    if (m.type() === 'error') problems.push(m.text());
  });
  page.on('pageerror', (e) => problems.push(`pageerror: ${e.message}`));
  return problems;
}

async function noCspViolations(site: SampleSite, problems: string[]) {
  // Reports are sent asynchronously: give the browser a moment to deliver any.
  await new Promise((r) => setTimeout(r, 500));
  expect(site.cspReports, JSON.stringify(site.cspReports)).toEqual([]);
  expect(problems.filter((p) => /Content Security Policy|TrustedHTML|TrustedScript|Trusted Type|eval/i.test(p))).toEqual([]);
}

describe('widgets on a third-party page', () => {
  it('when the page is on a listed origin, then the bundle loads from the API, the catalog is listed and a check returns a verdict', async () => {
    const page = await e2e.newPage();
    const problems = watch(page);
    try {
      const response = await page.goto(listed.url);
      expect(response!.headers()['content-security-policy']).toMatch(/script-src 'nonce-[^']+' 'strict-dynamic'/);
      expect(response!.headers()['content-security-policy']).not.toMatch(/unsafe-inline|unsafe-eval/);

      const widget = page.locator('#compatibility');
      const unit = widget.getByRole('combobox', { name: 'Your unit', exact: true });
      await unit.waitFor();
      // The catalog, read with the embed key from this origin: three units and four packs (the invented demo).
      expect(await unit.locator('option').allTextContents()).toEqual(['Bramblewick 1500', 'Quillfeather 600', 'Tarnhollow 3000', 'Another unit (enter its DC input)']);
      const pack = widget.getByRole('combobox', { name: 'Battery pack', exact: true });
      expect(await pack.locator('option').allTextContents()).toEqual(['Cinderwell 48-50', 'Fernmoss 12-100', 'Fernmoss 24-100', 'Glimmerstone 52-50', 'Another pack (enter its specifications)']);
      expect(await pack.inputValue()).toBe('LPS-CW48-50');

      // The bundle came from the API's origin, not the page's.
      const scriptOrigin = await page.locator('script[type=module]').getAttribute('src');
      expect(new URL(scriptOrigin!).origin).toBe(new URL(e2e.baseUrl).origin);
      expect(new URL(scriptOrigin!).origin).not.toBe(listed.origin);

      await unit.selectOption('LPS-BW1500');
      // Keyboard: the submit button takes Enter.
      await widget.getByRole('button', { name: 'Check compatibility' }).focus();
      await page.keyboard.press('Enter');
      const dcInput = widget.locator('[data-method=dc_input]');
      await dcInput.waitFor();
      await expect.poll(() => dcInput.locator('[data-verdict]').getAttribute('data-verdict')).toBe('compatible');
      expect(await dcInput.textContent()).toMatch(/Energy the unit gains[\d,.\s]+Wh/);
      expect(await widget.locator('[part=cautions]').textContent()).toMatch(/Safety/);
      await page.locator('#events li[data-type=ohmstead-result]').first().waitFor();

      // A unit whose input cannot take a 48 V pack: the verdict says so.
      await unit.selectOption('LPS-QF600');
      await widget.getByRole('button', { name: 'Check compatibility' }).click();
      await expect.poll(() => widget.locator('[data-method=dc_input] [data-verdict]').getAttribute('data-verdict')).toBe('incompatible');
      await e2e.screenshot(page, 'widgets-sample-page');

      // The other widgets answer too (pack value from the catalog's priced packs, wire and fuse in feet).
      const value = page.locator('#pack-value');
      await value.getByRole('button', { name: 'Compare' }).click();
      await value.locator('table tbody tr').nth(3).waitFor();
      const wire = page.locator('#wire-fuse');
      await wire.getByLabel('Current (A)', { exact: true }).fill('40');
      await wire.getByLabel('One-way length (ft)', { exact: true }).fill('10');
      await wire.getByRole('button', { name: 'Size the wire and fuse' }).click();
      await expect.poll(async () => wire.locator('[data-size]').getAttribute('data-size')).toMatch(/AWG$/);

      await noCspViolations(listed, problems);
      expect(problems).toEqual([]);
    } catch (error) {
      await e2e.screenshot(page, 'widgets-listed-failure');
      throw error;
    }
  }, 120_000);

  it('when a field is out of bounds, then the problem is shown beside it and announced, without a call', async () => {
    const page = await e2e.newPage();
    try {
      await page.goto(listed.url);
      const widget = page.locator('#compatibility');
      await widget.getByRole('combobox', { name: 'Your unit', exact: true }).waitFor();
      await widget.getByLabel('Pack charged to (%)', { exact: true }).fill('140');
      await widget.getByRole('button', { name: 'Check compatibility' }).click();
      await expect.poll(() => widget.getByRole('alert').textContent()).toMatch(/Pack charged to: Enter at most 100/);
      expect(await widget.getByLabel('Pack charged to (%)', { exact: true }).getAttribute('aria-invalid')).toBe('true');
      // Focus moves to the field to fix.
      expect(await page.evaluate(() => document.querySelector('#compatibility')!.shadowRoot!.activeElement?.getAttribute('name'))).toBe('/external/stateOfChargePct');
    } catch (error) {
      await e2e.screenshot(page, 'widgets-invalid-failure');
      throw error;
    }
  }, 60_000);

  it('when the same page is on an origin the key does not list, then the widget shows a clear refusal', async () => {
    const page = await e2e.newPage();
    const problems = watch(page);
    try {
      await page.goto(unlisted.url);
      const alert = page.locator('#compatibility').getByRole('alert');
      await expect.poll(() => alert.textContent(), { timeout: 15_000 }).toMatch(/not available on this site/);
      expect(await alert.textContent()).toContain(`not allowed on ${unlisted.origin}`);
      await page.locator('#events li[data-type=ohmstead-error]').first().waitFor();
      expect(await page.locator('#events').textContent()).toMatch(/ohmstead-error from compatibility \(refused\)/);
      await e2e.screenshot(page, 'widgets-refused');
      await noCspViolations(unlisted, problems);
      // The only errors are the browser's own notes on the refused cross-origin requests.
      expect(problems.filter((p) => !/CORS|Failed to load resource|net::ERR_FAILED/.test(p))).toEqual([]);
    } catch (error) {
      await e2e.screenshot(page, 'widgets-unlisted-failure');
      throw error;
    }
  }, 60_000);

  it('when the bundle is loaded twice (module and classic script), then nothing breaks', async () => {
    const page = await e2e.newPage();
    const problems = watch(page);
    try {
      await page.goto(`${listed.url}?twice=1`);
      const widget = page.locator('#compatibility');
      await widget.getByRole('combobox', { name: 'Your unit', exact: true }).waitFor();
      await widget.getByRole('button', { name: 'Check compatibility' }).click();
      await widget.locator('[data-method=dc_input] [data-verdict]').waitFor();
      expect(await page.locator('ohmstead-compatibility').count()).toBe(1);
      await noCspViolations(listed, problems);
      expect(problems).toEqual([]);
    } catch (error) {
      await e2e.screenshot(page, 'widgets-twice-failure');
      throw error;
    }
  }, 60_000);

  it('when the page is 320 px wide, then the widgets fit without sideways scrolling', async () => {
    const page = await e2e.newPage();
    try {
      await page.setViewportSize({ width: 320, height: 800 });
      await page.goto(listed.url);
      await page.locator('#compatibility').getByRole('combobox', { name: 'Your unit', exact: true }).waitFor();
      await page.locator('#charge-time').getByRole('combobox', { name: 'Battery pack', exact: true }).waitFor();
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await e2e.screenshot(page, 'widgets-320px');
    } catch (error) {
      await e2e.screenshot(page, 'widgets-320-failure');
      throw error;
    }
  }, 60_000);
});

describe('the console pages', () => {
  it('when the owner opens the Catalog page, then the catalog, the matrix and per-row CSV problems are shown', async () => {
    const page = await e2e.newPage();
    try {
      await e2e.signIn(page);
      await page.goto('/catalog');
      await page.getByRole('cell', { name: 'LPS-CW48-50' }).waitFor();
      const matrix = page.getByRole('region', { name: 'Compatibility matrix' });
      await matrix.getByText('12 of 12 pairs shown').waitFor();
      await matrix.getByLabel('Verdict').selectOption('incompatible');
      await expect.poll(async () => (await matrix.getByRole('status').textContent()) ?? '').toMatch(/^\d+ of 12 pairs shown$/);
      const packs = page.getByRole('region', { name: 'Packs' });
      await packs.getByLabel('CSV file of packs').setInputFiles({ name: 'packs.csv', mimeType: 'text/csv', buffer: Buffer.from('sku,name,chemistry,seriesCells,capacityAh\nX-1,Pack,lfp,four,100\n') });
      await packs.getByRole('button', { name: 'Import' }).click();
      const problem = packs.getByRole('alert');
      await problem.getByText('Nothing was imported', { exact: true }).waitFor();
      expect(await problem.getByRole('row').nth(1).textContent()).toMatch(/^12seriesCells"four" is not a number/);
      await e2e.screenshot(page, 'console-catalog');
    } catch (error) {
      await e2e.screenshot(page, 'console-catalog-failure');
      throw error;
    }
  }, 90_000);

  it('when the owner opens the Widgets page with the embed key, then the origins can be edited and the real widget previews', async () => {
    const page = await e2e.newPage();
    try {
      await e2e.signIn(page);
      await page.goto('/widgets');
      await page.getByLabel(/^Paste Demo widgets/).fill(embedKey);
      await page.getByRole('button', { name: 'Use this key' }).click();
      await page.getByLabel('Snippet to paste into your page').getByText(`key="${embedKey}"`).waitFor();
      // The preview runs on the console's origin: add it to the key beside the preview.
      await page.getByRole('button', { name: `Add ${new URL(e2e.baseUrl).origin}` }).click();
      await page.getByRole('listitem').filter({ hasText: new URL(e2e.baseUrl).origin }).waitFor();
      const preview = page.getByRole('region', { name: 'Live preview' });
      await expect.poll(() => preview.locator('ohmstead-compatibility').getByRole('combobox', { name: 'Your unit', exact: true }).locator('option').count(), { timeout: 15_000 }).toBe(4);
      await page.getByLabel('Widget', { exact: true }).selectOption('ohmstead-wire-fuse');
      await preview.locator('ohmstead-wire-fuse').getByRole('button', { name: 'Size the wire and fuse' }).waitFor();
      await e2e.screenshot(page, 'console-widgets');
    } catch (error) {
      await e2e.screenshot(page, 'console-widgets-failure');
      throw error;
    }
  }, 90_000);
});
