import { and, asc, eq, gte, lt, sql } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { organizationMonthlyUsage, usageCounters } from '../../db/schema/index.ts';

/** Calls counted for an organization in a month (first day given as YYYY-MM-01). */
export async function monthlyCalls(db: Db, organizationId: string, monthStart: string): Promise<number> {
  const rows = await db
    .select({ calls: organizationMonthlyUsage.calls })
    .from(organizationMonthlyUsage)
    .where(and(eq(organizationMonthlyUsage.organizationId, organizationId), eq(organizationMonthlyUsage.month, monthStart)));
  return rows[0]?.calls ?? 0;
}

/** Calls per day and endpoint, summed over keys, for [fromDay, toDay). */
export async function dailyCallsByEndpoint(db: Db, organizationId: string, fromDay: string, toDay: string) {
  return db
    .select({ date: usageCounters.day, endpoint: usageCounters.endpoint, calls: sql<number>`sum(${usageCounters.calls})::int` })
    .from(usageCounters)
    .where(and(eq(usageCounters.organizationId, organizationId), gte(usageCounters.day, fromDay), lt(usageCounters.day, toDay)))
    .groupBy(usageCounters.day, usageCounters.endpoint)
    .orderBy(asc(usageCounters.day), asc(usageCounters.endpoint));
}

/** Calls per key in [fromDay, toDay), with the key's name, for the console. */
export async function callsByKey(db: Db, organizationId: string, fromDay: string, toDay: string) {
  const { rows } = await db.execute<{ key_id: string; name: string; display_prefix: string; calls: number }>(sql`
    select k.id as key_id, k.name, k.display_prefix, sum(c.calls)::int as calls
    from usage_counters c join api_keys k on k.id = c.api_key_id
    where c.organization_id = ${organizationId} and c.day >= ${fromDay} and c.day < ${toDay}
    group by k.id, k.name, k.display_prefix
    order by calls desc, k.name`);
  return rows.map((r) => ({ keyId: r.key_id, name: r.name, displayPrefix: r.display_prefix, calls: Number(r.calls) }));
}

/** Recent calls from the request log, newest first, keyset-paginated on id. */
export async function recentRequests(
  db: Db,
  organizationId: string,
  q: { limit: number; before?: number; keyId?: string; endpoint?: string; status?: '2xx' | '4xx' | '5xx' },
) {
  const statusFloor = q.status ? Number(q.status[0]) * 100 : null;
  const { rows } = await db.execute<{
    id: number;
    created_at: Date;
    api_key_id: string | null;
    key_name: string | null;
    method: string;
    endpoint: string;
    status: number;
    duration_ms: number;
    request_id: string | null;
  }>(sql`
    select r.id, r.created_at, r.api_key_id, k.name as key_name, r.method, r.endpoint, r.status, r.duration_ms, r.request_id
    from request_log r left join api_keys k on k.id = r.api_key_id
    where r.organization_id = ${organizationId}
      ${q.before ? sql`and r.id < ${q.before}` : sql``}
      ${q.keyId ? sql`and r.api_key_id = ${q.keyId}` : sql``}
      ${q.endpoint ? sql`and r.endpoint = ${q.endpoint}` : sql``}
      ${statusFloor ? sql`and r.status >= ${statusFloor} and r.status < ${statusFloor + 100}` : sql``}
    order by r.id desc
    limit ${q.limit + 1}`);
  const items = rows.slice(0, q.limit).map((r) => ({
    id: Number(r.id),
    createdAt: new Date(r.created_at).toISOString(),
    apiKeyId: r.api_key_id,
    keyName: r.key_name,
    method: r.method,
    endpoint: r.endpoint,
    status: r.status,
    durationMs: r.duration_ms,
    requestId: r.request_id,
  }));
  return { items, nextBefore: rows.length > q.limit ? items.at(-1)!.id : null };
}
