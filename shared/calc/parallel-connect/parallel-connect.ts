/**
 * Connecting two packs in parallel: the inrush, its decay, a verdict, and a pre-charge resistor.
 *
 * Model: each pack is its open-circuit voltage (chemistry OCV curve at its state of charge;
 * `restingVoltageV` overrides it at the start) behind its internal resistance; the link adds its own
 * (given in mΩ, or a copper cable from the conductor table at 20 °C over the round trip — a cool cable has
 * the least resistance, so the inrush is not understated). Missing internal resistances count as zero
 * (worst case). The loop current I = (OCV_A − OCV_B) / R_total is integrated over time as both states of
 * charge move (see simulate.ts) until it falls to 1 % of its initial value ("settled").
 * Textbook check: Boylestad, Introductory Circuit Analysis, "Voltage sources in parallel": 12 V / 0.03 Ω
 * against 6 V / 0.02 Ω gives (12 − 6)/(0.03 + 0.02) = 120 A.
 *
 * Verdict (Ohmstead contract):
 * - `unsafe` (danger check) when |I₀| exceeds either pack's peak limit: peakDischargeA, or without one
 *   2 × maxContinuousDischargeA; also when the packs differ in chemistry or series count.
 * - `caution` when |I₀| exceeds the continuous limit (both packs' maxContinuousDischargeA and the receiving
 *   pack's maxChargeA), when the current stays above it longer than a pack's peakDurationS, or when no
 *   limits are known.
 * - `safe` otherwise.
 * recommendedMaxDifferenceV = continuous limit × R_total (the largest difference whose initial current stays
 * within it). The pre-charge resistor limits the initial current to `prechargeTargetA` (default: the
 * continuous limit): R_pre = |ΔV| / I_target − R_total, peak power I_target² · R_pre, and the energy it absorbs
 * while the packs equalize through it until the difference is small enough to close the main connection
 * (R_total × continuous limit) — simulated with the same model.
 */
import type { ParallelConnectData, ParallelConnectInput } from '../../schemas/parallel-connect.ts';
import type { PackSpec } from '../../schemas/common.ts';
import { findConductor } from '../tables/conductors.ts';
import { batteryWorkCautions } from '../tables/safety-cautions.ts';
import { CalcError } from '../errors.ts';
import type { CalcOutput, Check } from '../types.ts';
import { milliohmToOhm, roundTo } from '../units.ts';
import { packSource } from '../parallel-share/pack-source.ts';
import { thinIndices } from '../parallel-share/parallel-share.ts';
import { resolveOneWayLengthM } from '../wire-size/wire-size.ts';
import { simulateConnection } from './simulate.ts';

/** Fraction of the initial current at which the equalization counts as settled. */
export const SETTLED_FRACTION = 0.01;
const MAX_TIMELINE_POINTS = 201;

/** A pack's peak limit: peakDischargeA, or 2 × maxContinuousDischargeA; undefined when neither is known. */
export function packPeakLimitA(p: PackSpec): number | undefined {
  return p.peakDischargeA ?? (p.maxContinuousDischargeA !== undefined ? 2 * p.maxContinuousDischargeA : undefined);
}

/** The smallest of the defined numbers, or null when none is defined. */
export const minDefined = (...xs: Array<number | undefined>): number | null => {
  const d = xs.filter((x): x is number => x !== undefined);
  return d.length === 0 ? null : Math.min(...d);
};

