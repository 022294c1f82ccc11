import fc from 'fast-check';
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { CalcError } from '../errors.ts';
import { packOcvAtSoc } from '../chemistry/pack.ts';
import { RuntimeInputSchema, RuntimeResultSchema, runtimeInputExample } from '../../schemas/runtime.ts';
import { computeRuntime } from './runtime.ts';
import { allFinite, anyPack, everydayPack, num, positive } from '../pack-energy/fixtures/arbitraries.ts';

const lfp16 = { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } as const;

describe('computeRuntime — energy balance', () => {
  it('when a 5.12 kWh LFP pack at its 80 % default runs a 500 W AC load through a 90 % inverter, then it runs 4096 ÷ (500 ÷ 0.9) h', () => {
    // Energy balance (analytic): 51.2 V × 100 Ah × 0.8 = 4096 Wh; battery power 500 / 0.9 = 555.6 W → 7.3728 h.
    const { data } = computeRuntime({ pack: lfp16, loads: [{ powerW: 500 }], inverterEfficiencyPct: 90 });
    expect(data.usableEnergyWh).toBeCloseTo(4096, 9);
    expect(data.batteryPowerW).toBeCloseTo(500 / 0.9, 10);
    expect(data.runtimeHours).toBeCloseTo(7.3728, 10);
    expect(data.runtimeMinutes).toBeCloseTo(7.3728 * 60, 8);
    expect(data.inverterLossW).toBeCloseTo(500 / 0.9 - 500, 10);
    // Battery current at the nominal voltage: P ÷ V (Ohm's-law power relation).
    expect(data.batteryCurrentA).toBeCloseTo(500 / 0.9 / 51.2, 10);
  });

  it('when the worked example is computed, then mathjs’s evaluator gives the same runtime', () => {
    const { data } = computeRuntime(RuntimeInputSchema.parse(runtimeInputExample));
    // mathjs (npm) as an outside evaluator of the same balance: AC 120 × 0.4 + 65, DC 24, idle 15, η 0.9.
    const expected = math.evaluate('(51.2 * 100 * 0.8) / ((120 * 0.4 + 65) / 0.9 + 24 + 15)');
    expect(data.runtimeHours).toBeCloseTo(expected, 10);
    expect(data.acLoadPowerW).toBeCloseTo(113, 10);
    expect(data.dcLoadPowerW).toBeCloseTo(24, 10);
    expect(data.peakBatteryPowerW).toBeCloseTo((120 + 65) / 0.9 + 24 + 15, 10);
  });

  it('when loads are on DC, then no inverter loss applies to them', () => {
    const { data, checks } = computeRuntime({ usableEnergyWh: 1000, loads: [{ powerW: 50, ac: false }] });
    expect(data.batteryPowerW).toBe(50);
    expect(data.runtimeHours).toBe(20);
    expect(data.batteryCurrentA).toBeUndefined();
    expect(checks.map((c) => c.code)).toContain('no_inverter');
  });

  it('when usable energy and a nominal voltage are given, then the current is power ÷ voltage', () => {
    const { data } = computeRuntime({ usableEnergyWh: 1200, nominalVoltageV: 12, loads: [{ powerW: 90, ac: false }, { powerW: 180 }], inverterEfficiencyPct: 100 });
    expect(data.batteryPowerW).toBe(270);
    expect(data.batteryCurrentA).toBeCloseTo(22.5, 12);
    expect(data.runtimeHours).toBeCloseTo(1200 / 270, 12);
  });

  it('when the pack is part-charged, then only the energy above its depth-of-discharge floor counts', () => {
    // 50 % charged, 80 % depth → floor at 20 %, 30 % of 5 120 Wh = 1 536 Wh.
    const { data } = computeRuntime({ pack: { ...lfp16, stateOfChargePct: 50 }, loads: [{ powerW: 100, ac: false }] });
    expect(data.usableEnergyWh).toBeCloseTo(1536, 9);
    // A resting voltage overrides: the voltage of the curve at 60 % gives 60 % back (curve inverse).
    const v60 = packOcvAtSoc(lfp16, 60);
    const byVoltage = computeRuntime({ pack: { ...lfp16, restingVoltageV: v60 }, loads: [{ powerW: 100, ac: false }] });
    expect(byVoltage.data.usableEnergyWh).toBeCloseTo(0.4 * 5120, 6);
    // Below the floor nothing is left, and a warning says so.
    const empty = computeRuntime({ pack: { ...lfp16, stateOfChargePct: 10 }, loads: [{ powerW: 100 }] });
    expect(empty.data.runtimeHours).toBe(0);
    expect(empty.checks.find((c) => c.code === 'no_usable_energy')?.level).toBe('warning');
  });

  it('when the peak current exceeds the pack’s continuous rating, then a danger check appears', () => {
    const { data, checks } = computeRuntime({ pack: { ...lfp16, maxContinuousDischargeA: 50 }, loads: [{ powerW: 3000, dutyCyclePct: 10 }] });
    expect(data.peakBatteryCurrentA).toBeCloseTo(3000 / 0.9 / 51.2, 10);
    expect(checks.find((c) => c.code === 'discharge_current_above_rating')?.level).toBe('danger');
    expect(data.batteryCurrentA).toBeLessThan(50);
  });

  it('when a lead-acid battery is drawn well above its 20-hour rate, then a Peukert warning appears', () => {
    // 12 V 100 Ah at about 0.35C: well above the 0.05C rating rate (Peukert 1897; reference values §6.4).
    const { checks } = computeRuntime({ pack: { chemistry: 'lead_acid_agm', seriesCells: 6, capacityAh: 100 }, loads: [{ powerW: 400, ac: false }] });
    expect(checks.find((c) => c.code === 'peukert_effect')?.level).toBe('warning');
    const lfp = computeRuntime({ pack: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 }, loads: [{ powerW: 400, ac: false }] });
    expect(lfp.checks.map((c) => c.code)).not.toContain('peukert_effect');
  });

  it('when both or neither of usableEnergyWh and pack are given, then the schema names usableEnergyWh', () => {
    const neither = RuntimeInputSchema.safeParse({ loads: [{ powerW: 10 }] });
    expect(neither.error!.issues[0]!.path).toEqual(['usableEnergyWh']);
    const both = RuntimeInputSchema.safeParse({ usableEnergyWh: 10, pack: lfp16, loads: [{ powerW: 10 }] });
    expect(both.error!.issues[0]!.path).toEqual(['usableEnergyWh']);
    expect(() => computeRuntime({ loads: [{ powerW: 10 }] })).toThrow(CalcError);
  });

  it('when results can hurt, then a caution defers to codes and makers', () => {
    expect(computeRuntime({ pack: lfp16, loads: [{ powerW: 10 }] }).cautions.join(' ')).toMatch(/local electrical codes/);
  });
});

