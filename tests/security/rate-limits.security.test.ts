/**
 * OWASP API4:2023 unrestricted resource consumption: every API route is rate limited (driven by the OpenAPI
 * document, so routes added later are covered). Successful metered calculations are limited by the plan
 * (metering, tested in tests/api/metering.test.ts); everything else by the abuse guard
 * (server/modules/abuse/abuse-guard.ts), here with tiny limits:
 *   - every /v1 route: unauthenticated or refused calls per address; with a key, refused calculations and
 *     unmetered reads per key;
 *   - every console route: requests per address, and 401s per address;
 *   - 429 answers are problem documents with Retry-After, RateLimit, RateLimit-Policy and violated-policies;
 *   - a working key is still served from an address that floods 401s; /healthz and /readyz are never limited;
 *     successful calculations do not use up the failure budget.
 * Windows are one-minute fixed windows: each scenario starts away from a minute boundary.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { createTestKey, setLimits } from '../setup/fixtures.ts';
import { sessionCookie } from '../../server/modules/console/console.test-kit.ts';
import { consoleOperations, fillPath, operations, organizationWithEveryRole, startSecurityKit, withDocumentedBody, type SecurityKit } from './security-kit.ts';
import { usageCounters } from '../../server/db/schema/index.ts';
import { eq } from 'drizzle-orm';

const LIMIT = 3;
let kit: SecurityKit;
let a: Awaited<ReturnType<typeof organizationWithEveryRole>>;
beforeAll(async () => {
  kit = await startSecurityKit({
    TRUST_PROXY_HOPS: '1',
    ABUSE_ADDRESS_FAILURES_PER_MINUTE: String(LIMIT),
    ABUSE_KEY_FAILURES_PER_MINUTE: String(LIMIT),
    ABUSE_KEY_READS_PER_MINUTE: String(LIMIT),
    ABUSE_CONSOLE_REQUESTS_PER_MINUTE: String(LIMIT),
  });
  a = await organizationWithEveryRole(kit, 'limits');
  await setLimits(kit.db, a.org.id, { planId: 'scale' }); // a key per route
}, 60_000);
afterAll(() => kit?.close());

let addressCounter = 0;
/** A client address of its own (through X-Forwarded-For, one trusted proxy hop). */
const freshAddress = () => `203.0.113.${(addressCounter += 1) % 250}`;
const v1Operations = operations.filter((op) => op.path.startsWith('/v1/'));
const energy = { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } };

async function awayFromMinuteEdge() {
  const into = Date.now() % 60_000;
  if (into > 55_000) await new Promise((r) => setTimeout(r, 60_000 - into + 50));
}

function expectRefused(res: request.Response, policy: string) {
  expect(res.status, res.text.slice(0, 200)).toBe(429);
  expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
  expect(res.body['violated-policies']).toEqual([policy]);
  expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
  expect(res.headers['ratelimit-policy']).toBe(`"${policy}";q=${LIMIT};w=60`);
  expect(res.headers.ratelimit).toMatch(new RegExp(`^"${policy}";r=0;t=\\d+$`));
}

describe('every /v1 route: unauthenticated or refused calls per address', () => {
  it.each(v1Operations.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))('when %s is flooded without a valid key, then the address is refused with 429 before any key work', async (_n, op) => {
    await awayFromMinuteEdge();
    const address = freshAddress();
    for (let i = 0; i < LIMIT; i += 1) {
      const res = await withDocumentedBody(request(kit.app)[op.method](op.path).set('X-Forwarded-For', address).set('Authorization', `Bearer ohs_srv_${'Z'.repeat(40)}${i}`), op);
      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(res.headers['ratelimit-policy']).toBe(`"auth-failures";q=${LIMIT};w=60`);
      expect(res.headers.ratelimit).toBe(`"auth-failures";r=${LIMIT - 1 - i};t=${String(res.headers.ratelimit).split('t=')[1]}`);
    }
    expectRefused(await kit.scan(await withDocumentedBody(request(kit.app)[op.method](op.path).set('X-Forwarded-For', address), op)), 'auth-failures');
  });

  it('when an address is over its limit, then a call with a key this server already knows as valid is still served', async () => {
    await awayFromMinuteEdge();
    const address = freshAddress();
    expect((await request(kit.app).post('/v1/packs/energy').set('X-Forwarded-For', freshAddress()).set('Authorization', `Bearer ${a.serverKey}`).send(energy)).status).toBe(200);
    for (let i = 0; i <= LIMIT; i += 1) await request(kit.app).get('/v1/usage').set('X-Forwarded-For', address);
    expect((await request(kit.app).get('/v1/usage').set('X-Forwarded-For', address)).status).toBe(429);
    expect((await request(kit.app).post('/v1/packs/energy').set('X-Forwarded-For', address).set('Authorization', `Bearer ${a.serverKey}`).send(energy)).status).toBe(200);
  });

  it('when an address is over its limit, then /healthz and /readyz still answer', async () => {
    await awayFromMinuteEdge();
    const address = freshAddress();
    for (let i = 0; i <= LIMIT; i += 1) await request(kit.app).get('/v1/usage').set('X-Forwarded-For', address);
    expect((await request(kit.app).get('/v1/usage').set('X-Forwarded-For', address)).status).toBe(429);
    for (const path of ['/healthz', '/readyz']) {
      const res = await request(kit.app).get(path).set('X-Forwarded-For', address);
      expect(res.status, path).toBe(200);
      expect(res.headers.ratelimit, path).toBeUndefined();
    }
  });
});

