import { Router } from 'express';
import { computeFuseSize } from '#shared/calc/fuse-size/fuse-size.ts';
import { FuseSizeInputSchema } from '#shared/schemas/fuse-size.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/fuses/size. */
export function fusesRouter() {
  const router = Router();
  router.post('/fuses/size', calcHandler(FuseSizeInputSchema, computeFuseSize));
  return router;
}
