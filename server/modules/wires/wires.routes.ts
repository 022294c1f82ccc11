import { computeWireSize } from '#shared/calc/wire-size/wire-size.ts';
import { WireSizeInputSchema } from '#shared/schemas/wire-size.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/wires/size. */
export function wiresRoutes(): V1Route[] {
  return [
    v1Post('/wires/size', calcHandler(WireSizeInputSchema, computeWireSize)),
  ];
}
