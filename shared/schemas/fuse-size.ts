/** `POST /v1/fuses/size`: the overcurrent device for a battery circuit. */
import { z } from 'zod';
import { calcResultSchema, finite, PackSpecSchema } from './common.ts';
import { ConductorSizeSchema, TemperatureRatingSchema } from './conductors.ts';

export const FuseSizeInputSchema = z
  .strictObject({
    label: z.string().trim().min(1).max(80).optional().meta({ example: 'Main battery fuse' }),
    continuousCurrentA: finite().positive().max(4000).meta({ description: 'The continuous current the circuit carries, A.', example: 80 }),
    conductor: z
      .strictObject({
        size: ConductorSizeSchema,
        temperatureRatingC: TemperatureRatingSchema.default(75),
      })
      .optional()
      .meta({ description: 'The conductor the fuse protects; its ampacity (NEC Table 310.16, 30 °C, ≤ 3 conductors) and 240.4(D) limit cap the rating.' }),
    source: PackSpecSchema.optional().meta({ description: 'The battery feeding a fault: its full-charge voltage over its internal resistance (plus linkResistanceMOhm) gives the prospective short-circuit current.' }),
    linkResistanceMOhm: finite()
      .min(0)
      .max(100_000)
      .optional()
      .meta({ description: 'Resistance between the source and the fault (cables, connectors), mΩ; not given: zero.', example: 1.27 }),
    prospectiveShortCircuitA: finite().positive().max(10_000_000).optional().meta({ description: 'Known prospective short-circuit current, A (instead of a source).' }),
    systemMaxVoltageV: finite().positive().max(1500).optional().meta({ description: 'Highest voltage the circuit sees, V (instead of, or above, the source full-charge voltage).' }),
  })
  .superRefine((v, ctx) => {
    if (v.source && v.prospectiveShortCircuitA !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['prospectiveShortCircuitA'], message: 'Give either source or prospectiveShortCircuitA, not both' });
    }
    if (v.linkResistanceMOhm !== undefined && !v.source) {
      ctx.addIssue({ code: 'custom', path: ['linkResistanceMOhm'], message: 'linkResistanceMOhm needs a source pack' });
    }
  })
  .meta({
    id: 'FuseSizeInput',
    description: 'A circuit to protect: its continuous current, optionally the conductor, and the source battery (or a known short-circuit current).',
    example: {
      continuousCurrentA: 80,
      conductor: { size: '2 AWG' },
      source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100, internalResistanceMOhm: 2 },
      linkResistanceMOhm: 1.27,
    },
  });

export type FuseSizeInput = z.output<typeof FuseSizeInputSchema>;

export const FuseSizeDataSchema = z.object({
  minimumRatingA: z.number().meta({ description: '125 % of the continuous current, rounded up to an NEC 240.6(A) standard rating, A.' }),
  maximumRatingA: z
    .number()
    .nullable()
    .meta({ description: "The conductor's ampacity, capped by NEC 240.4(D) for small conductors, A; null without a conductor." }),
  recommendedRatingA: z.number().nullable().meta({ description: 'The smallest standard rating between minimum and maximum; null when the conductor cannot be protected (see checks).' }),
  prospectiveShortCircuitA: z.number().nullable().meta({ description: 'Full-charge voltage ÷ (internal + link resistance), A; null without a source or a given value.' }),
  requiredInterruptRatingA: z.number().nullable().meta({ description: 'The fuse must interrupt at least this DC current, A.' }),
  preferredInterruptRatingA: z.number().nullable().meta({ description: 'The lowest UL 248 preferred DC interrupting rating at or above that, A.' }),
  requiredVoltageRatingV: z.number().nullable().meta({ description: "The fuse's DC voltage rating must be at least this: the source's full-charge voltage (or systemMaxVoltageV if higher), V." }),
  conductor: z
    .object({
      size: z.string(),
      temperatureRatingC: z.number(),
      ampacityA: z.number().nullable(),
      smallConductorMaxOcpdA: z.number().nullable(),
      smallestProtectableSize: z.string().nullable().meta({ description: 'The smallest size (same system and column) that the minimum rating protects.' }),
    })
    .nullable(),
});

export const FuseSizeResultSchema = calcResultSchema('FuseSizeResult', FuseSizeDataSchema, 'Fuse rating window, recommendation, and the interrupt and voltage ratings it needs.');
export type FuseSizeData = z.infer<typeof FuseSizeDataSchema>;
