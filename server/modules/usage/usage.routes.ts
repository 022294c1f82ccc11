import { Router } from 'express';
import { UsageQuerySchema } from '#shared/schemas/usage.ts';
import type { Db } from '../../db/client.ts';
import { parseQuery } from '../../http/validate.ts';
import { getMonthlyUsage } from './usage.service.ts';

/** GET /v1/usage: needs a key, is not metered. */
export function usageRouter(db: Db) {
  const router = Router();
  router.get('/usage', async (req, res) => {
    const query = parseQuery(UsageQuerySchema, req);
    res.json({ data: await getMonthlyUsage(db, res.locals.apiKey!, query.month) });
  });
  return router;
}
