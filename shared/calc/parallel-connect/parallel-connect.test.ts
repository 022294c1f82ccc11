import * as mathjs from 'mathjs';
import { describe, expect, it } from 'vitest';
import { ParallelConnectInputSchema } from '../../schemas/parallel-connect.ts';
import { chemistries } from '../chemistry/presets.ts';
import { CalcError } from '../errors.ts';
import { packSource, sourceOcvV } from '../parallel-share/pack-source.ts';
import { findConductor } from '../tables/conductors.ts';
import { computeParallelConnect } from './parallel-connect.ts';
import { simulateConnection } from './simulate.ts';

const connect = (input: Record<string, unknown>) => computeParallelConnect(ParallelConnectInputSchema.parse(input));
// mathjs ships solveODE (Dormand–Prince RK45) but its type declarations do not list it.
const solveODE = (mathjs as unknown as {
  solveODE: (f: (t: number, y: number[]) => number[], tspan: number[], y0: number[], options: Record<string, number>) => { t: number[]; y: number[][] };
}).solveODE;

const lfp16 = (extra: Record<string, unknown>) => ({ chemistry: 'lfp' as const, seriesCells: 16, capacityAh: 100, ...extra });

function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// The LFP curve's long straight stretch: breakpoints 29.72 % (3.2772 V) to 98.33 % (3.3511 V) per cell
// (Sunil et al., IEEE TIM 2025). Both packs inside it make the equalization a plain RC discharge.
const plateau = chemistries.lfp.ocvCurve.filter((p) => p.socPct === 29.72 || p.socPct === 98.33);
const slopeVPerPct = ((plateau[1]!.cellVoltageV - plateau[0]!.cellVoltageV) / (plateau[1]!.socPct - plateau[0]!.socPct)) * 16;

describe('initial current against textbook examples', () => {
  it('when a 12 V battery of 0.03 Ω meets a 6 V battery of 0.02 Ω, then 120 A flows', () => {
    // Boylestad, Introductory Circuit Analysis, "Voltage sources in parallel": (12 − 6)/(0.03 + 0.02) = 120 A.
    const r = connect({
      packA: { chemistry: 'lead_acid_agm', seriesCells: 6, capacityAh: 50, restingVoltageV: 12, internalResistanceMOhm: 30 },
      packB: { chemistry: 'lead_acid_agm', seriesCells: 3, capacityAh: 50, restingVoltageV: 6, internalResistanceMOhm: 20 },
    });
    expect(r.data.voltageDifferenceV).toBeCloseTo(6, 10);
    expect(r.data.initialCurrentA).toBeCloseTo(120, 6);
    expect(r.data.verdict).toBe('unsafe'); // different series counts
    expect(r.checks).toContainEqual(expect.objectContaining({ code: 'series_mismatch', level: 'danger' }));
  });

  it('when 12 V / 3 Ω meets 5 V / 2 Ω, then 1.4 A flows', () => {
    // Physics forum case (secondary): (12 − 5)/(3 + 2) = 1.4 A.
    const r = connect({
      packA: { chemistry: 'lead_acid_flooded', seriesCells: 6, capacityAh: 10, restingVoltageV: 12, internalResistanceMOhm: 3000 },
      packB: { chemistry: 'lead_acid_flooded', seriesCells: 6, capacityAh: 10, restingVoltageV: 5, internalResistanceMOhm: 2000 },
    });
    expect(r.data.initialCurrentA).toBeCloseTo(1.4, 6);
  });

  it('when LFP packs at 53.6 V and 52.0 V with 8 mΩ each and 4 mΩ of cabling are joined, then 80 A flows', () => {
    // Derived example (reference values §6.2): I₀ = 1.6 V / 20 mΩ = 80 A.
    const r = connect({ packA: lfp16({ restingVoltageV: 53.6, internalResistanceMOhm: 8 }), packB: lfp16({ restingVoltageV: 52, internalResistanceMOhm: 8 }), link: { resistanceMOhm: 4 } });
    expect(r.data.initialCurrentA).toBeCloseTo(80, 6);
    expect(r.data.totalResistanceMOhm).toBeCloseTo(20, 10);
    expect(r.data.timeline[0]).toEqual({ tS: 0, currentA: 80, socAPct: expect.any(Number), socBPct: expect.any(Number) });
  });

  it('when pack A is the lower one, then the difference, the current and the charge moved are all negative (A minus B)', () => {
    const r = connect({ packA: lfp16({ restingVoltageV: 52, internalResistanceMOhm: 8 }), packB: lfp16({ restingVoltageV: 53.6, internalResistanceMOhm: 8 }), link: { resistanceMOhm: 4 } });
    expect(r.data.voltageDifferenceV).toBeCloseTo(-1.6, 10);
    expect(r.data.initialCurrentA).toBeCloseTo(-80, 6);
    expect(r.data.chargeTransferredAh).toBeLessThan(0);
    expect(r.data.finalStateOfChargeAPct).toBeGreaterThan(r.data.timeline[0]!.socAPct);
  });

  it('when the link is a 2/0 AWG cable 2 m each way, then its resistance is the conductor table\'s 20 °C value over 4 m', () => {
    // NEC Ch. 9 Table 8: 2/0 stranded 0.0967 Ω/kft at 75 °C; Note 2 back to 20 °C (α = 0.00323 from 75 °C): × 0.8223.
    const r = connect({ packA: lfp16({ restingVoltageV: 53.6, internalResistanceMOhm: 8 }), packB: lfp16({ restingVoltageV: 52, internalResistanceMOhm: 8 }), link: { cable: { size: '2/0', oneWayLengthM: 2 } } });
    const table8 = (0.0967 / 304.8) * 4 * (1 - 0.00323 * 55) * 1000; // mΩ
    expect(Math.abs(r.data.linkResistanceMOhm / table8 - 1)).toBeLessThan(5e-4);
    expect(r.data.linkResistanceMOhm).toBeCloseTo(findConductor('2/0 AWG')!.resistanceOhmPerKm20C * 4, 3);
  });
});

