/**
 * Conductor sizes as the API reads and writes them, one-way lengths in metres or feet, and the
 * `GET /v1/reference/conductors` result.
 */
import { z } from 'zod';
import { conductorSizes, parseConductorSize } from '../calc/tables/conductors.ts';
import { calcResultSchema } from './common.ts';

export const ConductorSizeSchema = z
  .string()
  .trim()
  .min(1)
  .max(20)
  .refine((s) => parseConductorSize(s) !== undefined, {
    message: `Unknown conductor size. Write AWG as "10 AWG", "10", "1/0" or "4/0 AWG" (18 AWG to 4/0 AWG) and metric as "16 mm²" or "16 mm2" (${conductorSizes.filter((s) => s.endsWith('mm²')).join(', ')})`,
  })
  .meta({
    id: 'ConductorSize',
    description:
      'A copper conductor size. AWG: "10 AWG", "10", "1/0", "1/0 AWG" (18 to 4/0); metric: "16 mm²", "16 mm2", "16mm²" (1.5 to 120 mm²). Outputs always use "10 AWG", "1/0 AWG", "16 mm²".',
    example: '2/0 AWG',
  });

export const TemperatureRatingSchema = z
  .union([z.literal(60), z.literal(75), z.literal(90)], { error: 'Use 60, 75 or 90 (the insulation temperature column, °C)' })
  .meta({ description: 'Insulation temperature column of NEC Table 310.16, °C: 60, 75 or 90.', example: 75 });

export const oneWayLengthMSchema = z.number().positive().max(10_000).meta({ description: 'One-way run length, m (the conductor runs there and back).', example: 3 });
export const oneWayLengthFtSchema = z.number().positive().max(32_808).meta({ description: 'One-way run length, ft (the conductor runs there and back).', example: 10 });

/** Adds an issue unless exactly one of `oneWayLengthM` / `oneWayLengthFt` is present on `value`. */
export function requireExactlyOneLength(value: { oneWayLengthM?: number; oneWayLengthFt?: number }, ctx: z.RefinementCtx, path: PropertyKey[] = []) {
  const m = value.oneWayLengthM !== undefined;
  const ft = value.oneWayLengthFt !== undefined;
  if (m && ft) ctx.addIssue({ code: 'custom', path: [...path, 'oneWayLengthFt'], message: 'Give the one-way length once: oneWayLengthM or oneWayLengthFt, not both' });
  if (!m && !ft) ctx.addIssue({ code: 'custom', path: [...path, 'oneWayLengthM'], message: 'Give the one-way length as oneWayLengthM or oneWayLengthFt' });
}

const ampacityColumn = (column: string) =>
  z.number().nullable().meta({ description: `Allowable ampacity in the ${column} °C column, A, at 30 °C ambient and ≤ 3 current-carrying conductors; null when the table lists none.` });

export const ConductorRowSchema = z
  .object({
    size: z.string().meta({ example: '10 AWG' }),
    system: z.enum(['awg', 'metric']),
    areaMm2: z.number().meta({ example: 5.26 }),
    areaCmil: z.number().nullable().meta({ description: 'AWG sizes: NEC Chapter 9 Table 8 area, circular mils.' }),
    resistanceOhmPerKm20C: z.number().meta({ description: 'DC resistance at 20 °C, Ω/km.', example: 3.345 }),
    resistanceOhmPerKm75C: z.number().meta({ description: 'DC resistance at 75 °C, Ω/km.', example: 4.068 }),
    temperatureCoefficientPerC: z.number().meta({ description: 'α referred to 20 °C: R(T) = R20·[1 + α·(T − 20)].', example: 0.00393 }),
    ampacityA: z.object({ '60': ampacityColumn('60'), '75': ampacityColumn('75'), '90': ampacityColumn('90') }),
    ampacityGrade: z
      .object({
        '60': z.enum(['published', 'from_memory', 'derived']).nullable(),
        '75': z.enum(['published', 'from_memory', 'derived']).nullable(),
        '90': z.enum(['published', 'from_memory', 'derived']).nullable(),
      })
      .meta({ description: '"published" in NEC Table 310.16; "from_memory" not yet confirmed in print; "derived" computed here (metric sizes), not a published value.' }),
    smallConductorMaxOcpdA: z.number().nullable().meta({ description: 'NEC 240.4(D) maximum overcurrent protection, A (metric sizes: derived from the next smaller AWG size).' }),
  })
  .meta({ id: 'ConductorRow' });

export const ConductorsReferenceResultSchema = calcResultSchema(
  'ConductorsReferenceResult',
  z.object({
    edition: z.string().meta({ example: 'NFPA 70 National Electrical Code, 2023 edition' }),
    conductors: z.array(ConductorRowSchema),
    sources: z.array(z.string()),
  }),
  'The copper conductor table: area, resistance and ampacity by temperature column, with sources.',
);
