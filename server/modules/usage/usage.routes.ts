import { UsageQuerySchema } from '#shared/schemas/usage.ts';
import type { Db } from '../../db/client.ts';
import { parseQuery } from '../../http/validate.ts';
import { getMonthlyUsage } from './usage.service.ts';
import { v1Get, type V1Route } from '../v1-route.ts';

/** GET /v1/usage: needs a key, is not metered. */
export function usageRoutes(db: Db): V1Route[] {
  return [
    v1Get('/usage', async (req, res) => {
      const query = parseQuery(UsageQuerySchema, req);
      res.json({ data: await getMonthlyUsage(db, res.locals.apiKey!, query.month) });
    }),
  ];
}
