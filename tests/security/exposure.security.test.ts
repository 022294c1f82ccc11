/**
 * OWASP API3:2023 excessive data exposure: every documented GET, as every role and on a populated
 * organization (members, an invitation, keys, a rotated key, usage, the request log, audit events, a
 * billing customer, sessions, mail), answers without a password hash, a key hash, a token hash, a stored
 * secret or a server-side secret (exposure.ts compares against the values really stored). A new key's
 * secret is in its creation answer only, and never again.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { giveBillingAccount } from '../../server/modules/billing/billing.test-kit.ts';
import { seedDemoCatalog } from '../../server/modules/catalog/catalog.seed.ts';
import { setLimits } from '../setup/fixtures.ts';
import { document, fillPath, operations, organizationWithEveryRole, startSecurityKit, type SecurityKit } from './security-kit.ts';

let kit: SecurityKit;
let a: Awaited<ReturnType<typeof organizationWithEveryRole>>;
let rotatedSecret = '';
let createdSecret = '';
beforeAll(async () => {
  kit = await startSecurityKit();
  a = await organizationWithEveryRole(kit, 'expose');
  await setLimits(kit.db, a.org.id, { planId: 'builder' });
  await giveBillingAccount(kit.db, kit.billing.stripe, a.org.id);
  await kit.db.transaction((tx) => seedDemoCatalog(tx, a.org.id));
  const post = (url: string, body?: object) => request(kit.app).post(url).set('Cookie', a.cookies.owner).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body);
  const created = await post('/console-api/keys', { name: 'exposure key', kind: 'server' });
  expect(created.status).toBe(201);
  createdSecret = created.body.secret;
  const rotated = await post(`/console-api/keys/${created.body.key.id}/rotate`, { overlapHours: 1 });
  expect(rotated.status).toBe(201);
  rotatedSecret = rotated.body.secret;
  // Usage, the request log and audit events.
  for (const key of [a.serverKey, createdSecret]) {
    await request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${key}`).send({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } });
    await request(kit.app).post('/v1/packs/energy').set('Authorization', `Bearer ${key}`).send({ pack: { chemistry: 'nope' } });
  }
  await post('/console-api/invitations', { email: 'expose-invitee@tests.example', role: 'developer' });
  await request(kit.app).post('/console-api/auth/forgot-password').set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ email: a.members.viewer!.email });
  await new Promise((r) => setTimeout(r, 400)); // request log batches
}, 60_000);
afterAll(() => kit?.close());

const gets = operations.filter((op) => op.method === 'get');

describe('no secret in any answer to a GET', () => {
  it.each(gets.map((op) => [op.path, op] as const))('when GET %s is read by each role (or with the server key), then no secret is in the answer', async (_p, op) => {
    const url = fillPath(op.path, { userId: a.members.developer!.id, invitationId: a.invitation.id, keyId: a.serverKeyId });
    const tries = op.auth === 'api-key' ? [{ Authorization: `Bearer ${a.serverKey}` }] : Object.values(a.cookies).map((Cookie) => ({ Cookie }));
    let successes = 0;
    for (const headers of tries) {
      const res = await kit.scan(await request(kit.app).get(url).set(headers));
      expect(res.status).toBeLessThan(500);
      if (res.status === 200) successes += 1;
      for (const secret of [a.serverKey, a.embedKey, createdSecret, rotatedSecret]) expect(res.text).not.toContain(secret.slice(8));
    }
    expect(successes, `nobody could read ${url}`).toBeGreaterThan(0);
  });

  it('when the document is read, then it holds no secret either', async () => {
    // The document names fields such as "password" in request schemas: only stored values are looked for.
    await kit.scan(await request(kit.app).get('/openapi.json'), { valuesOnly: true });
    expect(JSON.stringify(document)).not.toMatch(/ohs_srv_[A-Za-z0-9]{32,}/);
  });
});

describe('a key secret is shown once', () => {
  it('when keys are listed after creation and rotation, then only display prefixes and last four characters appear', async () => {
    const res = await kit.scan(await request(kit.app).get('/console-api/keys').set('Cookie', a.cookies.owner));
    for (const item of res.body.items as Array<Record<string, unknown>>) {
      expect(Object.keys(item)).not.toEqual(expect.arrayContaining(['secret']));
      expect(Object.keys(item).filter((k) => /hash|secret/i.test(k))).toEqual([]);
    }
    const shown = (res.body.items as Array<{ displayPrefix: string; last4: string }>).find((k) => rotatedSecret.startsWith(k.displayPrefix) && rotatedSecret.endsWith(k.last4));
    expect(shown).toBeDefined();
  });
});
