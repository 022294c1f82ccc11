/**
 * OWASP API9:2023 Improper Inventory Management: the routes the server really serves are the routes the
 * OpenAPI document lists (nothing undocumented reachable, nothing documented missing), and every
 * documented console route is in the role × route matrix (it lists the routes registered through
 * registerConsolePath and checks itself against them). The few served paths outside the document are
 * listed here with the reason.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { consoleRoutes } from '../../server/modules/console/console.openapi.ts';
import { createTestApp } from '../setup/app.ts';
import { servedRoutes } from './route-inventory.ts';
import { document } from './security-kit.ts';

const t = createTestApp();
afterAll(() => t.close());

/** Served but not API operations, with why. */
const undocumentedByDesign = new Map<string, string>([
  ['get /problems/{slug}', 'the human page each problem `type` URI resolves to (RFC 9457)'],
  ['get /openapi.json', 'the OpenAPI document itself'],
  ['get /widgets/{version}/{file}', 'the static widget bundle for third-party pages'],
  ['get /{*path}', "the console's pages (the built single-page app), when it is built"],
]);

const documented = new Set(Object.entries(document.paths ?? {}).flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m} ${path}`)));
const served = servedRoutes(t.app).map((r) => `${r.method} ${r.path}`);

describe('route inventory', () => {
  it('when the served routes are listed, then each is documented in the OpenAPI document or listed as served by design', () => {
    const stray = served.filter((r) => !documented.has(r) && !undocumentedByDesign.has(r));
    expect(stray).toEqual([]);
    expect(served.length).toBeGreaterThan(60);
  });

  it('when the documented operations are listed, then each is really served', () => {
    const missing = [...documented].filter((r) => !served.includes(r));
    expect(missing).toEqual([]);
  });

  it('when the documented console routes are listed, then each is registered with its access rule (and so in the role matrix)', () => {
    const registered = new Set(consoleRoutes.map((r) => `${r.method} ${r.path}`));
    const unregistered = [...documented].filter((r) => r.split(' ')[1]!.startsWith('/console-api/') && !registered.has(r));
    expect(unregistered).toEqual([]);
  });
});
