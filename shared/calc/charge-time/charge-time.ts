/**
 * Charge time: constant current (CC), then a constant-voltage (CV) taper to a termination current.
 *
 * Model
 * - Sources charge together; their currents add. A source given as `currentA` delivers up to that current.
 *   A source given as `powerW` delivers powerW × efficiencyPct / 100 divided by the pack's open-circuit
 *   voltage at the present state of charge (the v1 contract's rule), OCV from the chemistry's curve
 *   (shared/calc/chemistry). With both, the lower current applies. The sum is capped by the pack's
 *   `maxChargeA` when given (the charger is assumed to be set to respect it; a check says so).
 * - CV taper: once the charge voltage is reached, the current decays exponentially,
 *   I(t) = I₀·e^(−t/τ), until it falls to the termination current I_term = (termination C-rate) × Ah from the
 *   chemistry preset (LFP prismatic datasheet: CV until 0.05C; Li-ion "full" near 0.03C, Battery University
 *   BU-409 as reproduced; lead-acid 0.02C, common practice). This is the textbook equivalent-circuit view of
 *   CV charging (reference values §6.5: cell as a capacitance C_eq = dQ/dV behind a resistance R, τ = R·C_eq):
 *   in CV, stored charge Q and current are tied linearly, I = I_term + (Q_full − Q)/(η·τ), with η the
 *   coulombic efficiency, so the taper delivers η·τ·(I₀ − I_term) Ah of stored charge in τ·ln(I₀/I_term) hours,
 *   and the termination current is reached exactly at 100 %. The CV phase therefore starts where the
 *   sources' current meets that line: the higher the current, the earlier the taper starts.
 * - Time: dQ/dt = η·I, so t = ∫ dQ / (η·I(Q)) from the start to the target state of charge, with
 *   I(Q) = min(sources and pack limit at Q, CV line at Q). Integrated piece by piece between the OCV curve's
 *   breakpoints and every point where the limiting term changes; CV pieces use the closed form above, CC
 *   pieces 5-point Gauss–Legendre quadrature (exact for constant current).
 * - Voltage shown: in CC, OCV + I·R (R = the pack's `internalResistanceMOhm`, else the chemistry's typical
 *   ohmic resistance below), capped at the charge voltage; in CV, the charge voltage. R only affects the
 *   voltage and the energy figures, not the time.
 * - Energy: into the pack ∫ V·I dt; from the sources, each source's share of the current divided by its
 *   efficiency (when the pack limit or the taper holds the sources back, each is held back in proportion).
 *
 * Not modelled: temperature (and its effect on the taper), cell balancing at the top, float, and the
 * equalization charge of flooded lead-acid.
 *
 * Units: A, V, Ah, Wh, hours, minutes in the profile, % for states of charge.
 */
import type { CalcOutput, Check } from '../types.ts';
import { CalcError } from '../errors.ts';
import { cellOcvAtSoc } from '../chemistry/ocv.ts';
import { packVoltages } from '../chemistry/pack.ts';
import { chemistries, type ChemistryId, type OcvPoint } from '../chemistry/presets.ts';
import { assertFiniteNumbers } from '../pack-energy/pack-energy.ts';
import type { ChargeTimeData, ChargeTimeInput } from '../../schemas/charge-time.ts';

/**
 * CV taper time constant τ per chemistry, hours. τ = R·C_eq does not depend on capacity (R scales as 1/Ah,
 * C_eq as Ah). Values are calibrated on published charge descriptions, not measured:
 * - NMC 0.3 h: Battery University BU-409 (as reproduced, B): at about 1C, CC reaches roughly 70–80 % and CV
 *   adds 0.5–1+ h until the current falls to about 3 %. With τ = 0.3 h: CV from about 71 %, lasting 1.05 h.
 * - LFP 0.05 h: from memory — LFP's flat curve keeps the CC phase going to about 95 % at 1C, with a short CV.
 * - LTO 0.05 h: from memory.
 * - Lead-acid 2.5 h: from memory, after BU-403's description (as reproduced, B) that the saturation (topping)
 *   charge takes about as long as the bulk charge: at 0.1C this gives CV from about 80 %, lasting about 4 h,
 *   and a 12–13 h charge from empty.
 */
