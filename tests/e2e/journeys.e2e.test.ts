/**
 * Journeys of a new customer, in Debian's Chromium against the built console, the real server, the local
 * SMTP catcher and the Stripe-shaped fake (which delivers its signed webhooks to this server):
 *   1. sign up → confirm the address through the development mailbox page → sign in → create a server key
 *      → call the API with it → the call shows on the Usage page, against the free plan's quota;
 *   2. upgrade to Builder through the local checkout page → the plan and the quota are raised, in the
 *      console and for the API key;
 *   3. invite a colleague as a viewer → they accept through the e-mailed link (signing up on the way) → the
 *      viewer's console offers no key creation, no invitations, no billing and no audit log, and the server
 *      refuses those actions too.
 * The steps run in order in one file (each builds on the one before). A failing step leaves a screenshot
 * in tests/e2e/artifacts/.
 */
import { createServer } from 'node:net';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { plans } from '#shared/plans.ts';
import { startBillingFake, type BillingFake } from '../../server/modules/billing/billing.test-kit.ts';
import { collectSecrets, findLeaks } from '../security/exposure.ts';
import { startE2E, type E2E } from './harness.ts';

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

let e2e: E2E;
let billing: BillingFake;
const suffix = Math.random().toString(36).slice(2, 8);
const owner = { name: 'Wren Calloway', email: `wren-${suffix}@larkspur.example`, password: 'copper kettles hum at dawn', organization: `Larkspur Workshop ${suffix}` };
const colleague = { name: 'Ode Marchetti', email: `ode-${suffix}@larkspur.example`, password: 'silver ferns lean toward rain' };
let ownerPage: Page;
let serverKey = '';
/** Every JSON answer the browser received from the server during the journeys (scanned for secrets at the end). */
const received: Array<{ what: string; text: string; newKey: boolean }> = [];
async function newWatchedPage(): Promise<Page> {
  const page = await e2e.newPage();
  page.on('response', (response) => {
    const type = response.headers()['content-type'] ?? '';
    if (!response.url().startsWith(e2e.baseUrl) || !/json/.test(type)) return;
    const url = new URL(response.url());
    const newKey = response.request().method() === 'POST' && /^\/console-api\/keys(\/[^/]+\/rotate)?$/.test(url.pathname) && response.status() === 201;
    void response.text().then(
      (text) => received.push({ what: `${response.request().method()} ${url.pathname} ${response.status()}`, text, newKey }),
      () => {},
    );
  });
  return page;
}

beforeAll(async () => {
  // The server's port is chosen first so the e-mailed links and the fake's webhooks point at it.
  const port = await freePort();
  billing = await startBillingFake({ webhookUrl: `http://127.0.0.1:${port}/v1/webhooks/stripe` });
  e2e = await startE2E({ env: { PORT: String(port), ...billing.env } });
  ownerPage = await newWatchedPage();
}, 180_000);
afterAll(async () => {
  if (e2e && received.length > 0) {
    // Excessive data exposure: no password, key or token hash and no stored secret in anything the browser got.
    const secrets = await collectSecrets(e2e.db, e2e.env);
    const leaks = received.flatMap((r) => findLeaks(r.text, secrets, { allowApiKeySecret: r.newKey }).map((l) => `${r.what}: ${l}`));
    console.info(`[journeys] ${received.length} JSON answers received by the browser, scanned for secrets: ${leaks.length} found`);
    expect(leaks).toEqual([]);
  }
  await e2e?.close();
  await billing?.close();
});

/** Runs a step; on failure keeps a screenshot of the page for the report. */
async function step(page: Page, name: string, body: () => Promise<void>) {
  try {
    await body();
  } catch (error) {
    await e2e.screenshot(page, `journey-failure-${name}`).catch(() => {});
    throw error;
  }
}

/** Opens the development mailbox and follows the newest link to `path` sent to `to`. */
async function followMailedLink(page: Page, to: string, path: string) {
  await page.goto('/dev/mailbox');
  const message = page.getByRole('listitem').filter({ hasText: `to ${to}` }).first();
  await message.waitFor();
  const link = message.locator(`a[href*="${path}#token="]`).first();
  const href = (await link.getAttribute('href'))!;
  expect(new URL(href).origin).toBe(e2e.baseUrl);
  await link.click();
  await page.waitForURL((url) => url.pathname === path);
}

