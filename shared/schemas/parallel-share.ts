/** `POST /v1/parallel/share`: how 2–8 packs in parallel share a load. */
import { z } from 'zod';
import { calcResultSchema, finite, PackSpecSchema } from './common.ts';

export const ParallelPackSchema = PackSpecSchema.extend({
  cableResistanceMOhm: finite()
    .min(0)
    .max(100_000)
    .optional()
    .meta({ description: "Resistance of this pack's cables to the common bus, both poles together, mΩ.", example: 2 }),
}).meta({ id: 'ParallelPack', description: 'A pack on a common bus, with its cable resistance to the bus.' });

export const ParallelShareInputSchema = z
  .strictObject({
    label: z.string().trim().min(1).max(80).optional(),
    packs: z.array(ParallelPackSchema).min(2).max(8),
    load: z
      .strictObject({
        currentA: finite().positive().max(100_000).optional().meta({ description: 'Constant-current load, A.', example: 100 }),
        powerW: finite().positive().max(10_000_000).optional().meta({ description: 'Constant-power load, W (the current rises as the bus voltage falls).', example: 3000 }),
      })
      .superRefine((v, ctx) => {
        if ((v.currentA === undefined) === (v.powerW === undefined)) {
          ctx.addIssue({ code: 'custom', path: [v.currentA === undefined ? 'currentA' : 'powerW'], message: 'Give the load as exactly one of currentA or powerW' });
        }
      }),
    timeline: z.boolean().default(false).meta({ description: 'Also step the discharge in time until the first pack reaches its cut-off.' }),
  })
  .meta({
    id: 'ParallelShareInput',
    description: 'Packs in parallel on one bus and the load they carry.',
    example: {
      packs: [
        { label: 'Pack A', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 80, internalResistanceMOhm: 8, cableResistanceMOhm: 2 },
        { label: 'Pack B', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 80, internalResistanceMOhm: 12, cableResistanceMOhm: 2 },
      ],
      load: { currentA: 100 },
    },
  });

export type ParallelShareInput = z.output<typeof ParallelShareInputSchema>;

export const ParallelShareDataSchema = z.object({
  busVoltageV: z.number(),
  loadCurrentA: z.number(),
  loadPowerW: z.number(),
  maxDeliverablePowerW: z.number().meta({ description: 'The most power the packs can put into any load at this moment: V_th² / (4 R_th), W.' }),
  packs: z.array(
    z.object({
      label: z.string(),
      openCircuitVoltageV: z.number(),
      stateOfChargePct: z.number(),
      resistanceMOhm: z.number().meta({ description: 'Internal plus cable resistance, mΩ.' }),
      currentA: z.number().meta({ description: 'Current out of the pack, A; negative: the pack is being charged by the others.' }),
      powerW: z.number().meta({ description: 'Power the pack delivers to the bus, W.' }),
      sharePct: z.number().meta({ description: 'currentA ÷ the load current, %.' }),
    }),
  ),
  timeToFirstCutoffS: z.number().nullable(),
  timeToFirstCutoffH: z.number().nullable(),
  firstCutoffPack: z.string().nullable(),
  timeline: z
    .array(
      z.object({
        tS: z.number(),
        busVoltageV: z.number(),
        loadCurrentA: z.number(),
        packs: z.array(z.object({ currentA: z.number(), stateOfChargePct: z.number() })),
      }),
    )
    .optional()
    .meta({ description: 'When asked: the discharge stepped in time until the first pack reaches cut-off (at most 201 points).' }),
});

export const ParallelShareResultSchema = calcResultSchema('ParallelShareResult', ParallelShareDataSchema, 'Bus voltage and each pack\'s share of the load.');
export type ParallelShareData = z.infer<typeof ParallelShareDataSchema>;
