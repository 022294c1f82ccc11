import { computeWireSize } from '#shared/calc/wire-size/wire-size.ts';
import { WireSizeInputSchema, WireSizeResultSchema } from '#shared/schemas/wire-size.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

const example = { currentA: 20, systemVoltageV: 48, oneWayLengthFt: 10 };

registerCalcPath({
  path: '/v1/wires/size',
  tag: 'Wiring',
  summary: 'Size a DC conductor',
  description:
    'The smallest copper conductor (AWG 18–4/0 or metric 1.5–120 mm²) that carries the current — 125 % of a continuous current after ambient and bundling corrections, NEC 2023 Table 310.16 in the chosen column — keeps the round-trip voltage drop within the limit, and can be protected by the fuse the current needs (NEC 240.4(D), 240.6(A)). Every size is listed with its pass/fail reasons. When no size fits the answer is still 200, with `recommended: null` and a danger check.',
  request: WireSizeInputSchema,
  response: WireSizeResultSchema,
  requestExample: example,
  responseExample: computeWireSize(WireSizeInputSchema.parse(example)),
});
