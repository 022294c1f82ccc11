/** `POST /v1/wires/size`: the smallest copper conductor for a DC run. */
import { z } from 'zod';
import { calcResultSchema, finite } from './common.ts';
import { oneWayLengthFtSchema, oneWayLengthMSchema, requireExactlyOneLength, TemperatureRatingSchema } from './conductors.ts';

export const WireSizeInputSchema = z
  .strictObject({
    label: z.string().trim().min(1).max(80).optional().meta({ example: 'Pack to inverter' }),
    currentA: finite().positive().max(4000).meta({ description: 'Current the conductor carries, A.', example: 20 }),
    continuous: z
      .boolean()
      .default(true)
      .meta({ description: 'Continuous (3 h or more; battery circuits usually are): ampacity must be at least 125 % of the current.', example: true }),
    systemVoltageV: finite().positive().max(1500).meta({ description: 'Nominal system voltage, V, for the voltage-drop percentage.', example: 48 }),
    oneWayLengthM: oneWayLengthMSchema.optional(),
    oneWayLengthFt: oneWayLengthFtSchema.optional(),
    maxVoltageDropPct: finite().positive().max(50).default(3).meta({ description: 'Largest round-trip voltage drop allowed, % of systemVoltageV.', example: 3 }),
    material: z.literal('copper').default('copper').meta({ description: 'Conductor material; copper only.' }),
    temperatureRatingC: TemperatureRatingSchema.default(75),
    ambientTempC: finite().min(-40).max(100).default(30).meta({ description: 'Ambient temperature around the conductor, °C.', example: 30 }),
    currentCarryingConductors: z
      .number()
      .int()
      .min(1)
      .max(200)
      .default(2)
      .meta({ description: 'Current-carrying conductors in the same raceway or cable (a DC run is 2).', example: 2 }),
    sizeSystem: z.enum(['awg', 'metric']).default('awg').meta({ description: 'Which sizes to choose from.', example: 'awg' }),
  })
  .superRefine((v, ctx) => requireExactlyOneLength(v, ctx))
  .meta({
    id: 'WireSizeInput',
    description: 'A DC conductor run: current, system voltage, one-way length (m or ft) and the installation conditions.',
    example: { currentA: 20, systemVoltageV: 48, oneWayLengthFt: 10 },
  });

export type WireSizeInput = z.output<typeof WireSizeInputSchema>;

export const WireCriterionSchema = z.enum(['ampacity', 'voltage_drop', 'protection']);
export type WireCriterion = z.infer<typeof WireCriterionSchema>;

export const WireCandidateSchema = z
  .object({
    size: z.string().meta({ example: '10 AWG' }),
    areaMm2: z.number(),
    ampacityA: z.number().nullable().meta({ description: 'Table ampacity in the chosen column (30 °C, ≤ 3 conductors), A; null when none is listed.' }),
    deratedAmpacityA: z.number().nullable().meta({ description: 'After ambient correction and bundling adjustment, A.' }),
    maxOvercurrentProtectionA: z
      .number()
      .nullable()
      .meta({ description: 'Largest overcurrent device that protects this conductor here: derated ampacity, capped by NEC 240.4(D), A.' }),
    resistanceOhm: z.number().meta({ description: 'Round-trip DC resistance at the conductor temperature, Ω.' }),
    voltageDropV: z.number(),
    voltageDropPct: z.number(),
    powerLossW: z.number(),
    passes: z.boolean(),
    failed: z.array(WireCriterionSchema).meta({ description: 'The criteria this size fails.' }),
    reasons: z.array(z.string()).meta({ description: 'One line per criterion, pass or fail, with the numbers.' }),
  })
  .meta({ id: 'WireCandidate' });

export const WireSizeDataSchema = z.object({
  recommended: z
    .object({
      size: z.string().meta({ example: '10 AWG' }),
      areaMm2: z.number(),
      ampacityA: z.number(),
      deratedAmpacityA: z.number(),
      voltageDropV: z.number(),
      voltageDropPct: z.number(),
      powerLossW: z.number(),
      resistanceOhm: z.number(),
      maxOvercurrentProtectionA: z.number(),
    })
    .nullable()
    .meta({ description: 'The smallest size that passes every criterion; null (with a danger check) when none in the table does.' }),
  limitedBy: WireCriterionSchema.meta({
    description: 'The criterion that forced the choice: the one whose smallest passing size is the largest (or, with no recommendation, the one the largest size fails).',
  }),
  requiredAmpacityA: z.number().meta({ description: '125 % of the current when continuous, else the current, A.' }),
  fuseRatingA: z.number().nullable().meta({ description: 'The overcurrent device this current needs: the smallest NEC 240.6(A) standard rating at or above requiredAmpacityA, A.' }),
  oneWayLengthM: z.number(),
  oneWayLengthFt: z.number(),
  conductorTempC: z.number().meta({ description: 'Conductor temperature used for resistance (the insulation rating: the worst case the ampacity allows), °C.' }),
  ambientCorrectionFactor: z.number().nullable(),
  bundlingAdjustmentFactor: z.number(),
  candidates: z.array(WireCandidateSchema),
});

export const WireSizeResultSchema = calcResultSchema('WireSizeResult', WireSizeDataSchema, 'The recommended conductor, why, and every size considered.');
export type WireSizeData = z.infer<typeof WireSizeDataSchema>;
