import { computeCompatibility } from '#shared/calc/compatibility/compatibility.ts';
import { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/compatibility/check. */
export function compatibilityRoutes(): V1Route[] {
  return [
    v1Post('/compatibility/check', calcHandler(CompatibilityInputSchema, computeCompatibility)),
  ];
}