export const TAPER_TIME_CONSTANT_H: Record<ChemistryId, number> = {
  lfp: 0.05,
  nmc: 0.3,
  lto: 0.05,
  lead_acid_agm: 2.5,
  lead_acid_flooded: 2.5,
};

/**
 * Typical ohmic resistance per cell normalized to capacity, Ω·Ah (divide by Ah for a cell's Ω), used for the
 * voltage shown during CC when the pack gives no `internalResistanceMOhm`.
 * - LFP 0.05: a 51.2 V 100 Ah LFP module's maker data gives 8 mΩ battery-only, i.e. 0.5 mΩ × 100 Ah per cell (B).
 * - NMC 0.23: Huria et al., IEEE IEVC 2012, 27.63 Ah high-power Li-ion cell, R0 ≈ 8.2–8.7 mΩ at 20 °C (A).
 * - LTO 0.05: from memory.
 * - Lead-acid 0.08: from memory (a 100 Ah 12 V block of about 5 mΩ).
 */
export const OHMIC_RESISTANCE_OHM_AH: Record<ChemistryId, number> = {
  lfp: 0.05,
  nmc: 0.23,
  lto: 0.05,
  lead_acid_agm: 0.08,
  lead_acid_flooded: 0.08,
};

/**
 * The highest charge rate usually allowed, C (1/h).
 * - LFP 1C: prismatic LFP cell datasheet protocol "charge at 1C CC to 3.65 V" (A).
 * - NMC 1C: from memory (typical cell datasheet maximum).
 * - LTO 5C: from memory.
 * - Lead-acid 0.3C: common practice (no published source): bulk charge at 10–30 % of the 20-hour capacity.
 */
export const MAX_USUAL_CHARGE_C: Record<ChemistryId, number> = {
  lfp: 1,
  nmc: 1,
  lto: 5,
  lead_acid_agm: 0.3,
  lead_acid_flooded: 0.3,
};

/** Profile points are evenly spaced in time, at most this many. */
export const MAX_PROFILE_POINTS = 121;

/** Subdivisions of the state-of-charge range (besides breakpoints), for the profile and to find switch points. */
const GRID_CELLS = 400;

export interface CcCvSource {
  currentA?: number;
  powerW?: number;
  /** Fraction, (0, 1]. */
  efficiency: number;
}

/** Everything the CC/CV integrator needs, already at pack level. */
export interface CcCvModel {
  capacityAh: number;
  /** Coulombic efficiency η, fraction: stored Ah = η × delivered Ah. */
  coulombicEfficiency: number;
  chargeVoltageV: number;
  terminationCurrentA: number;
  taperTimeConstantH: number;
  ohmicResistanceOhm: number;
  /** Pack OCV (V) at a state of charge (%); piecewise linear between `ocvBreakpointsPct`. */
  ocvV: (socPct: number) => number;
  ocvBreakpointsPct: readonly number[];
  sources: readonly CcCvSource[];
  maxChargeA?: number;
}

export interface CcCvRun {
  totalHours: number;
  constantCurrentHours: number;
  taperHours: number;
  energyIntoPackWh: number;
  energyFromSourceWh: number;
  /** State of charge (%) and time (h) at every piece boundary, increasing; `taper` tells whether the piece ending here was in CV. */
  nodes: Array<{ socPct: number; hours: number; taper: boolean }>;
  /** State of charge (%) on the CV line where its current is `currentA` (the inverse of the taper's line). */
  taperSocAt: (currentA: number) => number;
  /** Current into the pack (A) at a state of charge. */
  currentAt: (socPct: number) => number;
  /** Terminal voltage (V) at a state of charge. */
  voltageAt: (socPct: number) => number;
  taperTimeConstantH: number;
}

