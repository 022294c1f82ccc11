/**
 * Browser tests against the real thing: the built console and the API served by our own server on this
 * run's migrated database (seeded with the invented demo), a real SMTP catcher, and Debian's Chromium
 * driven by playwright-core. Screenshots land in tests/e2e/artifacts/ (not committed).
 *
 *   const e2e = await startE2E();
 *   const page = await e2e.newPage();
 *   await page.goto('/sign-in');
 *   ...
 *   await e2e.close();
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { sql } from 'drizzle-orm';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { chromiumArgs, ensureChromium } from '../../scripts/lib/chromium.ts';
import { buildConsoleIfStale } from '../../scripts/lib/console-build.ts';
import { repoRoot } from '../../scripts/lib/postgres.ts';
import { createDb } from '../../server/db/client.ts';
import { demo, seedDemo } from '../../server/db/seed.ts';
import { parseEnv } from '../../server/env.ts';
import { startSmtpCatcher } from '../../server/fakes/smtp-catcher.ts';
import { startServer } from '../../server/index.ts';
import { generateApiKey } from '../../server/modules/keys/key-format.ts';
import { seedDemoApiAccess } from '../../server/modules/keys/keys.seed.ts';
import { keyHashSecret } from '../../server/modules/metering/platform.ts';

export const artifactsDir = join(repoRoot, 'tests', 'e2e', 'artifacts');

export async function startE2E(options: { env?: Record<string, string> } = {}) {
  await buildConsoleIfStale(() => {});
  const mailboxDir = mkdtempSync(join(tmpdir(), 'ohmstead-e2e-mail-'));
  const catcher = await startSmtpCatcher({ mailboxDir });
  const env = parseEnv({
    ...process.env,
    NODE_ENV: 'test',
    PORT: '0',
    LOG_LEVEL: process.env.LOG_LEVEL ?? 'silent',
    CONSOLE_DIST_DIR: join(repoRoot, 'dist'),
    SMTP_HOST: catcher.host,
    SMTP_PORT: String(catcher.port),
    DEV_MAILBOX_DIR: mailboxDir,
    ...options.env,
  });
  const { db, pool } = createDb(env.DATABASE_URL, { max: 4 });
  // Several browser test files share this run's database: seeding is idempotent, but not concurrent.
  const seeded = await db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(7101)`);
    return seedDemo(tx as unknown as typeof db);
  });
  const serverKey = generateApiKey('server');
  await seedDemoApiAccess(db, { ...seeded, serverKey, hashSecret: keyHashSecret(env), highLimits: true });
  const server = await startServer(env);
  const browser: Browser = await chromium.launch({ executablePath: ensureChromium(), args: chromiumArgs });
  const contexts: BrowserContext[] = [];
  mkdirSync(artifactsDir, { recursive: true });

  return {
    baseUrl: server.url,
    env,
    db,
    catcher,
    browser,
    demo: { email: demo.owner.email, password: demo.password, organizationId: seeded.organizationId, serverKey },
    /** A page in a fresh context (its own cookies) whose relative URLs resolve against the server. */
    async newPage(): Promise<Page> {
      const context = await browser.newContext({ baseURL: server.url, viewport: { width: 1280, height: 900 } });
      contexts.push(context);
      return context.newPage();
    },
    /** Signs in through the real sign-in page and waits for the console. */
    async signIn(page: Page, email: string = demo.owner.email, password: string = demo.password) {
      await page.goto('/sign-in');
      await page.getByLabel('E-mail address').fill(email);
      await page.getByLabel('Password', { exact: true }).fill(password);
      await page.getByRole('button', { name: 'Sign in', exact: true }).click();
      await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    },
    /** Saves a full-page screenshot under tests/e2e/artifacts/<name>.png. */
    async screenshot(page: Page, name: string) {
      await page.screenshot({ path: join(artifactsDir, `${name}.png`), fullPage: true });
    },
    async close() {
      for (const context of contexts) await context.close().catch(() => {});
      await browser.close();
      await server.close();
      await pool.end();
      await catcher.close();
      rmSync(mailboxDir, { recursive: true, force: true });
    },
  };
}

export type E2E = Awaited<ReturnType<typeof startE2E>>;
