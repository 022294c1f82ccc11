/**
 * Key authentication on the public API: every failure mode is a 401/403 problem, and CORS is answered
 * for exactly the origins listed on embed keys.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { revokeKey, rotateKey } from '../../server/modules/keys/keys.service.ts';
import { createTestApp } from '../setup/app.ts';
import { createOrganization, createTestKey } from '../setup/fixtures.ts';

const { app, db, close } = createTestApp({ API_KEY_CACHE_TTL_MS: '150' });
const secret = app.platform!.hashSecret;
afterAll(close);

let orgId: string;
let serverKey: string;
let embedKey: string;
beforeAll(async () => {
  const org = await createOrganization(db, { planId: 'builder' });
  orgId = org.id;
  serverKey = (await createTestKey(db, secret, orgId)).secret;
  embedKey = (await createTestKey(db, secret, orgId, { kind: 'embed', allowedOrigins: ['https://shop.larkspur.example'] })).secret;
});

const usage = (key?: string, headers: Record<string, string> = {}) => {
  const r = request(app).get('/v1/usage').set(headers);
  return key ? r.set('Authorization', `Bearer ${key}`) : r;
};

function expectProblem(res: request.Response, status: number, type: string) {
  expect(res.status).toBe(status);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  expect(res.body.type).toBe(type);
  expect(res.body.detail).toEqual(expect.any(String));
}

describe('API key authentication', () => {
  it('when no key is sent, then it is 401 with a Bearer challenge', async () => {
    const res = await usage();
    expectProblem(res, 401, '/problems/unauthorized');
    expect(res.headers['www-authenticate']).toMatch(/^Bearer/);
  });

  it('when the Authorization header is not a Bearer credential, then it is 401', async () => {
    expectProblem(await request(app).get('/v1/usage').set('Authorization', `Basic ${serverKey}`), 401, '/problems/unauthorized');
  });

  it('when the key is malformed, then it is 401 saying what keys look like', async () => {
    const res = await usage('sk_live_123');
    expectProblem(res, 401, '/problems/unauthorized');
    expect(res.body.detail).toMatch(/ohs_srv_/);
  });

  it('when a well-formed key is unknown, then it is 401', async () => {
    expectProblem(await usage(`ohs_srv_${'A'.repeat(40)}`), 401, '/problems/unauthorized');
  });

  it('when a valid server key is sent, then usage answers with the plan and quota', async () => {
    const res = await usage(serverKey);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ plan: 'builder', quota: 100_000, used: 0, remaining: 100_000, days: [] });
    expect(res.body.data.resetsAt).toMatch(/^\d{4}-\d{2}-01T00:00:00\.000Z$/);
  });

  it('when a month parameter is malformed, then it is a 400 naming the parameter', async () => {
    const res = await request(app).get('/v1/usage?month=2026-13').set('Authorization', `Bearer ${serverKey}`);
    expectProblem(res, 400, '/problems/malformed-request');
    expect(res.body.errors[0].parameter).toBe('month');
  });

  it('when a key is revoked, then it stops working within the cache time', async () => {
    const { key, secret: k } = await createTestKey(db, secret, orgId, { name: 'to revoke' });
    expect((await usage(k)).status).toBe(200);
    await revokeKey(db, orgId, key.id);
    await new Promise((r) => setTimeout(r, 200));
    const res = await usage(k);
    expectProblem(res, 401, '/problems/unauthorized');
    expect(res.body.detail).toMatch(/revoked/);
  });

  it('when a key has expired, then it is 401 saying so', async () => {
    const { secret: k } = await createTestKey(db, secret, orgId, { name: 'expired', expiresAt: new Date(Date.now() - 1000) });
    const res = await usage(k);
    expectProblem(res, 401, '/problems/unauthorized');
    expect(res.body.detail).toMatch(/expired/);
  });

  it('when a key is rotated, then old and new both work during the overlap, and the old one stops after it', async () => {
    const { key, secret: old } = await createTestKey(db, secret, orgId, { name: 'rotating' });
    const rotated = await rotateKey(db, secret, { organizationId: orgId, keyId: key.id, actorUserId: null, overlapS: 1 });
    expect((await usage(old)).status).toBe(200);
    expect((await usage(rotated.secret)).status).toBe(200);
    expect(rotated.previous.replacedByKeyId).toBe(rotated.key.id);
    await new Promise((r) => setTimeout(r, 1200));
    expectProblem(await usage(old), 401, '/problems/unauthorized');
    expect((await usage(rotated.secret)).status).toBe(200);
  });

  it('when an embed key calls a non-calculation endpoint, then it is 403', async () => {
    const res = await usage(embedKey, { Origin: 'https://shop.larkspur.example' });
    expectProblem(res, 403, '/problems/forbidden');
  });

  it('when a server key is used from another site, then it is 403 (a secret key must not sit in a web page)', async () => {
    expectProblem(await usage(serverKey, { Origin: 'https://elsewhere.example' }), 403, '/problems/forbidden');
  });

  it('when an unknown /v1 path is called, then it is 404 before any key is asked for', async () => {
    expectProblem(await request(app).post('/v1/packs/volume').send({}), 404, '/problems/not-found');
  });

  it('when a documented path is called with the wrong method, then it is 405 with Allow', async () => {
    const res = await request(app).delete('/v1/usage');
    expectProblem(res, 405, '/problems/method-not-allowed');
    expect(res.headers.allow).toBe('GET');
  });

  it('when a documented path is asked OPTIONS without an Origin, then it answers 204 with Allow and counts nothing', async () => {
    const res = await request(app).options('/v1/packs/energy/');
    expect(res.status).toBe(204);
    expect(res.headers.allow).toBe('POST');
    expect(res.headers.ratelimit).toBeUndefined();
  });

  it('when a calculation path is called with a trailing slash, then it is the same operation (metered)', async () => {
    const res = await request(app).post('/v1/packs/energy/').set('Authorization', `Bearer ${serverKey}`).send({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } });
    expect(res.status).toBe(200);
    expect(res.headers.ratelimit).toMatch(/"monthly";r=\d+/);
  });
});

describe('CORS for embed keys', () => {
  it('when a listed origin sends a preflight, then exactly that origin is allowed, without credentials', async () => {
    const res = await request(app)
      .options('/v1/usage')
      .set('Origin', 'https://shop.larkspur.example')
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'authorization, content-type');
    expect(res.status).toBe(204);
    expect(res.headers['access-control-allow-origin']).toBe('https://shop.larkspur.example');
    expect(res.headers['access-control-allow-headers']).toMatch(/Authorization/);
    expect(res.headers['access-control-allow-credentials']).toBeUndefined();
    expect(res.headers.vary).toMatch(/Origin/);
  });

  it('when an unlisted origin sends a preflight, then it is refused and no CORS header is sent', async () => {
    const res = await request(app).options('/v1/usage').set('Origin', 'https://evil.example').set('Access-Control-Request-Method', 'POST');
    expect(res.status).toBe(403);
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
  });
});
