import { computeCompatibility } from '#shared/calc/compatibility/compatibility.ts';
import { CompatibilityInputSchema, CompatibilityResultSchema } from '#shared/schemas/compatibility.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

const example = {
  host: { dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500 }, battery: { chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 40 } },
  external: { label: 'Shelf pack 48-100', chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 100, stateOfChargePct: 100, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 },
};

registerCalcPath({
  path: '/v1/compatibility/check',
  tag: 'Compatibility',
  summary: 'Check an external pack against a host unit',
  description:
    "By DC input: `incompatible` when the pack's full-charge voltage exceeds the input's maximum, `limited` when the input's minimum is above the pack's cut-off, else `compatible`; power at full and at cut-off, energy added after conversion losses and time to transfer (current and power caps are reported in `reasons`). By direct parallel onto the host's battery: same chemistry and series count required, with voltage-matching guidance and cautions.",
  request: CompatibilityInputSchema,
  response: CompatibilityResultSchema,
  requestExample: example,
  responseExample: computeCompatibility(CompatibilityInputSchema.parse(example)),
});
