import { Router } from 'express';
import { sql } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { AppError } from '../../http/problem.ts';

export function healthRouter(db: Db) {
  const router = Router();
  /** Liveness: no I/O, for load balancers and benchmarks. */
  router.get('/healthz', (_req, res) => {
    res.json({ status: 'ok' });
  });
  /** Readiness: the database answers. */
  router.get('/readyz', async (_req, res) => {
    try {
      await db.execute(sql`select 1`);
    } catch {
      throw new AppError('service-unavailable', 'The database is not reachable.');
    }
    res.json({ status: 'ready', checks: { database: 'ok' } });
  });
  return router;
}
