/**
 * POST /v1/charge/time — how long one or more sources take to charge a pack from one state of charge to
 * another: constant current, then a constant-voltage taper to the chemistry's termination current.
 */
import { z } from 'zod';
import { calcResultSchema, LabelSchema, PackSpecSchema } from './common.ts';

export const ChargeSourceSchema = z
  .strictObject({
    label: LabelSchema.optional().meta({ example: 'Mains charger' }),
    currentA: z.number().min(0).max(100_000).optional().meta({ description: 'The source’s maximum charge current into the pack, A.', example: 18 }),
    powerW: z
      .number()
      .min(0)
      .max(10_000_000)
      .optional()
      .meta({ description: 'The source’s power, W; it delivers powerW × efficiencyPct / 100 ÷ the pack’s open-circuit voltage, A.', example: 400 }),
    efficiencyPct: z
      .number()
      .gt(0)
      .max(100)
      .optional()
      .meta({ description: 'Conversion efficiency from the source to the pack, %. Default 100 (the rating is what reaches the pack).', example: 95 }),
  })
  .refine((s) => s.currentA !== undefined || s.powerW !== undefined, { message: 'Give currentA, powerW or both' })
  .meta({ id: 'ChargeSource', description: 'A charger, solar controller or other source; with both currentA and powerW, the lower current applies.' });

export const chargeTimeInputExample = {
  pack: { label: 'Shelf pack 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, maxChargeA: 50 },
  fromPct: 20,
  toPct: 100,
  sources: [{ label: 'Mains charger', currentA: 18 }, { label: 'Roof panels', powerW: 400, efficiencyPct: 95 }],
};

export const ChargeTimeInputSchema = z
  .strictObject({
    label: LabelSchema.optional(),
    pack: PackSpecSchema,
    fromPct: z.number().min(0).max(100).meta({ description: 'State of charge at the start, %.', example: 20 }),
    toPct: z.number().min(0).max(100).meta({ description: 'State of charge wanted, %; above fromPct.', example: 100 }),
    sources: z.array(ChargeSourceSchema).min(1).max(20).meta({ description: 'Sources charging together; their currents add.' }),
  })
  .superRefine((input, ctx) => {
    if (input.toPct <= input.fromPct) {
      ctx.addIssue({ code: 'custom', path: ['toPct'], message: `toPct must be above fromPct (${input.fromPct})` });
    }
  })
  .meta({ id: 'ChargeTimeInput', description: 'A pack, the states of charge to charge between, and the sources.', example: chargeTimeInputExample });

export type ChargeTimeInput = z.input<typeof ChargeTimeInputSchema>;

export const ChargeProfilePointSchema = z
  .object({
    minute: z.number().meta({ description: 'Minutes from the start.' }),
    socPct: z.number(),
    currentA: z.number().meta({ description: 'Current into the pack, A.' }),
    voltageV: z.number().meta({ description: 'Pack terminal voltage, V: open-circuit voltage + current × resistance in CC, the charge voltage in CV.' }),
  })
  .meta({ id: 'ChargeProfilePoint' });

export const ChargeTimeDataSchema = z
  .object({
    label: z.string().optional(),
    fromPct: z.number(),
    toPct: z.number(),
    totalHours: z.number().meta({ example: 4.48 }),
    constantCurrentHours: z.number(),
    taperHours: z.number().meta({ description: 'Time in the constant-voltage taper, h.' }),
    chargeCurrentA: z
      .number()
      .meta({ description: 'The constant current at the start: the sources’ current capped by the pack’s maxChargeA, A. A charge that starts inside the taper draws less (see profile).' }),
    chargeCRate: z.number().meta({ description: 'chargeCurrentA ÷ capacityAh, 1/h.' }),
    limitedBy: z.enum(['source', 'pack_limit']).meta({ description: 'What set the constant current at the start: the sources, or the pack’s maxChargeA.' }),
    sourceCurrentA: z.number().meta({ description: 'What the sources together could deliver at the start, A.' }),
    chargeVoltageV: z.number().meta({ description: 'Constant-voltage setpoint: series cells × full-charge cell voltage, V.' }),
    terminationCurrentA: z.number().meta({ description: 'The taper ends when the current falls to this, A (chemistry termination C-rate × capacity).' }),
    chargeAh: z.number().meta({ description: 'Charge delivered into the pack, Ah (stored charge ÷ coulombic efficiency).' }),
    energyIntoPackWh: z.number(),
    energyFromSourceWh: z.number().meta({ description: 'Energy taken from the sources, Wh (into the pack ÷ each source’s efficiency).' }),
    profile: z.array(ChargeProfilePointSchema).meta({ description: 'At most 121 points, evenly spaced in time, for a chart.' }),
  })
  .meta({ id: 'ChargeTimeData' });

export type ChargeTimeData = z.infer<typeof ChargeTimeDataSchema>;

export const ChargeTimeResultSchema = calcResultSchema('ChargeTimeResult', ChargeTimeDataSchema, 'Charge time in constant current and taper, with a profile.');
