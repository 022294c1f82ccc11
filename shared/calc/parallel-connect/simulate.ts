/**
 * Equalization of two packs connected in parallel, integrated over time on their OCV curves.
 *
 * State: the two states of charge s_A, s_B (%) and the heat E (J). With R the total loop resistance
 * (both internal resistances and the link), C_A, C_B the capacities (Ah) and OCV_X(s) the pack curves
 * (see ../parallel-share/pack-source.ts for the restingVoltageV offset):
 *   I    = (OCV_A(s_A) − OCV_B(s_B)) / R                       (A, positive from A into B)
 *   ds_A/dt = −I · 100 / (3600 · C_A),  ds_B/dt = +I · 100 / (3600 · C_B)   (%/s)
 *   dE/dt   = I² · R                                           (W)
 * Charge is conserved by construction: C_A·Δs_A = −C_B·Δs_B.
 *
 * On a straight stretch of both curves (slopes m_A, m_B in V/%) this is an RC discharge with
 *   τ = R · C_eff,  1/C_eff = m_A·100/(3600·C_A) + m_B·100/(3600·C_B)   (C_eff in farads),
 * so I(t) = I₀·e^(−t/τ); the tests use that closed form as a check (RC time constant, e.g. Wikipedia
 * "RC time constant"). The curves are piecewise linear, so the local τ changes at breakpoints.
 *
 * Integration: classical 4th-order Runge–Kutta. Adaptive mode (default): each step is a fraction (2 %) of the
 * local τ, never crosses a curve breakpoint (it stops on it, so each step sees one straight segment of
 * each curve), and never moves a state of charge by more than 2 %. Fixed-step mode: a constant step, for
 * benchmarks and comparisons. Both are bounded by `maxSteps`. The run stops when |I| falls to `stopBelowA`
 * (the crossing is hit exactly by re-taking the last step shorter: log-linear in I), when the giving pack
 * reaches 0 % or the receiving pack 100 % (its protection would end the transfer there), or at `maxSteps`.
 */
import { type PackSource, sourceOcvV, sourceSlopeVPerPct } from '../parallel-share/pack-source.ts';

export interface SimulationOptions {
  /** Constant step, s. When absent the step adapts to the curves. */
  fixedStepS?: number;
  /** Step budget; default 20 000. */
  maxSteps?: number;
  /** Stop when |I| ≤ this, A. Default: 1 % of the initial current. */
  stopBelowA?: number;
  /** Adaptive step as a fraction of the local time constant; default 0.02. */
  stepFraction?: number;
}

export type EndReason = 'settled' | 'soc_limit' | 'step_limit';

export interface SimulationResult {
  initialCurrentA: number;
  /** Time of each stored state, s (index 0 is the moment of connection). */
  tS: number[];
  currentA: number[];
  socAPct: number[];
  socBPct: number[];
  steps: number;
  endReason: EndReason;
  /** Time at which |I| reached stopBelowA, s; null if it did not. */
  stopTimeS: number | null;
  /** Ah moved from A into B over the run (negative: from B into A). */
  chargeAh: number;
  /** Heat in the whole loop resistance over the run, J. */
  heatJ: number;
}

const DEFAULT_MAX_STEPS = 20_000;
const MAX_SOC_STEP_PCT = 2;

