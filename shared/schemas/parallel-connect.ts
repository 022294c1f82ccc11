/** `POST /v1/parallel/connect`: what happens when two packs at different voltages are connected. */
import { z } from 'zod';
import { calcResultSchema, finite, PackSpecSchema } from './common.ts';
import { ConductorSizeSchema, oneWayLengthFtSchema, oneWayLengthMSchema, requireExactlyOneLength } from './conductors.ts';

export const ConnectionCableSchema = z
  .strictObject({
    size: ConductorSizeSchema,
    oneWayLengthM: oneWayLengthMSchema.optional(),
    oneWayLengthFt: oneWayLengthFtSchema.optional(),
  })
  .superRefine((v, ctx) => requireExactlyOneLength(v, ctx))
  .meta({ id: 'ConnectionCable', description: 'A copper cable pair between the packs: size and one-way length (the current runs there and back).' });

export const ConnectionLinkSchema = z
  .strictObject({
    resistanceMOhm: finite().min(0).max(100_000).optional().meta({ description: 'Resistance of the connection (cables, switch, fuse), both poles, mΩ.', example: 4 }),
    cable: ConnectionCableSchema.optional(),
  })
  .superRefine((v, ctx) => {
    if ((v.resistanceMOhm === undefined) === (v.cable === undefined)) {
      ctx.addIssue({ code: 'custom', path: [v.resistanceMOhm === undefined ? 'resistanceMOhm' : 'cable'], message: 'Give the link as exactly one of resistanceMOhm or cable' });
    }
  })
  .meta({ id: 'ConnectionLink', description: 'What joins the packs: a resistance, or a cable from the conductor table.' });

export const ParallelConnectInputSchema = z
  .strictObject({
    label: z.string().trim().min(1).max(80).optional(),
    packA: PackSpecSchema,
    packB: PackSpecSchema,
    link: ConnectionLinkSchema.optional(),
    prechargeTargetA: finite().positive().max(100_000).optional().meta({ description: 'Largest current wanted through a pre-charge resistor, A (default: the packs\' continuous limit).', example: 10 }),
  })
  .meta({
    id: 'ParallelConnectInput',
    description: 'Two packs about to be connected in parallel, and the link between them.',
    example: {
      packA: { label: 'Pack A', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, restingVoltageV: 53.6, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 },
      packB: { label: 'Pack B', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, restingVoltageV: 52.0, internalResistanceMOhm: 8, maxContinuousDischargeA: 100, peakDischargeA: 200 },
      link: { resistanceMOhm: 4 },
    },
  });

export type ParallelConnectInput = z.output<typeof ParallelConnectInputSchema>;

export const ConnectionVerdictSchema = z.enum(['safe', 'caution', 'unsafe']);

export const ParallelConnectDataSchema = z.object({
  voltageDifferenceV: z.number().meta({ description: "Pack A's open-circuit voltage minus pack B's, V (positive when A is higher)." }),
  totalResistanceMOhm: z.number().meta({ description: 'Both internal resistances plus the link, mΩ.' }),
  linkResistanceMOhm: z.number(),
  initialCurrentA: z.number().meta({ description: 'Current at the moment of connection, A: voltageDifferenceV ÷ total resistance; positive when it flows from A into B.' }),
  peakLimitA: z.number().nullable().meta({ description: 'The lower of the two packs\' peak limits (peakDischargeA, or 2 × maxContinuousDischargeA), A.' }),
  continuousLimitA: z.number().nullable().meta({ description: 'The lowest continuous limit that applies (both maxContinuousDischargeA, the receiving pack\'s maxChargeA), A.' }),
  timeToSettleS: z.number().nullable().meta({ description: 'Time until the current falls to 1 % of its initial value, s; null if not reached within the simulation.' }),
  chargeTransferredAh: z.number().meta({ description: 'Charge moved from A into B until then, Ah (negative: from B into A).' }),
  energyLossWh: z.number().meta({ description: 'Heat in the whole loop (both packs and the link) until then, Wh.' }),
  linkEnergyLossWh: z.number().meta({ description: 'The part of that heat dissipated in the link, Wh.' }),
  finalStateOfChargeAPct: z.number(),
  finalStateOfChargeBPct: z.number(),
  verdict: ConnectionVerdictSchema,
  recommendedMaxDifferenceV: z.number().nullable().meta({ description: 'The largest voltage difference whose initial current stays within continuousLimitA, V.' }),
  precharge: z
    .object({
      needed: z.boolean(),
      targetCurrentA: z.number(),
      resistanceOhm: z.number().meta({ description: 'Series resistor that limits the initial current to targetCurrentA, Ω.' }),
      peakPowerW: z.number().meta({ description: 'Power in the resistor at the moment of connection, W.' }),
      energyJ: z.number().meta({ description: 'Energy the resistor absorbs until the difference falls to bypassAtDifferenceV, J.' }),
      bypassAtDifferenceV: z.number().meta({ description: 'Close the main connection once the difference is at or below this, V.' }),
      timeToBypassS: z.number().nullable(),
    })
    .nullable(),
  endReason: z.enum(['settled', 'soc_limit', 'step_limit']),
  timeline: z
    .array(z.object({ tS: z.number(), currentA: z.number(), socAPct: z.number(), socBPct: z.number() }))
    .meta({ description: 'The equalization over time (at most 201 points, denser where the current changes fast).' }),
});

export const ParallelConnectResultSchema = calcResultSchema('ParallelConnectResult', ParallelConnectDataSchema, 'The connection inrush, its decay, a verdict and a pre-charge resistor.');
export type ParallelConnectData = z.infer<typeof ParallelConnectDataSchema>;
