/** Console API for usage (session): this month against the plan, by day, endpoint and key; recent calls. */
import { Router } from 'express';
import { eq } from 'drizzle-orm';
import { effectiveLimits } from '#shared/plans.ts';
import { ConsoleUsageQuerySchema, ConsoleUsageSchema, RequestLogPageSchema, RequestLogQuerySchema } from '#shared/schemas/keys.ts';
import type { Db } from '../../db/client.ts';
import { organizations } from '../../db/schema/index.ts';
import { parseQuery } from '../../http/validate.ts';
import { organizationAuth, requireRole } from '../auth/session.ts';
import { callsByKey, dailyCallsByEndpoint, monthlyCalls, recentRequests } from './usage.queries.ts';

const isoDay = (d: Date) => d.toISOString().slice(0, 10);

export function usageConsoleRouter(deps: { db: Db }) {
  const { db } = deps;
  const router = Router();
  const anyMember = requireRole('owner', 'admin', 'developer', 'viewer');

  router.get('/usage', anyMember, async (req, res) => {
    const { month } = parseQuery(ConsoleUsageQuerySchema, req);
    const organizationId = organizationAuth(res).organizationId;
    const now = new Date();
    const [y, m] = month ? month.split('-').map(Number) : [now.getUTCFullYear(), now.getUTCMonth() + 1];
    const start = new Date(Date.UTC(y!, m! - 1, 1));
    const next = new Date(Date.UTC(y!, m!, 1));
    const [org] = await db.select().from(organizations).where(eq(organizations.id, organizationId));
    const limits = effectiveLimits(org!);
    const used = await monthlyCalls(db, organizationId, isoDay(start));
    const byDayAndEndpoint = (await dailyCallsByEndpoint(db, organizationId, isoDay(start), isoDay(next))).map((d) => ({
      date: String(d.date),
      endpoint: d.endpoint,
      calls: Number(d.calls),
    }));
    const sumBy = (pick: (d: (typeof byDayAndEndpoint)[number]) => string) => {
      const totals = new Map<string, number>();
      for (const d of byDayAndEndpoint) totals.set(pick(d), (totals.get(pick(d)) ?? 0) + d.calls);
      return [...totals];
    };
    res.json(
      ConsoleUsageSchema.parse({
        month: isoDay(start).slice(0, 7),
        plan: limits.plan.id,
        quota: limits.monthlyQuotaCalls,
        ratePerMinute: limits.ratePerMinuteCalls,
        used,
        remaining: Math.max(0, limits.monthlyQuotaCalls - used),
        resetsAt: next.toISOString(),
        byDay: sumBy((d) => d.date).map(([date, calls]) => ({ date, calls })),
        byEndpoint: sumBy((d) => d.endpoint)
          .map(([endpoint, calls]) => ({ endpoint, calls }))
          .sort((a, b) => b.calls - a.calls),
        byKey: await callsByKey(db, organizationId, isoDay(start), isoDay(next)),
        byDayAndEndpoint,
      }),
    );
  });

  router.get('/requests', anyMember, async (req, res) => {
    const query = parseQuery(RequestLogQuerySchema, req);
    res.json(RequestLogPageSchema.parse(await recentRequests(db, organizationAuth(res).organizationId, query)));
  });

  return router;
}