describe('every /v1 route with a key: refused calculations and unmetered reads per key', () => {
  const keyed = v1Operations.filter((op) => op.auth === 'api-key');
  it.each(keyed.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))('when one key overuses %s, then that key is refused with 429 and nothing is counted', async (_n, op) => {
    await awayFromMinuteEdge();
    const { secret } = await createTestKey(kit.db, kit.app.platform!.hashSecret, a.org.id, { name: `limits ${op.path}` });
    const call = (body: 'bad' | 'documented') => {
      const r = request(kit.app)[op.method](op.path).set('X-Forwarded-For', freshAddress()).set('Authorization', `Bearer ${secret}`);
      return body === 'bad' ? r.send({ not: 'a valid body' }) : withDocumentedBody(r, op);
    };
    const before = await kit.db.select().from(usageCounters).where(eq(usageCounters.organizationId, a.org.id));
    const policy = op.method === 'get' ? 'key-reads' : 'key-failures';
    for (let i = 0; i < LIMIT; i += 1) {
      const res = await call(op.method === 'get' ? 'documented' : 'bad');
      expect(res.status, res.text.slice(0, 200)).toBe(op.method === 'get' ? 200 : 422);
      expect(res.headers['ratelimit-policy']).toBe(`"${policy}";q=${LIMIT};w=60`);
    }
    // Even a good call is refused now, before it is computed or counted.
    expectRefused(await kit.scan(await call('documented')), policy);
    const after = await kit.db.select().from(usageCounters).where(eq(usageCounters.organizationId, a.org.id));
    expect(after).toEqual(before);
  });

  it('when a key makes many successful calculations, then they do not use up its failure budget', async () => {
    await awayFromMinuteEdge();
    const { secret } = await createTestKey(kit.db, kit.app.platform!.hashSecret, a.org.id, { name: 'limits successes' });
    for (let i = 0; i < LIMIT * 4; i += 1) {
      const res = await request(kit.app).post('/v1/packs/energy').set('X-Forwarded-For', freshAddress()).set('Authorization', `Bearer ${secret}`).send(energy);
      expect(res.status).toBe(200);
      expect(res.headers['ratelimit-policy']).toMatch(/^"monthly";q=\d+;w=\d+, "minute";q=\d+;w=60$/);
    }
  });
});

describe('every console route: requests per session (or per address without one), and 401s per address', () => {
  it.each(consoleOperations.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))('when a session has used its console requests, then %s is refused with 429', async (_n, op) => {
    await awayFromMinuteEdge();
    const address = freshAddress();
    const cookie = await sessionCookie(kit.db, a.members.owner!.id, a.org.id);
    for (let i = 0; i < LIMIT; i += 1) {
      const res = await request(kit.app).get('/console-api/session').set('X-Forwarded-For', address).set('Cookie', cookie);
      expect(res.status).toBe(200);
      expect(res.headers.ratelimit).toBe(`"console";r=${LIMIT - 1 - i};t=${String(res.headers.ratelimit).split('t=')[1]}`);
    }
    const url = fillPath(op.path, { userId: a.members.developer!.id, invitationId: a.invitation.id, keyId: a.serverKeyId });
    expectRefused(await kit.scan(await withDocumentedBody(request(kit.app)[op.method](url).set('X-Forwarded-For', address).set('Cookie', cookie).set(CSRF_HEADER, CSRF_HEADER_VALUE), op)), 'console');
  });

  it('when one session has used its budget, then another session at the same address is still served', async () => {
    await awayFromMinuteEdge();
    const address = freshAddress();
    const busy = await sessionCookie(kit.db, a.members.owner!.id, a.org.id);
    for (let i = 0; i <= LIMIT; i += 1) await request(kit.app).get('/console-api/session').set('X-Forwarded-For', address).set('Cookie', busy);
    expect((await request(kit.app).get('/console-api/session').set('X-Forwarded-For', address).set('Cookie', busy)).status).toBe(429);
    expect((await request(kit.app).get('/console-api/session').set('X-Forwarded-For', address).set('Cookie', a.cookies.viewer)).status).toBe(200);
  });

  it('when requests without a session exceed the budget of their address, then they are refused with 429', async () => {
    await awayFromMinuteEdge();
    const address = freshAddress();
    const ask = () => request(kit.app).post('/console-api/auth/forgot-password').set('X-Forwarded-For', address).set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email: 'nobody@tests.example' });
    for (let i = 0; i < LIMIT; i += 1) expect((await ask()).status).toBe(202);
    expectRefused(await ask(), 'console');
  });

  it('when an address sends bad session cookies, then after the limit its console requests are refused', async () => {
    const flood = await startSecurityKit({ TRUST_PROXY_HOPS: '1', ABUSE_ADDRESS_FAILURES_PER_MINUTE: String(LIMIT), ABUSE_CONSOLE_REQUESTS_PER_MINUTE: '1000' });
    try {
      await awayFromMinuteEdge();
      const address = freshAddress();
      for (let i = 0; i < LIMIT; i += 1) {
        const res = await request(flood.app).get('/console-api/session').set('X-Forwarded-For', address).set('Cookie', `ohs_session=forged${i}`);
        expect(res.status).toBe(401);
        expect(res.headers['ratelimit-policy']).toBe(`"console";q=1000;w=60, "auth-failures";q=${LIMIT};w=60`);
      }
      const res = await request(flood.app).get('/console-api/session').set('X-Forwarded-For', address).set('Cookie', 'ohs_session=forged-again');
      expect(res.status).toBe(429);
      expect(res.body['violated-policies']).toEqual(['auth-failures']);
    } finally {
      await flood.close();
    }
  });
});
