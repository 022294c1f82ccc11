import type { UsageResult } from '#shared/schemas/usage.ts';
import type { Db } from '../../db/client.ts';
import type { ResolvedKey } from '../keys/key-resolver.ts';
import { dailyCallsByEndpoint, monthlyCalls } from './usage.queries.ts';

const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/** A month's usage for the key's organization. `month` is YYYY-MM (UTC); default: the month of `now`. */
export async function getMonthlyUsage(db: Db, key: ResolvedKey, month: string | undefined, now = new Date()): Promise<UsageResult['data']> {
  const [y, m] = month ? month.split('-').map(Number) : [now.getUTCFullYear(), now.getUTCMonth() + 1];
  const start = new Date(Date.UTC(y!, m! - 1, 1));
  const next = new Date(Date.UTC(y!, m!, 1));
  const used = await monthlyCalls(db, key.organizationId, isoDay(start));
  const days = await dailyCallsByEndpoint(db, key.organizationId, isoDay(start), isoDay(next));
  return {
    month: isoDay(start).slice(0, 7),
    plan: key.planId,
    quota: key.monthlyQuotaCalls,
    used,
    remaining: Math.max(0, key.monthlyQuotaCalls - used),
    resetsAt: next.toISOString(),
    days: days.map((d) => ({ date: String(d.date), endpoint: d.endpoint, calls: Number(d.calls) })),
  };
}