describe('equalization over time', () => {
  it('when both packs sit on a straight stretch of the curve, then the current is the RC closed form I₀·e^(−t/τ) with τ = R·C_eff', () => {
    // RC time constant (Wikipedia "RC time constant"): discharge v = V·e^(−t/τ); 36.8 % at 1τ, 0.7 % at 5τ.
    const a = packSource(lfp16({ stateOfChargePct: 90, capacityAh: 100 }), 'A');
    const b = packSource(lfp16({ stateOfChargePct: 40, capacityAh: 60 }), 'B');
    const rOhm = 0.02;
    const inverseC = slopeVPerPct * (100 / (3600 * 100)) + slopeVPerPct * (100 / (3600 * 60)); // V per coulomb
    const tau = rOhm / inverseC;
    const sim = simulateConnection(a, b, rOhm);
    const i0 = sim.initialCurrentA;
    expect(i0).toBeCloseTo((sourceOcvV(a, 90) - sourceOcvV(b, 40)) / rOhm, 10);
    for (let k = 0; k < sim.tS.length; k += 1) {
      expect(Math.abs(sim.currentA[k]! / (i0 * Math.exp(-sim.tS[k]! / tau)) - 1)).toBeLessThan(1e-6);
    }
    expect(sim.endReason).toBe('settled');
    // Settled at 1 % of I₀: t = τ·ln 100.
    expect(Math.abs(sim.stopTimeS! / (tau * Math.log(100)) - 1)).toBeLessThan(1e-6);
    // Charge: ∫ I dt = I₀·τ·(1 − 0.01); heat: ∫ I²R dt = R·I₀²·τ/2·(1 − 0.01²).
    expect(Math.abs(sim.chargeAh / ((i0 * tau * 0.99) / 3600) - 1)).toBeLessThan(1e-6);
    expect(Math.abs(sim.heatJ / (((rOhm * i0 * i0 * tau) / 2) * (1 - 1e-4)) - 1)).toBeLessThan(1e-6);
    // The 1τ point of the table: 36.8 %.
    const oneTau = sim.tS.findIndex((t) => t >= tau);
    expect(sim.currentA[oneTau]! / i0).toBeCloseTo(Math.exp(-sim.tS[oneTau]! / tau), 6);
  });

  it('when the packs cross the steep ends of the curve, then the states of charge match mathjs solveODE (RK45) on the same equations', () => {
    // Independent integrator: mathjs solveODE, Dormand–Prince RK45 with tight tolerance, on dSoC/dt = ∓I·100/(3600·C).
    const a = packSource(lfp16({ stateOfChargePct: 99.8, capacityAh: 100 }), 'A');
    const b = packSource(lfp16({ stateOfChargePct: 3, capacityAh: 80 }), 'B');
    const rOhm = 0.025;
    const sim = simulateConnection(a, b, rOhm);
    expect(sim.endReason).toBe('settled');
    const f = (_t: number, y: number[]) => {
      const i = (sourceOcvV(a, y[0]!) - sourceOcvV(b, y[1]!)) / rOhm;
      return [(-i * 100) / (3600 * 100), (i * 100) / (3600 * 80)];
    };
    for (const frac of [0.02, 0.1, 0.3, 0.6, 1]) {
      const k = Math.max(1, Math.round(frac * (sim.tS.length - 1)));
      const ref = solveODE(f, [0, sim.tS[k]!], [99.8, 3], { tol: 1e-9, maxIter: 1e6 });
      const [refA, refB] = ref.y.at(-1)!;
      expect(Math.abs(sim.socAPct[k]! - refA!)).toBeLessThan(2e-4);
      expect(Math.abs(sim.socBPct[k]! - refB!)).toBeLessThan(2e-4);
    }
  });

  it('when charge leaves A, then exactly the same charge arrives in B, and it equals ∫ I dt (charge conservation)', () => {
    const r = connect({ packA: lfp16({ stateOfChargePct: 95, capacityAh: 100, internalResistanceMOhm: 8 }), packB: lfp16({ stateOfChargePct: 10, capacityAh: 50, internalResistanceMOhm: 12 }), link: { resistanceMOhm: 3 } });
    const a = packSource(lfp16({ stateOfChargePct: 95, capacityAh: 100 }), 'A');
    const b = packSource(lfp16({ stateOfChargePct: 10, capacityAh: 50 }), 'B');
    const sim = simulateConnection(a, b, 0.023);
    const last = sim.tS.length - 1;
    const outOfA = ((95 - sim.socAPct[last]!) * 100) / 100;
    const intoB = ((sim.socBPct[last]! - 10) * 50) / 100;
    expect(outOfA).toBeCloseTo(intoB, 9);
    let integralAs = 0;
    for (let k = 1; k <= last; k += 1) integralAs += ((sim.currentA[k]! + sim.currentA[k - 1]!) / 2) * (sim.tS[k]! - sim.tS[k - 1]!);
    expect(Math.abs(integralAs / 3600 / outOfA - 1)).toBeLessThan(1e-3);
    expect(r.data.chargeTransferredAh).toBeCloseTo(outOfA, 3);
    expect(r.data.linkEnergyLossWh).toBeCloseTo((r.data.energyLossWh * 3) / 23, 3);
  });

  it('when the step is fixed, then the step budget is respected and the result approaches the adaptive one', () => {
    const a = packSource(lfp16({ stateOfChargePct: 80 }), 'A');
    const b = packSource(lfp16({ stateOfChargePct: 50 }), 'B');
    const fixed = simulateConnection(a, b, 0.02, { fixedStepS: 5, maxSteps: 1000, stopBelowA: 0 });
    expect(fixed.steps).toBe(1000);
    expect(fixed.endReason).toBe('step_limit');
    expect(fixed.tS.at(-1)).toBeCloseTo(5000, 6);
    const adaptive = simulateConnection(a, b, 0.02);
    // Both on the plateau: compare at the fixed run's end with the RC closed form through the adaptive run's τ.
    const tau = -adaptive.tS[1]! / Math.log(adaptive.currentA[1]! / adaptive.currentA[0]!);
    expect(fixed.currentA.at(-1)! / fixed.initialCurrentA).toBeCloseTo(Math.exp(-5000 / tau), 6);
  });

  it('when the voltage difference grows the inrush grows, and when the resistance grows it shrinks (property, seeded)', () => {
    const next = rng(4242);
    for (let k = 0; k < 200; k += 1) {
      const vB = 50 + next() * 4;
      const d1 = next() * 3;
      const d2 = d1 + 0.01 + next() * 2;
      const r1 = 1 + next() * 40;
      const r2 = r1 + 0.5 + next() * 20;
      const run = (d: number, rM: number) =>
        connect({ packA: lfp16({ restingVoltageV: vB + d, internalResistanceMOhm: rM / 2 }), packB: lfp16({ restingVoltageV: vB, internalResistanceMOhm: rM / 2 }) }).data.initialCurrentA;
      expect(run(d2, r1)).toBeGreaterThan(run(d1, r1));
      if (d1 > 0.001) expect(run(d1, r2)).toBeLessThan(run(d1, r1));
    }
  });
});

