/**
 * The catalog forms' fields, by kind: one per field of the shared schema, with units in the labels. The
 * form keeps text per dotted path (`dcInput.maxVoltageV`) and turns it into the nested item the schema checks.
 */
import { CatalogHostInputSchema, CatalogPackInputSchema, type CatalogHost, type CatalogKind, type CatalogPack } from '#shared/schemas/catalog.ts';

export interface ItemField {
  path: string;
  label: string;
  kind: 'text' | 'number' | 'url' | 'chemistry';
  hint?: string;
  group?: string;
}

export const chemistryOptions = [
  { value: 'lfp', label: 'LFP' },
  { value: 'nmc', label: 'NMC' },
  { value: 'lto', label: 'LTO' },
  { value: 'lead_acid_agm', label: 'Lead-acid AGM' },
  { value: 'lead_acid_flooded', label: 'Lead-acid flooded' },
];

export const itemFields: Record<CatalogKind, ItemField[]> = {
  hosts: [
    { path: 'sku', label: 'SKU', kind: 'text' },
    { path: 'name', label: 'Name', kind: 'text' },
    { path: 'url', label: 'Product page', kind: 'url', hint: 'Optional' },
    { path: 'dcInput.minVoltageV', label: 'Lowest input voltage (V)', kind: 'number', group: 'DC input' },
    { path: 'dcInput.maxVoltageV', label: 'Highest input voltage (V)', kind: 'number', group: 'DC input' },
    { path: 'dcInput.maxCurrentA', label: 'Input current limit (A)', kind: 'number', group: 'DC input' },
    { path: 'dcInput.maxPowerW', label: 'Input power limit (W)', kind: 'number', group: 'DC input', hint: 'Optional' },
    { path: 'dcInput.efficiencyPct', label: 'Conversion efficiency (%)', kind: 'number', group: 'DC input', hint: 'Optional; 90 when blank' },
    { path: 'battery.chemistry', label: 'Battery chemistry', kind: 'chemistry', group: 'Own battery' },
    { path: 'battery.seriesCells', label: 'Cells in series', kind: 'number', group: 'Own battery' },
    { path: 'battery.capacityAh', label: 'Capacity (Ah)', kind: 'number', group: 'Own battery', hint: 'Optional' },
  ],
  packs: [
    { path: 'sku', label: 'SKU', kind: 'text' },
    { path: 'name', label: 'Name', kind: 'text' },
    { path: 'url', label: 'Product page', kind: 'url', hint: 'Optional' },
    { path: 'chemistry', label: 'Chemistry', kind: 'chemistry' },
    { path: 'seriesCells', label: 'Cells in series', kind: 'number' },
    { path: 'capacityAh', label: 'Capacity (Ah)', kind: 'number' },
    { path: 'internalResistanceMOhm', label: 'Internal resistance (mΩ)', kind: 'number', hint: 'Optional' },
    { path: 'maxContinuousDischargeA', label: 'Continuous discharge limit (A)', kind: 'number', hint: 'Optional' },
    { path: 'maxChargeA', label: 'Charge limit (A)', kind: 'number', hint: 'Optional' },
    { path: 'peakDischargeA', label: 'Peak discharge (A)', kind: 'number', hint: 'Optional' },
    { path: 'cycleLife', label: 'Rated cycles', kind: 'number', hint: 'Optional' },
    { path: 'price.amount', label: 'Price', kind: 'number', group: 'Price', hint: 'Optional' },
    { path: 'price.currency', label: 'Currency', kind: 'text', group: 'Price', hint: 'ISO 4217, e.g. USD' },
  ],
};

export type FormValues = Record<string, string>;

/** An item's current values as form text. */
export function valuesOf(kind: CatalogKind, item?: CatalogHost | CatalogPack): FormValues {
  const out: FormValues = {};
  for (const f of itemFields[kind]) {
    let node: unknown = item;
    for (const key of f.path.split('.')) node = (node as Record<string, unknown> | undefined)?.[key];
    const fallback = f.kind === 'chemistry' && kind === 'packs' ? 'lfp' : '';
    out[f.path] = node === undefined || node === null ? fallback : String(node);
  }
  return out;
}

/** Form text → the item, validated with the shared schema; errors by dotted path ('' for the form). */
export function parseItem(kind: CatalogKind, values: FormValues) {
  const item: Record<string, unknown> = {};
  for (const f of itemFields[kind]) {
    const raw = (values[f.path] ?? '').trim();
    if (raw === '') continue;
    const value = f.kind === 'number' ? Number(raw) : raw;
    const keys = f.path.split('.');
    let node = item;
    for (const key of keys.slice(0, -1)) node = (node[key] ??= {}) as Record<string, unknown>;
    node[keys[keys.length - 1]!] = value;
  }
  const result = (kind === 'hosts' ? CatalogHostInputSchema : CatalogPackInputSchema).safeParse(item);
  if (result.success) return { item: result.data, errors: {} as Record<string, string> };
  const errors: Record<string, string> = {};
  for (const issue of result.error.issues) {
    const path = issue.path.join('.');
    const field = itemFields[kind].find((f) => f.path === path || f.path.startsWith(`${path}.`));
    const key = field && path !== 'dcInput' ? field.path : '';
    errors[key] ??= issue.message;
  }
  return { item: null, errors };
}
