/** The pack-value comparison's request: catalog packs with a price, and packs typed in (pure). */
import type { z } from 'zod';
import type { CatalogPack } from '#shared/schemas/catalog.ts';
import type { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { packFromCatalog } from '../compatibility/compatibility.model.ts';

export type PackCompareRequest = z.input<typeof PackCompareInputSchema>;
export type PackCompareOption = PackCompareRequest['options'][number];

/** Catalog packs the comparison can rank: those with a price. */
export const pricedPacks = (packs: readonly CatalogPack[]) => packs.filter((p) => p.price !== undefined);

export function optionFromCatalog(pack: CatalogPack): PackCompareOption {
  return { label: pack.name.slice(0, 80), pack: packFromCatalog(pack), price: pack.price!, ...(pack.cycleLife !== undefined ? { cycleLife: pack.cycleLife } : {}) };
}

/** Labels must tell options apart in the ranking: a repeated label gets " (2)", " (3)"… */
export function distinctLabels(options: PackCompareOption[]): PackCompareOption[] {
  const seen = new Map<string, number>();
  return options.map((o) => {
    const n = (seen.get(o.label) ?? 0) + 1;
    seen.set(o.label, n);
    return n === 1 ? o : { ...o, label: `${o.label.slice(0, 74)} (${n})` };
  });
}
