import { describe, expect, it } from 'vitest';
import { CompatibilityInputSchema } from '../../schemas/compatibility.ts';
import { cellOcvAtSoc, socAtCellOcv } from '../chemistry/ocv.ts';
import { chemistries } from '../chemistry/presets.ts';
import { computeCompatibility, integrateCellOcv } from './compatibility.ts';

const check = (input: Record<string, unknown>) => computeCompatibility(CompatibilityInputSchema.parse(input));
const pack48 = { label: 'Pack 48', chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 100, internalResistanceMOhm: 8, maxContinuousDischargeA: 100 };
const dcOnly = (dcInput: Record<string, unknown>, external: Record<string, unknown> = pack48) => check({ host: { dcInput }, external });
const method = (r: ReturnType<typeof check>, m: string) => r.data.methods.find((x) => x.method === m)!;

describe('DC input', () => {
  it('when a 16S LFP pack (40–58.4 V) meets a 12–60 V input, then it is compatible over its whole range', () => {
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 });
    expect(method(r, 'dc_input').verdict).toBe('compatible');
    // Current-capped: P = V × 15 A at 58.4 V and 40 V.
    expect(method(r, 'dc_input').inputPowerWAtFull).toBeCloseTo(876, 6);
    expect(method(r, 'dc_input').inputPowerWAtCutoff).toBeCloseTo(600, 6);
  });

  it('when the input maximum is below the full-charge voltage, then it is incompatible with a danger check', () => {
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 50, maxCurrentA: 15 });
    expect(method(r, 'dc_input').verdict).toBe('incompatible');
    expect(r.checks).toContainEqual(expect.objectContaining({ code: 'dc_input_overvoltage', level: 'danger' }));
    expect(method(r, 'dc_input').addedEnergyWh).toBeUndefined();
  });

  it('when the input minimum is above the pack\'s cut-off, then it is limited and the rest of the pack is unreachable', () => {
    const r = dcOnly({ minVoltageV: 52.8, maxVoltageV: 60, maxCurrentA: 15 });
    const m = method(r, 'dc_input');
    expect(m.verdict).toBe('limited');
    expect(m.inputPowerWAtCutoff).toBe(0);
    // 52.8 V is 3.3 V per cell, on the LFP curve at about 45.6 % (Sunil et al. breakpoints, linear).
    expect(m.usableSocRangePct!.toPct).toBeCloseTo(socAtCellOcv(chemistries.lfp.ocvCurve, 3.3), 2);
    expect(m.addedEnergyWh!).toBeLessThan(method(dcOnly({ minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 }), 'dc_input').addedEnergyWh!);
  });

  it('when a 12.8 V pack meets a 12–30 V input, then its cut-off (10 V) is below the input minimum: limited', () => {
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 30, maxCurrentA: 10 }, { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 });
    expect(method(r, 'dc_input').verdict).toBe('limited');
  });

  it('when the input caps current or power, then it is reported in reasons and the verdict stays compatible', () => {
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500 });
    const m = method(r, 'dc_input');
    expect(m.verdict).toBe('compatible');
    expect(m.inputPowerWAtFull).toBe(500);
    expect(m.reasons.join(' ')).toMatch(/500 W power limit/);
  });

  it('when only the current is capped, then the time is coulomb counting: capacity × ΔSoC / current', () => {
    // Analytic: P = V × I_max, so dt = (C · V · ds) / (V · I_max) = C · ds / I_max.
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 });
    const cutSoc = socAtCellOcv(chemistries.lfp.ocvCurve, 2.5);
    expect(method(r, 'dc_input').hoursToTransfer!).toBeCloseTo((100 * (100 - cutSoc)) / 100 / 15, 3);
  });

  it('when only the power is capped, then the time is energy / power', () => {
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 100, maxPowerW: 400 });
    const m = method(r, 'dc_input');
    expect(m.hoursToTransfer!).toBeCloseTo((m.addedEnergyWh! / 0.9) / 400, 2);
  });

  it('when a full 51.2 V 100 Ah LFP pack is drawn to cut-off, then the energy is within 3 % of its rated 5120 Wh and 90 % of it is added', () => {
    // Module datasheet (A): 51.2 V × 100 Ah = 5120 Wh. The OCV integral runs slightly above nominal (no load drop).
    const r = dcOnly({ minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 });
    expect(Math.abs(r.data.external.storedEnergyWh / 5120 - 1)).toBeLessThan(0.03);
    expect(method(r, 'dc_input').addedEnergyWh!).toBeCloseTo(r.data.external.storedEnergyWh * 0.9, 0);
  });

  it('when the OCV integral is computed exactly on segments, then it agrees with a fine midpoint sum', () => {
    const curve = chemistries.nmc.ocvCurve;
    let midpoint = 0;
    const n = 200_000;
    for (let k = 0; k < n; k += 1) midpoint += cellOcvAtSoc(curve, 3 + ((k + 0.5) * 94) / n) * (94 / n);
    expect(integrateCellOcv(curve, 3, 97)).toBeCloseTo(midpoint, 6);
  });
});

describe('direct parallel', () => {
  it('when chemistry and series count match, then it is compatible with cautions and a voltage-matching figure from the connection model', () => {
    const r = check({ host: { battery: { chemistry: 'lfp', seriesCells: 16, capacityAh: 40 } }, external: pack48 });
    const m = method(r, 'direct_parallel');
    expect(m.verdict).toBe('compatible');
    // Continuous limit × loop resistance: 100 A × 8 mΩ = 0.8 V.
    expect(m.recommendedMaxDifferenceV).toBeCloseTo(0.8, 10);
    expect(r.checks.map((c) => c.code)).toContain('direct_parallel_cautions');
    expect(r.cautions.join(' ')).toMatch(/Never parallel packs of different chemistry or voltage/);
    expect(m.addedEnergyWh).toBeCloseTo(r.data.external.storedEnergyWh, 6);
  });

  it('when chemistry or series count differ, then it is incompatible with a danger check', () => {
    for (const battery of [{ chemistry: 'nmc', seriesCells: 16 }, { chemistry: 'lfp', seriesCells: 15 }]) {
      const r = check({ host: { battery }, external: pack48 });
      expect(method(r, 'direct_parallel').verdict).toBe('incompatible');
      expect(r.checks).toContainEqual(expect.objectContaining({ code: 'direct_parallel_mismatch', level: 'danger' }));
    }
  });

  it('when the pack\'s resistance is unknown, then there is no figure but the matching advice still comes', () => {
    const r = check({ host: { battery: { chemistry: 'lfp', seriesCells: 16 } }, external: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } });
    const m = method(r, 'direct_parallel');
    expect(m.recommendedMaxDifferenceV).toBeNull();
    expect(m.reasons.join(' ')).toMatch(/charge both to full/);
  });

  it('when both methods are described, then both are answered', () => {
    const r = check({ host: { dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 }, battery: { chemistry: 'lfp', seriesCells: 16 } }, external: pack48 });
    expect(r.data.methods.map((m) => m.method)).toEqual(['dc_input', 'direct_parallel']);
  });
});
