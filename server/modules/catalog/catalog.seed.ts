/**
 * The invented demo retailer's catalog: three power-station models and four battery packs. Every name,
 * specification, address and price here is made up for the demo.
 */
import type { CatalogHostInput, CatalogPackInput } from '#shared/schemas/catalog.ts';
import { CatalogHostInputSchema, CatalogPackInputSchema } from '#shared/schemas/catalog.ts';
import type { Tx } from '../auth/auth.types.ts';
import { hostValues, packValues } from './catalog.mapping.ts';
import { countItems, upsertItems } from './catalog.queries.ts';

const shop = 'https://larkspur-power.example/products';

export const demoCatalog: { hosts: CatalogHostInput[]; packs: CatalogPackInput[] } = {
  hosts: [
    {
      sku: 'LPS-QF600',
      name: 'Quillfeather 600',
      url: `${shop}/quillfeather-600`,
      dcInput: { minVoltageV: 12, maxVoltageV: 28, maxCurrentA: 10, maxPowerW: 200, efficiencyPct: 90 },
      battery: { chemistry: 'lfp', seriesCells: 4, capacityAh: 50 },
    },
    {
      sku: 'LPS-BW1500',
      name: 'Bramblewick 1500',
      url: `${shop}/bramblewick-1500`,
      dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500, efficiencyPct: 92 },
      battery: { chemistry: 'lfp', seriesCells: 16, capacityAh: 30 },
    },
    {
      sku: 'LPS-TH3000',
      name: 'Tarnhollow 3000',
      url: `${shop}/tarnhollow-3000`,
      dcInput: { minVoltageV: 32, maxVoltageV: 150, maxCurrentA: 15, maxPowerW: 1200, efficiencyPct: 94 },
      battery: { chemistry: 'lfp', seriesCells: 16, capacityAh: 60 },
    },
  ].map((h) => CatalogHostInputSchema.parse(h)),
  packs: [
    {
      sku: 'LPS-FM12-100',
      name: 'Fernmoss 12-100',
      url: `${shop}/fernmoss-12-100`,
      chemistry: 'lfp',
      seriesCells: 4,
      capacityAh: 100,
      internalResistanceMOhm: 12,
      maxContinuousDischargeA: 100,
      maxChargeA: 50,
      cycleLife: 4000,
      price: { amount: 329, currency: 'USD' },
    },
    {
      sku: 'LPS-FM24-100',
      name: 'Fernmoss 24-100',
      url: `${shop}/fernmoss-24-100`,
      chemistry: 'lfp',
      seriesCells: 8,
      capacityAh: 100,
      internalResistanceMOhm: 20,
      maxContinuousDischargeA: 100,
      maxChargeA: 50,
      cycleLife: 4000,
      price: { amount: 619, currency: 'USD' },
    },
    {
      sku: 'LPS-CW48-50',
      name: 'Cinderwell 48-50',
      url: `${shop}/cinderwell-48-50`,
      chemistry: 'lfp',
      seriesCells: 16,
      capacityAh: 50,
      internalResistanceMOhm: 30,
      maxContinuousDischargeA: 50,
      maxChargeA: 25,
      cycleLife: 3500,
      price: { amount: 899, currency: 'USD' },
    },
    {
      sku: 'LPS-GS52-50',
      name: 'Glimmerstone 52-50',
      url: `${shop}/glimmerstone-52-50`,
      chemistry: 'nmc',
      seriesCells: 14,
      capacityAh: 50,
      internalResistanceMOhm: 25,
      maxContinuousDischargeA: 60,
      maxChargeA: 25,
      cycleLife: 1200,
      price: { amount: 749, currency: 'USD' },
    },
  ].map((p) => CatalogPackInputSchema.parse(p)),
};

/**
 * Lists the demo catalog for the organization when it lists nothing of a kind yet, so running the seed
 * again changes nothing (and items edited or deleted in the console stay that way while others remain).
 */
export async function seedDemoCatalog(tx: Tx, organizationId: string): Promise<void> {
  if ((await countItems(tx, 'hosts', organizationId)) === 0) await upsertItems(tx, 'hosts', organizationId, demoCatalog.hosts.map(hostValues), false);
  if ((await countItems(tx, 'packs', organizationId)) === 0) await upsertItems(tx, 'packs', organizationId, demoCatalog.packs.map(packValues), false);
}
