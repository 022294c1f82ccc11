/**
 * An organization's catalog: the host units and packs it sells. The same schemas validate the console's
 * forms, every row of a CSV import, the database rows read back, and describe `GET /v1/catalog`, which the
 * widgets read with an embed key. Items are known by their SKU (unique within the organization).
 */
import { z } from 'zod';
import { calcResultSchema, MoneySchema, PackSpecSchema } from './common.ts';
import { HostBatterySchema, HostDcInputSchema } from './compatibility.ts';
import { CycleLifeSchema } from './pack-energy.ts';

export const SkuSchema = z
  .string()
  .trim()
  .min(1, 'Give the SKU')
  .max(64)
  .regex(/^[A-Za-z0-9][A-Za-z0-9._\-/]*$/, 'Use letters, digits and . _ - / (starting with a letter or digit)')
  .meta({ description: 'Stock-keeping unit: the item\'s code, unique within the organization.', example: 'LPS-HS1200' });

const ProductNameSchema = z.string().trim().min(1, 'Give the product name').max(120).meta({ example: 'Hearthstone 1200' });

const ProductUrlSchema = z
  .url({ protocol: /^https?$/, message: 'Use a full http(s) address, such as https://shop.example/products/item' })
  .max(500)
  .meta({ description: 'The product page.', example: 'https://larkspur-power.example/products/hearthstone-1200' });

const hostShape = {
  sku: SkuSchema,
  name: ProductNameSchema,
  url: ProductUrlSchema.optional(),
  dcInput: HostDcInputSchema.optional(),
  battery: HostBatterySchema.optional(),
};

/** A host unit as entered: its DC input, its own battery, or both. */
export const CatalogHostInputSchema = z
  .strictObject(hostShape)
  .refine((h) => h.dcInput !== undefined || h.battery !== undefined, {
    path: ['dcInput'],
    message: 'Describe the unit by its DC input, its battery or both',
  })
  .meta({
    id: 'CatalogHostInput',
    description: 'A host unit (power station or similar) as the organization lists it.',
    example: {
      sku: 'LPS-HS1200',
      name: 'Hearthstone 1200',
      url: 'https://larkspur-power.example/products/hearthstone-1200',
      dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 13, maxPowerW: 600 },
      battery: { chemistry: 'lfp', seriesCells: 16, capacityAh: 23.4 },
    },
  });

export type CatalogHostInput = z.output<typeof CatalogHostInputSchema>;

const packShape = {
  sku: SkuSchema,
  name: ProductNameSchema,
  url: ProductUrlSchema.optional(),
  chemistry: PackSpecSchema.shape.chemistry,
  seriesCells: PackSpecSchema.shape.seriesCells,
  capacityAh: PackSpecSchema.shape.capacityAh,
  internalResistanceMOhm: PackSpecSchema.shape.internalResistanceMOhm,
  maxContinuousDischargeA: PackSpecSchema.shape.maxContinuousDischargeA,
  maxChargeA: PackSpecSchema.shape.maxChargeA,
  peakDischargeA: PackSpecSchema.shape.peakDischargeA,
  cycleLife: CycleLifeSchema.optional(),
  price: MoneySchema.optional().meta({ description: 'Shelf price.' }),
};

/** A pack as entered: what it is, its limits and its price. */
export const CatalogPackInputSchema = z.strictObject(packShape).meta({
  id: 'CatalogPackInput',
  description: 'A battery pack as the organization lists it.',
  example: {
    sku: 'LPS-FB48-100',
    name: 'Fieldbank 48-100',
    chemistry: 'lfp',
    seriesCells: 16,
    capacityAh: 100,
    internalResistanceMOhm: 9,
    maxContinuousDischargeA: 100,
    maxChargeA: 50,
    cycleLife: 4000,
    price: { amount: 1390, currency: 'USD' },
  },
});

export type CatalogPackInput = z.output<typeof CatalogPackInputSchema>;

const storedFields = {
  id: z.uuid(),
  createdAt: z.string().meta({ description: 'ISO 8601 time.' }),
  updatedAt: z.string().meta({ description: 'ISO 8601 time.' }),
};

export const CatalogHostSchema = z
  .object({ ...storedFields, ...hostShape, dcInput: HostDcInputSchema.optional(), battery: HostBatterySchema.optional() })
  .meta({ id: 'CatalogHost', description: 'A host unit in the catalog.' });
export type CatalogHost = z.output<typeof CatalogHostSchema>;

