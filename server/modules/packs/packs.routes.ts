import { Router } from 'express';
import { computePackCompare } from '#shared/calc/pack-compare/pack-compare.ts';
import { computePackEnergy } from '#shared/calc/pack-energy/pack-energy.ts';
import { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { PackEnergyInputSchema } from '#shared/schemas/pack-energy.ts';
import { calcHandler } from '../calc/calc-handler.ts';

/** POST /v1/packs/energy and POST /v1/packs/compare. */
export function packsRouter() {
  const router = Router();
  router.post('/packs/energy', calcHandler(PackEnergyInputSchema, computePackEnergy));
  router.post('/packs/compare', calcHandler(PackCompareInputSchema, computePackCompare));
  return router;
}
