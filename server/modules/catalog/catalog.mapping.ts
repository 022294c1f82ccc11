/** Catalog items between their API shape (shared/schemas/catalog.ts) and their database rows. */
import type { CatalogHost, CatalogHostInput, CatalogPack, CatalogPackInput } from '#shared/schemas/catalog.ts';
import type { ChemistryId } from '#shared/calc/chemistry/presets.ts';
import type { CatalogHostRow, CatalogHostValues, CatalogPackRow, CatalogPackValues } from './catalog.queries.ts';

/** The DC-input efficiency the compatibility check assumes when none is listed, % (its schema default). */
const DEFAULT_EFFICIENCY_PCT = 90;

const defined = <T extends object>(value: T) => Object.fromEntries(Object.entries(value).filter(([, v]) => v !== null && v !== undefined)) as T;

export function hostValues(input: CatalogHostInput): CatalogHostValues {
  return {
    sku: input.sku,
    name: input.name,
    url: input.url ?? null,
    dcInputMinVoltageV: input.dcInput?.minVoltageV ?? null,
    dcInputMaxVoltageV: input.dcInput?.maxVoltageV ?? null,
    dcInputMaxCurrentA: input.dcInput?.maxCurrentA ?? null,
    dcInputMaxPowerW: input.dcInput?.maxPowerW ?? null,
    dcInputEfficiencyPct: input.dcInput?.efficiencyPct ?? null,
    batteryChemistry: input.battery?.chemistry ?? null,
    batterySeriesCells: input.battery?.seriesCells ?? null,
    batteryCapacityAh: input.battery?.capacityAh ?? null,
  };
}

export function packValues(input: CatalogPackInput): CatalogPackValues {
  return {
    sku: input.sku,
    name: input.name,
    url: input.url ?? null,
    chemistry: input.chemistry,
    seriesCells: input.seriesCells,
    capacityAh: input.capacityAh,
    internalResistanceMOhm: input.internalResistanceMOhm ?? null,
    maxContinuousDischargeA: input.maxContinuousDischargeA ?? null,
    maxChargeA: input.maxChargeA ?? null,
    peakDischargeA: input.peakDischargeA ?? null,
    cycleLife: input.cycleLife ?? null,
    priceAmount: input.price?.amount ?? null,
    priceCurrency: input.price?.currency ?? null,
  };
}

export function hostView(row: CatalogHostRow): CatalogHost {
  return defined({
    id: row.id,
    sku: row.sku,
    name: row.name,
    url: row.url ?? undefined,
    dcInput:
      row.dcInputMaxVoltageV === null
        ? undefined
        : defined({
            minVoltageV: row.dcInputMinVoltageV ?? 0,
            maxVoltageV: row.dcInputMaxVoltageV,
            maxCurrentA: row.dcInputMaxCurrentA ?? 0,
            maxPowerW: row.dcInputMaxPowerW ?? undefined,
            efficiencyPct: row.dcInputEfficiencyPct ?? DEFAULT_EFFICIENCY_PCT,
          }),
    battery:
      row.batteryChemistry === null
        ? undefined
        : defined({ chemistry: row.batteryChemistry as ChemistryId, seriesCells: row.batterySeriesCells ?? 1, capacityAh: row.batteryCapacityAh ?? undefined }),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  });
}

export function packView(row: CatalogPackRow): CatalogPack {
  return defined({
    id: row.id,
    sku: row.sku,
    name: row.name,
    url: row.url ?? undefined,
    chemistry: row.chemistry as ChemistryId,
    seriesCells: row.seriesCells,
    capacityAh: row.capacityAh,
    internalResistanceMOhm: row.internalResistanceMOhm ?? undefined,
    maxContinuousDischargeA: row.maxContinuousDischargeA ?? undefined,
    maxChargeA: row.maxChargeA ?? undefined,
    peakDischargeA: row.peakDischargeA ?? undefined,
    cycleLife: row.cycleLife ?? undefined,
    price: row.priceAmount === null || row.priceCurrency === null ? undefined : { amount: Number(row.priceAmount), currency: row.priceCurrency },
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  });
}
