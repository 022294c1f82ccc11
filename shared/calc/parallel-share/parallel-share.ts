/**
 * Load sharing between 2–8 packs in parallel on one bus.
 *
 * Model: each pack is its open-circuit voltage E_i behind R_i = internal + cable resistance (Thevenin
 * source). Kirchhoff's current law at the bus (node-voltage analysis; Millman's theorem):
 *   Σ (E_i − V) / R_i = I_load.
 * With G = Σ 1/R_i and S = Σ E_i/R_i the packs together are V_th = S/G behind R_th = 1/G, so
 * - a constant-current load gives V = (S − I_load) / G;
 * - a constant-power load (I_load = P / V) gives G·V² − S·V + P = 0, a quadratic. Its real roots exist
 *   only while P ≤ S² / (4G) = V_th² / (4 R_th), the most the packs can deliver into any load; beyond that
 *   the load cannot be supplied and a CalcError is thrown. The operating point is the higher root (the
 *   stable one, where the load draws the lesser current); it is found by Newton's method started at V_th,
 *   which converges monotonically to that root.
 * Pack currents are I_i = (E_i − V)/R_i (negative: the pack is charged by the others) and sum to I_load.
 *
 * Timeline (optional): the states of charge move by dSoC_i/dt = −I_i / (36 × capacityAh_i) %/s, integrated
 * with the explicit midpoint method at a step of 1/2000 of the estimated run time, shortened where a curve is
 * steep to a fifth of the fastest pack-to-pack time constant (at most 4000 steps), until the first pack's terminal voltage E_i − I_i × R_internal,i reaches its cut-off voltage or its
 * state of charge reaches 0 % (the crossing is interpolated within the step). Output is thinned to ≤ 201 points.
 *
 * Sources: Kuphaldt, Lessons in Electric Circuits Vol. I, "Millman's Theorem"; IIT Kharagpur virtual lab
 * "Verification of Millman's Theorem" (V_m = Σ(V_i/R_i)/Σ(1/R_i)); chemistry OCV curves in ../chemistry.
 */
import type { ParallelShareData, ParallelShareInput } from '../../schemas/parallel-share.ts';
import { batteryWorkCautions } from '../tables/safety-cautions.ts';
import { CalcError } from '../errors.ts';
import type { CalcOutput, Check } from '../types.ts';
import { milliohmToOhm, roundTo } from '../units.ts';
import { packSource, sourceOcvV, sourceSlopeVPerPct, type PackSource } from './pack-source.ts';

export interface TheveninSource {
  ocvV: number;
  resistanceOhm: number;
}

export type NodeLoad = { currentA: number } | { powerW: number };

export interface NodeSolution {
  busVoltageV: number;
  loadCurrentA: number;
  /** Current out of each source, A. */
  currentsA: number[];
  theveninVoltageV: number;
  theveninResistanceOhm: number;
  /** V_th² / (4 R_th), W. */
  maxPowerW: number;
}

/**
 * Solves the bus voltage of parallel Thevenin sources feeding a constant-current or constant-power load.
 * Every resistance must be positive. Throws CalcError `load_exceeds_packs` when a constant-power load is
 * above V_th²/(4 R_th).
 */
export function solveNodeVoltage(sources: readonly TheveninSource[], load: NodeLoad, powerPointer = '#/load/powerW'): NodeSolution {
  let g = 0;
  let s = 0;
  for (const src of sources) {
    g += 1 / src.resistanceOhm;
    s += src.ocvV / src.resistanceOhm;
  }
  const vTh = s / g;
  const maxPowerW = (vTh * vTh * g) / 4;
  let v: number;
  if ('currentA' in load) {
    v = (s - load.currentA) / g;
  } else {
    const p = load.powerW;
    if (!(vTh > 0) || p > maxPowerW) {
      throw new CalcError(
        'load_exceeds_packs',
        `A ${roundTo(p, 1)} W constant-power load is more than these packs can deliver: at most ${roundTo(Math.max(maxPowerW, 0), 1)} W (V_th² / 4R_th with V_th = ${roundTo(vTh, 3)} V, R_th = ${roundTo(1000 / g, 4)} mΩ), and well before that the voltage collapses.`,
        powerPointer,
      );
    }
    // Newton on f(V) = G·V² − S·V + P from V_th (f > 0, f' > 0 there): monotone convergence to the upper root.
    v = vTh;
    for (let i = 0; i < 200; i += 1) {
      const f = g * v * v - s * v + p;
      const df = 2 * g * v - s;
      if (df <= 0) break;
      const next = v - f / df;
      if (Math.abs(next - v) <= 1e-13 * Math.abs(v)) {
        v = next;
        break;
      }
      v = next;
    }
  }
  const currentsA = sources.map((src) => (src.ocvV - v) / src.resistanceOhm);
  const loadCurrentA = 'currentA' in load ? load.currentA : load.powerW / v;
  return { busVoltageV: v, loadCurrentA, currentsA, theveninVoltageV: vTh, theveninResistanceOhm: 1 / g, maxPowerW };
}

