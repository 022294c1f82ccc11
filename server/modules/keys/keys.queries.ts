import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { apiKeys, organizations } from '../../db/schema/index.ts';

export type ApiKeyRow = typeof apiKeys.$inferSelect;
type Executor = Pick<Db, 'select' | 'insert' | 'update'>;

/** A key and the limits-relevant fields of its organization, by the key's hash. */
export async function findKeyWithOrganizationByHash(db: Db, keyHash: string) {
  const rows = await db
    .select({
      key: apiKeys,
      organization: {
        id: organizations.id,
        planId: organizations.planId,
        customMonthlyQuotaCalls: organizations.customMonthlyQuotaCalls,
        customRatePerMinuteCalls: organizations.customRatePerMinuteCalls,
      },
    })
    .from(apiKeys)
    .innerJoin(organizations, eq(organizations.id, apiKeys.organizationId))
    .where(eq(apiKeys.keyHash, keyHash))
    .limit(1);
  return rows[0];
}

export async function insertKey(db: Executor, values: typeof apiKeys.$inferInsert): Promise<ApiKeyRow> {
  const [row] = await db.insert(apiKeys).values(values).returning();
  return row!;
}

export async function listKeys(db: Db, organizationId: string): Promise<ApiKeyRow[]> {
  return db.select().from(apiKeys).where(eq(apiKeys.organizationId, organizationId)).orderBy(desc(apiKeys.createdAt));
}

export async function findKey(db: Executor, organizationId: string, keyId: string): Promise<ApiKeyRow | undefined> {
  const rows = await db
    .select()
    .from(apiKeys)
    .where(and(eq(apiKeys.organizationId, organizationId), eq(apiKeys.id, keyId)));
  return rows[0];
}

export async function revokeKeyRow(db: Executor, organizationId: string, keyId: string, at: Date): Promise<ApiKeyRow | undefined> {
  const [row] = await db
    .update(apiKeys)
    .set({ revokedAt: at })
    .where(and(eq(apiKeys.organizationId, organizationId), eq(apiKeys.id, keyId), isNull(apiKeys.revokedAt)))
    .returning();
  return row;
}

export async function markKeyReplaced(db: Executor, keyId: string, replacedByKeyId: string, expiresAt: Date) {
  await db
    .update(apiKeys)
    .set({ replacedByKeyId, expiresAt: sql`least(coalesce(${apiKeys.expiresAt}, ${expiresAt}), ${expiresAt})` })
    .where(eq(apiKeys.id, keyId));
}

/** Active keys of an organization (not revoked, not expired). */
export async function countActiveKeys(db: Executor, organizationId: string, at: Date): Promise<number> {
  const [row] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(apiKeys)
    .where(
      and(
        eq(apiKeys.organizationId, organizationId),
        isNull(apiKeys.revokedAt),
        sql`(${apiKeys.expiresAt} is null or ${apiKeys.expiresAt} > ${at})`,
      ),
    );
  return row?.n ?? 0;
}

/** Every origin listed on an active embed key: the origins CORS preflights are answered for. */
export async function listActiveEmbedOrigins(db: Db): Promise<string[]> {
  const rows = await db.execute<{ origin: string }>(
    sql`select distinct unnest(allowed_origins) as origin from api_keys where kind = 'embed' and revoked_at is null and (expires_at is null or expires_at > now())`,
  );
  return rows.rows.map((r) => r.origin);
}
