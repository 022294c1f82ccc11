/** The compatibility checker's request, from a catalog item or typed specifications (pure, testable in Node). */
import type { z } from 'zod';
import type { CatalogHost, CatalogPack } from '#shared/schemas/catalog.ts';
import type { PackSpec } from '#shared/schemas/common.ts';
import type { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';

export type CompatibilityRequest = z.input<typeof CompatibilityInputSchema>;
export const OTHER = '__other';

/** The host of a request: a catalog unit as listed (its DC input and battery). */
export function hostFromCatalog(host: CatalogHost): CompatibilityRequest['host'] {
  return { label: host.name.slice(0, 80), ...(host.dcInput ? { dcInput: host.dcInput } : {}), ...(host.battery ? { battery: host.battery } : {}) };
}

/** A catalog pack as the PackSpec the calculations take (its price and SKU stay behind). */
export function packFromCatalog(pack: CatalogPack): PackSpec {
  const spec: PackSpec = { label: pack.name.slice(0, 80), chemistry: pack.chemistry, seriesCells: pack.seriesCells, capacityAh: pack.capacityAh };
  for (const key of ['internalResistanceMOhm', 'maxContinuousDischargeA', 'maxChargeA', 'peakDischargeA'] as const) {
    if (pack[key] !== undefined) spec[key] = pack[key];
  }
  return spec;
}

/** Drops undefined members, so the strict API schema sees only the fields given. */
export function compact<T extends object>(value: T): T {
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as T;
}

/** Which catalog item a `*-sku` attribute picks, else the first; OTHER when the catalog has none. */
export function initialChoice(items: ReadonlyArray<{ sku: string }>, sku: string | null): string {
  if (sku && items.some((i) => i.sku === sku)) return sku;
  return items[0]?.sku ?? OTHER;
}
