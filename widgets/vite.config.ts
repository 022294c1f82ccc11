/**
 * The widget bundle: Vite in library mode, one ES module and one classic script (IIFE) with every tag, into
 * widgets/dist/ with a manifest (version, sizes, Subresource Integrity hashes). The server serves them at
 * /widgets/<version>/… (immutable) and /widgets/<major>/… (a moving alias). Build with
 *   npx vite build -c widgets/vite.config.ts
 * (npm start and the tests build it when its sources change: scripts/lib/console-build.ts).
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { defineConfig, type Plugin } from 'vite';
import { WIDGETS_VERSION } from './version.ts';

export const WIDGET_FILES = { es: 'ohmstead-widgets.js', iife: 'ohmstead-widgets.classic.js' } as const;

/**
 * Writes manifest.json beside the bundle (version; per file its bytes, gzipped bytes and SRI hash): what
 * the server serves under the version and what the size check reads. Each format's build adds its file.
 */
function manifest(outDir: string): Plugin {
  return {
    name: 'ohmstead-widgets-manifest',
    writeBundle(options, bundle) {
      const path = join(options.dir ?? outDir, 'manifest.json');
      const previous = existsSync(path) ? (JSON.parse(readFileSync(path, 'utf8')) as WidgetsManifest) : undefined;
      const files = previous?.version === WIDGETS_VERSION ? previous.files : [];
      for (const item of Object.values(bundle)) {
        if (item.type !== 'chunk') continue;
        const code = Buffer.from(item.code);
        const entry = { name: item.fileName, bytes: code.length, gzipBytes: gzipSync(code, { level: 9 }).length, integrity: `sha384-${createHash('sha384').update(code).digest('base64')}` };
        files.splice(0, files.length, ...files.filter((f) => f.name !== entry.name), entry);
      }
      files.sort((a, b) => a.name.localeCompare(b.name));
      writeFileSync(path, `${JSON.stringify({ version: WIDGETS_VERSION, files } satisfies WidgetsManifest, null, 1)}\n`);
    },
  };
}

export interface WidgetsManifest {
  version: string;
  files: Array<{ name: string; bytes: number; gzipBytes: number; integrity: string }>;
}

const outDir = fileURLToPath(new URL('./dist', import.meta.url));

export default defineConfig({
  root: fileURLToPath(new URL('..', import.meta.url)),
  publicDir: false,
  logLevel: 'warn',
  plugins: [manifest(outDir)],
  build: {
    outDir,
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: false,
    // Library builds keep ES output readable by default; this one ships to pages as it is.
    minify: true,
    rolldownOptions: { output: { minify: true } },
    copyPublicDir: false,
    lib: {
      entry: fileURLToPath(new URL('./index.ts', import.meta.url)),
      name: 'OhmsteadWidgets',
      formats: ['es', 'iife'],
      fileName: (format) => (format === 'es' ? WIDGET_FILES.es : WIDGET_FILES.iife),
    },
  },
});
