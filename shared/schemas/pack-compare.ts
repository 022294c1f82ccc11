/**
 * POST /v1/packs/compare — 2 to 20 priced options ranked by what a usable kWh costs, or, when every option
 * has a rated cycle life, by what a kWh cycled over the pack's life costs.
 */
import { z } from 'zod';
import { calcResultSchema, LabelSchema, MoneySchema, PackSpecSchema } from './common.ts';
import { CycleLifeSchema, DepthOfDischargePctSchema } from './pack-energy.ts';

export const PackCompareOptionSchema = z
  .strictObject({
    label: LabelSchema.meta({ description: 'How this option is named in the ranking.', example: 'Option A' }),
    pack: PackSpecSchema,
    depthOfDischargePct: DepthOfDischargePctSchema.optional(),
    price: MoneySchema,
    cycleLife: CycleLifeSchema.optional(),
  })
  .meta({ id: 'PackCompareOption', description: 'One priced pack to compare.' });

export const packCompareInputExample = {
  options: [
    { label: 'Option A', pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, price: { amount: 1450, currency: 'USD' }, cycleLife: 4000 },
    { label: 'Option B', pack: { chemistry: 'lfp', seriesCells: 4, capacityAh: 280 }, price: { amount: 690, currency: 'USD' }, cycleLife: 3500 },
    {
      label: 'Option C',
      pack: { chemistry: 'lead_acid_agm', seriesCells: 6, capacityAh: 200 },
      depthOfDischargePct: 50,
      price: { amount: 420, currency: 'USD' },
      cycleLife: 600,
    },
  ],
};

export const PackCompareInputSchema = z
  .strictObject({
    options: z.array(PackCompareOptionSchema).min(2).max(20).meta({ description: '2 to 20 options, all priced in one currency.' }),
  })
  .superRefine((input, ctx) => {
    const first = input.options[0]?.price.currency;
    input.options.forEach((option, i) => {
      if (option.price.currency !== first) {
        ctx.addIssue({
          code: 'custom',
          path: ['options', i, 'price', 'currency'],
          message: `Every option must be priced in one currency; option 0 is in ${first}, this one in ${option.price.currency}`,
        });
      }
    });
  })
  .meta({ id: 'PackCompareInput', description: 'Priced options to rank by cost per usable kWh or per kWh cycled.', example: packCompareInputExample });

export type PackCompareInput = z.input<typeof PackCompareInputSchema>;

export const PackCompareRankedOptionSchema = z
  .object({
    rank: z.number().int().meta({ description: '1 is the best value.', example: 1 }),
    label: z.string(),
    energyWh: z.number(),
    energyKWh: z.number(),
    depthOfDischargePct: z.number(),
    usableEnergyWh: z.number(),
    usableEnergyKWh: z.number(),
    price: MoneySchema,
    costPerUsableKWh: z.number().meta({ description: 'Price ÷ usable kWh.' }),
    cycleLife: z.number().int().optional(),
    lifetimeThroughputKWh: z.number().optional(),
    costPerKWhCycled: z.number().optional().meta({ description: 'Price ÷ (usable kWh × rated cycles).' }),
    relativeToBest: z
      .number()
      .meta({ description: 'This option’s ranking figure ÷ the best option’s: 1 for the best, 1.25 means 25 % more per kWh.', example: 1.25 }),
  })
  .meta({ id: 'PackCompareRankedOption' });

export const PackCompareDataSchema = z
  .object({
    rankedBy: z.enum(['costPerKWhCycled', 'costPerUsableKWh']).meta({
      description: 'costPerKWhCycled when every option has a cycleLife, otherwise costPerUsableKWh.',
    }),
    currency: z.string().meta({ example: 'USD' }),
    options: z.array(PackCompareRankedOptionSchema).meta({ description: 'Best value first (lowest ranking figure); ties keep the order given.' }),
  })
  .meta({ id: 'PackCompareData' });

export type PackCompareData = z.infer<typeof PackCompareDataSchema>;

export const PackCompareResultSchema = calcResultSchema('PackCompareResult', PackCompareDataSchema, 'The options ranked best value first.');
