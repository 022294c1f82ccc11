import fc from 'fast-check';
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { CalcError } from '../errors.ts';
import { PackEnergyInputSchema, PackEnergyResultSchema, packEnergyInputExample } from '../../schemas/pack-energy.ts';
import { computePackEnergy } from './pack-energy.ts';
import { allFinite, anyPack, everydayPack, num } from './fixtures/arbitraries.ts';

const lfp16 = { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } as const;

describe('computePackEnergy — trade facts and published values', () => {
  it('when 16 LFP cells are in series, then the pack is 51.2 V nominal, 58.4 V full and 40 V at cut-off', () => {
    // Common practice / LFP cell datasheets: 3.2 V nominal, 3.65 V charge limit, 2.5 V cut-off; a 51.2 V pack
    // datasheet states 58.4 V (reference values §5.1).
    const { data } = computePackEnergy({ pack: lfp16 });
    expect(data.nominalVoltageV).toBeCloseTo(51.2, 12);
    expect(data.fullChargeVoltageV).toBeCloseTo(58.4, 12);
    expect(data.cutoffVoltageV).toBeCloseTo(40.0, 12);
  });

  it('when a 51.2 V pack holds 100 Ah, then it holds 5 120 Wh (= 5.12 kWh)', () => {
    // Common practice, and an LFP module datasheet's "5120 Wh" (reference values §5.1).
    const { data } = computePackEnergy({ pack: lfp16 });
    expect(data.energyWh).toBeCloseTo(5120, 9);
    expect(data.energyKWh).toBeCloseTo(5.12, 12);
  });

  it('when the same product is worked with mathjs units, then mathjs agrees (V × Ah → Wh)', () => {
    // mathjs (npm) unit algebra as an outside reference: 51.2 V × 100 Ah expressed in Wh and kWh.
    const energy = math.multiply(math.unit('51.2 V'), math.unit('100 Ah')) as math.Unit;
    const { data } = computePackEnergy({ pack: lfp16 });
    expect(data.energyWh).toBeCloseTo(energy.toNumber('Wh'), 9);
    expect(data.energyKWh).toBeCloseTo(energy.toNumber('kWh'), 12);
  });

  it('when a 12 V lead-acid battery of 200 Ah is described, then it holds 2 400 Wh of which 1 200 Wh are usable at the default 50 %', () => {
    // Common practice: 6 cells × 2.0 V = 12 V; lead-acid is usually planned at 50 % depth of discharge.
    const { data } = computePackEnergy({ pack: { chemistry: 'lead_acid_flooded', seriesCells: 6, capacityAh: 200 } });
    expect(data.nominalVoltageV).toBeCloseTo(12, 12);
    expect(data.energyWh).toBeCloseTo(2400, 9);
    expect(data.depthOfDischargePct).toBe(50);
    expect(data.usableEnergyWh).toBeCloseTo(1200, 9);
  });
});

