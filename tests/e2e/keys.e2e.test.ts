/**
 * Journey: sign in to the demo → create a server key on the Keys page (its secret shown once) → call the
 * API with it from outside the browser → see the call on the Usage page.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startE2E, type E2E } from './harness.ts';

let e2e: E2E;
beforeAll(async () => {
  e2e = await startE2E();
}, 180_000);
afterAll(() => e2e?.close());

describe('keys and usage in the console', () => {
  it('when a member creates a server key and calls the API with it, then the call shows on the Usage page', async () => {
    const page = await e2e.newPage();
    try {
      await e2e.signIn(page);
      await page.getByRole('link', { name: 'Keys', exact: true }).click();
      await page.getByLabel('Name').fill('Journey key');
      await page.getByRole('button', { name: 'Create key' }).click();
      const secretBox = page.getByLabel('The new key');
      await secretBox.waitFor();
      const secret = (await secretBox.textContent())!.trim();
      expect(secret).toMatch(/^ohs_srv_[A-Za-z0-9]{40}$/);
      await e2e.screenshot(page, 'keys-created');

      const res = await fetch(`${e2e.baseUrl}/v1/packs/energy`, {
        method: 'POST',
        headers: { Authorization: `Bearer ${secret}`, 'Content-Type': 'application/json' },
        body: JSON.stringify({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } }),
      });
      expect(res.status).toBe(200);

      await page.getByRole('button', { name: 'I have stored it' }).click();
      await expect.poll(() => page.getByLabel('The new key').count()).toBe(0);
      await page.getByRole('link', { name: 'Usage', exact: true }).click();
      const byKey = page.getByRole('region', { name: 'By key' });
      await byKey.getByText('Journey key').waitFor();
      await page.getByRole('img', { name: /Calls per day/ }).waitFor();
      await e2e.screenshot(page, 'usage');
    } catch (error) {
      await e2e.screenshot(page, 'keys-journey-failure');
      throw error;
    }
  }, 120_000);
});
