import { Router } from 'express';
import { computeWireSize } from '#shared/calc/wire-size/wire-size.ts';
import { WireSizeInputSchema } from '#shared/schemas/wire-size.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/wires/size. */
export function wiresRouter() {
  const router = Router();
  router.post('/wires/size', calcHandler(WireSizeInputSchema, computeWireSize));
  return router;
}
