/**
 * Building blocks of the v1 contract shared by every calculation: the pack, the check, the response
 * envelope. Request objects are strict (unknown fields are rejected with a pointer to each).
 */
import { z } from 'zod';
import { chemistryIds } from '../calc/chemistry/presets.ts';

export const ChemistrySchema = z.enum(chemistryIds).meta({
  id: 'Chemistry',
  description: 'Cell chemistry preset: lfp, nmc, lto, lead_acid_agm, lead_acid_flooded.',
  example: 'lfp',
});

/** A finite number in a range; rejects NaN and ±Infinity (JSON cannot carry them, but callers of the core can). */
export const finite = () => z.number().refine(Number.isFinite, 'Must be a finite number');

export const LabelSchema = z.string().trim().min(1).max(80);

export const PackSpecSchema = z
  .strictObject({
    label: LabelSchema.optional().meta({ example: 'Shelf pack 48-100' }),
    chemistry: ChemistrySchema,
    seriesCells: z.number().int().min(1).max(400).meta({ description: 'Cells (or cell groups) in series.', example: 16 }),
    capacityAh: z.number().min(0.001).max(100_000).meta({ description: 'Rated capacity, Ah.', example: 100 }),
    stateOfChargePct: z.number().min(0).max(100).optional().meta({ description: 'State of charge, %. Used to look up the open-circuit voltage.', example: 50 }),
    restingVoltageV: z
      .number()
      .positive()
      .max(2000)
      .optional()
      .meta({ description: 'Measured rested pack voltage, V. When given, overrides the voltage looked up from stateOfChargePct.', example: 53.1 }),
    internalResistanceMOhm: z.number().min(0).max(100_000).optional().meta({ description: 'Pack internal resistance, mΩ (DC).', example: 8 }),
    maxContinuousDischargeA: z.number().positive().max(100_000).optional().meta({ example: 100 }),
    maxChargeA: z.number().positive().max(100_000).optional().meta({ example: 50 }),
    peakDischargeA: z.number().positive().max(1_000_000).optional().meta({ example: 200 }),
    peakDurationS: z.number().positive().max(86_400).optional().meta({ example: 5 }),
  })
  .meta({ id: 'PackSpec', description: 'A battery pack: chemistry, series cells and capacity, with optional state and limits.' });

export type PackSpec = z.infer<typeof PackSpecSchema>;

export const CheckSchema = z
  .object({
    code: z.string().meta({ example: 'depth_of_discharge_high' }),
    level: z.enum(['info', 'warning', 'danger']),
    message: z.string(),
  })
  .meta({ id: 'Check', description: 'A finding about the inputs or the result, by severity.' });

export const MoneySchema = z
  .strictObject({
    amount: z.number().min(0).max(100_000_000).meta({ example: 1299 }),
    currency: z
      .string()
      .regex(/^[A-Z]{3}$/, 'Use an ISO 4217 code such as USD or EUR')
      .meta({ example: 'USD' }),
  })
  .meta({ id: 'Money' });

/** The envelope of every successful calculation response. */
export function calcResultSchema<T extends z.ZodType>(id: string, data: T, description: string) {
  return z
    .object({
      data,
      checks: z.array(CheckSchema),
      cautions: z.array(z.string()).meta({ description: 'Safety cautions; always show them next to the result.' }),
      basis: z.array(z.string()).meta({ description: 'The tables, standards and models that produced the result.' }),
    })
    .meta({ id, description });
}
