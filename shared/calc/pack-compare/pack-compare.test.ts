import fc from 'fast-check';
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { CalcError } from '../errors.ts';
import { PackCompareInputSchema, PackCompareResultSchema, packCompareInputExample, type PackCompareInput } from '../../schemas/pack-compare.ts';
import { computePackCompare } from './pack-compare.ts';
import { allFinite, anyPack, everydayPack, num } from '../pack-energy/fixtures/arbitraries.ts';

const usd = (amount: number) => ({ amount, currency: 'USD' });

describe('computePackCompare', () => {
  it('when every option has a cycle life, then they are ranked by cost per kWh cycled, lowest first', () => {
    const { data } = computePackCompare(PackCompareInputSchema.parse(packCompareInputExample));
    expect(data.rankedBy).toBe('costPerKWhCycled');
    // By hand (mathjs evaluate), usable kWh × cycles:
    // A: 51.2 V × 100 Ah × 0.8 = 4.096 kWh × 4000; B: 12.8 V × 280 Ah × 0.8 = 2.8672 kWh × 3500;
    // C: 12 V × 200 Ah × 0.5 = 1.2 kWh × 600.
    const a = math.evaluate('1450 / (4.096 * 4000)');
    const b = math.evaluate('690 / (2.8672 * 3500)');
    const c = math.evaluate('420 / (1.2 * 600)');
    expect(data.options.map((o) => o.label)).toEqual(['Option B', 'Option A', 'Option C']);
    expect(data.options.map((o) => o.rank)).toEqual([1, 2, 3]);
    expect(data.options[0]!.costPerKWhCycled).toBeCloseTo(b, 12);
    expect(data.options[1]!.costPerKWhCycled).toBeCloseTo(a, 12);
    expect(data.options[2]!.costPerKWhCycled).toBeCloseTo(c, 12);
    expect(data.options[0]!.relativeToBest).toBe(1);
    expect(data.options[1]!.relativeToBest).toBeCloseTo(a / b, 12);
    expect(data.options[2]!.relativeToBest).toBeCloseTo(c / b, 12);
  });

  it('when one option lacks a cycle life, then all are ranked by cost per usable kWh and a check says why', () => {
    const input: PackCompareInput = {
      options: [
        { label: 'Long life', pack: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 }, price: usd(600), cycleLife: 6000 },
        { label: 'Cheap', pack: { chemistry: 'lead_acid_agm', seriesCells: 6, capacityAh: 100 }, price: usd(150) },
      ],
    };
    const { data, checks } = computePackCompare(input);
    expect(data.rankedBy).toBe('costPerUsableKWh');
    // Usable: LFP 12.8 × 100 × 0.8 = 1.024 kWh → 585.94/kWh; AGM 12 × 100 × 0.5 = 0.6 kWh → 250/kWh.
    expect(data.options.map((o) => o.label)).toEqual(['Cheap', 'Long life']);
    expect(data.options[0]!.costPerUsableKWh).toBeCloseTo(250, 10);
    expect(data.options[1]!.costPerUsableKWh).toBeCloseTo(600 / 1.024, 10);
    expect(data.options[1]!.costPerKWhCycled).toBeCloseTo(600 / (1.024 * 6000), 12);
    expect(checks.map((c) => c.code)).toContain('cycle_life_incomplete');
  });

  it('when two options cost the same per kWh, then they keep the order given', () => {
    const pack = { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 } as const;
    const { data } = computePackCompare({
      options: [
        { label: 'First', pack, price: usd(500) },
        { label: 'Second', pack, price: usd(500) },
        { label: 'Cheaper', pack, price: usd(400) },
      ],
    });
    expect(data.options.map((o) => o.label)).toEqual(['Cheaper', 'First', 'Second']);
    expect(data.options[1]!.relativeToBest).toBeCloseTo(1.25, 12);
  });

  it('when currencies differ or a price is zero, then a CalcError points at the field', () => {
    const pack = { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 } as const;
    const mixed = () => computePackCompare({ options: [{ label: 'A', pack, price: usd(1) }, { label: 'B', pack, price: { amount: 1, currency: 'EUR' } }] });
    expect(mixed).toThrow(CalcError);
    expect(() => mixed()).toThrow(expect.objectContaining({ pointer: '#/options/1/price/currency' }));
    expect(() => computePackCompare({ options: [{ label: 'A', pack, price: usd(1) }, { label: 'B', pack, price: usd(0) }] })).toThrow(
      expect.objectContaining({ code: 'zero_price', pointer: '#/options/1/price/amount' }),
    );
  });

  it('when the schema sees mixed currencies, then the issue names the option’s currency field', () => {
    const pack = { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 };
    const r = PackCompareInputSchema.safeParse({ options: [{ label: 'A', pack, price: usd(1) }, { label: 'B', pack, price: { amount: 2, currency: 'EUR' } }] });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0]!.path).toEqual(['options', 1, 'price', 'currency']);
  });

  it('when any options in the schema’s range are compared, then the ranking is sorted, starts at 1 and is finite (or a CalcError names a field)', () => {
    const option = fc.record(
      {
        label: fc.string({ minLength: 1, maxLength: 10 }).filter((s) => s.trim().length > 0),
        // Mostly everyday packs and prices, so that most runs rank; sometimes the schema's extremes.
        pack: fc.oneof({ arbitrary: everydayPack, weight: 9 }, { arbitrary: anyPack, weight: 1 }),
        depthOfDischargePct: num(1, 100),
        price: fc.record({ amount: fc.oneof({ arbitrary: num(1, 100_000), weight: 9 }, { arbitrary: num(0, 100_000_000), weight: 1 }), currency: fc.constant('USD') }),
        cycleLife: fc.integer({ min: 1, max: 1_000_000 }),
      },
      { requiredKeys: ['label', 'pack', 'price'] },
    );
    fc.assert(
      fc.property(fc.array(option, { minLength: 2, maxLength: 20 }), (options) => {
        const parsed = PackCompareInputSchema.parse({ options });
        let out: ReturnType<typeof computePackCompare>;
        try {
          out = computePackCompare(parsed);
        } catch (error) {
          expect(error).toBeInstanceOf(CalcError);
          expect((error as CalcError).pointer).toMatch(/^#\/options\/\d+\//);
          return;
        }
        {
          expect(allFinite(out)).toBe(true);
          expect(PackCompareResultSchema.safeParse(out).success).toBe(true);
          const figures = out.data.options.map((o) => (out.data.rankedBy === 'costPerKWhCycled' ? o.costPerKWhCycled! : o.costPerUsableKWh));
          for (let i = 1; i < figures.length; i += 1) expect(figures[i]!).toBeGreaterThanOrEqual(figures[i - 1]!);
          expect(out.data.options[0]!.relativeToBest).toBe(1);
        }
      }),
      { seed: 11, numRuns: 200 },
    );
  });
});
