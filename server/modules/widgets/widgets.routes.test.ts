/**
 * Serving the widget bundle (the exact version immutable, the major alias short-lived, both usable from
 * other sites) and the access check a widget uses to explain a refused origin.
 */
import express from 'express';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../../../tests/setup/app.ts';
import { createOrganization, createTestKey } from '../../../tests/setup/fixtures.ts';
import { WIDGETS_MAJOR } from '../../../widgets/version.ts';
import { errorHandler } from '../../http/error-handler.ts';
import { widgetsRouter } from './widgets.routes.ts';

const { app, db, close } = createTestApp();
const dist = mkdtempSync(join(tmpdir(), 'ohmstead-widgets-'));
afterAll(async () => {
  await close();
  rmSync(dist, { recursive: true, force: true });
});

describe('GET /widgets/<version>/<file>', () => {
  const version = `${WIDGETS_MAJOR}.4.2`;
  const site = express().use(widgetsRouter({ resolver: app.platform!.resolver, distDir: dist })).use(errorHandler);
  beforeAll(() => {
    writeFileSync(join(dist, 'ohmstead-widgets.js'), 'export const v = 1;\n');
    writeFileSync(join(dist, 'manifest.json'), JSON.stringify({ version, files: [{ name: 'ohmstead-widgets.js', bytes: 20, gzipBytes: 40, integrity: 'sha384-x' }] }));
  });

  it('when the exact version is asked for, then it is JavaScript cached for a year as immutable, usable cross-origin', async () => {
    const res = await request(site).get(`/widgets/${version}/ohmstead-widgets.js`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.headers['access-control-allow-origin']).toBe('*');
    expect(res.headers['cross-origin-resource-policy']).toBe('cross-origin');
    expect(res.text).toBe('export const v = 1;\n');
  });

  it('when the major alias is asked for, then it is the same file with a short cache', async () => {
    const res = await request(site).get(`/widgets/${WIDGETS_MAJOR}/ohmstead-widgets.js`);
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=300');
    expect(res.headers['x-ohmstead-widgets-version']).toBe(version);
  });

  it('when another version, an unknown file or a path outside the build is asked for, then it is a 404 problem', async () => {
    for (const path of [`/widgets/${WIDGETS_MAJOR}.0.0/ohmstead-widgets.js`, `/widgets/${Number(WIDGETS_MAJOR) + 1}/ohmstead-widgets.js`, `/widgets/${version}/manifest.json`, `/widgets/${version}/..%2Fversion.ts`]) {
      const res = await request(site).get(path);
      expect(res.status, path).toBe(404);
      expect(res.headers['content-type']).toMatch(/problem\+json/);
    }
  });
});

describe('POST /widgets/access', () => {
  let embed: string;
  beforeAll(async () => {
    const org = await createOrganization(db);
    embed = (await createTestKey(db, app.platform!.hashSecret, org.id, { kind: 'embed', allowedOrigins: ['https://listed.example'] })).secret;
  });
  const ask = (body: string, origin?: string) => {
    const r = request(app).post('/widgets/access').set('Content-Type', 'text/plain');
    return (origin ? r.set('Origin', origin) : r).send(body);
  };

  it('when the page\'s origin is listed on the key, then it is allowed; answered to any origin', async () => {
    const res = await ask(embed, 'https://listed.example');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ allowed: true, reason: 'allowed' });
    expect(res.headers['access-control-allow-origin']).toBe('*');
  });

  it('when it is not, or the key is not an embed key, then the answer says why', async () => {
    const refused = await ask(embed, 'https://unlisted.example');
    expect(refused.body).toMatchObject({ allowed: false, reason: 'origin_not_listed', origin: 'https://unlisted.example' });
    expect(refused.body.detail).toMatch(/not allowed on https:\/\/unlisted\.example/);
    expect((await ask('ohs_srv_' + 'a'.repeat(40), 'https://listed.example')).body.reason).toBe('not_an_embed_key');
    expect((await ask('ohs_emb_' + 'b'.repeat(40), 'https://listed.example')).body.reason).toBe('unknown_key');
  });
});
