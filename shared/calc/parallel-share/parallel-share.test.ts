import { lusolve } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { ParallelShareInputSchema } from '../../schemas/parallel-share.ts';
import { socAtCellOcv } from '../chemistry/ocv.ts';
import { chemistries } from '../chemistry/presets.ts';
import { CalcError } from '../errors.ts';
import { computeParallelShare, solveNodeVoltage, type TheveninSource } from './parallel-share.ts';

const share = (input: Record<string, unknown>) => computeParallelShare(ParallelShareInputSchema.parse(input));

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

describe('solveNodeVoltage against textbook examples', () => {
  it('when 28 V / 4 Ω, 0 V / 2 Ω and 7 V / 1 Ω are in parallel, then the node is 8 V and the 7 V source is charged at 1 A', () => {
    // Kuphaldt, Lessons in Electric Circuits Vol. I, "Millman's Theorem": V = (28/4 + 0/2 + 7/1)/(1/4 + 1/2 + 1/1) = 8 V.
    const sol = solveNodeVoltage(
      [
        { ocvV: 28, resistanceOhm: 4 },
        { ocvV: 0, resistanceOhm: 2 },
        { ocvV: 7, resistanceOhm: 1 },
      ],
      { currentA: 0 },
    );
    expect(sol.busVoltageV).toBeCloseTo(8, 12);
    // Branch currents (derived): 5 A out of B1, 4 A into R2, 1 A into B3.
    expect(sol.currentsA[0]).toBeCloseTo(5, 12);
    expect(sol.currentsA[1]).toBeCloseTo(-4, 12);
    expect(sol.currentsA[2]).toBeCloseTo(-1, 12);
  });

  it('when 10 V / 3 Ω and 12 V / 5 Ω feed a 30 Ω load, then V = 172/17 V and the 10 V source takes 2/51 A', () => {
    // Tutorial example (mathskey.com), exact values derived: V = 172/17, I1 = −2/51 A, I2 = 32/85 A, I_load = 172/510 A.
    // The 30 Ω load is the same circuit element as a 0 V source behind 30 Ω.
    const sol = solveNodeVoltage(
      [
        { ocvV: 10, resistanceOhm: 3 },
        { ocvV: 12, resistanceOhm: 5 },
        { ocvV: 0, resistanceOhm: 30 },
      ],
      { currentA: 0 },
    );
    expect(sol.busVoltageV).toBeCloseTo(172 / 17, 12);
    expect(sol.currentsA[0]).toBeCloseTo(-2 / 51, 12);
    expect(sol.currentsA[1]).toBeCloseTo(32 / 85, 12);
    expect(-sol.currentsA[2]!).toBeCloseTo(172 / 510, 12);
    // Thevenin equivalent of the two sources alone: R_th = 1.875 Ω, V_th = 10.75 V.
    const th = solveNodeVoltage([{ ocvV: 10, resistanceOhm: 3 }, { ocvV: 12, resistanceOhm: 5 }], { currentA: 0 });
    expect(th.theveninResistanceOhm).toBeCloseTo(1.875, 12);
    expect(th.theveninVoltageV).toBeCloseTo(10.75, 12);
  });

  it('when N random sources feed a constant-current load, then the bus voltage and currents match mathjs lusolve of the circuit equations', () => {
    // Independent solution: unknowns [V, I_1..I_N]; V + R_i·I_i = E_i for each source, Σ I_i = I_load (mathjs lusolve).
    const next = rng(42);
    for (let k = 0; k < 100; k += 1) {
      const n = 2 + Math.floor(next() * 7);
      const sources: TheveninSource[] = Array.from({ length: n }, () => ({ ocvV: 48 + next() * 10, resistanceOhm: 0.002 + next() * 0.05 }));
      const loadA = next() * 300;
      const a: number[][] = [];
      const b: number[] = [];
      sources.forEach((s, i) => {
        const r = new Array(n + 1).fill(0);
        r[0] = 1;
        r[i + 1] = s.resistanceOhm;
        a.push(r);
        b.push(s.ocvV);
      });
      a.push([0, ...new Array(n).fill(1)]);
      b.push(loadA);
      const x = (lusolve(a, b) as number[][]).map((row) => row[0]!);
      const sol = solveNodeVoltage(sources, { currentA: loadA });
      expect(sol.busVoltageV).toBeCloseTo(x[0]!, 9);
      sol.currentsA.forEach((c, i) => expect(c).toBeCloseTo(x[i + 1]!, 7));
    }
  });

  it('when the load is a constant power, then the bus voltage is the quadratic\'s higher root (S + √(S² − 4GP)) / 2G', () => {
    // Closed form of G·V² − S·V + P = 0; the solver itself uses Newton's method.
    const next = rng(7);
    for (let k = 0; k < 100; k += 1) {
      const n = 2 + Math.floor(next() * 7);
      const sources: TheveninSource[] = Array.from({ length: n }, () => ({ ocvV: 12 + next() * 2, resistanceOhm: 0.005 + next() * 0.05 }));
      const g = sources.reduce((s, x) => s + 1 / x.resistanceOhm, 0);
      const s = sources.reduce((acc, x) => acc + x.ocvV / x.resistanceOhm, 0);
      const pMax = (s * s) / (4 * g);
      const p = pMax * next() * 0.99;
      const closed = (s + Math.sqrt(s * s - 4 * g * p)) / (2 * g);
      const sol = solveNodeVoltage(sources, { powerW: p });
      expect(sol.busVoltageV).toBeCloseTo(closed, 9);
      expect(sol.busVoltageV * sol.loadCurrentA).toBeCloseTo(p, 6);
      expect(sol.currentsA.reduce((x, y) => x + y, 0)).toBeCloseTo(sol.loadCurrentA, 6);
    }
  });

  it('when the power exceeds V_th² / 4R_th, then it is a calculation error naming load.powerW', () => {
    const sources = [{ ocvV: 12, resistanceOhm: 0.01 }, { ocvV: 12, resistanceOhm: 0.01 }];
    // V_th = 12 V, R_th = 5 mΩ → P_max = 144 / 0.02 = 7200 W.
    expect(solveNodeVoltage(sources, { powerW: 7199 }).busVoltageV).toBeGreaterThan(5.9);
    expect(() => solveNodeVoltage(sources, { powerW: 7201 })).toThrow(CalcError);
    try {
      solveNodeVoltage(sources, { powerW: 7201 });
    } catch (e) {
      expect((e as CalcError).code).toBe('load_exceeds_packs');
      expect((e as CalcError).pointer).toBe('#/load/powerW');
    }
  });
});

