/**
 * OWASP API3:2023 Broken Object Property Level Authorization — mass assignment. A client must never set
 * what the server decides: a role (other than by the routes made for it), the organization a thing belongs
 * to, the plan or limits, verification state, who created something. Two layers:
 *   - every documented request body is a closed schema (additionalProperties: false, all the way down),
 *     so an unknown property is a 422 rather than silently passed on (the document is the contract every
 *     route parses with);
 *   - for every documented console body, adding each privileged property to its documented example is
 *     refused with a 4xx and changes nothing; and the routes that do take a role or an organization refuse
 *     the values they must not accept.
 */
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { memberships, users } from '../../server/db/schema/index.ts';
import { resolve, type JsonSchema } from '../fuzz/openapi-arbitraries.ts';
import { consoleOperations, document, fillPath, operations, organizationFingerprint, organizationWithEveryRole, startSecurityKit, type SecurityKit } from './security-kit.ts';

let kit: SecurityKit;
let a: Awaited<ReturnType<typeof organizationWithEveryRole>>;
let b: Awaited<ReturnType<typeof organizationWithEveryRole>>;
beforeAll(async () => {
  kit = await startSecurityKit();
  a = await organizationWithEveryRole(kit, 'mass-a');
  b = await organizationWithEveryRole(kit, 'mass-b');
}, 60_000);
afterAll(() => kit?.close());

/** JSON Pointers of object schemas in a body schema that accept properties they do not list. */
function openObjects(schema: JsonSchema, at = '#', seen = new Set<JsonSchema>()): string[] {
  const s = resolve(document, schema);
  if (seen.has(s)) return [];
  seen.add(s);
  const out: string[] = [];
  if (s.type === 'object' || s.properties) {
    if (s.additionalProperties !== false) out.push(at);
    for (const [k, v] of Object.entries(s.properties ?? {})) out.push(...openObjects(v, `${at}/${k}`, seen));
  }
  for (const alt of [...(s.anyOf ?? []), ...(s.oneOf ?? []), ...(s.allOf ?? [])]) out.push(...openObjects(alt, at, seen));
  if (s.items) out.push(...openObjects(s.items, `${at}/0`, seen));
  return out;
}

const privileged = {
  role: 'owner',
  organizationId: '00000000-0000-4000-8000-000000000000',
  planId: 'scale',
  customMonthlyQuotaCalls: 1_000_000_000,
  userId: '00000000-0000-4000-8000-000000000001',
  emailVerifiedAt: '2026-01-01T00:00:00Z',
  createdByUserId: '00000000-0000-4000-8000-000000000002',
  isAdmin: true,
};

// The Stripe webhook carries Stripe's own event object, accepted only with a valid signature.
const bodies = operations.filter((op) => op.bodySchema && op.bodyTypes.includes('application/json') && op.path !== '/v1/webhooks/stripe');

describe('request bodies are closed', () => {
  it.each(bodies.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))('when the body schema of %s is read, then no object in it accepts unlisted properties', (_n, op) => {
    expect(openObjects(op.bodySchema!)).toEqual([]);
  });
});

describe('privileged properties are refused on every console body', () => {
  const withBody = consoleOperations.filter((op) => op.bodySchema && op.bodyTypes.includes('application/json'));
  it.each(withBody.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))(
    'when %s gets role, organizationId, planId and other server-decided properties, then each is refused and nothing changes',
    async (_n, op) => {
      const declared = new Set(Object.keys(resolve(document, op.bodySchema!).properties ?? {}));
      const base = (op.examples[0] as Record<string, unknown> | undefined) ?? {};
      const url = fillPath(op.path, { userId: a.members.developer!.id, invitationId: a.invitation.id, keyId: a.serverKeyId });
      for (const [name, value] of Object.entries(privileged)) {
        if (declared.has(name)) continue; // routes that take it are checked below
        const before = await organizationFingerprint(kit.db, a.org.id);
        const res = await kit.scan(await request(kit.app)[op.method](url).set('Cookie', a.cookies.owner).set(CSRF_HEADER, CSRF_HEADER_VALUE).send({ ...base, [name]: value }));
        expect(res.status, `${name} on ${op.method} ${url}: ${res.text.slice(0, 200)}`).toBeGreaterThanOrEqual(400);
        expect(res.status).toBeLessThan(500);
        expect(await organizationFingerprint(kit.db, a.org.id), `${name} on ${op.method} ${url} changed the organization`).toBe(before);
      }
    },
  );
});

describe('routes that take a role or an organization refuse what they must not accept', () => {
  const send = (method: 'post' | 'patch' | 'put', url: string, body: object, cookie = a.cookies.owner) =>
    request(kit.app)[method](url).set('Cookie', cookie).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body).then((r) => kit.scan(r));

  it('when a member is given the owner role by a role change or an invitation, then it is 422 (ownership moves only by transfer)', async () => {
    expect((await send('patch', `/console-api/members/${a.members.developer!.id}`, { role: 'owner' })).status).toBe(422);
    expect((await send('post', '/console-api/invitations', { email: 'new-owner@tests.example', role: 'owner' })).status).toBe(422);
    const [m] = await kit.db.select().from(memberships).where(eq(memberships.userId, a.members.developer!.id));
    expect(m!.role).toBe('developer');
  });

  it('when an admin tries to make themselves owner, then it is refused', async () => {
    const res = await send('patch', `/console-api/members/${a.members.admin!.id}`, { role: 'owner' }, a.cookies.admin);
    expect(res.status).toBe(422);
  });

  it("when a member switches to an organization they do not belong to, then it is 404 and the session keeps its organization", async () => {
    expect((await send('put', '/console-api/session/organization', { organizationId: b.org.id })).status).toBe(404);
    const session = await kit.scan(await request(kit.app).get('/console-api/session').set('Cookie', a.cookies.owner));
    expect(JSON.stringify(session.body)).toContain(a.org.id);
    expect(JSON.stringify(session.body)).not.toContain(b.org.id);
  });

  it('when a key, a checkout or a sign-up names an organization, plan limits or verification, then it is 422', async () => {
    expect((await send('post', '/console-api/keys', { name: 'k', kind: 'server', organizationId: b.org.id })).status).toBe(422);
    expect((await send('post', '/console-api/billing/checkout', { planId: 'builder', organizationId: b.org.id })).status).toBe(422);
    const email = `mass-${Date.now()}@tests.example`;
    expect((await send('post', '/console-api/auth/sign-up', { email, name: 'Mass Person', password: 'granite kettle orbit lantern', emailVerifiedAt: '2026-01-01T00:00:00Z' })).status).toBe(422);
    expect(await kit.db.select().from(users).where(eq(users.email, email))).toEqual([]);
  });
});
