import { computeParallelConnect } from '#shared/calc/parallel-connect/parallel-connect.ts';
import { computeParallelShare } from '#shared/calc/parallel-share/parallel-share.ts';
import { ParallelConnectInputSchema, ParallelConnectResultSchema } from '#shared/schemas/parallel-connect.ts';
import { ParallelShareInputSchema, ParallelShareResultSchema } from '#shared/schemas/parallel-share.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

const shareExample = {
  packs: [
    { label: 'Pack A', chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 100, stateOfChargePct: 80, internalResistanceMOhm: 8, cableResistanceMOhm: 2 },
    { label: 'Pack B', chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 100, stateOfChargePct: 80, internalResistanceMOhm: 12, cableResistanceMOhm: 2 },
  ],
  load: { currentA: 100 },
};

registerCalcPath({
  path: '/v1/parallel/share',
  tag: 'Parallel packs',
  summary: 'Share a load between packs in parallel',
  description:
    'Node-voltage solution for 2–8 packs on one bus, each its open-circuit voltage behind internal plus cable resistance: Σ(OCVᵢ − V)/Rᵢ = I_load. A constant-power load makes it a quadratic; a load above what the packs can deliver is a 422 calculation error. With `timeline: true` the discharge is stepped in time until the first pack reaches cut-off.',
  request: ParallelShareInputSchema,
  response: ParallelShareResultSchema,
  requestExample: shareExample,
  responseExample: computeParallelShare(ParallelShareInputSchema.parse(shareExample)),
});

const connectExample = {
  packA: { label: 'Pack A', chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 100, restingVoltageV: 53.6, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 },
  packB: { label: 'Pack B', chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 100, restingVoltageV: 52.0, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 },
  link: { resistanceMOhm: 4 },
};

registerCalcPath({
  path: '/v1/parallel/connect',
  tag: 'Parallel packs',
  summary: 'Connect two packs: inrush and equalization',
  description:
    "The current when two packs at different voltages are connected, (OCV_A − OCV_B) / R_total, integrated over time on the chemistries' OCV curves until it settles: settling time, charge moved, heat, a verdict against the packs' peak and continuous limits (`unsafe` with a danger check above either pack's peakDischargeA, or 2 × maxContinuousDischargeA), the largest safe voltage difference, and a pre-charge resistor. `voltageDifferenceV` is A minus B.",
  request: ParallelConnectInputSchema,
  response: ParallelConnectResultSchema,
  requestExample: connectExample,
  responseExample: (() => {
    const r = computeParallelConnect(ParallelConnectInputSchema.parse(connectExample));
    // Keep the documented example short: every 20th timeline point.
    return { ...r, data: { ...r.data, timeline: r.data.timeline.filter((_, i) => i % 20 === 0 || i === r.data.timeline.length - 1) } };
  })(),
});
