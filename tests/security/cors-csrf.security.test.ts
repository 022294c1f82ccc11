/**
 * OWASP API8:2023 security misconfiguration — CORS — and cross-site request forgery on the console.
 *   - /v1 answers CORS only for origins listed on an active embed key, with that exact origin (never `*`,
 *     never `null`), `Vary: Origin`, and never `Access-Control-Allow-Credentials`; preflights from other
 *     origins are refused.
 *   - the console API never sends `Access-Control-Allow-Origin` or `-Credentials`, whatever the origin.
 *   - every state-changing console route (driven by the OpenAPI document) refuses a request without the
 *     CSRF header, with a foreign Origin, with `Sec-Fetch-Site: cross-site`, or with a form body — and
 *     writes nothing.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { consoleOperations, fillPath, operations, organizationFingerprint, organizationWithEveryRole, startSecurityKit, withDocumentedBody, type SecurityKit } from './security-kit.ts';

let kit: SecurityKit;
let a: Awaited<ReturnType<typeof organizationWithEveryRole>>;
beforeAll(async () => {
  kit = await startSecurityKit({ API_KEY_CACHE_TTL_MS: '0' });
  a = await organizationWithEveryRole(kit, 'cors');
}, 60_000);
afterAll(() => kit?.close());

const energy = { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } };

describe('CORS on /v1', () => {
  it('when a listed origin preflights, then exactly that origin is allowed, without credentials', async () => {
    const res = await request(kit.app)
      .options('/v1/packs/energy')
      .set('Origin', a.embedOrigin)
      .set('Access-Control-Request-Method', 'POST')
      .set('Access-Control-Request-Headers', 'authorization, content-type');
    expect(res.status).toBe(204);
    expect(res.headers['access-control-allow-origin']).toBe(a.embedOrigin);
    expect(res.headers['access-control-allow-credentials']).toBeUndefined();
    expect(res.headers.vary).toMatch(/Origin/i);
  });

  it.each(['https://evil.example', 'null', `${'https://cors.shop.example'}.evil.example`, 'http://cors.shop.example', 'https://CORS.shop.example'])(
    'when %s preflights or calls, then no CORS permission is given',
    async (origin) => {
      const pre = await kit.scan(await request(kit.app).options('/v1/packs/energy').set('Origin', origin).set('Access-Control-Request-Method', 'POST'));
      expect(pre.status).toBe(403);
      expect(pre.headers['access-control-allow-origin']).toBeUndefined();
      const call = await kit.scan(await request(kit.app).post('/v1/packs/energy').set('Origin', origin).set('Authorization', `Bearer ${a.embedKey}`).send(energy));
      expect(call.status).toBe(403);
      expect(call.headers['access-control-allow-origin']).toBeUndefined();
    },
  );

  it('when every /v1 route is called from a listed origin, then no answer allows credentials or any origin but that one', async () => {
    for (const op of operations.filter((o) => o.path.startsWith('/v1/'))) {
      const res = await withDocumentedBody(request(kit.app)[op.method](op.path).set('Origin', a.embedOrigin).set('Authorization', `Bearer ${a.embedKey}`), op);
      expect(res.headers['access-control-allow-credentials'], op.path).toBeUndefined();
      expect([undefined, a.embedOrigin], op.path).toContain(res.headers['access-control-allow-origin']);
    }
  });
});

describe('CORS on the console API', () => {
  it.each(consoleOperations.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))('when %s is preflighted or called from another origin, then no CORS header is sent', async (_n, op) => {
    const url = fillPath(op.path, { userId: a.members.developer!.id, invitationId: a.invitation.id, keyId: a.serverKeyId });
    for (const origin of [a.embedOrigin, 'https://evil.example']) {
      const pre = await request(kit.app).options(url).set('Origin', origin).set('Access-Control-Request-Method', op.method.toUpperCase()).set('Access-Control-Request-Headers', CSRF_HEADER);
      const call = await kit.scan(await withDocumentedBody(request(kit.app)[op.method](url).set('Origin', origin).set('Cookie', a.cookies.owner), op));
      for (const res of [pre, call]) {
        expect(res.headers['access-control-allow-origin']).toBeUndefined();
        expect(res.headers['access-control-allow-credentials']).toBeUndefined();
      }
    }
  });
});

describe('CSRF on every state-changing console route', () => {
  const changing = consoleOperations.filter((op) => op.method !== 'get');
  const forged: Array<[string, Record<string, string>]> = [
    ['without the CSRF header', {}],
    ['from a foreign Origin', { [CSRF_HEADER]: CSRF_HEADER_VALUE, Origin: 'https://evil.example' }],
    ['with Sec-Fetch-Site: cross-site', { [CSRF_HEADER]: CSRF_HEADER_VALUE, 'Sec-Fetch-Site': 'cross-site' }],
    ['with Sec-Fetch-Site: same-site', { [CSRF_HEADER]: CSRF_HEADER_VALUE, 'Sec-Fetch-Site': 'same-site' }],
  ];

  it.each(changing.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))('when %s is forged, then it is 403 (or 415 for a form body) and changes nothing', async (_n, op) => {
    const url = fillPath(op.path, { userId: a.members.developer!.id, invitationId: a.invitation.id, keyId: a.serverKeyId });
    const before = await organizationFingerprint(kit.db, a.org.id);
    for (const [how, headers] of forged) {
      const res = await kit.scan(await withDocumentedBody(request(kit.app)[op.method](url).set('Cookie', a.cookies.owner).set(headers), op));
      expect(res.status, `${how}: ${res.text.slice(0, 200)}`).toBe(403);
      expect(res.body.reason, how).toBe('csrf');
    }
    // A cross-site HTML form can send only simple content types.
    if (op.bodyTypes.includes('application/json')) {
      const form = await request(kit.app)[op.method](url).set('Cookie', a.cookies.owner).set(CSRF_HEADER, CSRF_HEADER_VALUE).type('form').send('name=x&role=owner');
      expect(form.status).toBe(415);
    }
    expect(await organizationFingerprint(kit.db, a.org.id)).toBe(before);
  });
});