export const CatalogPackSchema = z.object({ ...storedFields, ...packShape }).meta({ id: 'CatalogPack', description: 'A pack in the catalog.' });
export type CatalogPack = z.output<typeof CatalogPackSchema>;

export const CatalogSchema = z
  .object({ hosts: z.array(CatalogHostSchema), packs: z.array(CatalogPackSchema) })
  .meta({ id: 'Catalog', description: 'The organization\'s host units and packs, each list ordered by name.' });
export type Catalog = z.output<typeof CatalogSchema>;

/** `GET /v1/catalog`: the catalog in the response envelope (read-only; embed keys may read it from their origins). */
export const CatalogResultSchema = calcResultSchema('CatalogResult', CatalogSchema, 'The catalog of the key\'s organization.');

export const CatalogKindSchema = z.enum(['hosts', 'packs']).meta({ id: 'CatalogKind' });
export type CatalogKind = z.output<typeof CatalogKindSchema>;

/**
 * CSV columns, in file order, and where each goes in the item: one column per field, named like the
 * field with its unit (`dcInputMaxVoltageV`), blank for a field left out.
 */
export const catalogCsvColumns = {
  hosts: [
    { column: 'sku', path: ['sku'] },
    { column: 'name', path: ['name'] },
    { column: 'url', path: ['url'] },
    { column: 'dcInputMinVoltageV', path: ['dcInput', 'minVoltageV'], numeric: true },
    { column: 'dcInputMaxVoltageV', path: ['dcInput', 'maxVoltageV'], numeric: true },
    { column: 'dcInputMaxCurrentA', path: ['dcInput', 'maxCurrentA'], numeric: true },
    { column: 'dcInputMaxPowerW', path: ['dcInput', 'maxPowerW'], numeric: true },
    { column: 'dcInputEfficiencyPct', path: ['dcInput', 'efficiencyPct'], numeric: true },
    { column: 'batteryChemistry', path: ['battery', 'chemistry'] },
    { column: 'batterySeriesCells', path: ['battery', 'seriesCells'], numeric: true },
    { column: 'batteryCapacityAh', path: ['battery', 'capacityAh'], numeric: true },
  ],
  packs: [
    { column: 'sku', path: ['sku'] },
    { column: 'name', path: ['name'] },
    { column: 'url', path: ['url'] },
    { column: 'chemistry', path: ['chemistry'] },
    { column: 'seriesCells', path: ['seriesCells'], numeric: true },
    { column: 'capacityAh', path: ['capacityAh'], numeric: true },
    { column: 'internalResistanceMOhm', path: ['internalResistanceMOhm'], numeric: true },
    { column: 'maxContinuousDischargeA', path: ['maxContinuousDischargeA'], numeric: true },
    { column: 'maxChargeA', path: ['maxChargeA'], numeric: true },
    { column: 'peakDischargeA', path: ['peakDischargeA'], numeric: true },
    { column: 'cycleLife', path: ['cycleLife'], numeric: true },
    { column: 'priceAmount', path: ['price', 'amount'], numeric: true },
    { column: 'priceCurrency', path: ['price', 'currency'] },
  ],
} as const satisfies Record<CatalogKind, ReadonlyArray<{ column: string; path: readonly string[]; numeric?: boolean }>>;

export const CatalogImportModeSchema = z
  .enum(['merge', 'replace'])
  .meta({ description: 'merge: add new SKUs and update listed ones; replace: also delete the SKUs the file does not list.' });

export const CatalogImportQuerySchema = z.strictObject({ mode: CatalogImportModeSchema.default('merge') });

export const CatalogImportResultSchema = z
  .object({
    kind: CatalogKindSchema,
    mode: CatalogImportModeSchema,
    rows: z.number().int().meta({ description: 'Data rows in the file.' }),
    created: z.number().int(),
    updated: z.number().int(),
    deleted: z.number().int(),
  })
  .meta({ id: 'CatalogImportResult', description: 'What an import changed (all of it in one transaction).' });
export type CatalogImportResult = z.output<typeof CatalogImportResultSchema>;

/** One problem in an uploaded CSV file: the data row (1 = first after the header), its line in the file, the column. */
export const CatalogCsvRowErrorSchema = z
  .object({
    row: z.number().int().meta({ example: 3 }),
    line: z.number().int().meta({ description: 'Line in the file (the header is line 1).', example: 4 }),
    column: z.string().nullable().meta({ example: 'seriesCells' }),
    detail: z.string(),
  })
  .meta({ id: 'CatalogCsvRowError' });
export type CatalogCsvRowError = z.output<typeof CatalogCsvRowErrorSchema>;

