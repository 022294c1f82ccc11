/**
 * The role × route matrix: every accounts console route, tried by someone signed out, by each of the four
 * roles of organization A, and by the owner of organization B (another tenant). Only what the role allows
 * succeeds; nobody outside A ever sees or changes A's data, and A's resources addressed from B are 404.
 * The table is checked against the registered routes, so a new route cannot be left out.
 */
import { and, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, type Role } from '#shared/schemas/accounts.ts';
import { auditEvents, emailTokens, invitations, memberships, organizations } from '../../db/schema/index.ts';
import { buildOpenApiDocument } from '../../openapi/document.ts';
import { hashToken, randomToken } from '../auth/tokens.ts';
import { consoleRoutes as registeredConsoleRoutes, type ConsoleAccess } from './console.openapi.ts';
import { createOrganizationWith, createUser, sessionCookie, startConsoleKit, TEST_PASSWORD, uniqueEmail, type ConsoleKit } from './console.test-kit.ts';
import { billingAccounts } from '../../db/schema/index.ts';
import { giveBillingAccount, startBillingFake, type BillingFake } from '../billing/billing.test-kit.ts';
import { playgroundCalculations } from '../playground/playground.calcs.ts';
import { createTestKey } from '../../../tests/setup/fixtures.ts';
import { apiKeys, catalogHosts, catalogPacks } from '../../db/schema/index.ts';
import { seedDemoCatalog } from '../catalog/catalog.seed.ts';
import { requestLog, usageCounters } from '../../db/schema/index.ts';

// Billing routes talk to the payment provider: the Stripe-shaped fake starts first and the app is pointed at it.
let billingFake: BillingFake;
let envBeforeBilling: Record<string, string | undefined> = {};
beforeAll(async () => {
  billingFake = await startBillingFake();
  envBeforeBilling = Object.fromEntries(Object.keys(billingFake.env).map((k) => [k, process.env[k]]));
  Object.assign(process.env, billingFake.env);
});
afterAll(async () => {
  for (const [k, v] of Object.entries(envBeforeBilling)) if (v === undefined) delete process.env[k]; else process.env[k] = v;
  await billingFake.close();
});
let kit: ConsoleKit;
beforeAll(async () => {
  kit = await startConsoleKit();
});
afterAll(() => kit.close());

const actors = ['anonymous', 'owner', 'admin', 'developer', 'viewer', 'outsider'] as const;
type Actor = (typeof actors)[number];

/** A fresh world per case: organization A (four roles, a target developer, an open invitation), organization B (the outsider owns it). */
async function world(actor: Actor) {
  const db = kit.db;
  const a = await createOrganizationWith(db, 'a', ['owner', 'admin', 'developer', 'viewer']);
  const target = await createUser(db, 'a-target');
  await db.insert(memberships).values({ organizationId: a.org.id, userId: target.id, role: 'developer' });
  const invitationToken = randomToken();
  const [invitation] = await db
    .insert(invitations)
    .values({ organizationId: a.org.id, email: uniqueEmail('a-invitee'), role: 'viewer', tokenHash: hashToken(invitationToken), invitedByUserId: a.members.owner!.id, expiresAt: new Date(Date.now() + 86_400_000) })
    .returning();
  await db.insert(auditEvents).values({ organizationId: a.org.id, actorUserId: a.members.owner!.id, action: 'organization.created', details: { marker: 'org-a' } });
  const b = await createOrganizationWith(db, 'b', ['owner']);
  const user = actor === 'anonymous' ? undefined : actor === 'outsider' ? b.members.owner! : a.members[actor]!;
  const cookie = user ? await sessionCookie(db, user.id, actor === 'outsider' ? b.org.id : a.org.id) : undefined;
  return { a: { ...a, target, invitation: invitation!, invitationToken }, b, actor, user, cookie };
}
type World = Awaited<ReturnType<typeof world>>;

/** A's people, to check that nothing of A appears in what another tenant receives. */
const aEmails = (w: World) => [...Object.values(w.a.members).map((u) => u.email), w.a.target.email, w.a.invitation.email];

interface Row {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  send: (w: World) => Promise<{ url: string; body?: unknown }> | { url: string; body?: unknown };
  /** Where the generic rule (from the route's access) does not say it all. */
  override?: Partial<Record<Actor, number>>;
  /** Extra checks after the call, e.g. that A was not touched by the outsider. */
  check?: (w: World, res: request.Response) => Promise<void> | void;
  /** A multipart upload (field `file`) instead of a JSON body. */
  attach?: { content: string; filename: string };
}

