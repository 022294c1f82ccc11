import { Router } from 'express';
import { computeRuntime } from '#shared/calc/runtime/runtime.ts';
import { RuntimeInputSchema } from '#shared/schemas/runtime.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/runtime. */
export function runtimeRouter() {
  const router = Router();
  router.post('/runtime', calcHandler(RuntimeInputSchema, computeRuntime));
  return router;
}
