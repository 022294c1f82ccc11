/**
 * POST /v1/runtime — how long a pack (or a known usable energy) runs a set of AC and DC loads, the AC ones
 * through an inverter.
 */
import { z } from 'zod';
import { calcResultSchema, LabelSchema, PackSpecSchema } from './common.ts';
import { DepthOfDischargePctSchema } from './pack-energy.ts';

export const RuntimeLoadSchema = z
  .strictObject({
    label: LabelSchema.optional().meta({ example: 'Fridge' }),
    powerW: z.number().positive().max(10_000_000).meta({ description: 'The load’s power while running, W.', example: 120 }),
    ac: z.boolean().optional().meta({ description: 'Whether the load runs on AC through the inverter. Default true; false for loads on the DC bus.', example: true }),
    dutyCyclePct: z
      .number()
      .gt(0)
      .max(100)
      .optional()
      .meta({ description: 'Share of the time the load runs, %. Default 100 (always on).', example: 40 }),
  })
  .meta({ id: 'RuntimeLoad' });

export const runtimeInputExample = {
  pack: { label: 'Shelf pack 48-100', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 },
  loads: [
    { label: 'Fridge', powerW: 120, dutyCyclePct: 40 },
    { label: 'Laptop', powerW: 65 },
    { label: 'DC lights', powerW: 24, ac: false },
  ],
  inverterEfficiencyPct: 90,
  idleDrawW: 15,
};

export const RuntimeInputSchema = z
  .strictObject({
    label: LabelSchema.optional(),
    usableEnergyWh: z.number().positive().max(1_000_000_000).optional().meta({ description: 'Usable energy, Wh; give this or pack.', example: 4096 }),
    nominalVoltageV: z
      .number()
      .positive()
      .max(2000)
      .optional()
      .meta({ description: 'With usableEnergyWh only: the battery’s nominal voltage, V, so that the battery current can be given.', example: 51.2 }),
    pack: PackSpecSchema.optional().meta({
      description:
        'The pack; its usable energy is nominal energy × depth of discharge, starting from stateOfChargePct (or restingVoltageV) when given, else full.',
    }),
    depthOfDischargePct: DepthOfDischargePctSchema.optional(),
    loads: z.array(RuntimeLoadSchema).min(1).max(100),
    inverterEfficiencyPct: z
      .number()
      .min(10)
      .max(100)
      .optional()
      .meta({ description: 'Inverter efficiency for the AC loads, %. Default 90 (common practice).', example: 90 }),
    idleDrawW: z
      .number()
      .min(0)
      .max(1_000_000)
      .optional()
      .meta({ description: 'Constant draw at the battery besides the loads (inverter no-load draw, BMS, monitors), W. Default 0.', example: 15 }),
  })
  .superRefine((input, ctx) => {
    if (input.usableEnergyWh === undefined && input.pack === undefined) {
      ctx.addIssue({ code: 'custom', path: ['usableEnergyWh'], message: 'Give usableEnergyWh or pack' });
    }
    if (input.usableEnergyWh !== undefined && input.pack !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['usableEnergyWh'], message: 'Give usableEnergyWh or pack, not both' });
    }
    if (input.pack === undefined && input.depthOfDischargePct !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['depthOfDischargePct'], message: 'depthOfDischargePct applies to a pack; usableEnergyWh is already usable' });
    }
    if (input.pack !== undefined && input.nominalVoltageV !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['nominalVoltageV'], message: 'nominalVoltageV applies with usableEnergyWh; a pack’s own voltage is used' });
    }
  })
  .meta({ id: 'RuntimeInput', description: 'Usable energy or a pack, and the loads it runs.', example: runtimeInputExample });

export type RuntimeInput = z.input<typeof RuntimeInputSchema>;

export const RuntimeDataSchema = z
  .object({
    label: z.string().optional(),
    usableEnergyWh: z.number().meta({ description: 'Energy available to the loads, Wh.' }),
    usableEnergyKWh: z.number(),
    acLoadPowerW: z.number().meta({ description: 'Average AC load (power × duty cycle, summed), W.' }),
    dcLoadPowerW: z.number().meta({ description: 'Average DC load, W.' }),
    inverterLossW: z.number().meta({ description: 'AC load ÷ efficiency − AC load, W.' }),
    idleDrawW: z.number(),
    batteryPowerW: z.number().meta({ description: 'Average power drawn from the battery, W.' }),
    batteryCurrentA: z.number().optional().meta({ description: 'batteryPowerW ÷ nominal voltage, A (when a voltage is known).' }),
    peakBatteryPowerW: z.number().meta({ description: 'Battery power with every load on at once, W.' }),
    peakBatteryCurrentA: z.number().optional().meta({ description: 'peakBatteryPowerW ÷ nominal voltage, A: size wires and fuses for at least this.' }),
    nominalVoltageV: z.number().optional(),
    runtimeHours: z.number().meta({ description: 'usableEnergyWh ÷ batteryPowerW, h.' }),
    runtimeMinutes: z.number(),
  })
  .meta({ id: 'RuntimeData' });

export type RuntimeData = z.infer<typeof RuntimeDataSchema>;

export const RuntimeResultSchema = calcResultSchema('RuntimeResult', RuntimeDataSchema, 'Battery power, current and runtime for the loads.');
