import { ChemistriesResultSchema } from '#shared/schemas/chemistries.ts';
import { registerReferencePath } from '../calc/calc.openapi.ts';

registerReferencePath({
  path: '/v1/reference/chemistries',
  tag: 'Reference',
  summary: 'The chemistry presets',
  description:
    'LFP, NMC, LTO, AGM and flooded lead-acid: per-cell nominal, full-charge and cut-off voltages (pack voltages are these × series cells), the default depth of discharge, the rested open-circuit-voltage curve (state of charge → cell volts; interpolate linearly) and the sources of each. Needs a key; not metered.',
  response: ChemistriesResultSchema,
});
