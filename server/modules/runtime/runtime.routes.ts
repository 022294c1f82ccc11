import { computeRuntime } from '#shared/calc/runtime/runtime.ts';
import { RuntimeInputSchema } from '#shared/schemas/runtime.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/runtime. */
export function runtimeRoutes(): V1Route[] {
  return [
    v1Post('/runtime', calcHandler(RuntimeInputSchema, computeRuntime)),
  ];
}
