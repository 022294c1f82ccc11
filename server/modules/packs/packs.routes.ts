import { computePackCompare } from '#shared/calc/pack-compare/pack-compare.ts';
import { computePackEnergy } from '#shared/calc/pack-energy/pack-energy.ts';
import { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { PackEnergyInputSchema } from '#shared/schemas/pack-energy.ts';
import { calcHandler } from '../calc/calc-handler.ts';
import { v1Post, type V1Route } from '../v1-route.ts';

/** POST /v1/packs/energy and POST /v1/packs/compare. */
export function packsRoutes(): V1Route[] {
  return [
    v1Post('/packs/energy', calcHandler(PackEnergyInputSchema, computePackEnergy)),
    v1Post('/packs/compare', calcHandler(PackCompareInputSchema, computePackCompare)),
  ];
}
