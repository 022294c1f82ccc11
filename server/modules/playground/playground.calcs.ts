/**
 * The calculations the console's playground runs: for each, the v1 endpoint it stands for, the shared
 * input and result schemas, the pure calculator, and the request body of its playground route
 * (`{ keyId, input }`, where `input` is exactly the v1 request body). One table drives the routes, the
 * OpenAPI registrations and the role × route matrix test.
 */
import { z } from 'zod';
import { computeCapacityTest } from '#shared/calc/capacity-test/capacity-test.ts';
import { computeChargeTime } from '#shared/calc/charge-time/charge-time.ts';
import { computeCompatibility } from '#shared/calc/compatibility/compatibility.ts';
import { computeFuseSize } from '#shared/calc/fuse-size/fuse-size.ts';
import { computePackCompare } from '#shared/calc/pack-compare/pack-compare.ts';
import { computePackEnergy } from '#shared/calc/pack-energy/pack-energy.ts';
import { computeParallelConnect } from '#shared/calc/parallel-connect/parallel-connect.ts';
import { computeParallelShare } from '#shared/calc/parallel-share/parallel-share.ts';
import { computeRuntime } from '#shared/calc/runtime/runtime.ts';
import type { CalcOutput } from '#shared/calc/types.ts';
import { computeWireSize } from '#shared/calc/wire-size/wire-size.ts';
import { CapacityTestInputSchema, CapacityTestResultSchema, capacityTestInputExample } from '#shared/schemas/capacity-test.ts';
import { ChargeTimeInputSchema, ChargeTimeResultSchema, chargeTimeInputExample } from '#shared/schemas/charge-time.ts';
import { ChemistrySchema, LabelSchema } from '#shared/schemas/common.ts';
import { CompatibilityInputSchema, CompatibilityResultSchema } from '#shared/schemas/compatibility.ts';
import { FuseSizeInputSchema, FuseSizeResultSchema } from '#shared/schemas/fuse-size.ts';
import { PackCompareInputSchema, PackCompareResultSchema, packCompareInputExample } from '#shared/schemas/pack-compare.ts';
import { PackEnergyInputSchema, PackEnergyResultSchema, packEnergyInputExample } from '#shared/schemas/pack-energy.ts';
import { ParallelConnectInputSchema, ParallelConnectResultSchema } from '#shared/schemas/parallel-connect.ts';
import { ParallelShareInputSchema, ParallelShareResultSchema } from '#shared/schemas/parallel-share.ts';
import { RuntimeInputSchema, RuntimeResultSchema, runtimeInputExample } from '#shared/schemas/runtime.ts';
import { WireSizeInputSchema, WireSizeResultSchema } from '#shared/schemas/wire-size.ts';

/** Who may run playground calls: they spend the organization's quota, so not viewers. */
export const PLAYGROUND_ROLES = ['owner', 'admin', 'developer'] as const;

export const PlaygroundKeyIdSchema = z.uuid('Choose one of your organization’s server keys').meta({
  description: 'The server key of your organization the call is made under: it is checked, metered and counted against that key like any call.',
  example: '0b5f3a52-8c1e-4f7e-9a57-3c1d2e4f5a6b',
});

/**
 * A capacity-test log as the console uploads it: the CSV text and what `text/csv` calls pass in the query
 * string. Limited by the console API's JSON body limit (200 kB by default); larger logs go to
 * `POST /v1/capacity-tests/evaluate` as `text/csv` directly (up to 5 MB).
 */
export const PlaygroundCapacityCsvSchema = z
  .strictObject({
    text: z.string().min(1, 'Choose a CSV log').meta({ description: 'The CSV log: a header row (tS,currentA[,voltageV]) and one sample per row.', example: 'tS,currentA,voltageV\n0,20,53.2\n1800,20,52.9\n3600,20,52.8\n' }),
    ratedAh: z.number().positive().max(100_000).meta({ description: 'Rated capacity, Ah.', example: 100 }),
    chemistry: ChemistrySchema.optional(),
    label: LabelSchema.optional(),
  })
  .meta({ id: 'PlaygroundCapacityCsv', description: 'A capacity-test CSV log and the parameters a text/csv call passes as query parameters.' });

export interface PlaygroundCalculation {
  /** The v1 endpoint the calculation stands for, e.g. "/v1/packs/energy". */
  endpoint: string;
  /** The playground route below /console-api, e.g. "/playground/packs/energy". */
  path: string;
  summary: string;
  /** The route's JSON body: `{ keyId, input }` (capacity tests: `input` or `csv`). */
  body: z.ZodType;
  result: z.ZodType;
  /** Runs the calculator on an input already parsed with its schema. */
  compute: (input: unknown) => CalcOutput<unknown>;
  /** A worked request body for documentation and tests (without the key). */
  exampleInput: unknown;
}