describe('verdict, matching and pre-charge', () => {
  const limits = { maxContinuousDischargeA: 100, peakDischargeA: 200 };
  const pair = (vA: number, vB: number, extra: Record<string, unknown> = {}) => ({
    packA: lfp16({ restingVoltageV: vA, internalResistanceMOhm: 8, ...extra }),
    packB: lfp16({ restingVoltageV: vB, internalResistanceMOhm: 8, ...extra }),
    link: { resistanceMOhm: 4 },
  });

  it('when the initial current exceeds a peak limit, then the verdict is unsafe with a danger check', () => {
    // 5 V / 20 mΩ = 250 A > 200 A peak.
    const r = connect(pair(55, 50, limits));
    expect(r.data.initialCurrentA).toBeCloseTo(250, 6);
    expect(r.data.verdict).toBe('unsafe');
    expect(r.checks).toContainEqual(expect.objectContaining({ code: 'inrush_over_peak', level: 'danger' }));
  });

  it('when no peak is given, then twice the continuous limit is the peak', () => {
    // 4.2 V / 20 mΩ = 210 A > 2 × 100 A; 3.8 V → 190 A is only a caution.
    expect(connect(pair(54.2, 50, { maxContinuousDischargeA: 100 })).data.verdict).toBe('unsafe');
    expect(connect(pair(53.8, 50, { maxContinuousDischargeA: 100 })).data.verdict).toBe('caution');
  });

  it('when the current is between the continuous and the peak limit, then caution; below it, safe', () => {
    expect(connect(pair(53, 50, limits)).data.verdict).toBe('caution'); // 150 A
    expect(connect(pair(51.5, 50, limits)).data.verdict).toBe('safe'); // 75 A
  });

  it('when no limits are known, then the verdict is caution', () => {
    const r = connect(pair(50.2, 50));
    expect(r.data.verdict).toBe('caution');
    expect(r.checks.map((c) => c.code)).toContain('limits_unknown');
  });

  it('when the receiving pack has a lower charge limit, then that limit sets the matching difference', () => {
    const r = connect({ ...pair(51, 50, limits), packB: lfp16({ restingVoltageV: 50, internalResistanceMOhm: 8, ...limits, maxChargeA: 40 }) });
    expect(r.data.continuousLimitA).toBe(40);
    expect(r.data.recommendedMaxDifferenceV).toBeCloseTo(40 * 0.02, 10);
    expect(r.data.verdict).toBe('caution'); // 50 A > 40 A
  });

  it('when packs are connected at exactly the recommended difference, then the initial current is the continuous limit', () => {
    const first = connect(pair(53, 50, limits));
    const d = first.data.recommendedMaxDifferenceV!;
    expect(d).toBeCloseTo(2, 10); // 100 A × 20 mΩ
    const again = connect(pair(50 + d, 50, limits));
    expect(again.data.initialCurrentA).toBeCloseTo(100, 6);
    expect(again.data.verdict).toBe('safe');
  });

  it('when the packs are of different chemistry, then the verdict is unsafe whatever the current', () => {
    const r = connect({ packA: lfp16({ restingVoltageV: 52, internalResistanceMOhm: 8 }), packB: { chemistry: 'nmc', seriesCells: 14, capacityAh: 50, restingVoltageV: 52, internalResistanceMOhm: 10 } });
    expect(r.data.initialCurrentA).toBeCloseTo(0, 10);
    expect(r.data.verdict).toBe('unsafe');
  });

  it('when a pre-charge is needed, then R = ΔV/I_target − R_total, its peak power is I_target²·R, and its energy matches the RC closed form', () => {
    // Both packs on the LFP plateau (52.44–53.62 V for 16 cells): 1.05 V apart, 20 mΩ loop, 10 A target
    // → R_pre = 0.105 − 0.02 = 0.085 Ω and 10² × 0.085 = 8.5 W. Continuous limit 25 A → bypass at 25 A × 20 mΩ = 0.5 V.
    // Energy into the whole loop while the difference falls from ΔV₀ to ΔV₁ is ½·C_eff·(ΔV₀² − ΔV₁²) (capacitor
    // discharge through a resistor); the resistor's part is R_pre/(R_pre + R_total).
    const packLimits = { maxContinuousDischargeA: 25, peakDischargeA: 100 };
    const r = connect({
      packA: lfp16({ restingVoltageV: 53.55, internalResistanceMOhm: 8, ...packLimits }),
      packB: lfp16({ restingVoltageV: 52.5, internalResistanceMOhm: 8, ...packLimits }),
      link: { resistanceMOhm: 4 },
      prechargeTargetA: 10,
    });
    const p = r.data.precharge!;
    expect(p.needed).toBe(true);
    expect(p.resistanceOhm).toBeCloseTo(0.085, 4);
    expect(p.peakPowerW).toBeCloseTo(8.5, 2);
    expect(p.bypassAtDifferenceV).toBeCloseTo(0.5, 4);
    const cEff = 1 / (2 * slopeVPerPct * (100 / (3600 * 100)));
    const closed = (0.5 * cEff * (1.05 ** 2 - 0.5 ** 2) * 0.085) / 0.105;
    expect(Math.abs(p.energyJ / closed - 1)).toBeLessThan(1e-4);
    // Time: ΔV falls as e^(−t/τ') with τ' = 0.105 Ω × C_eff.
    expect(Math.abs(p.timeToBypassS! / (0.105 * cEff * Math.log(1.05 / 0.5)) - 1)).toBeLessThan(1e-4);
  });

  it('when the inrush is already within the target, then no pre-charge is needed', () => {
    const p = connect(pair(50.5, 50, limits)).data.precharge!;
    expect(p).toMatchObject({ needed: false, resistanceOhm: 0, peakPowerW: 0, energyJ: 0 });
  });

  it('when there is no resistance anywhere, then it is a calculation error', () => {
    expect(() => connect({ packA: lfp16({ restingVoltageV: 52 }), packB: lfp16({ restingVoltageV: 51 }) })).toThrow(CalcError);
  });

  it('when the timeline is returned, then it has at most 201 points, starts at the connection and ends where the current settled', () => {
    const r = connect(pair(53.6, 52, limits));
    expect(r.data.timeline.length).toBeLessThanOrEqual(201);
    expect(r.data.timeline[0]!.tS).toBe(0);
    expect(r.data.timeline.at(-1)!.tS).toBeCloseTo(r.data.timeToSettleS!, 1);
    expect(Math.abs(r.data.timeline.at(-1)!.currentA / r.data.initialCurrentA)).toBeCloseTo(0.01, 6);
    for (let k = 1; k < r.data.timeline.length; k += 1) expect(r.data.timeline[k]!.tS).toBeGreaterThan(r.data.timeline[k - 1]!.tS);
  });
});

