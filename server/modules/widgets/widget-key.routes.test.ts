/**
 * `PATCH /console-api/keys/{keyId}` (the Widgets page edits an embed key's origins beside its preview):
 * the change applies at once on this server, is audited with what changed, and keeps the rules of
 * creation (normalized origins, at least one for an embed key, none for a server key, the plan's limit).
 */
import request from 'supertest';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { auditEvents, organizations } from '../../db/schema/index.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, type ConsoleKit } from '../console/console.test-kit.ts';

let kit: ConsoleKit;
let org: Awaited<ReturnType<typeof createOrganizationWith>>;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  kit = await startConsoleKit();
  org = await createOrganizationWith(kit.db, 'widget-key', ['owner', 'developer']);
  await kit.db.update(organizations).set({ planId: 'builder' }).where(eq(organizations.id, org.org.id));
  cookies.owner = await sessionCookie(kit.db, org.members.owner!.id, org.org.id);
  cookies.developer = await sessionCookie(kit.db, org.members.developer!.id, org.org.id);
});
afterAll(() => kit.close());

const call = (who: string, method: 'post' | 'patch', path: string, body: object) =>
  request(kit.app)[method](`/console-api${path}`).set('Cookie', cookies[who]!).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body);
const catalogFrom = (key: string, origin: string) => request(kit.app).get('/v1/catalog').set('Authorization', `Bearer ${key}`).set('Origin', origin);

describe('PATCH /console-api/keys/{keyId}', () => {
  it('when an owner replaces an embed key\'s origins, then the new site works at once, the old one is refused, and it is audited', async () => {
    const created = await call('owner', 'post', '/keys', { name: 'Blog widgets', kind: 'embed', allowedOrigins: ['https://old.example'] });
    expect(created.status).toBe(201);
    const { key, secret } = created.body;
    expect((await catalogFrom(secret, 'https://old.example')).status).toBe(200);

    const res = await call('owner', 'patch', `/keys/${key.id}`, { name: 'Blog and shop', allowedOrigins: ['https://NEW.example/', 'https://shop.example:8443'] });
    expect(res.status).toBe(200);
    expect(res.body.key).toMatchObject({ name: 'Blog and shop', allowedOrigins: ['https://new.example', 'https://shop.example:8443'] });
    expect((await catalogFrom(secret, 'https://new.example')).status).toBe(200);
    expect((await catalogFrom(secret, 'https://old.example')).status).toBe(403);

    const [event] = await kit.db.select().from(auditEvents).where(and(eq(auditEvents.organizationId, org.org.id), eq(auditEvents.action, 'api_key.updated')));
    expect(event!.details).toEqual({
      name: { from: 'Blog widgets', to: 'Blog and shop' },
      allowedOrigins: { added: ['https://new.example', 'https://shop.example:8443'], removed: ['https://old.example'] },
    });
  });

  it('when the list would be empty, hold a path, or a server key is given origins, then it is a 422 on allowedOrigins', async () => {
    const embed = (await call('owner', 'post', '/keys', { name: 'E', kind: 'embed', allowedOrigins: ['https://e.example'] })).body.key;
    const server = (await call('owner', 'post', '/keys', { name: 'S', kind: 'server' })).body.key;
    for (const [id, body] of [
      [embed.id, { allowedOrigins: [] }],
      [embed.id, { allowedOrigins: ['https://e.example/shop'] }],
      [server.id, { allowedOrigins: ['https://e.example'] }],
    ] as const) {
      const res = await call('owner', 'patch', `/keys/${id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(422);
    }
    expect((await call('owner', 'patch', `/keys/${embed.id}`, {})).status).toBe(422);
  });

  it('when the key is revoked, then it cannot be changed (409); a developer may change only the keys they created', async () => {
    const mine = (await call('developer', 'post', '/keys', { name: 'Mine', kind: 'embed', allowedOrigins: ['https://dev.example'] })).body.key;
    expect((await call('developer', 'patch', `/keys/${mine.id}`, { name: 'Still mine' })).status).toBe(200);
    const owners = (await call('owner', 'post', '/keys', { name: 'Owner\'s', kind: 'embed', allowedOrigins: ['https://o.example'] })).body.key;
    expect((await call('developer', 'patch', `/keys/${owners.id}`, { name: 'Taken' })).status).toBe(403);
    await call('owner', 'post', `/keys/${owners.id}/revoke`, {});
    const res = await call('owner', 'patch', `/keys/${owners.id}`, { name: 'Too late' });
    expect(res.status).toBe(409);
  });
});