function calculation<S extends z.ZodType>(options: {
  endpoint: string;
  summary: string;
  input: S;
  result: z.ZodType;
  compute: (input: z.output<S>) => CalcOutput<unknown>;
  exampleInput: unknown;
  body?: z.ZodType;
}): PlaygroundCalculation {
  const name = options.endpoint
    .slice('/v1/'.length)
    .split(/[/-]/)
    .map((w) => w[0]!.toUpperCase() + w.slice(1))
    .join('');
  return {
    endpoint: options.endpoint,
    path: `/playground${options.endpoint.slice('/v1'.length)}`,
    summary: options.summary,
    body:
      options.body ??
      z
        .strictObject({ keyId: PlaygroundKeyIdSchema, input: options.input })
        .meta({ id: `Playground${name}Request`, description: `A playground call: the key to run it under and the ${options.endpoint} request body.` }),
    result: options.result,
    compute: (input) => options.compute(input as z.output<S>),
    exampleInput: options.exampleInput,
  };
}

/** Every calculation endpoint of the v1 API, in the console's order. */
export const playgroundCalculations: PlaygroundCalculation[] = [
  calculation({ endpoint: '/v1/packs/energy', summary: 'Pack energy and value', input: PackEnergyInputSchema, result: PackEnergyResultSchema, compute: computePackEnergy, exampleInput: packEnergyInputExample }),
  calculation({ endpoint: '/v1/packs/compare', summary: 'Compare priced packs', input: PackCompareInputSchema, result: PackCompareResultSchema, compute: computePackCompare, exampleInput: packCompareInputExample }),
  calculation({ endpoint: '/v1/runtime', summary: 'Runtime on a set of loads', input: RuntimeInputSchema, result: RuntimeResultSchema, compute: computeRuntime, exampleInput: runtimeInputExample }),
  calculation({ endpoint: '/v1/charge/time', summary: 'Charge time and profile', input: ChargeTimeInputSchema, result: ChargeTimeResultSchema, compute: computeChargeTime, exampleInput: chargeTimeInputExample }),
  calculation({
    endpoint: '/v1/capacity-tests/evaluate',
    summary: 'Evaluate a capacity test',
    input: CapacityTestInputSchema,
    result: CapacityTestResultSchema,
    compute: computeCapacityTest,
    exampleInput: capacityTestInputExample,
    body: z
      .strictObject({
        keyId: PlaygroundKeyIdSchema,
        input: CapacityTestInputSchema.optional().meta({ description: 'The test as JSON (figures or samples), exactly as POST /v1/capacity-tests/evaluate takes it.' }),
        csv: PlaygroundCapacityCsvSchema.optional(),
      })
      .superRefine((v, ctx) => {
        if ((v.input === undefined) === (v.csv === undefined)) {
          ctx.addIssue({ code: 'custom', path: [v.input === undefined ? 'input' : 'csv'], message: 'Give the test as exactly one of input (JSON) or csv (a log)' });
        }
      })
      .meta({ id: 'PlaygroundCapacityTestsEvaluateRequest', description: 'A playground capacity test: the key to run it under, and the test as JSON or as a CSV log.' }),
  }),
  calculation({ endpoint: '/v1/wires/size', summary: 'Size a DC conductor', input: WireSizeInputSchema, result: WireSizeResultSchema, compute: computeWireSize, exampleInput: WireSizeInputSchema.meta()?.example }),
  calculation({ endpoint: '/v1/fuses/size', summary: 'Size a fuse', input: FuseSizeInputSchema, result: FuseSizeResultSchema, compute: computeFuseSize, exampleInput: FuseSizeInputSchema.meta()?.example }),
  calculation({ endpoint: '/v1/parallel/share', summary: 'Load sharing between parallel packs', input: ParallelShareInputSchema, result: ParallelShareResultSchema, compute: computeParallelShare, exampleInput: ParallelShareInputSchema.meta()?.example }),
  calculation({ endpoint: '/v1/parallel/connect', summary: 'Connecting two packs', input: ParallelConnectInputSchema, result: ParallelConnectResultSchema, compute: computeParallelConnect, exampleInput: ParallelConnectInputSchema.meta()?.example }),
  calculation({ endpoint: '/v1/compatibility/check', summary: 'External pack compatibility', input: CompatibilityInputSchema, result: CompatibilityResultSchema, compute: computeCompatibility, exampleInput: CompatibilityInputSchema.meta()?.example }),
];