async function usageQuotaText(page: Page) {
  await page.goto('/usage');
  const quota = page.getByRole('region', { name: /./ }).filter({ has: page.locator('#quota-title') });
  await quota.waitFor();
  return (await quota.textContent()) ?? '';
}

describe('a new customer', () => {
  it('when they sign up, confirm by e-mail, create a key and call the API, then the call shows on the Usage page', async () => {
    const page = ownerPage;
    await step(page, 'sign-up', async () => {
      await page.goto('/sign-up');
      await page.getByLabel('Your name').fill(owner.name);
      await page.getByLabel('E-mail address').fill(owner.email);
      await page.getByLabel('Password', { exact: true }).fill(owner.password);
      await page.getByLabel('Organization name').fill(owner.organization);
      await page.getByRole('button', { name: 'Create account' }).click();
      await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();

      await page.getByRole('link', { name: 'Read it in the development mailbox' }).click();
      await followMailedLink(page, owner.email, '/verify-email');
      await page.getByText('Address confirmed').waitFor();
      await e2e.signIn(page, owner.email, owner.password);
      await page.getByRole('navigation', { name: 'Console sections' }).waitFor();
    });

    await step(page, 'key', async () => {
      await page.getByRole('link', { name: 'Keys', exact: true }).click();
      await page.getByLabel('Name').fill('Storefront server');
      await page.getByRole('button', { name: 'Create key' }).click();
      const secretBox = page.getByLabel('The new key');
      await secretBox.waitFor();
      serverKey = (await secretBox.textContent())!.trim();
      expect(serverKey).toMatch(/^ohs_srv_[A-Za-z0-9]{40}$/);
      await page.getByRole('button', { name: 'I have stored it' }).click();
    });

    const res = await fetch(`${e2e.baseUrl}/v1/wires/size`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${serverKey}`, 'Content-Type': 'application/json' },
      body: JSON.stringify({ currentA: 40, systemVoltageV: 12, oneWayLengthM: 2 }),
    });
    expect(res.status).toBe(200);
    expect(res.headers.get('ratelimit-policy')).toContain(`"monthly";q=${plans.free.monthlyQuotaCalls}`);

    await step(page, 'usage', async () => {
      await page.getByRole('link', { name: 'Usage', exact: true }).click();
      await page.getByRole('region', { name: 'By key' }).getByText('Storefront server').waitFor();
      await page.getByRole('region', { name: 'By endpoint' }).getByText('/v1/wires/size').waitFor();
      const text = await usageQuotaText(page);
      expect(text.replace(/\s+/g, ' ')).toMatch(/(^|\D)1 of 1,000\s*calls on the free plan/i);
      await e2e.screenshot(page, 'journey-usage');
    });
  }, 120_000);

  it('when they upgrade through the checkout page, then the plan and the quota are raised for the console and the API', async () => {
    const page = ownerPage;
    await step(page, 'checkout', async () => {
      await page.getByRole('link', { name: 'Billing', exact: true }).click();
      await page.getByRole('button', { name: 'Upgrade to Builder' }).click();
      // The Stripe-shaped fake's own checkout page, on its own origin.
      await page.waitForURL((url) => url.origin === billing.fake.url.replace(/\/$/, '') && url.pathname.startsWith('/checkout/'));
      await page.getByLabel('Card number').fill('4242 4242 4242 4242');
      await page.getByRole('button', { name: /subscribe/ }).click();
      await page.waitForURL((url) => url.origin === e2e.baseUrl && url.pathname === '/billing');
      // The plan changes when the signed webhook arrives, not because of the redirect.
      await page.getByText('Subscription confirmed').waitFor({ timeout: 20_000 });
      await page.getByRole('region', { name: 'Current plan' }).getByText('Builder', { exact: true }).waitFor();
      await e2e.screenshot(page, 'journey-billing-upgraded');
    });

    await step(page, 'quota', async () => {
      const text = await usageQuotaText(page);
      expect(text.replace(/\s+/g, ' ')).toMatch(/of 100,000\s*calls on the builder plan/i);
    });

    // The API key follows within the key cache time.
    await expect
      .poll(
        async () => {
          const r = await fetch(`${e2e.baseUrl}/v1/usage`, { headers: { Authorization: `Bearer ${serverKey}` } });
          return ((await r.json()) as { data: { quota: number; plan: string } }).data;
        },
        { timeout: 10_000, interval: 500 },
      )
      .toMatchObject({ plan: 'builder', quota: plans.builder.monthlyQuotaCalls });
  }, 120_000);

  it('when they invite a colleague as a viewer who accepts, then the viewer sees and may do only what a viewer may', async () => {
    const page = ownerPage;
    await step(page, 'invite', async () => {
      await page.getByRole('link', { name: 'Team', exact: true }).click();
      const form = page.getByRole('form', { name: 'Invite someone' });
      await form.getByLabel('E-mail address').fill(colleague.email);
      await form.getByLabel('Role').selectOption('viewer');
      await form.getByRole('button', { name: 'Send invitation' }).click();
      await page.getByText(`Invitation sent to ${colleague.email}.`).waitFor();
    });

    const viewer = await newWatchedPage();
    await step(viewer, 'accept', async () => {
      await followMailedLink(viewer, colleague.email, '/invitations/accept');
      await viewer.getByText(new RegExp(`invited ${colleague.email.replace('.', '\\.')} to join ${owner.organization} as a viewer`)).waitFor();
      await viewer.getByRole('link', { name: 'Create an account' }).click();
      await viewer.getByLabel('Your name').fill(colleague.name);
      await viewer.getByLabel('E-mail address').fill(colleague.email);
      await viewer.getByLabel('Password', { exact: true }).fill(colleague.password);
      await expect.poll(() => viewer.getByLabel('Organization name').count()).toBe(0);
      await viewer.getByRole('button', { name: 'Create account' }).click();
      await viewer.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
      await followMailedLink(viewer, colleague.email, '/verify-email');
      await viewer.getByText('Address confirmed').waitFor();
      await e2e.signIn(viewer, colleague.email, colleague.password);
      // Back on the invitation, now signed in with the invited address.
      await viewer.getByRole('button', { name: `Join ${owner.organization}` }).click();
      await viewer.waitForURL((url) => url.pathname === '/team');
    });

    await step(viewer, 'viewer-limits', async () => {
      const nav = viewer.getByRole('navigation', { name: 'Console sections' });
      await nav.getByRole('link', { name: 'Keys', exact: true }).waitFor();
      expect(await nav.getByRole('link', { name: 'Audit log' }).count()).toBe(0);
      expect(await nav.getByRole('link', { name: 'Billing', exact: true }).count()).toBe(0);
      // Team: the members are listed, with no invitation form.
      await viewer.getByText(owner.email).first().waitFor();
      expect(await viewer.getByRole('form', { name: 'Invite someone' }).count()).toBe(0);
      // Keys: listed, not created.
      await nav.getByRole('link', { name: 'Keys', exact: true }).click();
      await viewer.getByText('Storefront server').first().waitFor();
      expect(await viewer.getByRole('button', { name: 'Create key' }).count()).toBe(0);
      // Billing: the owner's (not in the viewer's menu; the page itself says so).
      expect(await nav.getByRole('link', { name: 'Billing', exact: true }).count()).toBe(0);
      await viewer.goto('/billing');
      await viewer.getByText("Only the organization's owner manages billing").waitFor();
      expect(await viewer.getByRole('button', { name: /Upgrade to/ }).count()).toBe(0);
      await e2e.screenshot(viewer, 'journey-viewer');
      // The server says the same, whatever the page shows.
      const attempts = await viewer.evaluate(async () => {
        const post = (url: string, body: unknown) =>
          fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-Ohmstead-CSRF': '1' }, body: JSON.stringify(body) }).then((r) => r.status);
        return {
          key: await post('/console-api/keys', { name: 'sneaky', kind: 'server' }),
          invite: await post('/console-api/invitations', { email: 'someone@larkspur.example', role: 'admin' }),
          checkout: await post('/console-api/billing/checkout', { planId: 'scale' }),
          audit: await fetch('/console-api/audit-events').then((r) => r.status),
        };
      });
      expect(attempts).toEqual({ key: 403, invite: 403, checkout: 403, audit: 403 });
    });
  }, 150_000);
});