describe('computePackEnergy — value figures', () => {
  it('when a price and cycle life are given, then cost per usable kWh and per kWh cycled follow (checked with mathjs evaluate)', () => {
    const { data, checks } = computePackEnergy(PackEnergyInputSchema.parse(packEnergyInputExample));
    // Independent arithmetic by mathjs's expression evaluator.
    const usableKWh = math.evaluate('16 * 3.2 * 100 * 0.90 / 1000');
    expect(data.usableEnergyKWh).toBeCloseTo(usableKWh, 12);
    expect(data.costPerUsableKWh).toBeCloseTo(math.evaluate(`1450 / ${usableKWh}`), 10);
    expect(data.lifetimeThroughputKWh).toBeCloseTo(math.evaluate(`${usableKWh} * 4000`), 8);
    expect(data.costPerKWhCycled).toBeCloseTo(math.evaluate(`1450 / (${usableKWh} * 4000)`), 12);
    expect(data.currency).toBe('USD');
    expect(checks.map((c) => c.code)).toContain('depth_of_discharge_above_default');
  });

  it('when no cycle life is given, then no lifetime figures appear and a check asks for it', () => {
    const { data, checks } = computePackEnergy({ pack: lfp16, price: { amount: 1000, currency: 'EUR' } });
    expect(data.costPerUsableKWh).toBeCloseTo(1000 / 4.096, 10);
    expect(data.lifetimeThroughputKWh).toBeUndefined();
    expect(data.costPerKWhCycled).toBeUndefined();
    expect(checks.find((c) => c.code === 'cycle_life_missing')?.level).toBe('info');
  });

  it('when the depth of discharge goes beyond what the chemistry tolerates, then a warning says so', () => {
    // Preset: NMC routine depth at most 90 % (common practice); lead-acid 80 %.
    const nmc = computePackEnergy({ pack: { chemistry: 'nmc', seriesCells: 14, capacityAh: 50 }, depthOfDischargePct: 95 });
    expect(nmc.checks.find((c) => c.code === 'depth_of_discharge_high')?.level).toBe('warning');
    const agm = computePackEnergy({ pack: { chemistry: 'lead_acid_agm', seriesCells: 6, capacityAh: 100 }, depthOfDischargePct: 80 });
    expect(agm.checks.map((c) => c.code)).toEqual(['depth_of_discharge_above_default']);
    const lfp = computePackEnergy({ pack: lfp16, depthOfDischargePct: 100 });
    expect(lfp.checks.map((c) => c.code)).not.toContain('depth_of_discharge_high');
  });

  it('when the pack is above 60 V DC at full charge, then a warning and a caution appear; at 58.4 V they do not', () => {
    const high = computePackEnergy({ pack: { chemistry: 'nmc', seriesCells: 16, capacityAh: 50 } });
    expect(high.checks.find((c) => c.code === 'voltage_above_60v_dc')?.level).toBe('warning');
    expect(high.cautions.join(' ')).toMatch(/electrical codes/);
    expect(computePackEnergy({ pack: lfp16 }).checks.map((c) => c.code)).not.toContain('voltage_above_60v_dc');
  });

  it('when a label is given, then it is echoed; otherwise the pack’s label is', () => {
    expect(computePackEnergy({ label: 'Mine', pack: { ...lfp16, label: 'Pack' } }).data.label).toBe('Mine');
    expect(computePackEnergy({ pack: { ...lfp16, label: 'Pack' } }).data.label).toBe('Pack');
  });
});

describe('computePackEnergy — properties', () => {
  it('when series cells or Ah are multiplied by k, then energy and usable energy are multiplied by k (linear scaling)', () => {
    fc.assert(
      fc.property(everydayPack, fc.integer({ min: 1, max: 10 }), num(0.01, 100), (pack, k, scale) => {
        const base = computePackEnergy({ pack }).data;
        const cells = computePackEnergy({ pack: { ...pack, seriesCells: pack.seriesCells * k } }).data;
        const ah = computePackEnergy({ pack: { ...pack, capacityAh: pack.capacityAh * scale } }).data;
        expect(cells.energyWh).toBeCloseTo(base.energyWh * k, 6);
        expect(cells.usableEnergyWh).toBeCloseTo(base.usableEnergyWh * k, 6);
        expect(ah.energyWh / (base.energyWh * scale)).toBeCloseTo(1, 12);
        expect(ah.usableEnergyWh / (base.usableEnergyWh * scale)).toBeCloseTo(1, 12);
      }),
      { seed: 20261203, numRuns: 300 },
    );
  });

  it('when any input in the schema’s range is given, then the result is finite and matches the result schema, or a CalcError names a field', () => {
    const input = fc.record(
      {
        pack: anyPack,
        depthOfDischargePct: num(1, 100),
        price: fc.record({ amount: num(0, 100_000_000), currency: fc.constantFrom('USD', 'EUR') }),
        cycleLife: fc.integer({ min: 1, max: 1_000_000 }),
      },
      { requiredKeys: ['pack'] },
    );
    fc.assert(
      fc.property(input, (raw) => {
        const parsed = PackEnergyInputSchema.parse(raw);
        let out: ReturnType<typeof computePackEnergy>;
        try {
          out = computePackEnergy(parsed);
        } catch (error) {
          expect(error).toBeInstanceOf(CalcError);
          expect((error as CalcError).pointer).toMatch(/^#\//);
          return;
        }
        expect(allFinite(out)).toBe(true);
        expect(PackEnergyResultSchema.safeParse(out).success).toBe(true);
      }),
      { seed: 7, numRuns: 500 },
    );
    // A capacity near zero is inside the schema's range: the answer is a named CalcError, not Infinity.
    expect(() => computePackEnergy({ pack: { ...lfp16, capacityAh: 1e-320 }, price: { amount: 1e8, currency: 'USD' } })).toThrow(CalcError);
  });
});
