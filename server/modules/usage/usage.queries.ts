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
