/**
 * The playground's calculations: one per v1 calculation endpoint, and the demo scenario's values in each
 * form pass the form's schema and give a request body the API's own schema accepts.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { CapacityTestInputSchema } from '#shared/schemas/capacity-test.ts';
import { ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';
import { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';
import { FuseSizeInputSchema } from '#shared/schemas/fuse-size.ts';
import { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { PackEnergyInputSchema } from '#shared/schemas/pack-energy.ts';
import { ParallelConnectInputSchema } from '#shared/schemas/parallel-connect.ts';
import { ParallelShareInputSchema } from '#shared/schemas/parallel-share.ts';
import { RuntimeInputSchema } from '#shared/schemas/runtime.ts';
import { WireSizeInputSchema } from '#shared/schemas/wire-size.ts';
import { clean } from '../definition.ts';
import { capacityTest, sampleCapacityLog } from './capacity-test.tsx';
import { calculations } from './index.ts';
import { computeCapacityTest, parseCapacityLogCsv } from '#shared/calc/capacity-test/capacity-test.ts';

const apiSchemas: Record<string, z.ZodType> = {
  '/v1/packs/energy': PackEnergyInputSchema,
  '/v1/packs/compare': PackCompareInputSchema,
  '/v1/runtime': RuntimeInputSchema,
  '/v1/charge/time': ChargeTimeInputSchema,
  '/v1/capacity-tests/evaluate': CapacityTestInputSchema,
  '/v1/wires/size': WireSizeInputSchema,
  '/v1/fuses/size': FuseSizeInputSchema,
  '/v1/parallel/share': ParallelShareInputSchema,
  '/v1/parallel/connect': ParallelConnectInputSchema,
  '/v1/compatibility/check': CompatibilityInputSchema,
};

describe('the playground calculations', () => {
  it('when listed, then there is one per calculation endpoint of the OpenAPI document, each with a unique slug', () => {
    const document = JSON.parse(readFileSync('openapi/openapi.json', 'utf8')) as { paths: Record<string, Record<string, { security?: unknown[] }>> };
    const calculationPaths = Object.keys(document.paths).filter((p) => p.startsWith('/v1/') && document.paths[p]!.post && p !== '/v1/webhooks/stripe' && !p.startsWith('/v1/widgets'));
    const playgroundPaths = Object.keys(document.paths).filter((p) => p.startsWith('/console-api/playground/'));
    expect(calculations.map((c) => c.endpoint).sort()).toEqual(playgroundPaths.map((p) => p.replace('/console-api/playground', '/v1')).sort());
    for (const endpoint of calculations.map((c) => c.endpoint)) expect(calculationPaths).toContain(endpoint);
    expect(new Set(calculations.map((c) => c.slug)).size).toBe(calculations.length);
  });

  it.each(calculations.map((c) => [c.endpoint, c] as const))('when %s opens with the demo values, then they pass the form and the API schema', (endpoint, calc) => {
    expect(calc.formSchema.safeParse(calc.defaults).error).toBeUndefined();
    const body = calc.toRequest ? calc.toRequest(calc.defaults).body : { input: clean(calc.defaults.input) };
    expect(apiSchemas[endpoint]!.safeParse(body.input).error).toBeUndefined();
  });

  it('when the capacity test switches to the sample log, then the log parses and the CSV request carries it with the rating', () => {
    const text = sampleCapacityLog();
    const parsed = parseCapacityLogCsv(text);
    expect(parsed.ok).toBe(true);
    // 20 A for 4.8 h (0.2C on a rated 100 Ah): 96 Ah by the trapezoidal rule, exact for a constant current.
    if (parsed.ok) {
      expect(parsed.samples.at(-1)!.tS).toBe(17_280);
      expect(computeCapacityTest({ ratedAh: 100, samples: parsed.samples }).data.measuredAh).toBeCloseTo(96, 9);
    }
    const values = { ...capacityTest.defaults, mode: 'csv', csv: { fileName: 'log.csv', text, ratedAh: 100, chemistry: 'lfp' } };
    expect(capacityTest.formSchema.safeParse(values).error).toBeUndefined();
    expect(capacityTest.toRequest!(values)).toEqual({
      body: { csv: { text, ratedAh: 100, chemistry: 'lfp' } },
      snippet: { endpoint: '/v1/capacity-tests/evaluate', csv: { fileName: 'log.csv', query: { ratedAh: 100, chemistry: 'lfp' } } },
    });
  });

  it('when a CSV log has a bad row, then the form reports it before any call', () => {
    const values = { ...capacityTest.defaults, mode: 'csv', csv: { fileName: 'log.csv', text: 'tS,currentA\n0,20\nsoon,20\n', ratedAh: 100 } };
    const result = capacityTest.formSchema.safeParse(values);
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.path).toEqual(['csv', 'text']);
  });
});
