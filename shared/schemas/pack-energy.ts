/**
 * POST /v1/packs/energy — how much energy a pack holds, how much of it is usable, and what a usable kWh
 * (and a kWh cycled over the pack's life) costs.
 */
import { z } from 'zod';
import { calcResultSchema, ChemistrySchema, LabelSchema, MoneySchema, PackSpecSchema } from './common.ts';

/** Depth of discharge a user plans to use, %; 1–100 (below 1 % the cost per kWh is meaningless). */
export const DepthOfDischargePctSchema = z
  .number()
  .min(1)
  .max(100)
  .meta({ description: 'Planned depth of discharge, %. Default: the chemistry preset’s default (LFP 80, NMC 80, LTO 90, lead-acid 50).', example: 80 });

/** Rated cycles to end of life at the planned depth of discharge. */
export const CycleLifeSchema = z
  .number()
  .int()
  .min(1)
  .max(1_000_000)
  .meta({ description: 'Rated cycles to end of life at the planned depth of discharge (from the pack’s datasheet).', example: 4000 });

export const packEnergyInputExample = {
  pack: { label: 'Shelf pack 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 },
  depthOfDischargePct: 90,
  price: { amount: 1450, currency: 'USD' },
  cycleLife: 4000,
};

export const PackEnergyInputSchema = z
  .strictObject({
    label: LabelSchema.optional().meta({ description: 'Your name for this calculation; echoed back.' }),
    pack: PackSpecSchema,
    depthOfDischargePct: DepthOfDischargePctSchema.optional(),
    price: MoneySchema.optional().meta({ description: 'What the pack costs; gives the cost per usable kWh.' }),
    cycleLife: CycleLifeSchema.optional(),
  })
  .meta({
    id: 'PackEnergyInput',
    description: 'A pack, with an optional planned depth of discharge, price and rated cycle life.',
    example: packEnergyInputExample,
  });

export type PackEnergyInput = z.input<typeof PackEnergyInputSchema>;

export const PackEnergyDataSchema = z
  .object({
    label: z.string().optional(),
    chemistry: ChemistrySchema,
    seriesCells: z.number().int(),
    nominalVoltageV: z.number().meta({ description: 'Series cells × the chemistry’s nominal cell voltage, V.', example: 51.2 }),
    fullChargeVoltageV: z.number().meta({ description: 'Series cells × the full-charge (absorption) cell voltage, V.', example: 58.4 }),
    cutoffVoltageV: z.number().meta({ description: 'Series cells × the discharge cut-off cell voltage, V.', example: 40 }),
    capacityAh: z.number().meta({ example: 100 }),
    energyWh: z.number().meta({ description: 'Nominal voltage × rated capacity, Wh.', example: 5120 }),
    energyKWh: z.number().meta({ example: 5.12 }),
    depthOfDischargePct: z.number().meta({ description: 'The depth of discharge used (given or the chemistry default), %.', example: 90 }),
    usableEnergyWh: z.number().meta({ description: 'energyWh × depth of discharge, Wh.', example: 4608 }),
    usableEnergyKWh: z.number().meta({ example: 4.608 }),
    currency: z.string().optional().meta({ example: 'USD' }),
    costPerUsableKWh: z.number().optional().meta({ description: 'Price ÷ usable kWh, in the price’s currency.', example: 314.67 }),
    cycleLife: z.number().int().optional(),
    lifetimeThroughputKWh: z.number().optional().meta({ description: 'Usable kWh × rated cycles: the energy delivered over the pack’s rated life.', example: 18432 }),
    costPerKWhCycled: z.number().optional().meta({ description: 'Price ÷ lifetime throughput, in the price’s currency per kWh.', example: 0.0787 }),
  })
  .meta({ id: 'PackEnergyData' });

export type PackEnergyData = z.infer<typeof PackEnergyDataSchema>;

export const PackEnergyResultSchema = calcResultSchema(
  'PackEnergyResult',
  PackEnergyDataSchema,
  'Pack voltages, energy and usable energy, with the cost per usable kWh and per kWh cycled when a price (and cycle life) is given.',
);
