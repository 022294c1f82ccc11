/** Requests the widgets build from catalog items and typed specifications (pure models). */
import { describe, expect, it } from 'vitest';
import { CompatibilityInputSchema } from '#shared/schemas/compatibility.ts';
import { ChargeTimeInputSchema } from '#shared/schemas/charge-time.ts';
import { PackCompareInputSchema } from '#shared/schemas/pack-compare.ts';
import { WireSizeInputSchema } from '#shared/schemas/wire-size.ts';
import { profilePoints } from '../charge-time/charge-time.model.ts';
import { distinctLabels, optionFromCatalog, pricedPacks } from '../pack-value/pack-value.model.ts';
import { fuseRequest, wireRequest } from '../wire-fuse/wire-fuse.model.ts';
import { hostFromCatalog, initialChoice, OTHER, packFromCatalog } from './compatibility.model.ts';

const stored = { id: '00000000-0000-4000-8000-000000000000', createdAt: '', updatedAt: '' };
// Invented catalog items, as GET /v1/catalog answers them.
const hosts = [{ ...stored, sku: 'T-1', name: 'Test unit', dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500, efficiencyPct: 92 }, battery: { chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 30 } }];
const packs = [
  { ...stored, sku: 'P-1', name: 'Test pack 48', url: 'https://shop.example/p-1', chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 50, maxChargeA: 25, cycleLife: 3500, price: { amount: 899, currency: 'USD' } },
  { ...stored, sku: 'P-2', name: 'Test pack 24', chemistry: 'lfp' as const, seriesCells: 8, capacityAh: 100, price: { amount: 619, currency: 'USD' } },
  { ...stored, sku: 'P-3', name: 'Unpriced pack', chemistry: 'nmc' as const, seriesCells: 14, capacityAh: 50 },
];

describe('widget requests pass the shared schemas (what the API will check)', () => {
  it('when built from catalog items, then the compatibility request is valid and carries no catalog-only fields', () => {
    const request = { host: hostFromCatalog(hosts[0]!), external: { ...packFromCatalog(packs[0]!), stateOfChargePct: 100 } };
    expect(CompatibilityInputSchema.safeParse(request).success).toBe(true);
    expect(request.external).not.toHaveProperty('price');
    expect(request.external).not.toHaveProperty('sku');
  });

  it('when packs are compared, then only priced ones are offered and repeated labels are told apart', () => {
    const options = distinctLabels([...pricedPacks(packs).map(optionFromCatalog), optionFromCatalog(packs[0]!)]);
    expect(PackCompareInputSchema.safeParse({ options }).success).toBe(true);
    expect(options.at(-1)!.label).toBe(`${packs[0]!.name} (2)`);
  });

  it('when the wire is sized in imperial units, then the length goes in feet and AWG sizes are asked for', () => {
    const values = { currentA: 40, systemVoltageV: 12, oneWayLength: 10, temperatureRatingC: 75 as const, continuous: true };
    const imperial = wireRequest(values, 'imperial');
    expect(imperial).toMatchObject({ oneWayLengthFt: 10, sizeSystem: 'awg' });
    expect(wireRequest(values, 'metric')).toMatchObject({ oneWayLengthM: 10, sizeSystem: 'metric' });
    expect(WireSizeInputSchema.safeParse(imperial).success).toBe(true);
    expect(fuseRequest(values, { recommended: null } as never)).toBeNull();
  });

  it('when a catalog pack is charged, then the request is valid and the chart spans the box', () => {
    expect(ChargeTimeInputSchema.safeParse({ pack: packFromCatalog(packs[1]!), fromPct: 20, toPct: 100, sources: [{ currentA: 20 }] }).success).toBe(true);
    const points = profilePoints([{ minute: 0, socPct: 20, currentA: 1, voltageV: 1 }, { minute: 60, socPct: 100, currentA: 0, voltageV: 1 }], 300, 120).split(' ');
    expect(points).toEqual(['0.0,96.0', '300.0,0.0']);
  });

  it('when a SKU attribute names a catalog item, then it is preselected; otherwise the first, or typed specs', () => {
    expect(initialChoice(packs, 'P-2')).toBe('P-2');
    expect(initialChoice(packs, 'NOPE')).toBe(packs[0]!.sku);
    expect(initialChoice([], null)).toBe(OTHER);
  });
});
