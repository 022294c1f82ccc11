import { Router } from 'express';
import { computeParallelConnect } from '#shared/calc/parallel-connect/parallel-connect.ts';
import { computeParallelShare } from '#shared/calc/parallel-share/parallel-share.ts';
import { ParallelConnectInputSchema } from '#shared/schemas/parallel-connect.ts';
import { ParallelShareInputSchema } from '#shared/schemas/parallel-share.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/parallel/share and /v1/parallel/connect. */
export function parallelRouter() {
  const router = Router();
  router.post('/parallel/share', calcHandler(ParallelShareInputSchema, computeParallelShare));
  router.post('/parallel/connect', calcHandler(ParallelConnectInputSchema, computeParallelConnect));
  return router;
}