/** The link resistance in Ω and a description of where it came from. */
export function linkResistanceOhm(link: ParallelConnectInput['link']): { ohm: number; description: string } {
  if (!link) return { ohm: 0, description: 'no link resistance given (zero)' };
  if (link.resistanceMOhm !== undefined) return { ohm: milliohmToOhm(link.resistanceMOhm), description: `link ${link.resistanceMOhm} mΩ` };
  if (link.cable) {
    const row = findConductor(link.cable.size);
    if (!row) throw new CalcError('unknown_conductor', `Unknown conductor size "${link.cable.size}".`, '#/link/cable/size');
    const lengthM = resolveOneWayLengthM(link.cable, '#/link/cable/oneWayLengthM');
    const ohm = (row.resistanceOhmPerKm20C * 2 * lengthM) / 1000;
    return { ohm, description: `${row.size} copper, ${roundTo(lengthM, 3)} m one way (${roundTo(2 * lengthM, 3)} m round trip) at 20 °C: ${roundTo(ohm * 1000, 4)} mΩ` };
  }
  return { ohm: 0, description: 'no link resistance given (zero)' };
}

/**
 * Connects pack A to pack B (model above). Resistances in mΩ, cable lengths in m or ft; returns volts, amperes
 * (positive from A into B), seconds, ampere-hours, watt-hours, the verdict, the matching difference and the
 * pre-charge resistor (Ω, W, J), and a timeline of at most 201 points.
 */