async function freshEmailToken(purpose: 'verify_email' | 'reset_password') {
  const user = await createUser(kit.db, `tok-${purpose}`, { verified: purpose === 'reset_password' });
  const token = randomToken();
  await kit.db.insert(emailTokens).values({ tokenHash: hashToken(token), userId: user.id, purpose, email: user.email, expiresAt: new Date(Date.now() + 3_600_000) });
  return token;
}

const rows: Row[] = [
  { method: 'post', path: '/console-api/auth/sign-up', send: () => ({ url: '/console-api/auth/sign-up', body: { email: uniqueEmail('new'), name: 'New Person', password: 'granite kettle orbit lantern' } }) },
  {
    method: 'post',
    path: '/console-api/auth/sign-in',
    send: async () => ({ url: '/console-api/auth/sign-in', body: { email: (await createUser(kit.db, 'signin')).email, password: TEST_PASSWORD } }),
  },
  { method: 'post', path: '/console-api/auth/sign-out', send: () => ({ url: '/console-api/auth/sign-out' }) },
  { method: 'post', path: '/console-api/auth/verify-email', send: async () => ({ url: '/console-api/auth/verify-email', body: { token: await freshEmailToken('verify_email') } }) },
  { method: 'post', path: '/console-api/auth/resend-verification', send: () => ({ url: '/console-api/auth/resend-verification', body: { email: uniqueEmail('resend') } }) },
  { method: 'post', path: '/console-api/auth/forgot-password', send: () => ({ url: '/console-api/auth/forgot-password', body: { email: uniqueEmail('forgot') } }) },
  {
    method: 'post',
    path: '/console-api/auth/reset-password',
    send: async () => ({ url: '/console-api/auth/reset-password', body: { token: await freshEmailToken('reset_password'), password: 'a fresh phrase for the matrix' } }),
  },
  { method: 'get', path: '/console-api/session', send: () => ({ url: '/console-api/session' }), check: (w, res) => void (res.status === 200 && expect(res.body.user.id).toBe(w.user!.id)) },
  {
    method: 'put',
    path: '/console-api/session/organization',
    send: (w) => ({ url: '/console-api/session/organization', body: { organizationId: w.a.org.id } }),
    override: { outsider: 404 },
  },
  { method: 'patch', path: '/console-api/account', send: () => ({ url: '/console-api/account', body: { name: 'Renamed Person' } }) },
  { method: 'post', path: '/console-api/account/password', send: () => ({ url: '/console-api/account/password', body: { currentPassword: TEST_PASSWORD, newPassword: 'another phrase for the matrix' } }) },
  {
    method: 'get',
    path: '/console-api/account/sessions',
    send: () => ({ url: '/console-api/account/sessions' }),
    check: (_w, res) => void (res.status === 200 && expect(res.body.sessions).toHaveLength(1)),
  },
  { method: 'post', path: '/console-api/account/sign-out-everywhere', send: () => ({ url: '/console-api/account/sign-out-everywhere' }) },
  { method: 'post', path: '/console-api/organizations', send: () => ({ url: '/console-api/organizations', body: { name: 'Another Shop' } }) },
  {
    method: 'get',
    path: '/console-api/organization',
    send: () => ({ url: '/console-api/organization' }),
    check: (w, res) => void (res.status === 200 && expect(res.body.id).toBe(w.actor === 'outsider' ? w.b.org.id : w.a.org.id)),
  },
  {
    method: 'patch',
    path: '/console-api/organization',
    send: () => ({ url: '/console-api/organization', body: { name: 'Renamed Shop' } }),
    check: async (w) => {
      const [a] = await kit.db.select().from(organizations).where(eq(organizations.id, w.a.org.id));
      expect(a!.name).toBe(['owner', 'admin'].includes(w.actor) ? 'Renamed Shop' : w.a.org.name);
    },
  },
  {
    method: 'delete',
    path: '/console-api/organization',
    send: (w) => ({ url: '/console-api/organization', body: { confirmName: w.a.org.name } }),
    // The outsider can only ever address their own organization, whose name this is not.
    override: { outsider: 422 },
    check: async (w) => {
      const left = await kit.db.select().from(organizations).where(eq(organizations.id, w.a.org.id));
      expect(left.length).toBe(w.actor === 'owner' ? 0 : 1);
    },
  },
  {
    method: 'post',
    path: '/console-api/organization/transfer-ownership',
    send: (w) => ({ url: '/console-api/organization/transfer-ownership', body: { userId: w.a.target.id } }),
    override: { outsider: 404 },
    check: async (w) => {
      const [m] = await kit.db.select().from(memberships).where(and(eq(memberships.organizationId, w.a.org.id), eq(memberships.userId, w.a.target.id)));
      expect(m!.role).toBe(w.actor === 'owner' ? 'owner' : 'developer');
    },
  },
  {
    method: 'get',
    path: '/console-api/members',
    send: () => ({ url: '/console-api/members' }),
    check: (w, res) => {
      if (w.actor === 'outsider') for (const email of aEmails(w)) expect(JSON.stringify(res.body)).not.toContain(email);
      else if (res.status === 200) expect(res.body.members).toHaveLength(5);
    },
  },
  {
    method: 'patch',
    path: '/console-api/members/{userId}',
    send: (w) => ({ url: `/console-api/members/${w.a.target.id}`, body: { role: 'viewer' } }),
    override: { outsider: 404 },
    check: async (w) => {
      const [m] = await kit.db.select().from(memberships).where(and(eq(memberships.organizationId, w.a.org.id), eq(memberships.userId, w.a.target.id)));
      expect(m!.role).toBe(['owner', 'admin'].includes(w.actor) ? 'viewer' : 'developer');
    },
  },
  {
    method: 'delete',
    path: '/console-api/members/{userId}',
    send: (w) => ({ url: `/console-api/members/${w.a.target.id}` }),
    // Everyone may leave; removing someone else needs owner or admin.
    override: { developer: 403, viewer: 403, outsider: 404 },
    check: async (w) => {
      const left = await kit.db.select().from(memberships).where(and(eq(memberships.organizationId, w.a.org.id), eq(memberships.userId, w.a.target.id)));
      expect(left.length).toBe(['owner', 'admin'].includes(w.actor) ? 0 : 1);
    },
  },
  {
    method: 'get',
    path: '/console-api/invitations',
    send: () => ({ url: '/console-api/invitations' }),
    check: (w, res) => {
      if (w.actor === 'outsider') expect(JSON.stringify(res.body)).not.toContain(w.a.invitation.email);
      else if (res.status === 200) expect(res.body.invitations.map((i: { id: string }) => i.id)).toEqual([w.a.invitation.id]);
    },
  },
  {
    method: 'post',
    path: '/console-api/invitations',
    send: () => ({ url: '/console-api/invitations', body: { email: uniqueEmail('matrix-invite'), role: 'developer' } }),
    check: async (w, res) => {
      const inA = await kit.db.select().from(invitations).where(eq(invitations.organizationId, w.a.org.id));
      expect(inA.length).toBe(['owner', 'admin'].includes(w.actor) ? 2 : 1);
      if (w.actor === 'outsider') expect(res.body.email).toBeDefined();
    },
  },
  {
    method: 'delete',
    path: '/console-api/invitations/{invitationId}',
    send: (w) => ({ url: `/console-api/invitations/${w.a.invitation.id}` }),
    override: { outsider: 404 },
    check: async (w) => {
      const [inv] = await kit.db.select().from(invitations).where(eq(invitations.id, w.a.invitation.id));
      expect(inv!.revokedAt !== null).toBe(['owner', 'admin'].includes(w.actor));
    },
  },
  // The token is the credential: whoever holds it may see what it offers.
  { method: 'post', path: '/console-api/invitations/preview', send: (w) => ({ url: '/console-api/invitations/preview', body: { token: w.a.invitationToken } }) },
  {
    method: 'post',
    path: '/console-api/invitations/accept',
    // An invitation to the actor's own address from a third organization.
    send: async (w) => {
      if (!w.user) return { url: '/console-api/invitations/accept', body: { token: w.a.invitationToken } };
      const c = await createOrganizationWith(kit.db, 'c', ['owner']);
      const token = randomToken();
      await kit.db.insert(invitations).values({ organizationId: c.org.id, email: w.user.email, role: 'viewer', tokenHash: hashToken(token), invitedByUserId: c.members.owner!.id, expiresAt: new Date(Date.now() + 86_400_000) });
      return { url: '/console-api/invitations/accept', body: { token } };
    },
  },
  {
    method: 'get',
    path: '/console-api/audit-events',
    send: () => ({ url: '/console-api/audit-events' }),
    check: (w, res) => {
      if (w.actor === 'outsider') expect(JSON.stringify(res.body)).not.toContain('org-a');
      else if (res.status === 200) expect(JSON.stringify(res.body)).toContain('org-a');
    },
  },
  { method: 'get', path: '/console-api/dev/mailbox', send: () => ({ url: '/console-api/dev/mailbox' }) },
  { method: 'delete', path: '/console-api/dev/mailbox', send: () => ({ url: '/console-api/dev/mailbox' }) },
  // Billing is the owner's: the page, invoices, checkout and portal (the outsider owns organization B and acts on it).
  { method: 'get', path: '/console-api/billing', send: () => ({ url: '/console-api/billing' }), check: (_w, res) => void (res.status === 200 && expect(res.body.plan.id).toBe('free')) },
  { method: 'get', path: '/console-api/billing/invoices', send: () => ({ url: '/console-api/billing/invoices' }) },
  {
    method: 'post',
    path: '/console-api/billing/checkout',
    send: () => ({ url: '/console-api/billing/checkout', body: { planId: 'builder' } }),
    check: async (w, res) => {
      const [account] = await kit.db.select().from(billingAccounts).where(eq(billingAccounts.organizationId, w.a.org.id));
      expect(Boolean(account?.stripeCustomerId)).toBe(w.actor === 'owner');
      if (res.status === 201) expect(res.body.url).toMatch(/\/checkout\/cs_test_/);
    },
  },
  {
    method: 'post',
    path: '/console-api/billing/portal',
    send: async (w) => {
      await giveBillingAccount(kit.db, billingFake.stripe, w.a.org.id);
      await giveBillingAccount(kit.db, billingFake.stripe, w.b.org.id);
      return { url: '/console-api/billing/portal' };
    },
    check: (_w, res) => void (res.status === 201 && expect(res.body.url).toMatch(/\/portal\/bps_/)),
  },
  // The playground runs a calculation under one of A's server keys; the outsider names A's key from B (404).
  ...playgroundCalculations.map(
    (c): Row => ({
      method: 'post',
      path: `/console-api${c.path}`,
      send: async (w) => ({ url: `/console-api${c.path}`, body: { keyId: (await createTestKey(kit.db, kit.app.platform!.hashSecret, w.a.org.id)).key.id, input: c.exampleInput } }),
      override: { outsider: 404 },
    }),
  ),
  // The catalog: every role reads, owners, admins and developers change it; the outsider acts on B's catalog
  // (an item of A addressed from B is 404) and A's catalog is never touched by B.
  ...catalogRows(),
  // Keys: every role lists, owners/admins/developers create; revoking and rotating someone else's key needs
  // owner or admin; A's keys addressed from B are 404 and never appear in B's answers.
  {
    method: 'get',
    path: '/console-api/keys',
    send: async (w) => {
      await createTestKey(kit.db, kit.app.platform!.hashSecret, w.a.org.id, { name: 'key-of-org-a' });
      return { url: '/console-api/keys' };
    },
    check: (w, res) => {
      if (w.actor === 'outsider') expect(JSON.stringify(res.body)).not.toContain('key-of-org-a');
      else if (res.status === 200) expect(res.body.items.map((k: { name: string }) => k.name)).toEqual(['key-of-org-a']);
    },
  },
  {
    method: 'post',
    path: '/console-api/keys',
    send: () => ({ url: '/console-api/keys', body: { name: 'Matrix key', kind: 'server' } }),
    check: async (w) => {
      const inA = await kit.db.select().from(apiKeys).where(eq(apiKeys.organizationId, w.a.org.id));
      expect(inA.length).toBe(['owner', 'admin', 'developer'].includes(w.actor) ? 1 : 0);
    },
  },
  {
    method: 'post',
    path: '/console-api/keys/{keyId}/revoke',
    send: async (w) => ({ url: `/console-api/keys/${(await createTestKey(kit.db, kit.app.platform!.hashSecret, w.a.org.id)).key.id}/revoke` }),
    override: { developer: 403, outsider: 404 },
    check: async (w) => {
      const [key] = await kit.db.select().from(apiKeys).where(eq(apiKeys.organizationId, w.a.org.id));
      expect(key!.revokedAt !== null).toBe(['owner', 'admin'].includes(w.actor));
    },
  },
  {
    method: 'post',
    path: '/console-api/keys/{keyId}/rotate',
    send: async (w) => ({ url: `/console-api/keys/${(await createTestKey(kit.db, kit.app.platform!.hashSecret, w.a.org.id)).key.id}/rotate`, body: { overlapHours: 1 } }),
    override: { developer: 403, outsider: 404 },
    check: async (w) => {
      const inA = await kit.db.select().from(apiKeys).where(eq(apiKeys.organizationId, w.a.org.id));
      expect(inA.length).toBe(['owner', 'admin'].includes(w.actor) ? 2 : 1);
    },
  },
  // Usage and the request log: every role of A reads A's; the outsider reads only B's.
  {
    method: 'get',
    path: '/console-api/usage',
    send: async (w) => {
      const { key } = await createTestKey(kit.db, kit.app.platform!.hashSecret, w.a.org.id, { name: 'usage-key-of-org-a' });
      await kit.db.insert(usageCounters).values({ organizationId: w.a.org.id, apiKeyId: key.id, endpoint: '/v1/packs/energy', day: new Date().toISOString().slice(0, 10), calls: 7 });
      return { url: '/console-api/usage' };
    },
    check: (w, res) => {
      if (w.actor === 'outsider') expect(res.body.used).toBe(0);
      else if (res.status === 200) expect(res.body.byKey.map((k: { name: string; calls: number }) => [k.name, k.calls])).toEqual([['usage-key-of-org-a', 7]]);
    },
  },
  {
    method: 'get',
    path: '/console-api/requests',
    send: async (w) => {
      await kit.db.insert(requestLog).values({ organizationId: w.a.org.id, method: 'POST', endpoint: '/v1/packs/energy', status: 200, durationMs: 3, requestId: 'request-of-org-a' });
      return { url: '/console-api/requests' };
    },
    check: (w, res) => {
      if (w.actor === 'outsider') expect(JSON.stringify(res.body)).not.toContain('request-of-org-a');
      else if (res.status === 200) expect(res.body.items.map((i: { requestId: string }) => i.requestId)).toEqual(['request-of-org-a']);
    },
  },
  // A key's name and allowed origins (the Widgets page): developers only for the keys they created.
  {
    method: 'patch',
    path: '/console-api/keys/{keyId}',
    send: async (w) => {
      const { key } = await createTestKey(kit.db, kit.app.platform!.hashSecret, w.a.org.id, { kind: 'embed', allowedOrigins: ['https://a.example'] });
      return { url: `/console-api/keys/${key.id}`, body: { allowedOrigins: ['https://shop.a.example'] } };
    },
    override: { developer: 403, outsider: 404 },
    check: async (w) => {
      const [key] = await kit.db.select().from(apiKeys).where(eq(apiKeys.organizationId, w.a.org.id));
      expect(key!.allowedOrigins).toEqual([['owner', 'admin'].includes(w.actor) ? 'https://shop.a.example' : 'https://a.example']);
    },
  },
];

