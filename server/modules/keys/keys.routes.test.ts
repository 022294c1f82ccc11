/**
 * Console key management end to end: create (secret once), use, revoke, rotate; what each role may do;
 * another organization's key is 404; audit entries; usage and the request log; quota e-mails.
 */
import request from 'supertest';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { auditEvents, organizations } from '../../db/schema/index.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, type ConsoleKit } from '../console/console.test-kit.ts';

let kit: ConsoleKit;
let org: Awaited<ReturnType<typeof createOrganizationWith>>;
let other: Awaited<ReturnType<typeof createOrganizationWith>>;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  kit = await startConsoleKit();
  org = await createOrganizationWith(kit.db, 'keys', ['owner', 'admin', 'developer', 'viewer']);
  other = await createOrganizationWith(kit.db, 'keys-other', ['owner']);
  await kit.db.update(organizations).set({ planId: 'builder' }).where(eq(organizations.id, org.org.id));
  for (const role of ['owner', 'admin', 'developer', 'viewer'] as const) cookies[role] = await sessionCookie(kit.db, org.members[role]!.id, org.org.id);
  cookies.otherOwner = await sessionCookie(kit.db, other.members.owner!.id, other.org.id);
});
afterAll(() => kit.close());

const as = (who: string) => ({
  get: (path: string) => request(kit.app).get(`/console-api${path}`).set('Cookie', cookies[who]!),
  post: (path: string, body: object = {}) =>
    request(kit.app).post(`/console-api${path}`).set('Cookie', cookies[who]!).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body),
});
const v1 = (key: string) => ({
  usage: () => request(kit.app).get('/v1/usage').set('Authorization', `Bearer ${key}`),
  energy: () =>
    request(kit.app)
      .post('/v1/packs/energy')
      .set('Authorization', `Bearer ${key}`)
      .send({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } }),
});

describe('creating keys', () => {
  it('when an owner creates a server key, then the secret is shown once, works, and never appears in the list', async () => {
    const res = await as('owner').post('/keys', { name: 'Checkout service', kind: 'server' });
    expect(res.status).toBe(201);
    expect(res.body.secret).toMatch(/^ohs_srv_[A-Za-z0-9]{40}$/);
    expect(res.body.key).toMatchObject({ name: 'Checkout service', kind: 'server', status: 'active', last4: res.body.secret.slice(-4) });
    expect((await v1(res.body.secret).usage()).status).toBe(200);
    const list = await as('owner').get('/keys');
    expect(list.status).toBe(200);
    expect(JSON.stringify(list.body)).not.toContain(res.body.secret);
    expect(JSON.stringify(list.body)).not.toMatch(/keyHash|key_hash/);
    const events = await kit.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.organizationId, org.org.id), eq(auditEvents.action, 'api_key.created'), eq(auditEvents.targetId, res.body.key.id)));
    expect(events).toHaveLength(1);
    expect(events[0]!.actorUserId).toBe(org.members.owner!.id);
  });

  it('when an embed key is created without origins, then it is a 422 pointing at allowedOrigins', async () => {
    const res = await as('admin').post('/keys', { name: 'Widget', kind: 'embed' });
    expect(res.status).toBe(422);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toContain('#/allowedOrigins');
  });

  it('when an origin has a path, then it is refused', async () => {
    const res = await as('admin').post('/keys', { name: 'Widget', kind: 'embed', allowedOrigins: ['https://shop.example/products'] });
    expect(res.status).toBe(422);
  });

  it('when an embed key is used from its origin on a calculation, then it works and CORS names that origin', async () => {
    const created = await as('admin').post('/keys', { name: 'Widget', kind: 'embed', allowedOrigins: ['https://blog.larkspur.example'] });
    expect(created.status).toBe(201);
    const ok = await v1(created.body.secret).energy().set('Origin', 'https://blog.larkspur.example');
    expect(ok.status).toBe(200);
    expect(ok.headers['access-control-allow-origin']).toBe('https://blog.larkspur.example');
    const elsewhere = await v1(created.body.secret).energy().set('Origin', 'https://copycat.example');
    expect(elsewhere.status).toBe(403);
    const noOrigin = await v1(created.body.secret).energy();
    expect(noOrigin.status).toBe(403);
  });

  it('when a viewer tries to create a key, then it is 403; when the CSRF header is missing, then it is refused', async () => {
    expect((await as('viewer').post('/keys', { name: 'x', kind: 'server' })).status).toBe(403);
    const noCsrf = await request(kit.app).post('/console-api/keys').set('Cookie', cookies.owner!).send({ name: 'x', kind: 'server' });
    expect(noCsrf.status).toBeGreaterThanOrEqual(400);
    expect(noCsrf.status).toBeLessThan(500);
    expect(noCsrf.headers['content-type']).toMatch(/problem\+json/);
  });
});

