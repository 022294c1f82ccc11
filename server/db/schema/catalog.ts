import { sql } from 'drizzle-orm';
import { check, doublePrecision, integer, numeric, pgTable, text, unique, uuid } from 'drizzle-orm/pg-core';
import { timestamps } from './columns.ts';
import { organizations } from './organizations.ts';

/**
 * An organization's catalog: the host units (power stations and the like) and the battery packs it sells,
 * read by its widgets and the compatibility matrix. Each item is known by its SKU, unique within the
 * organization, which CSV imports match on (the unique index on (organization, sku) also serves the
 * organization's listing). Validation lives in shared/schemas/catalog.ts; the checks here
 * only keep rows that no schema could have produced out of the table.
 */
export const catalogHosts = pgTable(
  'catalog_hosts',
  {
    id: uuid().primaryKey().defaultRandom(),
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    sku: text().notNull(),
    name: text().notNull(),
    /** The product page. */
    url: text(),
    /** The DC (solar-style) input window and limits: all null when the unit has none listed. */
    dcInputMinVoltageV: doublePrecision(),
    dcInputMaxVoltageV: doublePrecision(),
    dcInputMaxCurrentA: doublePrecision(),
    dcInputMaxPowerW: doublePrecision(),
    dcInputEfficiencyPct: doublePrecision(),
    /** The unit's own battery (for direct-parallel checks): null when not listed. */
    batteryChemistry: text(),
    batterySeriesCells: integer(),
    batteryCapacityAh: doublePrecision(),
    ...timestamps,
  },
  (t) => [
    unique('catalog_hosts_org_sku_key').on(t.organizationId, t.sku),
    check('catalog_hosts_described', sql`${t.dcInputMaxVoltageV} is not null or ${t.batteryChemistry} is not null`),
  ],
);

export const catalogPacks = pgTable(
  'catalog_packs',
  {
    id: uuid().primaryKey().defaultRandom(),
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    sku: text().notNull(),
    name: text().notNull(),
    url: text(),
    chemistry: text().notNull(),
    seriesCells: integer().notNull(),
    capacityAh: doublePrecision().notNull(),
    internalResistanceMOhm: doublePrecision(),
    maxContinuousDischargeA: doublePrecision(),
    maxChargeA: doublePrecision(),
    peakDischargeA: doublePrecision(),
    cycleLife: integer(),
    /** Shelf price in priceCurrency (ISO 4217); both null when the pack is not priced. */
    priceAmount: numeric({ precision: 14, scale: 2, mode: 'number' }),
    priceCurrency: text(),
    ...timestamps,
  },
  (t) => [
    unique('catalog_packs_org_sku_key').on(t.organizationId, t.sku),
    check('catalog_packs_price_whole', sql`(${t.priceAmount} is null) = (${t.priceCurrency} is null)`),
  ],
);