/** Both organizations get the demo catalog; returns A's first host and pack. */
async function withCatalogs(w: World) {
  for (const id of [w.a.org.id, w.b.org.id]) await kit.db.transaction((tx) => seedDemoCatalog(tx, id));
  const [host] = await kit.db.select().from(catalogHosts).where(eq(catalogHosts.organizationId, w.a.org.id));
  const [pack] = await kit.db.select().from(catalogPacks).where(eq(catalogPacks.organizationId, w.a.org.id));
  return { host: host!, pack: pack! };
}
const editors = (w: World) => ['owner', 'admin', 'developer'].includes(w.actor);
async function countIn(table: typeof catalogHosts | typeof catalogPacks, organizationId: string) {
  return (await kit.db.select().from(table).where(eq(table.organizationId, organizationId))).length;
}

function catalogRows(): Row[] {
  const host = { sku: 'MX-H', name: 'Matrix unit', dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 } };
  const pack = { sku: 'MX-P', name: 'Matrix pack', chemistry: 'lfp', seriesCells: 16, capacityAh: 50 };
  const rows: Row[] = [
    { method: 'get', path: '/console-api/catalog', send: async (w) => (await withCatalogs(w), { url: '/console-api/catalog' }), check: (_w, res) => void (res.status === 200 && expect(res.body.hosts).toHaveLength(3)) },
    { method: 'get', path: '/console-api/catalog/matrix', send: async (w) => (await withCatalogs(w), { url: '/console-api/catalog/matrix' }), check: (_w, res) => void (res.status === 200 && expect(res.body.data.pairs).toHaveLength(12)) },
  ];
  for (const kind of ['hosts', 'packs'] as const) {
    const table = kind === 'hosts' ? catalogHosts : catalogPacks;
    const item = kind === 'hosts' ? host : pack;
    rows.push(
      {
        method: 'post',
        path: `/console-api/catalog/${kind}`,
        send: () => ({ url: `/console-api/catalog/${kind}`, body: item }),
        check: async (w) => expect(await countIn(table, w.a.org.id)).toBe(editors(w) ? 1 : 0),
      },
      {
        method: 'put',
        path: `/console-api/catalog/${kind}/{itemId}`,
        send: async (w) => ({ url: `/console-api/catalog/${kind}/${(await withCatalogs(w))[kind === 'hosts' ? 'host' : 'pack'].id}`, body: item }),
        override: { outsider: 404 },
        check: async (w) => {
          const skus = (await kit.db.select().from(table).where(eq(table.organizationId, w.a.org.id))).map((r) => r.sku);
          expect(skus.includes(item.sku)).toBe(editors(w));
        },
      },
      {
        method: 'delete',
        path: `/console-api/catalog/${kind}/{itemId}`,
        send: async (w) => ({ url: `/console-api/catalog/${kind}/${(await withCatalogs(w))[kind === 'hosts' ? 'host' : 'pack'].id}` }),
        override: { outsider: 404 },
        check: async (w) => expect(await countIn(table, w.a.org.id)).toBe((kind === 'hosts' ? 3 : 4) - (editors(w) ? 1 : 0)),
      },
      {
        method: 'get',
        path: `/console-api/catalog/${kind}/export`,
        send: async (w) => (await withCatalogs(w), { url: `/console-api/catalog/${kind}/export` }),
        check: (_w, res) => void (res.status === 200 && expect(res.text.split('\r\n').filter(Boolean)).toHaveLength(kind === 'hosts' ? 4 : 5)),
      },
      {
        method: 'post',
        path: `/console-api/catalog/${kind}/import`,
        send: () => ({ url: `/console-api/catalog/${kind}/import` }),
        attach: {
          filename: `${kind}.csv`,
          content: kind === 'hosts' ? 'sku,name,dcInputMinVoltageV,dcInputMaxVoltageV,dcInputMaxCurrentA\nMX-H,Matrix unit,12,60,15\n' : 'sku,name,chemistry,seriesCells,capacityAh\nMX-P,Matrix pack,lfp,16,50\n',
        },
        check: async (w) => expect(await countIn(table, w.a.org.id)).toBe(editors(w) ? 1 : 0),
      },
    );
  }
  return rows;
}

