/**
 * The widget bundle over HTTP, for any page on any site:
 * - `GET /widgets/<version>/<file>`: the build of that exact version, immutable (cached for a year);
 *   `GET /widgets/<major>/<file>`: the current build of that major version, a moving alias cached for five
 *   minutes. Both are public (`Access-Control-Allow-Origin: *`, `Cross-Origin-Resource-Policy:
 *   cross-origin`), so a module script, a classic script and Subresource Integrity all work cross-origin.
 * - `POST /widgets/access`: may this embed key be used from the calling page's origin? A CORS-simple
 *   request (the key as a text/plain body, no custom headers), so a widget can explain a refusal that the
 *   API's CORS preflight otherwise hides from it. It tells nothing that is secret: embed keys are public
 *   and so are the sites they work on.
 */
import express, { Router } from 'express';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { WIDGETS_MAJOR } from '../../../widgets/version.ts';
import { AppError } from '../../http/problem.ts';
import { keyKindOf } from '../keys/key-format.ts';
import type { KeyResolver } from '../keys/key-resolver.ts';

/** Where `npx vite build -c widgets/vite.config.ts` writes the bundle. */
export const WIDGETS_DIST_DIR = fileURLToPath(new URL('../../../widgets/dist', import.meta.url));

interface Manifest {
  version: string;
  files: Array<{ name: string; bytes: number; gzipBytes: number; integrity: string }>;
}

/** The manifest of the build on disk, re-read when the build changes (npm start may build after start-up in development). */
function manifestReader(dir: string) {
  let cached: { mtimeMs: number; manifest: Manifest } | undefined;
  return (): Manifest | undefined => {
    const path = join(dir, 'manifest.json');
    if (!existsSync(path)) return undefined;
    const { mtimeMs } = statSync(path);
    if (cached?.mtimeMs !== mtimeMs) cached = { mtimeMs, manifest: JSON.parse(readFileSync(path, 'utf8')) as Manifest };
    return cached.manifest;
  };
}

const YEAR_S = 365 * 24 * 3600;
const ALIAS_S = 300;

export function widgetsRouter(deps: { resolver: KeyResolver; distDir?: string }) {
  const dir = deps.distDir ?? WIDGETS_DIST_DIR;
  const manifest = manifestReader(dir);
  const router = Router();

  router.get('/widgets/:version/:file', (req, res) => {
    const current = manifest();
    const { version, file } = req.params;
    const entry = current?.files.find((f) => f.name === file);
    const exact = current?.version === version;
    const alias = version === WIDGETS_MAJOR && current?.version.split('.')[0] === version;
    if (!current || !entry || !(exact || alias)) {
      throw new AppError('not-found', current ? `No widget file ${version}/${file}. This server has version ${current.version}: /widgets/${current.version}/<file> or /widgets/${WIDGETS_MAJOR}/<file>.` : 'The widget bundle has not been built on this server.');
    }
    res.setHeader('Access-Control-Allow-Origin', '*');
    res.setHeader('Cross-Origin-Resource-Policy', 'cross-origin');
    res.setHeader('Cache-Control', exact ? `public, max-age=${YEAR_S}, immutable` : `public, max-age=${ALIAS_S}`);
    res.setHeader('X-Ohmstead-Widgets-Version', current.version);
    res.type('text/javascript; charset=utf-8');
    res.sendFile(join(dir, entry.name), { cacheControl: false, lastModified: true, etag: true });
  });

  router.post('/widgets/access', express.text({ type: () => true, limit: 512 }), async (req, res) => {
    res.setHeader('Access-Control-Allow-Origin', '*');
    res.setHeader('Cache-Control', 'no-store');
    const key = typeof req.body === 'string' ? req.body.trim() : '';
    const origin = req.get('origin');
    const answer = (allowed: boolean, reason: string, detail: string) => res.json({ allowed, reason, origin: origin ?? null, detail });
    if (keyKindOf(key) !== 'embed') return answer(false, 'not_an_embed_key', 'the widget needs an Ohmstead embed key (ohs_emb_…) in its key attribute.');
    const resolved = await deps.resolver.resolve(key);
    if (!resolved) return answer(false, 'unknown_key', 'its embed key is not recognised: check the key attribute against the console.');
    if (resolved.revokedAt || (resolved.expiresAt && resolved.expiresAt.getTime() <= Date.now())) return answer(false, 'key_inactive', 'its embed key has been revoked or has expired.');
    if (!origin || !resolved.allowedOrigins.includes(origin)) {
      return answer(false, 'origin_not_listed', `its embed key is not allowed on ${origin ?? 'this page'}. The key's owner can add this site's origin to the key in the Ohmstead console.`);
    }
    return answer(true, 'allowed', 'This key may be used here.');
  });

  return router;
}
