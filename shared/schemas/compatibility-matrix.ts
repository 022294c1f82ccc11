/**
 * `POST /v1/compatibility/matrix`: the compatibility check (./compatibility.ts) for every host × pack pair,
 * of the key's catalog or of lists sent in the body (each side independently).
 */
import { z } from 'zod';
import { calcResultSchema, CheckSchema, LabelSchema, PackSpecSchema } from './common.ts';
import { CompatibilityMethodSchema, HostBatterySchema, HostDcInputSchema } from './compatibility.ts';
import { SkuSchema } from './catalog.ts';

/** Largest matrix one call computes (hosts × packs); larger catalogs are filtered with hostSkus / packSkus. */
export const MATRIX_MAX_PAIRS = 2000;
const MAX_SIDE = 200;

export const MatrixHostSchema = z
  .strictObject({
    label: LabelSchema.meta({ example: 'Hearthstone 1200' }),
    sku: SkuSchema.optional(),
    dcInput: HostDcInputSchema.optional(),
    battery: HostBatterySchema.optional(),
  })
  .refine((h) => h.dcInput !== undefined || h.battery !== undefined, { path: ['dcInput'], message: 'Describe the host by dcInput, battery or both' })
  .meta({ id: 'MatrixHost', description: 'A host unit for the matrix: a label, optionally its SKU, and its DC input and/or battery.' });

export const MatrixPackSchema = PackSpecSchema.extend({
  label: LabelSchema.meta({ example: 'Fieldbank 48-100' }),
  sku: SkuSchema.optional(),
}).meta({ id: 'MatrixPack', description: 'A pack for the matrix: a PackSpec with a label and optionally its SKU.' });

export const CompatibilityMatrixInputSchema = z
  .strictObject({
    hosts: z.array(MatrixHostSchema).min(1).max(MAX_SIDE).optional().meta({ description: 'Hosts to check; left out: the catalog\'s host units.' }),
    packs: z.array(MatrixPackSchema).min(1).max(MAX_SIDE).optional().meta({ description: 'Packs to check; left out: the catalog\'s packs.' }),
    hostSkus: z.array(SkuSchema).min(1).max(MAX_SIDE).optional().meta({ description: 'Only these catalog host units (when hosts is left out).' }),
    packSkus: z.array(SkuSchema).min(1).max(MAX_SIDE).optional().meta({ description: 'Only these catalog packs (when packs is left out).' }),
    defaultStateOfChargePct: z
      .number()
      .min(0)
      .max(100)
      .default(100)
      .meta({ description: 'State of charge assumed for packs that give neither stateOfChargePct nor restingVoltageV (catalog packs never do), %.', example: 100 }),
  })
  .superRefine((v, ctx) => {
    if (v.hosts && v.hostSkus) ctx.addIssue({ code: 'custom', path: ['hostSkus'], message: 'hostSkus filters the catalog: leave it out when sending hosts' });
    if (v.packs && v.packSkus) ctx.addIssue({ code: 'custom', path: ['packSkus'], message: 'packSkus filters the catalog: leave it out when sending packs' });
    if (v.hosts && v.packs && v.hosts.length * v.packs.length > MATRIX_MAX_PAIRS) {
      ctx.addIssue({ code: 'custom', path: ['packs'], message: `At most ${MATRIX_MAX_PAIRS} pairs per call (hosts × packs); split the request` });
    }
  })
  .meta({
    id: 'CompatibilityMatrixInput',
    description: 'Which hosts and packs to pair: the catalog\'s (optionally filtered by SKU) or lists sent here. An empty body checks the whole catalog.',
    example: {
      hosts: [{ label: 'Unit with a 12–60 V input', dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 13, maxPowerW: 600 } }],
      packs: [
        { label: '48 V LFP 100 Ah', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 },
        { label: '12 V LFP 200 Ah', chemistry: 'lfp', seriesCells: 4, capacityAh: 200 },
      ],
    },
  });
export type CompatibilityMatrixInput = z.output<typeof CompatibilityMatrixInputSchema>;

const ItemSourceSchema = z.enum(['catalog', 'request']).meta({ description: 'Whether the item came from the catalog or from the request.' });

export const CompatibilityMatrixDataSchema = z
  .object({
    hosts: z.array(z.object({ label: z.string(), sku: z.string().nullable(), source: ItemSourceSchema })),
    packs: z.array(
      z.object({
        label: z.string(),
        sku: z.string().nullable(),
        source: ItemSourceSchema,
        nominalVoltageV: z.number(),
        fullChargeVoltageV: z.number(),
        cutoffVoltageV: z.number(),
        stateOfChargePct: z.number(),
        storedEnergyWh: z.number(),
      }),
    ),
    pairs: z
      .array(
        z.object({
          hostIndex: z.number().int().meta({ description: 'Index into hosts.' }),
          packIndex: z.number().int().meta({ description: 'Index into packs.' }),
          verdict: z.enum(['compatible', 'limited', 'incompatible']).meta({ description: 'The best verdict among the methods.' }),
          method: z.enum(['dc_input', 'direct_parallel']).meta({ description: 'The method that gives it (dc_input first on a tie).' }),
          methods: z.array(CompatibilityMethodSchema),
          checks: z.array(CheckSchema).meta({ description: 'The check\'s findings for this pair.' }),
        }),
      )
      .meta({ description: 'Every host × pack pair, host by host in the order of hosts, then pack by pack.' }),
    counts: z.object({ compatible: z.number().int(), limited: z.number().int(), incompatible: z.number().int() }).meta({ description: 'Pairs by verdict.' }),
  })
  .meta({ id: 'CompatibilityMatrixData' });
export type CompatibilityMatrixData = z.output<typeof CompatibilityMatrixDataSchema>;

export const CompatibilityMatrixResultSchema = calcResultSchema(
  'CompatibilityMatrixResult',
  CompatibilityMatrixDataSchema,
  'The compatibility verdicts of every host × pack pair, with each pair\'s methods and findings.',
);
