/**
 * `npm start`'s sample third-party page: the demo organization's embed key is seeded listing exactly the
 * page's origin (and kept in its file, so the snippet is the same every start), and the page is served
 * under a strict Content-Security-Policy that loads the bundle from the API's origin.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../../tests/setup/app.ts';
import { apiKeys } from '../db/schema/index.ts';
import { seedDemo } from '../db/seed.ts';
import { hashApiKey } from '../modules/keys/key-format.ts';
import { keyHashSecret } from '../modules/metering/platform.ts';
import { startDemoSampleSite } from './sample-site.ts';

const { db, env, close } = createTestApp();
const dir = mkdtempSync(join(tmpdir(), 'ohmstead-sample-'));
afterAll(async () => {
  await close();
  rmSync(dir, { recursive: true, force: true });
});

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });

describe('the demo sample page', () => {
  it('when started twice, then the same embed key lists the page\'s origin and the page is served under a strict CSP', async () => {
    await seedDemo(db);
    const keyFile = join(dir, 'demo-embed-key');
    const port = await freePort();
    const options = { env: { ...env, HOST: '127.0.0.1' }, apiUrl: 'http://127.0.0.1:3999', port, keyFile, log: () => {} };
    const first = await startDemoSampleSite(options);
    await first!.close();
    const site = (await startDemoSampleSite(options))!;
    try {
      const key = readFileSync(keyFile, 'utf8').trim();
      expect(key).toMatch(/^ohs_emb_[A-Za-z0-9]{32,}$/);
      const [row] = await db.select().from(apiKeys).where(eq(apiKeys.keyHash, hashApiKey(key, keyHashSecret(env))));
      expect(row).toMatchObject({ kind: 'embed', allowedOrigins: [`http://127.0.0.1:${port}`], revokedAt: null });

      const res = await fetch(site.url);
      const csp = res.headers.get('content-security-policy')!;
      expect(csp).toMatch(/script-src 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
      expect(csp).toContain('connect-src http://127.0.0.1:3999');
      expect(csp).toContain("require-trusted-types-for 'script'");
      const html = await res.text();
      expect(html).toContain('src="http://127.0.0.1:3999/widgets/1/ohmstead-widgets.js"');
      expect(html).toContain(`<ohmstead-compatibility id="compatibility" key="${key}"`);
      expect(html).not.toMatch(/<script(?![^>]*\bsrc=)/);
    } finally {
      await site.close();
      // The run's database is shared with the other tests that use the demo organization: leave its key count as it was.
      await db.update(apiKeys).set({ revokedAt: new Date() }).where(eq(apiKeys.keyHash, hashApiKey(readFileSync(keyFile, 'utf8').trim(), keyHashSecret(env))));
    }
  });
});
