/**
 * The widget bundle's budget and hygiene, on a fresh build: each file (the ES module and the classic
 * script, each the whole bundle) at most 35 kB gzipped; nothing a strict Content-Security-Policy forbids
 * (eval, new Function, HTML string sinks, inline handlers); no React; the manifest's SRI hashes match.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { WIDGETS_VERSION } from './version.ts';
import type { WidgetsManifest } from './vite.config.ts';

const BUDGET_GZIP_BYTES = 35 * 1024;
const outDir = mkdtempSync(join(tmpdir(), 'ohmstead-widgets-build-'));
let manifest: WidgetsManifest;

beforeAll(async () => {
  const { build } = await import('vite');
  await build({ configFile: fileURLToPath(new URL('./vite.config.ts', import.meta.url)), logLevel: 'silent', build: { outDir } });
  manifest = JSON.parse(readFileSync(join(outDir, 'manifest.json'), 'utf8')) as WidgetsManifest;
}, 60_000);
afterAll(() => rmSync(outDir, { recursive: true, force: true }));

describe('the widget bundle', () => {
  it('when built, then it is one ES module and one classic script of this version', () => {
    expect(manifest.version).toBe(WIDGETS_VERSION);
    expect(manifest.files.map((f) => f.name).sort()).toEqual(['ohmstead-widgets.classic.js', 'ohmstead-widgets.js']);
  });

  it('when gzipped, then each file is within the 35 kB budget', () => {
    for (const file of manifest.files) {
      const code = readFileSync(join(outDir, file.name));
      const gzipped = gzipSync(code, { level: 9 }).length;
      expect(gzipped).toBe(file.gzipBytes);
      console.log(`${file.name}: ${code.length} B, ${gzipped} B gzipped (budget ${BUDGET_GZIP_BYTES})`);
      expect(gzipped).toBeLessThanOrEqual(BUDGET_GZIP_BYTES);
    }
  });

  it('when read, then it holds nothing a strict CSP refuses and no React, and the SRI hashes match', () => {
    for (const file of manifest.files) {
      const code = readFileSync(join(outDir, file.name));
      const text = code.toString('utf8');
      expect(text).not.toMatch(/\beval\s*\(|new Function\s*\(|\.innerHTML\s*=|\.outerHTML\s*=|insertAdjacentHTML|document\.write|setAttribute\(\s*["']on/);
      expect(text).not.toMatch(/react-dom|__SECRET_INTERNALS|createElement\("div",\s*null/);
      expect(file.integrity).toBe(`sha384-${createHash('sha384').update(code).digest('base64')}`);
    }
  });

  it('when both files are compared, then the classic script defines the same tags', () => {
    for (const file of manifest.files) {
      const text = readFileSync(join(outDir, file.name), 'utf8');
      for (const tag of ['ohmstead-compatibility', 'ohmstead-pack-value', 'ohmstead-wire-fuse', 'ohmstead-charge-time']) expect(text).toContain(tag);
    }
  });
});