const MAX_TIMELINE_STEPS = 4000;
const TARGET_TIMELINE_STEPS = 2000;
const MAX_TIMELINE_POINTS = 201;

/** Evenly thins indices 0..n−1 to at most `max`, always keeping the first and last. */
export function thinIndices(n: number, max: number): number[] {
  if (n <= max) return Array.from({ length: n }, (_, i) => i);
  const out: number[] = [];
  for (let k = 0; k < max; k += 1) out.push(Math.round((k * (n - 1)) / (max - 1)));
  return out;
}

/**
 * Shares a load between 2–8 packs (model above). Resistances in mΩ on input (internal + cable), load in A or W;
 * returns the bus voltage (V), each pack's current (A, negative when charged), power (W) and share (%), and
 * optionally the timeline to the first cut-off (s).
 */
export function computeParallelShare(input: ParallelShareInput): CalcOutput<ParallelShareData> {
  const checks: Check[] = [];
  const sources: PackSource[] = input.packs.map((p, i) => packSource(p, `Pack ${i + 1}`));
  const resistancesOhm = input.packs.map((p, i) => {
    const r = sources[i]!.internalOhm + milliohmToOhm(p.cableResistanceMOhm ?? 0);
    if (!(r > 0)) {
      throw new CalcError(
        'pack_resistance_missing',
        `${sources[i]!.label} has no resistance: give internalResistanceMOhm (and cableResistanceMOhm) — how packs share a load depends on it.`,
        `#/packs/${i}/internalResistanceMOhm`,
      );
    }
    return r;
  });
  const load: NodeLoad = input.load.currentA !== undefined ? { currentA: input.load.currentA } : { powerW: input.load.powerW! };

  const first = input.packs[0]!;
  input.packs.forEach((p, i) => {
    if (i > 0 && p.chemistry !== first.chemistry) {
      checks.push({ code: 'mixed_chemistry', level: 'danger', message: `${sources[i]!.label} is ${p.chemistry} but ${sources[0]!.label} is ${first.chemistry}: never parallel packs of different chemistry.` });
    }
    if (i > 0 && p.seriesCells !== first.seriesCells) {
      checks.push({ code: 'series_mismatch', level: 'danger', message: `${sources[i]!.label} has ${p.seriesCells} cells in series but ${sources[0]!.label} has ${first.seriesCells}: never parallel packs of different voltage.` });
    }
    if (sources[i]!.socAssumed) {
      checks.push({ code: 'soc_assumed', level: 'info', message: `${sources[i]!.label}: no stateOfChargePct or restingVoltageV given; 100 % assumed.` });
    }
  });

  const solveAt = (socs: readonly number[]) =>
    solveNodeVoltage(
      sources.map((s, i) => ({ ocvV: sourceOcvV(s, socs[i]!), resistanceOhm: resistancesOhm[i]! })),
      load,
    );
  const socs0 = sources.map((s) => s.initialSocPct);
  const sol = solveAt(socs0);

  sol.currentsA.forEach((iA, k) => {
    const p = input.packs[k]!;
    const label = sources[k]!.label;
    const peak = p.peakDischargeA ?? (p.maxContinuousDischargeA !== undefined ? 2 * p.maxContinuousDischargeA : undefined);
    if (iA < 0) {
      const over = p.maxChargeA !== undefined && -iA > p.maxChargeA;
      checks.push({
        code: 'pack_back_fed',
        level: over ? 'danger' : 'warning',
        message: `${label} is being charged at ${roundTo(-iA, 2)} A by the other packs${over ? `, above its ${p.maxChargeA} A charge limit` : ''}: its open-circuit voltage is below the bus.`,
      });
    } else if (peak !== undefined && iA > peak) {
      checks.push({ code: 'pack_over_peak', level: 'danger', message: `${label} carries ${roundTo(iA, 2)} A, above its ${roundTo(peak, 1)} A peak rating: its protection will trip or the pack will be damaged.` });
    } else if (p.maxContinuousDischargeA !== undefined && iA > p.maxContinuousDischargeA) {
      checks.push({ code: 'pack_over_continuous', level: 'warning', message: `${label} carries ${roundTo(iA, 2)} A, above its ${p.maxContinuousDischargeA} A continuous rating.` });
    }
    const terminalV = sources[k]!.initialOcvV - iA * sources[k]!.internalOhm;
    if (terminalV < sources[k]!.cutoffVoltageV) {
      checks.push({ code: 'below_cutoff', level: 'warning', message: `${label}'s terminal voltage ${roundTo(terminalV, 3)} V is below its ${roundTo(sources[k]!.cutoffVoltageV, 2)} V cut-off under this load.` });
    }
  });
  if (sources.some((s) => !s.internalGiven)) {
    checks.push({ code: 'internal_resistance_missing', level: 'warning', message: 'A pack has no internalResistanceMOhm: only its cable resistance sets its share, which overstates its current.' });
  }

  let timeline: ParallelShareData['timeline'];
  let timeToFirstCutoffS: number | null = null;
  let firstCutoffPack: string | null = null;
  if (input.timeline) {
    const run = runShareTimeline(sources, resistancesOhm, solveAt, socs0);
    timeline = run.points;
    timeToFirstCutoffS = run.cutoffS;
    firstCutoffPack = run.cutoffIndex === null ? null : sources[run.cutoffIndex]!.label;
    if (run.endReason === 'load_exceeds_packs') {
      checks.push({ code: 'power_collapse', level: 'danger', message: `At ${roundTo(run.endS / 3600, 3)} h the packs can no longer deliver the load's power: the bus voltage collapses before a pack reaches cut-off.` });
    } else if (run.endReason === 'step_limit') {
      checks.push({ code: 'timeline_incomplete', level: 'info', message: 'The timeline stopped at its step limit before any pack reached cut-off.' });
    }
    if (run.overfilled) {
      checks.push({ code: 'pack_overfilled', level: 'warning', message: 'A back-fed pack reached 100 % during the timeline; its protection would stop the charge there, which this model does not.' });
    }
  }

  const r = (x: number, d: number) => roundTo(x, d);
  return {
    data: {
      busVoltageV: r(sol.busVoltageV, 4),
      loadCurrentA: r(sol.loadCurrentA, 4),
      loadPowerW: r(sol.loadCurrentA * sol.busVoltageV, 3),
      maxDeliverablePowerW: r(sol.maxPowerW, 1),
      packs: sources.map((s, i) => ({
        label: s.label,
        openCircuitVoltageV: r(s.initialOcvV, 4),
        stateOfChargePct: r(s.initialSocPct, 3),
        resistanceMOhm: r(resistancesOhm[i]! * 1000, 4),
        currentA: r(sol.currentsA[i]!, 4),
        powerW: r(sol.currentsA[i]! * sol.busVoltageV, 3),
        sharePct: r((sol.currentsA[i]! / sol.loadCurrentA) * 100, 3),
      })),
      timeToFirstCutoffS: timeToFirstCutoffS === null ? null : r(timeToFirstCutoffS, 1),
      timeToFirstCutoffH: timeToFirstCutoffS === null ? null : r(timeToFirstCutoffS / 3600, 4),
      firstCutoffPack,
      ...(timeline ? { timeline } : {}),
    },
    checks,
    cautions: batteryWorkCautions('Fuse each pack separately before the common bus, so that a fault in one pack is not fed by the others.'),
    basis: [
      'Node-voltage analysis (Millman\'s theorem): each pack is its open-circuit voltage behind internal + cable resistance; Σ(E_i − V)/R_i = I_load',
      'Constant-power load: G·V² − S·V + P = 0, higher root; no solution above V_th²/(4R_th)',
      'Open-circuit voltages from the chemistry presets\' OCV curves (restingVoltageV overrides at the start)',
      ...(input.timeline ? ['Timeline: explicit midpoint integration of each pack\'s state of charge to the first cut-off'] : []),
    ],
  };
}

