import { computeRuntime } from '#shared/calc/runtime/runtime.ts';
import { RuntimeInputSchema, RuntimeResultSchema, runtimeInputExample } from '#shared/schemas/runtime.ts';
import { registerCalcPath } from '../calc/calc.openapi.ts';

registerCalcPath({
  path: '/v1/runtime',
  tag: 'Runtime and charging',
  summary: 'Runtime of loads',
  description:
    'How long usable energy (or a pack, from its state of charge down to its depth-of-discharge floor) runs AC loads through an inverter and DC loads directly: battery power = Σ AC load × duty ÷ inverter efficiency + Σ DC load × duty + idle draw; runtime = usable Wh ÷ battery W. The peak current (every load on) is what wires and fuses must carry.',
  request: RuntimeInputSchema,
  response: RuntimeResultSchema,
  requestExample: runtimeInputExample,
  responseExample: computeRuntime(RuntimeInputSchema.parse(runtimeInputExample)),
});
