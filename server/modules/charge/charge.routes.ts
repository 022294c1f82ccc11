import { Router } from 'express';
import { computeChargeTime } from '#shared/calc/charge-time/charge-time.ts';
import { ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/charge/time. */
export function chargeRouter() {
  const router = Router();
  router.post('/charge/time', calcHandler(ChargeTimeInputSchema, computeChargeTime));
  return router;
}
