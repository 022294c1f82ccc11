import { computeFuseSize } from '#shared/calc/fuse-size/fuse-size.ts';
import { FuseSizeInputSchema } from '#shared/schemas/fuse-size.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/fuses/size. */
export function fusesRoutes(): V1Route[] {
  return [
    v1Post('/fuses/size', calcHandler(FuseSizeInputSchema, computeFuseSize)),
  ];
}
