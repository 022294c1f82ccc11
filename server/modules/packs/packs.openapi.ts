import { computePackCompare } from '#shared/calc/pack-compare/pack-compare.ts';
import { computePackEnergy } from '#shared/calc/pack-energy/pack-energy.ts';
import { PackCompareInputSchema, PackCompareResultSchema, packCompareInputExample } from '#shared/schemas/pack-compare.ts';
import { PackEnergyInputSchema, PackEnergyResultSchema, packEnergyInputExample } from '#shared/schemas/pack-energy.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

registerCalcPath({
  path: '/v1/packs/energy',
  tag: 'Packs',
  summary: 'Pack energy and value',
  description:
    'Pack voltages (series cells × the chemistry’s per-cell nominal, full-charge and cut-off voltages), energy (nominal V × Ah) and usable energy (× depth of discharge), with the cost per usable kWh when a price is given and the cost per kWh cycled when a cycle life is given too. Worked example: a 16-cell LFP pack of 100 Ah is 51.2 V and 5 120 Wh; at 90 % it has 4 608 Wh usable.',
  request: PackEnergyInputSchema,
  response: PackEnergyResultSchema,
  requestExample: packEnergyInputExample,
  // Computed from the example by the same calculator the endpoint runs, so the document cannot drift from it.
  responseExample: computePackEnergy(PackEnergyInputSchema.parse(packEnergyInputExample)),
});

registerCalcPath({
  path: '/v1/packs/compare',
  tag: 'Packs',
  summary: 'Compare priced packs',
  description:
    '2 to 20 priced options (one currency), ranked best value first: by cost per kWh cycled (price ÷ usable kWh × rated cycles) when every option has a cycleLife, otherwise by cost per usable kWh. `relativeToBest` is each option’s figure over the best one’s.',
  request: PackCompareInputSchema,
  response: PackCompareResultSchema,
  requestExample: packCompareInputExample,
  responseExample: computePackCompare(PackCompareInputSchema.parse(packCompareInputExample)),
});
