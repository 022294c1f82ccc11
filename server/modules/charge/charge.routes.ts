import { computeChargeTime } from '#shared/calc/charge-time/charge-time.ts';
import { ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/charge/time. */
export function chargeRoutes(): V1Route[] {
  return [
    v1Post('/charge/time', calcHandler(ChargeTimeInputSchema, computeChargeTime)),
  ];
}