interface ShareRun {
  points: NonNullable<ParallelShareData['timeline']>;
  cutoffS: number | null;
  cutoffIndex: number | null;
  endS: number;
  endReason: 'cutoff' | 'load_exceeds_packs' | 'step_limit';
  overfilled: boolean;
}

function runShareTimeline(
  sources: readonly PackSource[],
  resistancesOhm: readonly number[],
  solveAt: (socs: readonly number[]) => NodeSolution,
  socs0: readonly number[],
): ShareRun {
  const kPctPerAs = sources.map((s) => 100 / (3600 * s.capacityAh));
  const tS: number[] = [0];
  const socHist: number[][] = [socs0.slice()];
  const solHist: NodeSolution[] = [solveAt(socs0)];
  // Per pack, two margins to its end of discharge: terminal voltage over cut-off (V) and state of charge (%).
  // A pack is done when either reaches 0; each is interpolated linearly inside the step that crosses it.
  const margins = (sol: NodeSolution, socs: readonly number[]) =>
    sources.map((src, i) => [sourceOcvV(src, socs[i]!) - sol.currentsA[i]! * src.internalOhm - src.cutoffVoltageV, socs[i]!] as const);
  const crossed = (m: ReturnType<typeof margins>) => m.findIndex(([v, soc]) => v <= 0 || soc <= 0);
  const storedAh = sources.reduce((sum, s, i) => sum + (s.capacityAh * Math.max(socs0[i]!, 0)) / 100, 0);
  const nominalDtS = Math.max((storedAh * 3600) / Math.max(solHist[0]!.loadCurrentA, 1e-9) / TARGET_TIMELINE_STEPS, 1e-3);
  // Where a curve is steep the packs exchange charge quickly among themselves (time constant R_i·C_i with
  // C_i = 1/(dOCV_i/dQ)); the step stays below a fifth of the fastest one so the explicit method is stable.
  const stepAt = (socs: readonly number[]) => {
    let dt = nominalDtS;
    sources.forEach((src, i) => {
      const dVdQ = sourceSlopeVPerPct(src, socs[i]!) * kPctPerAs[i]!;
      if (dVdQ > 0) dt = Math.min(dt, (0.2 * resistancesOhm[i]!) / dVdQ);
    });
    return Math.max(dt, 1e-3);
  };
  let endReason: ShareRun['endReason'] = 'step_limit';
  let cutoffS: number | null = null;
  let cutoffIndex: number | null = null;
  let overfilled = false;
  let prevMargins = margins(solHist[0]!, socs0);
  if (crossed(prevMargins) !== -1) {
    endReason = 'cutoff';
    cutoffS = 0;
    cutoffIndex = crossed(prevMargins);
  }
  let socs = socs0.slice();
  let sol = solHist[0]!;
  for (let step = 0; endReason === 'step_limit' && step < MAX_TIMELINE_STEPS; step += 1) {
    const dtS = stepAt(socs);
    let next: number[];
    let nextSol: NodeSolution;
    try {
      const mid = socs.map((s, i) => s - 0.5 * dtS * sol.currentsA[i]! * kPctPerAs[i]!);
      const midSol = solveAt(mid);
      next = socs.map((s, i) => s - dtS * midSol.currentsA[i]! * kPctPerAs[i]!);
      nextSol = solveAt(next);
    } catch (error) {
      if (error instanceof CalcError) {
        endReason = 'load_exceeds_packs';
        break;
      }
      throw error;
    }
    const t = tS[tS.length - 1]! + dtS;
    const m = margins(nextSol, next);
    if (next.some((s) => s > 100)) overfilled = true;
    if (crossed(m) !== -1) {
      // The earliest crossing inside the step, each margin linear over the step.
      let f = Number.POSITIVE_INFINITY;
      let who = 0;
      m.forEach(([v, soc], i) => {
        if (v > 0 && soc > 0) return;
        const [pv, psoc] = prevMargins[i]!;
        const fi = Math.min(v <= 0 ? pv / (pv - v) : 1, soc <= 0 ? psoc / (psoc - soc) : 1);
        if (fi < f) {
          f = fi;
          who = i;
        }
      });
      const tc = t - dtS + f * dtS;
      const socC = socs.map((s, i) => s + f * (next[i]! - s));
      let solC = nextSol;
      try {
        solC = solveAt(socC);
      } catch {
        // Between two solvable states the interpolated one is solvable in practice; keep the step's end if not.
      }
      tS.push(tc);
      socHist.push(socC);
      solHist.push(solC);
      cutoffS = tc;
      cutoffIndex = who;
      endReason = 'cutoff';
      break;
    }
    tS.push(t);
    socHist.push(next);
    solHist.push(nextSol);
    socs = next;
    sol = nextSol;
    prevMargins = m;
  }
  const keep = thinIndices(tS.length, MAX_TIMELINE_POINTS);
  const points = keep.map((k) => ({
    tS: roundTo(tS[k]!, 1),
    busVoltageV: roundTo(solHist[k]!.busVoltageV, 4),
    loadCurrentA: roundTo(solHist[k]!.loadCurrentA, 4),
    packs: solHist[k]!.currentsA.map((c, i) => ({ currentA: roundTo(c, 4), stateOfChargePct: roundTo(socHist[k]![i]!, 3) })),
  }));
  return { points, cutoffS, cutoffIndex, endS: tS[tS.length - 1]!, endReason, overfilled };
}
