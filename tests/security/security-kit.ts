/**
 * Shared set-up for the security tests: the real app (console kit: SMTP catcher, sessions, CSRF header)
 * pointed at the Stripe-shaped fake, an organization with one member of each role, keys, and the
 * documented operations. Every body a security test receives goes through `scan` (no secrets).
 */
import type { Response } from 'supertest';
import { expect } from 'vitest';
import { invitations } from '../../server/db/schema/index.ts';
import { hashToken, randomToken } from '../../server/modules/auth/tokens.ts';
import { startBillingFake, type BillingFake } from '../../server/modules/billing/billing.test-kit.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, uniqueEmail, type ConsoleKit } from '../../server/modules/console/console.test-kit.ts';
import { buildOpenApiDocument } from '../../server/openapi/document.ts';
import { createTestKey } from '../setup/fixtures.ts';
import { listOperations, type OpenApiDocument, type Operation } from '../fuzz/openapi-arbitraries.ts';
import { collectSecrets, findLeaks } from './exposure.ts';

export const document = buildOpenApiDocument() as unknown as OpenApiDocument;
export const operations = listOperations(document);
export const consoleOperations = operations.filter((op) => op.path.startsWith('/console-api/'));
export const v1KeyOperations = operations.filter((op) => op.path.startsWith('/v1/') && op.auth === 'api-key');

export interface SecurityKit extends ConsoleKit {
  billing: BillingFake;
  /** Fails the test when the body carries a secret; returns the response for chaining. */
  scan(res: Response, options?: { allowApiKeySecret?: boolean; valuesOnly?: boolean }): Promise<Response>;
  close(): Promise<void>;
}

export async function startSecurityKit(overrides: Record<string, string> = {}): Promise<SecurityKit> {
  const billing = await startBillingFake();
  const kit = await startConsoleKit({ ...billing.env, ...overrides });
  return {
    ...kit,
    billing,
    async scan(res, options = {}) {
      const secrets = await collectSecrets(kit.db, kit.env);
      expect(findLeaks(res.text ?? '', secrets, options), `${res.status} ${res.text?.slice(0, 300)}`).toEqual([]);
      return res;
    },
    async close() {
      await kit.close();
      await billing.close();
    },
  };
}

/** An organization with one member of each role, each signed in; an invitation; a server key and an embed key. */
export async function organizationWithEveryRole(kit: ConsoleKit, label = 'sec') {
  const { org, members } = await createOrganizationWith(kit.db, label, ['owner', 'admin', 'developer', 'viewer']);
  const cookies = {
    owner: await sessionCookie(kit.db, members.owner!.id, org.id),
    admin: await sessionCookie(kit.db, members.admin!.id, org.id),
    developer: await sessionCookie(kit.db, members.developer!.id, org.id),
    viewer: await sessionCookie(kit.db, members.viewer!.id, org.id),
  };
  const invitationToken = randomToken();
  const [invitation] = await kit.db
    .insert(invitations)
    .values({ organizationId: org.id, email: uniqueEmail(`${label}-invitee`), role: 'viewer', tokenHash: hashToken(invitationToken), invitedByUserId: members.owner!.id, expiresAt: new Date(Date.now() + 86_400_000) })
    .returning();
  const server = await createTestKey(kit.db, kit.app.platform!.hashSecret, org.id, { name: `${label} server key` });
  const embed = await createTestKey(kit.db, kit.app.platform!.hashSecret, org.id, { kind: 'embed', allowedOrigins: [`https://${label}.shop.example`], name: `${label} embed key` });
  return { org, members, cookies, invitation: invitation!, invitationToken, serverKey: server.secret, serverKeyId: server.key.id, embedKey: embed.secret, embedOrigin: `https://${label}.shop.example` };
}

/**
 * A fingerprint of everything one organization owns (itself, members and their users and sessions,
 * invitations, keys, audit events, usage, billing, catalog): other test files share the database, so a
 * "nothing changed" check compares this rather than whole tables. Volatile columns are left out.
 */
export async function organizationFingerprint(db: ConsoleKit['db'], organizationId: string): Promise<string> {
  const volatile = "- 'last_seen_at' - 'last_used_at'";
  const byOrg = ['organizations:id', 'memberships:organization_id', 'invitations:organization_id', 'api_keys:organization_id', 'audit_events:organization_id', 'usage_counters:organization_id', 'billing_accounts:organization_id', 'catalog_hosts:organization_id', 'catalog_packs:organization_id'];
  const parts = byOrg.map((spec) => {
    const [table, column] = spec.split(':');
    return `select '${table}' as t, count(*)::int as n, coalesce(sum(hashtextextended((to_jsonb(x) ${volatile})::text, 0)), 0)::text as h from ${table} x where ${column} = $1`;
  });
  parts.push(`select 'users' as t, count(*)::int, coalesce(sum(hashtextextended(to_jsonb(u)::text, 0)), 0)::text from users u where id in (select user_id from memberships where organization_id = $1)`);
  parts.push(`select 'sessions' as t, count(*)::int, coalesce(sum(hashtextextended((to_jsonb(s) ${volatile})::text, 0)), 0)::text from sessions s where user_id in (select user_id from memberships where organization_id = $1)`);
  const { rows } = await db.$client.query(parts.join(' union all '), [organizationId]);
  return JSON.stringify(rows);
}

/** Sends the operation's documented kind of body: its JSON example (or {}), or a small CSV file for a multipart upload. */
export function withDocumentedBody(req: import('supertest').Test, op: Operation): import('supertest').Test {
  if (op.bodyTypes.includes('application/json')) return req.send((op.examples[0] as object | undefined) ?? {});
  if (op.bodyTypes.includes('multipart/form-data')) return req.attach('file', Buffer.from('sku,name\n'), { filename: 'items.csv', contentType: 'text/csv' });
  return req;
}

/** A documented path with its {parameters} filled from a map (unknown ones with a random UUID). */
export function fillPath(path: string, values: Record<string, string>): string {
  return path.replace(/\{(\w+)\}/g, (_m, name: string) => values[name] ?? crypto.randomUUID());
}