describe('revoking and rotating', () => {
  it('when a developer revokes a key someone else made, then it is 403; their own key, then it stops working', async () => {
    const ownersKey = await as('owner').post('/keys', { name: 'Owner key', kind: 'server' });
    expect((await as('developer').post(`/keys/${ownersKey.body.key.id}/revoke`)).status).toBe(403);
    const mine = await as('developer').post('/keys', { name: 'Dev key', kind: 'server' });
    const revoked = await as('developer').post(`/keys/${mine.body.key.id}/revoke`);
    expect(revoked.status).toBe(200);
    expect(revoked.body.key.status).toBe('revoked');
    expect((await v1(mine.body.secret).usage()).status).toBe(401);
    expect((await as('developer').post(`/keys/${mine.body.key.id}/revoke`)).status).toBe(409);
  });

  it("when another organization's key is named, then it is 404, not 403", async () => {
    const theirs = await as('otherOwner').post('/keys', { name: 'Theirs', kind: 'server' });
    expect(theirs.status).toBe(201);
    expect((await as('owner').post(`/keys/${theirs.body.key.id}/revoke`)).status).toBe(404);
    expect((await as('owner').post(`/keys/${theirs.body.key.id}/rotate`, { overlapHours: 1 })).status).toBe(404);
    expect((await as('owner').get('/keys')).body.items.map((k: { id: string }) => k.id)).not.toContain(theirs.body.key.id);
  });

  it('when a key is rotated, then a new secret is returned and both work during the overlap', async () => {
    const first = await as('admin').post('/keys', { name: 'Rotating', kind: 'server' });
    const rotated = await as('admin').post(`/keys/${first.body.key.id}/rotate`, { overlapHours: 2 });
    expect(rotated.status).toBe(201);
    expect(rotated.body.secret).not.toBe(first.body.secret);
    expect(rotated.body.previous.status).toBe('expiring');
    expect((await v1(first.body.secret).usage()).status).toBe(200);
    expect((await v1(rotated.body.secret).usage()).status).toBe(200);
    expect((await as('admin').post(`/keys/${first.body.key.id}/rotate`, { overlapHours: 2 })).status).toBe(409);
  });
});

describe('usage in the console', () => {
  it('when calls are made with a key, then usage shows them by endpoint and key, and the request log lists them', async () => {
    const created = await as('owner').post('/keys', { name: 'Usage probe', kind: 'server' });
    for (let i = 0; i < 3; i += 1) expect((await v1(created.body.secret).energy()).status).toBe(200);
    const bad = await request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${created.body.secret}`).send({ pack: { chemistry: 'lfp' } });
    expect(bad.status).toBe(422);
    const usage = await as('viewer').get('/usage');
    expect(usage.status).toBe(200);
    expect(usage.body.byKey.find((k: { keyId: string }) => k.keyId === created.body.key.id)?.calls).toBe(3);
    expect(usage.body.byEndpoint.find((e: { endpoint: string }) => e.endpoint === '/v1/packs/energy')?.calls).toBeGreaterThanOrEqual(3);
    await kit.app.platform!.requestLog.flush();
    const log = await as('developer').get(`/requests?keyId=${created.body.key.id}`);
    expect(log.status).toBe(200);
    expect(log.body.items.map((r: { status: number }) => r.status).sort()).toEqual([200, 200, 200, 422]);
    const errorsOnly = await as('developer').get(`/requests?keyId=${created.body.key.id}&status=4xx`);
    expect(errorsOnly.body.items).toHaveLength(1);
  });
});

describe('quota e-mails and the monthly quota', () => {
  it('when an organization reaches 80 % and then 100 % of its quota, then owners and admins are e-mailed once each, and the next call is 429', async () => {
    const small = await createOrganizationWith(kit.db, 'quota', ['owner', 'admin', 'viewer']);
    await kit.db.update(organizations).set({ customMonthlyQuotaCalls: 5 }).where(eq(organizations.id, small.org.id));
    cookies.quotaOwner = await sessionCookie(kit.db, small.members.owner!.id, small.org.id);
    const created = await as('quotaOwner').post('/keys', { name: 'Quota probe', kind: 'server' });
    const results: number[] = [];
    for (let i = 0; i < 6; i += 1) results.push((await v1(created.body.secret).energy()).status);
    expect(results).toEqual([200, 200, 200, 200, 200, 429]);
    const limited = await v1(created.body.secret).energy();
    expect(limited.body.type).toBe('/problems/quota-exceeded');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect(limited.headers.ratelimit).toMatch(/"monthly";r=0;t=\d+/);
    const to = [small.members.owner!.email, small.members.admin!.email];
    for (const address of to) {
      await kit.catcher.waitForMessage((m) => m.to.includes(address) && m.subject.includes('80%'));
      await kit.catcher.waitForMessage((m) => m.to.includes(address) && m.subject.includes('has used this month'));
    }
    const quotaMails = kit.catcher.messages.filter((m) => m.subject.includes(small.org.name));
    expect(quotaMails).toHaveLength(4);
    expect(kit.catcher.messages.some((m) => m.to.includes(small.members.viewer!.email))).toBe(false);
  });
});