describe('computeRuntime — properties', () => {
  it('when any load rises, then the runtime falls (strictly, when there is energy to use)', () => {
    const load = fc.record({ powerW: num(0.1, 10_000), ac: fc.boolean(), dutyCyclePct: num(1, 100) });
    fc.assert(
      fc.property(everydayPack, fc.array(load, { minLength: 1, maxLength: 8 }), fc.nat(7), num(1.001, 10), num(10, 100), (pack, loads, which, factor, eff) => {
        const i = which % loads.length;
        const base = computeRuntime({ pack, loads, inverterEfficiencyPct: eff }).data;
        const more = loads.map((l, k) => (k === i ? { ...l, powerW: l.powerW * factor } : l));
        const heavier = computeRuntime({ pack, loads: more, inverterEfficiencyPct: eff }).data;
        expect(heavier.batteryPowerW).toBeGreaterThan(base.batteryPowerW);
        expect(heavier.runtimeHours).toBeLessThan(base.runtimeHours);
      }),
      { seed: 3, numRuns: 300 },
    );
  });

  it('when any input in the schema’s range is given, then the result is finite and matches the result schema, or a CalcError names a field', () => {
    const load = fc.record({ powerW: positive(10_000_000), ac: fc.boolean(), dutyCyclePct: fc.double({ min: 1e-9, max: 100, noNaN: true }) }, { requiredKeys: ['powerW'] });
    const common = {
      loads: fc.array(load, { minLength: 1, maxLength: 100 }),
      inverterEfficiencyPct: num(10, 100),
      idleDrawW: num(0, 1_000_000),
    };
    const input = fc.oneof(
      fc.record({ pack: anyPack, depthOfDischargePct: num(1, 100), ...common }, { requiredKeys: ['pack', 'loads'] }),
      fc.record({ usableEnergyWh: positive(1e9), nominalVoltageV: positive(2000), ...common }, { requiredKeys: ['usableEnergyWh', 'loads'] }),
    );
    fc.assert(
      fc.property(input, (raw) => {
        const parsed = RuntimeInputSchema.parse(raw);
        let out: ReturnType<typeof computeRuntime>;
        try {
          out = computeRuntime(parsed);
        } catch (error) {
          expect(error).toBeInstanceOf(CalcError);
          expect((error as CalcError).pointer).toMatch(/^#\//);
          return;
        }
        expect(allFinite(out)).toBe(true);
        expect(RuntimeResultSchema.safeParse(out).success).toBe(true);
      }),
      { seed: 5, numRuns: 400 },
    );
  });
});
