/**
 * OWASP API1:2023 (object level) and API5:2023 (function level) authorization, and API2:2023 broken
 * authentication, beyond the console role × route matrix (server/modules/console/accounts-console.matrix.test.ts,
 * which tries every console route as each role and as another tenant):
 *   - console routes never accept an API key, and /v1 routes never accept a console session (driven by
 *     the OpenAPI document: every route);
 *   - an API key reads only its own organization's usage;
 *   - embed keys are calculation-only and origin-bound; server keys refuse foreign browser origins;
 *   - a revoked key stops working; a key is never accepted from the query string.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { setLimits } from '../setup/fixtures.ts';
import { consoleOperations, fillPath, organizationWithEveryRole, startSecurityKit, v1KeyOperations, withDocumentedBody, type SecurityKit } from './security-kit.ts';

let kit: SecurityKit;
let a: Awaited<ReturnType<typeof organizationWithEveryRole>>;
let b: Awaited<ReturnType<typeof organizationWithEveryRole>>;
beforeAll(async () => {
  // Key lookups are not cached here, so a revocation shows at once.
  kit = await startSecurityKit({ API_KEY_CACHE_TTL_MS: '0' });
  a = await organizationWithEveryRole(kit, 'authz-a');
  b = await organizationWithEveryRole(kit, 'authz-b');
  // Room for more keys than the free plan's two.
  await setLimits(kit.db, a.org.id, { planId: 'builder' });
}, 60_000);
afterAll(() => kit?.close());

const energy = { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } };

describe('credentials stay on their side', () => {
  const sessionRoutes = consoleOperations.filter((op) => op.auth === 'session');

  it.each(sessionRoutes.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))(
    'when %s is called with a valid server key and no session, then it is 401',
    async (_name, op) => {
      const url = fillPath(op.path, { userId: a.members.developer!.id, invitationId: a.invitation.id, keyId: a.serverKeyId });
      const res = await kit.scan(await withDocumentedBody(request(kit.app)[op.method](url).set('Authorization', `Bearer ${a.serverKey}`).set(CSRF_HEADER, CSRF_HEADER_VALUE), op));
      expect(res.status).toBe(401);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    },
  );

  it.each(v1KeyOperations.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))(
    'when %s is called with an owner\'s session cookie and no key, then it is 401 with WWW-Authenticate: Bearer',
    async (_name, op) => {
      const res = await kit.scan(await withDocumentedBody(request(kit.app)[op.method](op.path).set('Cookie', a.cookies.owner), op));
      expect(res.status).toBe(401);
      expect(res.headers['www-authenticate']).toMatch(/^Bearer/);
    },
  );

  it('when a key is sent in the query string instead of the Authorization header, then it is refused', async () => {
    const res = await kit.scan(await request(kit.app).get(`/v1/reference/chemistries?api_key=${a.serverKey}`));
    expect(res.status).toBe(401);
  });
});

describe('object level: each key sees its own organization', () => {
  it('when two organizations make calls, then /v1/usage with A\'s key shows exactly A\'s calls', async () => {
    for (let i = 0; i < 3; i += 1) expect((await request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${a.serverKey}`).send(energy)).status).toBe(200);
    for (let i = 0; i < 5; i += 1) expect((await request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${b.serverKey}`).send(energy)).status).toBe(200);
    const usageA = await kit.scan(await request(kit.app).get('/v1/usage').set('Authorization', `Bearer ${a.serverKey}`));
    const usageB = await kit.scan(await request(kit.app).get('/v1/usage').set('Authorization', `Bearer ${b.serverKey}`));
    expect(usageA.body.data.used).toBe(3);
    expect(usageB.body.data.used).toBe(5);
  });

  it("when the console's request log is read, then a member sees only their organization's calls", async () => {
    await new Promise((r) => setTimeout(r, 400)); // the request log is written in batches of 250 ms
    const logA = await kit.scan(await request(kit.app).get('/console-api/requests').set('Cookie', a.cookies.viewer));
    expect(logA.status).toBe(200);
    expect(logA.body.items.length).toBeGreaterThanOrEqual(3);
    expect(new Set(logA.body.items.map((i: { keyName: string }) => i.keyName))).toEqual(new Set(['authz-a server key']));
  });
});

describe('function level: what each kind of key may call', () => {
  it('when an embed key reads usage or reference data, then it is 403 even from its own origin', async () => {
    for (const path of ['/v1/usage', '/v1/reference/chemistries', '/v1/reference/conductors']) {
      const res = await kit.scan(await request(kit.app).get(path).set('Authorization', `Bearer ${a.embedKey}`).set('Origin', a.embedOrigin));
      expect(res.status, path).toBe(403);
    }
  });

  it('when an embed key calculates without an Origin or from an unlisted one, then it is 403; from its origin, 200', async () => {
    const call = (origin?: string) => {
      const r = request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${a.embedKey}`);
      return (origin ? r.set('Origin', origin) : r).send(energy);
    };
    expect((await call()).status).toBe(403);
    expect((await call('https://elsewhere.example')).status).toBe(403);
    expect((await call(b.embedOrigin)).status).toBe(403);
    expect((await call(a.embedOrigin)).status).toBe(200);
  });

  it('when a server key is used from a web page on another site, then it is 403', async () => {
    const res = await kit.scan(await request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${a.serverKey}`).set('Origin', 'https://elsewhere.example').send(energy));
    expect(res.status).toBe(403);
  });

  it('when a key is revoked in the console, then the next call with it is 401', async () => {
    const created = await kit.scan(await request(kit.app).post('/console-api/keys').set('Cookie', a.cookies.owner).set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ name: 'short-lived', kind: 'server' }), { allowApiKeySecret: true });
    expect(created.status).toBe(201);
    const key = created.body.secret as string;
    expect((await request(kit.app).get('/v1/usage').set('Authorization', `Bearer ${key}`)).status).toBe(200);
    const revoked = await kit.scan(await request(kit.app).post(`/console-api/keys/${created.body.key.id}/revoke`).set('Cookie', a.cookies.owner).set(CSRF_HEADER, CSRF_HEADER_VALUE));
    expect(revoked.status).toBe(200);
    const after = await kit.scan(await request(kit.app).get('/v1/usage').set('Authorization', `Bearer ${key}`));
    expect(after.status).toBe(401);
    expect(after.body.detail).toMatch(/revoked/);
  });
});