describe('robustness', () => {
  it('when random valid packs of any chemistry are connected, then the answer is finite or a CalcError, never another failure (seeded)', () => {
    const next = rng(2718);
    const chems = ['lfp', 'nmc', 'lto', 'lead_acid_agm', 'lead_acid_flooded'] as const;
    const pack = () => ({
      chemistry: chems[Math.floor(next() * 5)]!,
      seriesCells: 1 + Math.floor(next() * 20),
      capacityAh: 0.5 + next() * 300,
      ...(next() < 0.5 ? { stateOfChargePct: next() < 0.2 ? Math.round(next()) * 100 : next() * 100 } : { restingVoltageV: 1 + next() * 80 }),
      ...(next() < 0.8 ? { internalResistanceMOhm: next() * 200 } : {}),
      ...(next() < 0.5 ? { maxContinuousDischargeA: 1 + next() * 300 } : {}),
      ...(next() < 0.3 ? { peakDischargeA: 1 + next() * 600, peakDurationS: 1 + next() * 30 } : {}),
    });
    for (let k = 0; k < 400; k += 1) {
      try {
        const r = connect({ packA: pack(), packB: pack(), ...(next() < 0.5 ? { link: { resistanceMOhm: next() * 10 } } : {}), ...(next() < 0.3 ? { prechargeTargetA: 0.1 + next() * 50 } : {}) });
        JSON.stringify(r.data, (_key, v) => {
          if (typeof v === 'number') expect(Number.isFinite(v)).toBe(true);
          return v;
        });
        expect(r.data.timeline.length).toBeLessThanOrEqual(201);
      } catch (e) {
        expect(e).toBeInstanceOf(CalcError);
      }
    }
  });
});
