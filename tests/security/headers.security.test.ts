/**
 * OWASP API8:2023 security misconfiguration — response headers (helmet; OWASP HTTP Headers Cheat Sheet):
 * a Content-Security-Policy, nosniff, framing refused, no referrer, an isolated opener, no X-Powered-By,
 * on every kind of answer: a calculation, a problem, the console API (also never stored), a console page,
 * a problem-type page, the OpenAPI document and an unknown path.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../setup/app.ts';
import { createOrganization, createTestKey } from '../setup/fixtures.ts';

const dist = mkdtempSync(join(tmpdir(), 'ohmstead-dist-'));
writeFileSync(join(dist, 'index.html'), '<!doctype html><html lang="en"><title>Ohmstead</title><div id="root"></div></html>');
const t = createTestApp({ CONSOLE_DIST_DIR: dist });
let key = '';
beforeAll(async () => {
  const org = await createOrganization(t.db);
  key = (await createTestKey(t.db, t.app.platform!.hashSecret, org.id)).secret;
});
afterAll(async () => {
  await t.close();
  rmSync(dist, { recursive: true, force: true });
});

const answers: Array<[string, () => request.Test]> = [
  ['a calculation', () => request(t.app).post('/v1/packs/energy').set('Authorization', `Bearer ${key}`).send({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } })],
  ['a /v1 problem', () => request(t.app).post('/v1/packs/energy').send({})],
  ['a console API answer', () => request(t.app).get('/console-api/session')],
  ['a console page', () => request(t.app).get('/keys').set('Accept', 'text/html')],
  ['a problem-type page', () => request(t.app).get('/problems/validation-error').set('Accept', 'text/html')],
  ['the OpenAPI document', () => request(t.app).get('/openapi.json')],
  ['an unknown path', () => request(t.app).get('/no/such/thing').set('Accept', 'application/json')],
];

describe('security headers on every kind of answer', () => {
  it.each(answers)('when %s is served, then the security headers are present and X-Powered-By is not', async (_what, send) => {
    const res = await send();
    expect(res.status).toBeLessThan(500);
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['content-security-policy']).toMatch(/frame-ancestors 'self'/);
    expect(res.headers['content-security-policy']).toMatch(/object-src 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('when the console API answers, then it is never stored by a browser or a shared cache', async () => {
    expect((await request(t.app).get('/console-api/session')).headers['cache-control']).toBe('no-store');
  });

  it('when a console page is served, then it is the app shell under the same policy', async () => {
    const res = await request(t.app).get('/usage').set('Accept', 'text/html');
    expect(res.status).toBe(200);
    expect(res.text).toContain('<div id="root">');
  });
});