/** Simulates the connection of pack sources `a` and `b` through a total loop resistance (Ω). */
export function simulateConnection(a: PackSource, b: PackSource, resistanceOhm: number, options: SimulationOptions = {}): SimulationResult {
  const maxSteps = options.maxSteps ?? DEFAULT_MAX_STEPS;
  const frac = options.stepFraction ?? 0.02;
  const kA = 100 / (3600 * a.capacityAh);
  const kB = 100 / (3600 * b.capacityAh);
  const current = (sA: number, sB: number) => (sourceOcvV(a, sA) - sourceOcvV(b, sB)) / resistanceOhm;

  let sA = a.initialSocPct;
  let sB = b.initialSocPct;
  let heat = 0;
  let t = 0;
  let i = current(sA, sB);
  const i0 = i;
  const stopBelowA = options.stopBelowA ?? Math.abs(i0) * 0.01;
  const tS = [0];
  const currentA = [i];
  const socAPct = [sA];
  const socBPct = [sB];

  // One RK4 step of length h from (sA, sB, heat); returns the new state.
  const rk4 = (h: number, s1: number, s2: number): [number, number, number] => {
    const i1 = current(s1, s2);
    const i2 = current(s1 - 0.5 * h * kA * i1, s2 + 0.5 * h * kB * i1);
    const i3 = current(s1 - 0.5 * h * kA * i2, s2 + 0.5 * h * kB * i2);
    const i4 = current(s1 - h * kA * i3, s2 + h * kB * i3);
    const iAvg = (i1 + 2 * i2 + 2 * i3 + i4) / 6;
    const i2Avg = (i1 * i1 + 2 * i2 * i2 + 2 * i3 * i3 + i4 * i4) / 6;
    return [s1 - h * kA * iAvg, s2 + h * kB * iAvg, h * i2Avg * resistanceOhm];
  };

  const adaptiveStep = (s1: number, s2: number, iNow: number): number => {
    const dirA = iNow > 0 ? -1 : 1; // A loses charge when current flows A → B
    const dirB = -dirA;
    const slopeA = sourceSlopeVPerPct(a, dirA < 0 ? s1 - 1e-9 : s1);
    const slopeB = sourceSlopeVPerPct(b, dirB < 0 ? s2 - 1e-9 : s2);
    const inverseC = slopeA * kA + slopeB * kB; // V per coulomb
    const absI = Math.abs(iNow);
    let h = inverseC > 0 ? (frac * resistanceOhm) / inverseC : Number.POSITIVE_INFINITY;
    h = Math.min(h, MAX_SOC_STEP_PCT / (absI * Math.max(kA, kB)));
    // Do not cross a breakpoint: |I| only decreases during a step, so the travel is at most |I|·k·h.
    const toBreak = (s: { curve: readonly { socPct: number }[] }, soc: number, dir: number) => {
      if (dir > 0) {
        const next = s.curve.find((p) => p.socPct > soc + 1e-9);
        return next ? next.socPct - soc : Number.POSITIVE_INFINITY;
      }
      let prev: number | undefined;
      for (const p of s.curve) if (p.socPct < soc - 1e-9) prev = p.socPct;
      return prev === undefined ? Number.POSITIVE_INFINITY : soc - prev;
    };
    h = Math.min(h, toBreak(a, s1, dirA) / (absI * kA), toBreak(b, s2, dirB) / (absI * kB));
    return h;
  };

  let endReason: EndReason = 'step_limit';
  let stopTimeS: number | null = null;
  if (Math.abs(i0) <= stopBelowA) {
    endReason = 'settled';
    stopTimeS = 0;
  }
  let steps = 0;
  while (endReason === 'step_limit' && steps < maxSteps) {
    if (i === 0) {
      // Exactly equal voltages: nothing left to move (guards the adaptive step against a division by zero).
      endReason = 'settled';
      stopTimeS = t;
      break;
    }
    const h = options.fixedStepS ?? adaptiveStep(sA, sB, i);
    let [nA, nB, dHeat] = rk4(h, sA, sB);
    let iNext = current(nA, nB);
    let hTaken = h;
    // End of transfer: the giving pack empty or the receiving pack full.
    const overA = i > 0 ? -nA : nA - 100;
    const overB = i > 0 ? nB - 100 : -nB;
    if (overA >= 0 || overB >= 0) {
      const fA = overA >= 0 ? (i > 0 ? sA : 100 - sA) / Math.abs(nA - sA) : 1;
      const fB = overB >= 0 ? (i > 0 ? 100 - sB : sB) / Math.abs(nB - sB) : 1;
      hTaken = h * Math.max(0, Math.min(fA, fB, 1));
      [nA, nB, dHeat] = rk4(hTaken, sA, sB);
      iNext = current(nA, nB);
      endReason = 'soc_limit';
    } else if (Math.abs(iNext) <= stopBelowA || Math.sign(iNext) !== Math.sign(i)) {
      // Settled inside this step: re-take it to land on |I| = stopBelowA (log-linear in |I|).
      const a0 = Math.abs(i);
      const a1 = Math.max(Math.abs(iNext), 1e-300);
      const f = Math.sign(iNext) !== Math.sign(i) ? 1 : Math.log(a0 / stopBelowA) / Math.log(a0 / a1);
      hTaken = h * Math.min(Math.max(f, 0), 1);
      [nA, nB, dHeat] = rk4(hTaken, sA, sB);
      iNext = current(nA, nB);
      endReason = 'settled';
    }
    sA = nA;
    sB = nB;
    heat += dHeat;
    t += hTaken;
    i = iNext;
    steps += 1;
    tS.push(t);
    currentA.push(i);
    socAPct.push(sA);
    socBPct.push(sB);
    if (endReason === 'settled') stopTimeS = t;
  }

  return {
    initialCurrentA: i0,
    tS,
    currentA,
    socAPct,
    socBPct,
    steps,
    endReason,
    stopTimeS,
    chargeAh: ((a.initialSocPct - sA) * a.capacityAh) / 100,
    heatJ: heat,
  };
}