describe('computeParallelShare', () => {
  const lfp = (extra: Record<string, unknown>) => ({ chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 60, ...extra });

  it('when two packs at the same voltage have 8 mΩ and 12 mΩ, then a 100 A load splits 60 A / 40 A', () => {
    // Current divider (derived): I_k = I · (1/R_k) / Σ(1/R_i).
    const r = share({ packs: [lfp({ internalResistanceMOhm: 8 }), lfp({ internalResistanceMOhm: 12 })], load: { currentA: 100 } });
    expect(r.data.packs[0]!.currentA).toBeCloseTo(60, 3);
    expect(r.data.packs[1]!.currentA).toBeCloseTo(40, 3);
    expect(r.data.packs[0]!.sharePct).toBeCloseTo(60, 3);
    expect(r.cautions.join(' ')).toMatch(/different chemistry or voltage/);
  });

  it('when packs are given by resting voltage, then the Millman node voltage follows (12.8 V / 10 mΩ and 13.2 V / 10 mΩ, no load → 13.0 V)', () => {
    // V = (12.8/0.01 + 13.2/0.01)/(2/0.01) = 13.0 V; 20 A circulates from the higher pack.
    const pack = (v: number) => ({ chemistry: 'lfp', seriesCells: 4, capacityAh: 100, restingVoltageV: v, internalResistanceMOhm: 10 });
    const r = share({ packs: [pack(12.8), pack(13.2)], load: { currentA: 0.000001 } });
    expect(r.data.busVoltageV).toBeCloseTo(13.0, 4);
    expect(r.data.packs[1]!.currentA).toBeCloseTo(20, 3);
    expect(r.checks.map((c) => c.code)).toContain('pack_back_fed');
  });

  it('when sharing currents are summed, then they equal the load (property, seeded)', () => {
    const next = rng(99);
    for (let k = 0; k < 100; k += 1) {
      const n = 2 + Math.floor(next() * 7);
      const packs = Array.from({ length: n }, () => lfp({ stateOfChargePct: 20 + next() * 70, internalResistanceMOhm: 2 + next() * 30, cableResistanceMOhm: next() * 5 }));
      const load = next() < 0.5 ? { currentA: 1 + next() * 200 } : { powerW: 100 + next() * 5000 };
      const r = share({ packs, load });
      const sum = r.data.packs.reduce((s, p) => s + p.currentA, 0);
      expect(Math.abs(sum - r.data.loadCurrentA)).toBeLessThan(1e-3 * n);
    }
  });

  it('when a pack has no resistance, then it is a calculation error naming that pack', () => {
    expect(() => share({ packs: [lfp({ internalResistanceMOhm: 8 }), lfp({})], load: { currentA: 10 } })).toThrow(/Pack 2 has no resistance/);
  });

  it('when packs of different chemistry or series count are paralleled, then danger checks say never to', () => {
    const r = share({ packs: [lfp({ internalResistanceMOhm: 8 }), { chemistry: 'nmc', seriesCells: 14, capacityAh: 50, stateOfChargePct: 50, internalResistanceMOhm: 10 }], load: { currentA: 10 } });
    expect(r.checks.filter((c) => c.level === 'danger').map((c) => c.code)).toEqual(expect.arrayContaining(['mixed_chemistry', 'series_mismatch']));
  });

  it('when two identical packs carry a constant current to cut-off, then the time matches coulomb counting to the state where OCV − I·R/2 is the cut-off', () => {
    // Analytic (derived): equal packs share equally; each reaches cut-off when its OCV(s) = V_cut + (I/2)·R_int.
    const iLoad = 50;
    const rInt = 0.008;
    const r = share({ packs: [lfp({ stateOfChargePct: 80, internalResistanceMOhm: 8 }), lfp({ stateOfChargePct: 80, internalResistanceMOhm: 8 })], load: { currentA: iLoad }, timeline: true });
    const sEnd = socAtCellOcv(chemistries.lfp.ocvCurve, (40 + (iLoad / 2) * rInt) / 16);
    const expectedS = ((80 - sEnd) / 100) * 100 * 3600 / (iLoad / 2);
    expect(Math.abs(r.data.timeToFirstCutoffS! / expectedS - 1)).toBeLessThan(1e-3);
    const tl = r.data.timeline!;
    expect(tl.length).toBeLessThanOrEqual(201);
    expect(tl[0]!.tS).toBe(0);
    expect(tl.at(-1)!.tS).toBeCloseTo(r.data.timeToFirstCutoffS!, 0);
  });

  it('when unequal packs run to cut-off, then the charge they gave equals ∫ I_load dt (charge conservation)', () => {
    const r = share({
      packs: [lfp({ stateOfChargePct: 90, internalResistanceMOhm: 8, capacityAh: 100 }), lfp({ stateOfChargePct: 70, internalResistanceMOhm: 15, capacityAh: 50 })],
      load: { powerW: 2000 },
      timeline: true,
    });
    const tl = r.data.timeline!;
    let integralAs = 0;
    for (let k = 1; k < tl.length; k += 1) integralAs += ((tl[k]!.loadCurrentA + tl[k - 1]!.loadCurrentA) / 2) * (tl[k]!.tS - tl[k - 1]!.tS);
    const givenAh = ((90 - tl.at(-1)!.packs[0]!.stateOfChargePct) * 100) / 100 + ((70 - tl.at(-1)!.packs[1]!.stateOfChargePct) * 50) / 100;
    expect(Math.abs(integralAs / 3600 / givenAh - 1)).toBeLessThan(5e-3);
    expect(r.data.firstCutoffPack).not.toBeNull();
  });
});
