import { Router } from 'express';
import { computeCompatibility } from '#shared/calc/compatibility/compatibility.ts';
import { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/compatibility/check. */
export function compatibilityRouter() {
  const router = Router();
  router.post('/compatibility/check', calcHandler(CompatibilityInputSchema, computeCompatibility));
  return router;
}
