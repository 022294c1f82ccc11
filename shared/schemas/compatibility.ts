/** `POST /v1/compatibility/check`: will an external pack work with a host unit, and how. */
import { z } from 'zod';
import { calcResultSchema, ChemistrySchema, finite, PackSpecSchema } from './common.ts';

export const HostDcInputSchema = z
  .strictObject({
    minVoltageV: finite().min(0).max(1500).meta({ description: 'Lowest input voltage the unit runs at, V.', example: 12 }),
    maxVoltageV: finite().positive().max(1500).meta({ description: 'Highest input voltage the unit accepts, V.', example: 60 }),
    maxCurrentA: finite().positive().max(10_000).meta({ description: 'Input current limit, A.', example: 15 }),
    maxPowerW: finite().positive().max(1_000_000).optional().meta({ description: 'Input power limit, W.', example: 500 }),
    efficiencyPct: finite()
      .positive()
      .max(100)
      .default(90)
      .meta({ description: "Conversion efficiency from the input to the unit's battery, %. Default 90 % (common practice, no published source).", example: 90 }),
  })
  .refine((v) => v.maxVoltageV > v.minVoltageV, { path: ['maxVoltageV'], message: 'maxVoltageV must be above minVoltageV' })
  .meta({ id: 'HostDcInput', description: 'The host unit\'s DC (solar-style) input window and limits.' });

export const HostBatterySchema = z
  .strictObject({
    chemistry: ChemistrySchema,
    seriesCells: z.number().int().min(1).max(400).meta({ example: 16 }),
    capacityAh: z.number().positive().max(100_000).optional().meta({ example: 50 }),
  })
  .meta({ id: 'HostBattery', description: "The host unit's own battery, for a direct parallel connection." });

export const CompatibilityInputSchema = z
  .strictObject({
    label: z.string().trim().min(1).max(80).optional(),
    host: z
      .strictObject({
        label: z.string().trim().min(1).max(80).optional(),
        dcInput: HostDcInputSchema.optional(),
        battery: HostBatterySchema.optional(),
      })
      .refine((h) => h.dcInput !== undefined || h.battery !== undefined, { path: ['dcInput'], message: 'Describe the host by dcInput, battery or both' }),
    external: PackSpecSchema,
  })
  .meta({
    id: 'CompatibilityInput',
    description: 'A host unit (its DC input and/or its battery) and an external pack.',
    example: {
      host: { dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500 }, battery: { chemistry: 'lfp', seriesCells: 16, capacityAh: 40 } },
      external: { label: 'Shelf pack 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 100, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 },
    },
  });

export type CompatibilityInput = z.output<typeof CompatibilityInputSchema>;

export const CompatibilityMethodSchema = z
  .object({
    method: z.enum(['dc_input', 'direct_parallel']),
    verdict: z.enum(['compatible', 'limited', 'incompatible']),
    inputPowerWAtFull: z.number().optional().meta({ description: 'Power the input draws with the pack at full-charge voltage, W.' }),
    inputPowerWAtCutoff: z.number().optional().meta({ description: 'Power the input draws with the pack at its cut-off voltage, W (0 when that is below the input\'s minimum).' }),
    addedEnergyWh: z.number().optional().meta({ description: 'Energy the host gains from the pack: dc_input after conversion losses; direct_parallel the pack\'s stored energy to cut-off, Wh.' }),
    hoursToTransfer: z.number().optional().meta({ description: 'Time for the input to draw the reachable energy at its caps, h.' }),
    usableSocRangePct: z
      .object({ fromPct: z.number(), toPct: z.number() })
      .optional()
      .meta({ description: 'The part of the pack the method can use: from its present state of charge down to this, %.' }),
    recommendedMaxDifferenceV: z.number().nullable().optional().meta({ description: 'direct_parallel: largest resting-voltage difference to connect at, V.' }),
    reasons: z.array(z.string()),
  })
  .meta({ id: 'CompatibilityMethod' });

export const CompatibilityDataSchema = z.object({
  external: z.object({
    label: z.string(),
    nominalVoltageV: z.number(),
    fullChargeVoltageV: z.number(),
    cutoffVoltageV: z.number(),
    openCircuitVoltageV: z.number(),
    stateOfChargePct: z.number(),
    storedEnergyWh: z.number().meta({ description: 'Energy from the present state down to 0 % on the OCV curve, Wh.' }),
  }),
  methods: z.array(CompatibilityMethodSchema),
});

export const CompatibilityResultSchema = calcResultSchema('CompatibilityResult', CompatibilityDataSchema, 'Whether and how the external pack works with the host, method by method.');
export type CompatibilityData = z.infer<typeof CompatibilityDataSchema>;