const document = buildOpenApiDocument();
const successStatus = (row: Row) => {
  const responses = (document.paths?.[row.path] as Record<string, { responses: Record<string, unknown> }>)[row.method]!.responses;
  return Number(Object.keys(responses).find((s) => s.startsWith('2')));
};
const accessOf = (row: Row): ConsoleAccess => registeredConsoleRoutes.find((r) => r.method === row.method && r.path === row.path)!.access;

/** What the route's declared access says each actor gets; the outsider acts on their own organization B. */
function expected(row: Row, actor: Actor): number {
  if (row.override?.[actor] !== undefined) return row.override[actor]!;
  const access = accessOf(row);
  const ok = successStatus(row);
  if (access === 'public' || access === 'development') return ok;
  if (actor === 'anonymous') return 401;
  if (access === 'session' || actor === 'outsider') return ok;
  return (access as readonly Role[]).includes(actor) ? ok : 403;
}

describe('the matrix covers every accounts console route', () => {
  it('when the registered routes are listed, then each has exactly one row', () => {
    const registered = registeredConsoleRoutes.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    expect(rows.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort()).toEqual(registered);
    expect(registered.length).toBeGreaterThanOrEqual(28);
  });
});

describe.each(rows)('$method $path', (row) => {
  it.each(actors)('when tried by %s, then only what the role allows succeeds', async (actor) => {
    const w = await world(actor);
    const { url, body } = await row.send(w);
    let req = request(kit.app)[row.method](url).set(CSRF_HEADER, '1');
    if (w.cookie) req = req.set('Cookie', w.cookie);
    if (row.attach) req = req.attach('file', Buffer.from(row.attach.content), { filename: row.attach.filename, contentType: 'text/csv' });
    const res = body === undefined ? await req : await req.send(body as object);
    const want = expected(row, actor);
    expect(res.status, `${row.method.toUpperCase()} ${url} as ${actor}: ${JSON.stringify(res.body)}`).toBe(want);
    if (want >= 400) expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    await row.check?.(w, res);
    // Whatever happened, nobody's password hash leaves the server.
    expect(JSON.stringify(res.body ?? {})).not.toMatch(/\$argon2/);
  });
});
