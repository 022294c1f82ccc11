import { computeParallelConnect } from '#shared/calc/parallel-connect/parallel-connect.ts';
import { computeParallelShare } from '#shared/calc/parallel-share/parallel-share.ts';
import { ParallelConnectInputSchema } from '#shared/schemas/parallel-connect.ts';
import { ParallelShareInputSchema } from '#shared/schemas/parallel-share.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/parallel/share and /v1/parallel/connect. */
export function parallelRoutes(): V1Route[] {
  return [
    v1Post('/parallel/share', calcHandler(ParallelShareInputSchema, computeParallelShare)),
    v1Post('/parallel/connect', calcHandler(ParallelConnectInputSchema, computeParallelConnect)),
  ];
}
