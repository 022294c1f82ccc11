/** GET /v1/reference/chemistries — the chemistry presets every calculation uses. */
import { z } from 'zod';
import { calcResultSchema, ChemistrySchema } from './common.ts';

export const ChemistryReferenceSchema = z
  .object({
    id: ChemistrySchema,
    name: z.string().meta({ example: 'Lithium iron phosphate (LFP, LiFePO₄/graphite)' }),
    nominalCellVoltageV: z.number().meta({ example: 3.2 }),
    fullChargeCellVoltageV: z.number().meta({ description: 'Charge (absorption / constant-voltage) voltage per cell, V.', example: 3.65 }),
    cutoffCellVoltageV: z.number().meta({ description: 'End-of-discharge voltage per cell, V.', example: 2.5 }),
    defaultDepthOfDischargePct: z.number().meta({ example: 80 }),
    ocvCurve: z
      .array(z.object({ socPct: z.number(), cellVoltageV: z.number() }))
      .meta({ description: 'Rested open-circuit voltage per cell against state of charge; interpolate linearly between points.' }),
    sources: z.array(z.string()),
  })
  .meta({ id: 'ChemistryReference' });

export const ChemistriesDataSchema = z
  .object({ chemistries: z.array(ChemistryReferenceSchema) })
  .meta({ id: 'ChemistriesData' });

export type ChemistriesData = z.infer<typeof ChemistriesDataSchema>;

export const ChemistriesResultSchema = calcResultSchema(
  'ChemistriesResult',
  ChemistriesDataSchema,
  'The chemistry presets: per-cell voltages, default depth of discharge, open-circuit-voltage curve and sources.',
);