export function computeParallelConnect(input: ParallelConnectInput): CalcOutput<ParallelConnectData> {
  const checks: Check[] = [];
  const a = packSource(input.packA, 'Pack A');
  const b = packSource(input.packB, 'Pack B');
  const link = linkResistanceOhm(input.link);
  const totalOhm = a.internalOhm + b.internalOhm + link.ohm;
  if (!(totalOhm > 0)) {
    throw new CalcError(
      'loop_resistance_missing',
      'The connection has no resistance at all, so the model would give an unbounded current: give the packs\' internalResistanceMOhm (from the makers\' data) and/or the link.',
      '#/packA/internalResistanceMOhm',
    );
  }
  for (const [s, key] of [[a, 'packA'], [b, 'packB']] as const) {
    if (!s.internalGiven) checks.push({ code: 'internal_resistance_assumed_zero', level: 'warning', message: `${s.label} has no internalResistanceMOhm: counted as zero, which overstates the current (the worst case).` });
    if (s.socAssumed) checks.push({ code: 'soc_assumed', level: 'info', message: `${s.label}: no stateOfChargePct or restingVoltageV given (${key}); 100 % assumed.` });
  }

  let mismatch = false;
  if (input.packA.chemistry !== input.packB.chemistry) {
    mismatch = true;
    checks.push({ code: 'mixed_chemistry', level: 'danger', message: `The packs are ${input.packA.chemistry} and ${input.packB.chemistry}: never parallel packs of different chemistry. Their voltages do not track and one will be over- or under-charged.` });
  }
  if (input.packA.seriesCells !== input.packB.seriesCells) {
    mismatch = true;
    checks.push({ code: 'series_mismatch', level: 'danger', message: `The packs have ${input.packA.seriesCells} and ${input.packB.seriesCells} cells in series: never parallel packs of different voltage.` });
  }

  const deltaV = a.initialOcvV - b.initialOcvV;
  const sim = simulateConnection(a, b, totalOhm, {});
  const i0 = sim.initialCurrentA;
  const absI0 = Math.abs(i0);
  const giver = i0 >= 0 ? input.packA : input.packB;
  const receiver = i0 >= 0 ? input.packB : input.packA;

  const peakLimitA = minDefined(packPeakLimitA(input.packA), packPeakLimitA(input.packB));
  const continuousLimitA =
    absI0 === 0
      ? minDefined(input.packA.maxContinuousDischargeA, input.packB.maxContinuousDischargeA, input.packA.maxChargeA, input.packB.maxChargeA)
      : minDefined(input.packA.maxContinuousDischargeA, input.packB.maxContinuousDischargeA, receiver.maxChargeA);

  let verdict: ParallelConnectData['verdict'] = 'safe';
  const worsen = (v: ParallelConnectData['verdict']) => {
    const rank = { safe: 0, caution: 1, unsafe: 2 } as const;
    if (rank[v] > rank[verdict]) verdict = v;
  };
  if (mismatch) worsen('unsafe');
  if (peakLimitA !== null && absI0 > peakLimitA) {
    worsen('unsafe');
    checks.push({
      code: 'inrush_over_peak',
      level: 'danger',
      message: `The initial current of ${roundTo(absI0, 1)} A exceeds a pack's peak limit of ${roundTo(peakLimitA, 1)} A: connecting now can trip or damage the packs' protection, weld contacts or start a fire. Bring the voltages together first or use a pre-charge resistor.`,
    });
  }
  if (continuousLimitA !== null && absI0 > continuousLimitA) {
    worsen('caution');
    checks.push({ code: 'inrush_over_continuous', level: 'warning', message: `The initial current of ${roundTo(absI0, 1)} A is above the continuous limit of ${roundTo(continuousLimitA, 1)} A.` });
  }
  if (peakLimitA === null && continuousLimitA === null) {
    worsen('caution');
    checks.push({
      code: 'limits_unknown',
      level: 'warning',
      message: 'No current limits were given (maxContinuousDischargeA, peakDischargeA, maxChargeA), so the inrush cannot be judged against the packs: treat it with caution.',
    });
  }
  if (continuousLimitA !== null && absI0 > continuousLimitA) {
    // How long the current stays above the continuous limit, from the full-resolution run.
    let aboveS = 0;
    for (let k = 1; k < sim.tS.length; k += 1) if (Math.abs(sim.currentA[k - 1]!) > continuousLimitA) aboveS = sim.tS[k]!;
    const duration = minDefined(giver.peakDurationS, receiver.peakDurationS);
    if (duration !== null && aboveS > duration) {
      worsen('caution');
      checks.push({ code: 'over_continuous_too_long', level: 'warning', message: `The current stays above ${roundTo(continuousLimitA, 1)} A for about ${roundTo(aboveS, 1)} s, longer than the ${duration} s peak duration: expect the protection to trip.` });
    }
  }

  const recommendedMaxDifferenceV = continuousLimitA === null ? null : continuousLimitA * totalOhm;
  if (recommendedMaxDifferenceV !== null) {
    checks.push({
      code: 'voltage_matching',
      level: Math.abs(deltaV) > recommendedMaxDifferenceV ? 'warning' : 'info',
      message: `Connect only when the resting voltages are within ${roundTo(recommendedMaxDifferenceV, 3)} V of each other (now ${roundTo(Math.abs(deltaV), 3)} V): charge or discharge the higher pack separately first, then measure again after a rest.`,
    });
  }

  let precharge: ParallelConnectData['precharge'] = null;
  const targetA = input.prechargeTargetA ?? continuousLimitA;
  if (targetA === null) {
    checks.push({ code: 'precharge_target_unknown', level: 'info', message: 'Give prechargeTargetA (or the packs\' continuous limits) to size a pre-charge resistor.' });
  } else if (absI0 <= targetA) {
    precharge = { needed: false, targetCurrentA: targetA, resistanceOhm: 0, peakPowerW: 0, energyJ: 0, bypassAtDifferenceV: roundTo(Math.abs(deltaV), 4), timeToBypassS: 0 };
  } else {
    const rPre = Math.abs(deltaV) / targetA - totalOhm;
    const bypassDiffV = totalOhm * (continuousLimitA ?? targetA);
    const run = simulateConnection(a, b, totalOhm + rPre, { stopBelowA: bypassDiffV / (totalOhm + rPre) });
    const energyJ = (run.heatJ * rPre) / (totalOhm + rPre);
    precharge = {
      needed: true,
      targetCurrentA: targetA,
      resistanceOhm: roundTo(rPre, 4),
      peakPowerW: roundTo(targetA * targetA * rPre, 2),
      energyJ: roundTo(energyJ, 1),
      bypassAtDifferenceV: roundTo(bypassDiffV, 4),
      timeToBypassS: run.endReason === 'settled' && run.stopTimeS !== null ? roundTo(run.stopTimeS, 1) : null,
    };
    checks.push({
      code: 'precharge',
      level: 'info',
      message: `A ${roundTo(rPre, 3)} Ω pre-charge resistor limits the first current to ${roundTo(targetA, 2)} A (${roundTo(targetA * targetA * rPre, 1)} W at first, ${roundTo(energyJ / 1000, 2)} kJ in all${precharge.timeToBypassS !== null ? ` over ${roundTo(precharge.timeToBypassS / 60, 1)} min` : ''}); close the main connection once the difference is ${roundTo(bypassDiffV, 3)} V or less. Choose a resistor rated for that energy and watch its temperature.`,
    });
    if (input.prechargeTargetA !== undefined && continuousLimitA !== null && input.prechargeTargetA > continuousLimitA) {
      checks.push({ code: 'precharge_target_high', level: 'warning', message: `prechargeTargetA (${input.prechargeTargetA} A) is above the packs' continuous limit (${roundTo(continuousLimitA, 1)} A).` });
    }
  }

  if (sim.endReason === 'soc_limit') {
    checks.push({ code: 'soc_limit_reached', level: 'warning', message: 'One pack reached 0 % or 100 % before the currents settled: its protection would end the transfer there. The voltage difference is larger than the packs\' curves can absorb.' });
  } else if (sim.endReason === 'step_limit') {
    checks.push({ code: 'simulation_incomplete', level: 'info', message: 'The simulation reached its step limit before the current settled; the figures cover the simulated span.' });
  }

  const keep = thinIndices(sim.tS.length, MAX_TIMELINE_POINTS);
  const finalIndex = sim.tS.length - 1;
  const heatWh = sim.heatJ / 3600;
  return {
    data: {
      voltageDifferenceV: roundTo(deltaV, 4),
      totalResistanceMOhm: roundTo(totalOhm * 1000, 4),
      linkResistanceMOhm: roundTo(link.ohm * 1000, 4),
      initialCurrentA: roundTo(i0, 3),
      peakLimitA,
      continuousLimitA,
      timeToSettleS: sim.endReason === 'settled' && sim.stopTimeS !== null ? roundTo(sim.stopTimeS, 2) : null,
      chargeTransferredAh: roundTo(sim.chargeAh, 4),
      energyLossWh: roundTo(heatWh, 4),
      linkEnergyLossWh: roundTo((heatWh * link.ohm) / totalOhm, 4),
      finalStateOfChargeAPct: roundTo(sim.socAPct[finalIndex]!, 3),
      finalStateOfChargeBPct: roundTo(sim.socBPct[finalIndex]!, 3),
      verdict,
      recommendedMaxDifferenceV: recommendedMaxDifferenceV === null ? null : roundTo(recommendedMaxDifferenceV, 4),
      precharge,
      endReason: sim.endReason,
      timeline: keep.map((k) => ({
        tS: roundTo(sim.tS[k]!, 3),
        currentA: roundTo(sim.currentA[k]!, 4),
        socAPct: roundTo(sim.socAPct[k]!, 4),
        socBPct: roundTo(sim.socBPct[k]!, 4),
      })),
    },
    checks,
    cautions: batteryWorkCautions(
      'Connect packs through a fuse on each pack and a switch rated for DC; the first current flows at the instant of contact, where sparks can ignite gases from lead-acid batteries.',
    ),
    basis: [
      'Each pack: open-circuit voltage from its chemistry OCV curve (restingVoltageV overrides at the start) behind its internal resistance',
      `Loop resistance: both internal resistances plus the link (${link.description})`,
      'I(t) = (OCV_A(SoC_A) − OCV_B(SoC_B)) / R_total, integrated with 4th-order Runge–Kutta on the OCV curves until the current falls to 1 % of its initial value',
      'Verdict: initial current against peakDischargeA (or 2 × maxContinuousDischargeA) and the continuous limits',
    ],
  };
}
