import { describe, expect, it } from 'vitest';
import { PackCompareResultSchema, packCompareInputExample } from '#shared/schemas/pack-compare.ts';
import { PackEnergyResultSchema, packEnergyInputExample } from '#shared/schemas/pack-energy.ts';
import { v1Client } from '../../../tests/setup/v1.ts';

const api = v1Client();

describe('POST /v1/packs/energy', () => {
  it('when a 16S 100 Ah LFP pack is sent, then it answers 51.2 V and 5 120 Wh in the contract envelope', async () => {
    // Trade facts (common practice; an LFP module datasheet's "5120 Wh"): 16 × 3.2 V = 51.2 V; × 100 Ah = 5 120 Wh.
    const res = await api.post('/v1/packs/energy', { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(PackEnergyResultSchema.safeParse(res.body).success).toBe(true);
    expect(res.body.data).toMatchObject({ capacityAh: 100, depthOfDischargePct: 80 });
    expect(res.body.data.nominalVoltageV).toBeCloseTo(51.2, 10);
    expect(res.body.data.fullChargeVoltageV).toBeCloseTo(58.4, 10);
    expect(res.body.data.cutoffVoltageV).toBeCloseTo(40, 10);
    expect(res.body.data.energyWh).toBeCloseTo(5120, 8);
    expect(res.body.data.usableEnergyWh).toBeCloseTo(4096, 8);
    expect(res.body.data.costPerUsableKWh).toBeUndefined();
    expect(Array.isArray(res.body.checks) && Array.isArray(res.body.cautions)).toBe(true);
    expect(res.body.basis.join(' ')).toMatch(/Sunil/);
  });

  it('when the worked example is sent, then cost per usable kWh and per kWh cycled come back', async () => {
    const res = await api.post('/v1/packs/energy', packEnergyInputExample);
    expect(res.status).toBe(200);
    // 1450 ÷ 4.608 kWh; 1450 ÷ (4.608 × 4000).
    expect(res.body.data.costPerUsableKWh).toBeCloseTo(1450 / 4.608, 8);
    expect(res.body.data.lifetimeThroughputKWh).toBeCloseTo(18432, 6);
    expect(res.body.data.costPerKWhCycled).toBeCloseTo(1450 / 18432, 10);
  });

  it('when seriesCells is zero and a field is unknown, then it is a 422 problem naming both', async () => {
    const res = await api.post('/v1/packs/energy', { pack: { chemistry: 'lfp', seriesCells: 0, capacityAh: 100 }, volts: 12 });
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.type).toBe('/problems/validation-error');
    const pointers = res.body.errors.map((e: { pointer: string }) => e.pointer);
    expect(pointers).toContain('#/pack/seriesCells');
    expect(JSON.stringify(res.body.errors)).toMatch(/volts/);
  });

  it('when the chemistry is unknown, then the 422 names pack/chemistry', async () => {
    const res = await api.post('/v1/packs/energy', { pack: { chemistry: 'nicd', seriesCells: 10, capacityAh: 10 } });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/pack/chemistry');
  });

  it('when the capacity is below 1 mAh (where costs per kWh would overflow), then it is a 422 naming the field, not a 500', async () => {
    const res = await api.post('/v1/packs/energy', { pack: { chemistry: 'lfp', seriesCells: 1, capacityAh: 1e-320 }, price: { amount: 1e8, currency: 'USD' } });
    expect(res.status).toBe(422);
    expect(res.body.type).toBe('/problems/validation-error');
    expect(res.body.errors[0].pointer).toBe('#/pack/capacityAh');
  });
});

describe('POST /v1/packs/compare', () => {
  it('when the worked example is sent, then options come back ranked by cost per kWh cycled, best first', async () => {
    const res = await api.post('/v1/packs/compare', packCompareInputExample);
    expect(res.status).toBe(200);
    expect(PackCompareResultSchema.safeParse(res.body).success).toBe(true);
    expect(res.body.data.rankedBy).toBe('costPerKWhCycled');
    expect(res.body.data.currency).toBe('USD');
    const figures = res.body.data.options.map((o: { costPerKWhCycled: number }) => o.costPerKWhCycled);
    expect([...figures].sort((a: number, b: number) => a - b)).toEqual(figures);
    expect(res.body.data.options[0].relativeToBest).toBe(1);
    for (const o of res.body.data.options) expect(Object.keys(o)).toEqual(expect.arrayContaining(['label', 'energyWh', 'usableEnergyWh', 'costPerUsableKWh', 'relativeToBest']));
  });

  it('when currencies differ, then it is a 422 naming the second option’s currency', async () => {
    const pack = { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 };
    const res = await api.post('/v1/packs/compare', {
      options: [
        { label: 'A', pack, price: { amount: 500, currency: 'USD' } },
        { label: 'B', pack, price: { amount: 500, currency: 'EUR' } },
      ],
    });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/options/1/price/currency');
  });

  it('when only one option is sent, then it is a 422 naming options', async () => {
    const res = await api.post('/v1/packs/compare', { options: [{ label: 'A', pack: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 }, price: { amount: 1, currency: 'USD' } }] });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/options');
  });

  it('when a price is zero, then it is a 422 calculation error naming that amount', async () => {
    const pack = { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 };
    const res = await api.post('/v1/packs/compare', {
      options: [
        { label: 'A', pack, price: { amount: 500, currency: 'USD' } },
        { label: 'Free', pack, price: { amount: 0, currency: 'USD' } },
      ],
    });
    expect(res.status).toBe(422);
    expect(res.body.type).toBe('/problems/calculation-error');
    expect(res.body.errors[0].pointer).toBe('#/options/1/price/amount');
  });
});
