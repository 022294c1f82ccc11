/**
 * POST /v1/capacity-tests/evaluate — did a capacity test pass? From figures (measured Ah, discharge current)
 * or from a log of time / current (/ voltage) samples, as JSON or as a `text/csv` body.
 */
import { z } from 'zod';
import { calcResultSchema, ChemistrySchema, LabelSchema } from './common.ts';

export const CapacitySampleSchema = z
  .strictObject({
    tS: z.number().min(-1e9).max(1e9).meta({ description: 'Time, s; strictly increasing.', example: 0 }),
    currentA: z
      .number()
      .min(-1e6)
      .max(1e6)
      .meta({ description: 'Discharge current, A; its magnitude counts, so either sign convention works.', example: 20 }),
    voltageV: z.number().positive().max(2000).optional().meta({ description: 'Pack voltage, V; when every sample has it, energy is given too.', example: 52.1 }),
  })
  .meta({ id: 'CapacitySample' });

export const MAX_CAPACITY_SAMPLES = 500_000;

export const capacityTestInputExample = { ratedAh: 100, measuredAh: 96.4, dischargeCurrentA: 20, chemistry: 'lfp' };

export const CapacityTestInputSchema = z
  .strictObject({
    label: LabelSchema.optional(),
    chemistry: ChemistrySchema.optional().meta({ description: 'Optional; tells which discharge rate the rating is usually quoted at.' }),
    ratedAh: z.number().positive().max(100_000).meta({ description: 'Rated capacity, Ah.', example: 100 }),
    measuredAh: z.number().min(0).max(1_000_000).optional().meta({ description: 'Capacity the test delivered, Ah; give this or samples.', example: 96.4 }),
    dischargeCurrentA: z.number().positive().max(1_000_000).optional().meta({ description: 'With measuredAh: the test’s discharge current, A.', example: 20 }),
    samples: z
      .array(CapacitySampleSchema)
      .min(2)
      .max(MAX_CAPACITY_SAMPLES)
      .optional()
      .meta({ description: 'The test’s log; integrated with the trapezoidal rule.' }),
  })
  .superRefine((input, ctx) => {
    if (input.measuredAh === undefined && input.samples === undefined) {
      ctx.addIssue({ code: 'custom', path: ['measuredAh'], message: 'Give measuredAh or samples' });
    }
    if (input.measuredAh !== undefined && input.samples !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['measuredAh'], message: 'Give measuredAh or samples, not both' });
    }
    if (input.samples !== undefined && input.dischargeCurrentA !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['dischargeCurrentA'], message: 'dischargeCurrentA goes with measuredAh; with samples the current is read from the log' });
    }
  })
  .meta({
    id: 'CapacityTestInput',
    description:
      'A capacity test by figures (ratedAh, measuredAh, dischargeCurrentA) or by samples. The same endpoint accepts a text/csv log with a header row (tS,currentA[,voltageV]) and ratedAh (and optionally chemistry, label) as query parameters.',
    example: capacityTestInputExample,
  });

export type CapacityTestInput = z.input<typeof CapacityTestInputSchema>;

/** Query parameters that go with a `text/csv` body. */
export const CapacityTestCsvQuerySchema = z.strictObject({
  ratedAh: z.coerce.number().positive().max(100_000),
  chemistry: ChemistrySchema.optional(),
  label: LabelSchema.optional(),
});

export const capacityTestCsvExample = 'tS,currentA,voltageV\n0,20,53.2\n1800,20,52.9\n3600,20,52.8\n';

export const CapacityVerdictSchema = z
  .enum(['pass', 'marginal', 'fail'])
  .meta({ id: 'CapacityVerdict', description: 'pass: at least 90 % of rating; marginal: 80–90 %; fail: below 80 %.' });

export const CapacityTestDataSchema = z
  .object({
    label: z.string().optional(),
    ratedAh: z.number(),
    measuredAh: z.number().meta({ example: 96.4 }),
    measuredWh: z.number().optional().meta({ description: 'From samples that all carry a voltage: ∫ V·|I| dt, Wh.' }),
    dischargeCurrentA: z.number().nullable().meta({ description: 'The discharge current (with samples, the average: measuredAh ÷ duration), A; null when not known.' }),
    cRate: z.number().nullable().meta({ description: 'Discharge current ÷ ratedAh, 1/h; null when the current is not known.', example: 0.2 }),
    durationHours: z.number().optional().meta({ description: 'With samples: last tS − first tS, h.' }),
    averageVoltageV: z.number().optional(),
    sampleCount: z.number().int().optional(),
    stateOfHealthPct: z.number().meta({ description: 'measuredAh ÷ ratedAh × 100; not capped at 100.', example: 96.4 }),
    verdict: CapacityVerdictSchema,
  })
  .meta({ id: 'CapacityTestData' });

export type CapacityTestData = z.infer<typeof CapacityTestDataSchema>;

export const CapacityTestResultSchema = calcResultSchema('CapacityTestResult', CapacityTestDataSchema, 'Measured capacity, state of health and a verdict.');