// 5-point Gauss–Legendre nodes and weights on [−1, 1], from their closed forms (Abramowitz & Stegun 25.4.29,
// Table 25.4): x = 0, ±⅓√(5 ∓ 2√(10/7)); w = 128/225, (322 ± 13√70)/900.
const GL_X1 = Math.sqrt(5 - 2 * Math.sqrt(10 / 7)) / 3;
const GL_X2 = Math.sqrt(5 + 2 * Math.sqrt(10 / 7)) / 3;
const GL_W1 = (322 + 13 * Math.sqrt(70)) / 900;
const GL_W2 = (322 - 13 * Math.sqrt(70)) / 900;
const GL_X = [0, -GL_X1, GL_X1, -GL_X2, GL_X2];
const GL_W = [128 / 225, GL_W1, GL_W1, GL_W2, GL_W2];

function gaussLegendre(f: (x: number) => number, a: number, b: number): number {
  const half = (b - a) / 2;
  const mid = (a + b) / 2;
  let sum = 0;
  for (let i = 0; i < GL_X.length; i += 1) sum += GL_W[i]! * f(mid + half * GL_X[i]!);
  return sum * half;
}

/** Bisection for the point in [a, b] where g changes sign (g(a) and g(b) of opposite sign). */
function bisect(g: (x: number) => number, a: number, b: number): number {
  let lo = a;
  let hi = b;
  const gLo = g(lo) > 0;
  for (let i = 0; i < 200 && hi - lo > 1e-13 * Math.max(1, Math.abs(hi)); i += 1) {
    const mid = (lo + hi) / 2;
    if (g(mid) > 0 === gLo) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

/**
 * Integrates a CC/CV charge from `fromPct` to `toPct` (see the module comment for the model). Pure; used by
 * computeChargeTime and tested on its own against the closed forms.
 */
export function simulateCcCv(model: CcCvModel, fromPct: number, toPct: number): CcCvRun {
  const { capacityAh: ah, coulombicEfficiency: eta, taperTimeConstantH: tau } = model;
  const ahPerPct = ah / 100;

  // Hot loops: written without allocations (this runs a few thousand times per request).
  const sourceCurrent = (s: CcCvSource, ocv: number) =>
    Math.min(s.currentA ?? Infinity, s.powerW !== undefined ? (s.powerW * s.efficiency) / ocv : Infinity);
  const sourceTotal = (q: number) => {
    const ocv = model.ocvV(q);
    let total = 0;
    for (const s of model.sources) total += sourceCurrent(s, ocv);
    return total;
  };
  const available = (q: number) => Math.min(sourceTotal(q), model.maxChargeA ?? Infinity);
  const cvLine = (q: number) => model.terminationCurrentA + ((100 - q) * ahPerPct) / (eta * tau);
  const current = (q: number) => Math.min(available(q), cvLine(q));
  const voltage = (q: number) => {
    const iAv = available(q);
    const iCv = cvLine(q);
    if (iCv < iAv) return model.chargeVoltageV;
    return Math.min(model.chargeVoltageV, model.ocvV(q) + iAv * model.ohmicResistanceOhm);
  };
  /** Σ (share of the current from source i) / efficiency i: the source energy per unit of pack energy. */
  const sourceEnergyWeight = (q: number) => {
    const ocv = model.ocvV(q);
    let total = 0;
    let weighted = 0;
    for (const s of model.sources) {
      const part = sourceCurrent(s, ocv);
      total += part;
      weighted += part / s.efficiency;
    }
    return weighted / total;
  };

  // Piece boundaries: the grid, the curve's breakpoints, and every switch of the limiting term.
  const cuts = new Set<number>([fromPct, toPct]);
  for (let k = 1; k < GRID_CELLS; k += 1) cuts.add(fromPct + ((toPct - fromPct) * k) / GRID_CELLS);
  for (const b of model.ocvBreakpointsPct) if (b > fromPct && b < toPct) cuts.add(b);
  const base = [...cuts].sort((a, b) => a - b);
  const switchFns: Array<(q: number) => number> = [
    (q) => cvLine(q) - available(q),
    (q) => (model.maxChargeA === undefined ? 1 : sourceTotal(q) - model.maxChargeA),
    ...model.sources.map((s) => (q: number) =>
      s.currentA === undefined || s.powerW === undefined ? 1 : s.currentA - (s.powerW * s.efficiency) / model.ocvV(q),
    ),
  ];
  // Each switch function is evaluated once per grid point; a sign change between neighbours is bisected.
  for (const g of switchFns) {
    let ga = g(base[0]!);
    for (let k = 0; k + 1 < base.length; k += 1) {
      const gb = g(base[k + 1]!);
      if ((ga > 0 && gb <= 0) || (ga <= 0 && gb > 0)) cuts.add(bisect(g, base[k]!, base[k + 1]!));
      ga = gb;
    }
  }
  const bounds = [...cuts].sort((a, b) => a - b);

  let hours = 0;
  let ccHours = 0;
  let cvHours = 0;
  let energyIntoPackWh = 0;
  let energyFromSourceWh = 0;
  const nodes: CcCvRun['nodes'] = [{ socPct: bounds[0]!, hours: 0, taper: false }];
  for (let k = 0; k + 1 < bounds.length; k += 1) {
    const a = bounds[k]!;
    const b = bounds[k + 1]!;
    if (b <= a) continue;
    const mid = (a + b) / 2;
    const inTaper = cvLine(mid) < available(mid);
    let dt: number;
    if (inTaper) {
      // Closed form: the CV line is linear in Q, dI/dQ = −1/(η·τ), so ∫ dQ/(η·I) = τ·ln(I_a / I_b).
      dt = tau * Math.log(cvLine(a) / cvLine(b));
      cvHours += dt;
    } else {
      dt = gaussLegendre((q) => ahPerPct / (eta * available(q)), a, b);
      ccHours += dt;
    }
    hours += dt;
    // Energy: V·I·dt = V·dQ/η, into the pack and (each source's share ÷ its efficiency) from the sources.
    const half = (b - a) / 2;
    for (let i = 0; i < GL_X.length; i += 1) {
      const q = mid + half * GL_X[i]!;
      const v = voltage(q);
      energyIntoPackWh += GL_W[i]! * half * ((v * ahPerPct) / eta);
      energyFromSourceWh += GL_W[i]! * half * ((v * sourceEnergyWeight(q) * ahPerPct) / eta);
    }
    nodes.push({ socPct: b, hours, taper: inTaper });
  }
  return {
    totalHours: hours,
    constantCurrentHours: ccHours,
    taperHours: cvHours,
    energyIntoPackWh,
    energyFromSourceWh,
    nodes,
    currentAt: current,
    voltageAt: voltage,
    taperSocAt: (currentA) => 100 - ((currentA - model.terminationCurrentA) * eta * tau) / ahPerPct,
    taperTimeConstantH: tau,
  };
}

/**
 * Resamples a run at evenly spaced times (at most MAX_PROFILE_POINTS). Inside a taper piece the state of charge
 * follows from the exponential decay exactly; inside a CC piece it is interpolated linearly in time (exact for
 * a constant current, and the pieces are at most 1/400 of the range wide).
 */
export function chargeProfile(run: CcCvRun, maxPoints = MAX_PROFILE_POINTS): ChargeTimeData['profile'] {
  const n = Math.max(2, Math.min(maxPoints, run.nodes.length));
  const profile: ChargeTimeData['profile'] = [];
  let k = 0;
  for (let j = 0; j < n; j += 1) {
    const t = j === n - 1 ? run.totalHours : (run.totalHours * j) / (n - 1);
    while (k + 2 < run.nodes.length && run.nodes[k + 1]!.hours < t) k += 1;
    const a = run.nodes[k]!;
    const b = run.nodes[Math.min(k + 1, run.nodes.length - 1)]!;
    let soc: number;
    if (j === n - 1) soc = run.nodes.at(-1)!.socPct;
    else if (!(b.hours > a.hours)) soc = a.socPct;
    else if (b.taper) soc = run.taperSocAt(run.currentAt(a.socPct) * Math.exp(-(t - a.hours) / run.taperTimeConstantH));
    else soc = a.socPct + ((t - a.hours) / (b.hours - a.hours)) * (b.socPct - a.socPct);
    profile.push({ minute: t * 60, socPct: soc, currentA: run.currentAt(soc), voltageV: run.voltageAt(soc) });
  }
  return profile;
}

export function computeChargeTime(input: ChargeTimeInput): CalcOutput<ChargeTimeData> {
  const { pack, fromPct, toPct } = input;
  if (!(toPct > fromPct)) throw new CalcError('target_not_above_start', `toPct must be above fromPct (${fromPct}).`, '#/toPct');
  const chem = chemistries[pack.chemistry];
  const voltages = packVoltages(pack);
  const ah = pack.capacityAh;
  const checks: Check[] = [];

  const sources: CcCvSource[] = input.sources.map((s) => ({
    ...(s.currentA !== undefined ? { currentA: s.currentA } : {}),
    ...(s.powerW !== undefined ? { powerW: s.powerW } : {}),
    efficiency: (s.efficiencyPct ?? 100) / 100,
  }));
  const ocvV = (socPct: number) => cellOcvAtSoc(chem.ocvCurve, socPct) * pack.seriesCells;
  const startOcv = ocvV(fromPct);
  const startCurrents = sources.map((s) =>
    Math.min(s.currentA ?? Infinity, s.powerW !== undefined ? (s.powerW * s.efficiency) / startOcv : Infinity),
  );
  startCurrents.forEach((c, i) => {
    if (c === 0 && startCurrents.some((other) => other > 0)) {
      checks.push({ code: 'source_delivers_nothing', level: 'warning', message: `Source ${i}${labelOf(input.sources[i]!.label)} delivers no current (zero current or power).` });
    }
  });
  const sourceCurrentA = startCurrents.reduce((a, b) => a + b, 0);
  if (!(sourceCurrentA > 0)) {
    throw new CalcError('no_charge_current', 'The sources deliver no current: give at least one source a current or power above zero.', '#/sources');
  }

  const model: CcCvModel = {
    capacityAh: ah,
    coulombicEfficiency: chem.coulombicEfficiency,
    chargeVoltageV: voltages.fullChargeVoltageV,
    terminationCurrentA: chem.terminationCurrentC * ah,
    taperTimeConstantH: TAPER_TIME_CONSTANT_H[pack.chemistry],
    ohmicResistanceOhm:
      pack.internalResistanceMOhm !== undefined ? pack.internalResistanceMOhm / 1000 : (OHMIC_RESISTANCE_OHM_AH[pack.chemistry] * pack.seriesCells) / ah,
    ocvV,
    ocvBreakpointsPct: chem.ocvCurve.map((p: OcvPoint) => p.socPct),
    sources,
    ...(pack.maxChargeA !== undefined ? { maxChargeA: pack.maxChargeA } : {}),
  };
  const run = simulateCcCv(model, fromPct, toPct);
  // The constant current the sources and the pack limit set at the start (a charge that starts inside the
  // taper draws less at once; the profile shows that).
  const chargeCurrentA = Math.min(sourceCurrentA, pack.maxChargeA ?? Infinity);
  const limitedBy = pack.maxChargeA !== undefined && pack.maxChargeA < sourceCurrentA ? 'pack_limit' : 'source';
  const chargeCRate = chargeCurrentA / ah;

  const data: ChargeTimeData = {
    ...(input.label !== undefined ? { label: input.label } : {}),
    fromPct,
    toPct,
    totalHours: run.totalHours,
    constantCurrentHours: run.constantCurrentHours,
    taperHours: run.taperHours,
    chargeCurrentA,
    chargeCRate,
    limitedBy,
    sourceCurrentA,
    chargeVoltageV: voltages.fullChargeVoltageV,
    terminationCurrentA: model.terminationCurrentA,
    chargeAh: ((toPct - fromPct) * ah) / 100 / chem.coulombicEfficiency,
    energyIntoPackWh: run.energyIntoPackWh,
    energyFromSourceWh: run.energyFromSourceWh,
    profile: chargeProfile(run),
  };
  assertFiniteNumbers(data, '#/pack/capacityAh');

  if (limitedBy === 'pack_limit') {
    checks.push({
      code: 'source_above_pack_charge_limit',
      level: 'warning',
      message: `The sources can deliver about ${fmt(sourceCurrentA)} A, above the pack’s ${pack.maxChargeA} A charge limit. This assumes the charge is held to ${pack.maxChargeA} A: set the charger’s current limit, or the pack’s protection may disconnect it.`,
    });
  }
  const usualMaxC = MAX_USUAL_CHARGE_C[pack.chemistry];
  const allowedByPack = pack.maxChargeA !== undefined && chargeCurrentA <= pack.maxChargeA;
  if (chargeCRate > 1) {
    checks.push({
      code: 'charge_current_above_1c',
      level: chargeCRate > usualMaxC && !allowedByPack ? 'warning' : 'info',
      message: `The charge current is ${fmt(chargeCRate)}C (${fmt(chargeCurrentA)} A on ${ah} Ah), above 1C${chargeCRate > usualMaxC ? ` and above the ${usualMaxC}C usual for ${chem.name}` : ''}; check it against the pack maker’s charge rating.`,
    });
  } else if (chargeCRate > usualMaxC) {
    checks.push({
      code: 'charge_rate_above_chemistry_practice',
      level: 'warning',
      message: `The charge current is ${fmt(chargeCRate)}C, above the ${usualMaxC}C usual for ${chem.name} (common practice); it shortens life and heats the battery.`,
    });
  }
  if (run.currentAt(toPct) < model.terminationCurrentA && toPct > 99.999) {
    checks.push({
      code: 'source_below_termination_current',
      level: 'warning',
      message: `Near full the sources deliver less than the ${fmt(model.terminationCurrentA)} A termination current (${chem.terminationCurrentC}C); a charger may stop early or never signal full, so treat the time as an estimate.`,
    });
  }
  if (run.taperHours > 0 && run.constantCurrentHours === 0) {
    checks.push({
      code: 'starts_in_taper',
      level: 'info',
      message: `At ${fromPct} % the pack is already in the constant-voltage taper for ${fmt(chargeCurrentA)} A, so it draws ${fmt(run.currentAt(fromPct))} A from the start.`,
    });
  }
  if (run.totalHours > 48) {
    checks.push({ code: 'long_charge', level: 'info', message: `The charge takes about ${fmt(run.totalHours)} h; a bigger source would shorten it.` });
  }

  const lithium = !pack.chemistry.startsWith('lead_acid');
  const cautions = [
    `Charge only with a charger or controller set for ${chem.name} at ${fmt(voltages.fullChargeVoltageV)} V, within the pack maker’s current limit; follow local electrical codes, the equipment maker’s instructions and licensed practice.`,
    'Fuse the charging circuit close to the battery and size its wiring for the charge current.',
    lithium
      ? 'Do not charge lithium cells below 0 °C (32 °F) unless the maker allows it; LFP cell datasheets limit charging to about 0–45 °C (32–113 °F).'
      : 'Lead-acid batteries give off hydrogen while charging: ventilate the space and keep sparks and flames away.',
  ];

  return {
    data,
    checks,
    cautions,
    basis: [
      'CC/CV model: sources (current, or power × efficiency ÷ OCV at the present state of charge) capped by the pack limit, then a constant-voltage taper I = I₀·e^(−t/τ) to the termination current; t = ∫ dQ / (η·I).',
      `Chemistry preset ${chem.id}: charge voltage ${chem.fullChargeCellVoltageV} V/cell, termination ${chem.terminationCurrentC}C, coulombic efficiency ${chem.coulombicEfficiency}, taper time constant ${model.taperTimeConstantH} h (see the charge-time model for its calibration).`,
      `OCV curve and voltages: ${chem.sources.join('; ')}.`,
    ],
  };
}

function labelOf(label: string | undefined) {
  return label ? ` (“${label}”)` : '';
}

function fmt(v: number) {
  return Math.abs(v) >= 100 ? String(Math.round(v)) : String(Math.round(v * 100) / 100);
}
