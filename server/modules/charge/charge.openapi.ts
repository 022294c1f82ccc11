import { computeChargeTime } from '#shared/calc/charge-time/charge-time.ts';
import { ChargeTimeInputSchema, ChargeTimeResultSchema, chargeTimeInputExample } from '#shared/schemas/charge-time.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

const example = computeChargeTime(ChargeTimeInputSchema.parse(chargeTimeInputExample));

registerCalcPath({
  path: '/v1/charge/time',
  tag: 'Runtime and charging',
  summary: 'Charge time (CC/CV)',
  description:
    'Constant current limited by the sources (a `currentA`, or `powerW × efficiencyPct / 100` over the pack’s open-circuit voltage at the present state of charge) and by the pack’s maxChargeA, then a constant-voltage taper decaying exponentially to the chemistry’s termination current. Returns the CC and taper times, the energy drawn and a profile of at most 121 points for a chart. Example: an 18 A charger fills an empty 100 Ah LFP pack in about 5.6 h.',
  request: ChargeTimeInputSchema,
  response: ChargeTimeResultSchema,
  requestExample: chargeTimeInputExample,
  // The example's profile is thinned to every tenth point to keep the document readable.
  responseExample: { ...example, data: { ...example.data, profile: example.data.profile.filter((_, i, all) => i % 10 === 0 || i === all.length - 1) } },
});
