/**
 * Wire sizing for a DC run: the smallest copper conductor that carries the current, keeps the round-trip
 * voltage drop within a limit, and can be protected by the overcurrent device the current needs.
 *
 * Model (units in names; every table in `../tables/`, NFPA 70 NEC **2023 edition**):
 * 1. Required ampacity: `I × 1.25` for a continuous current (NEC 210.19(A)(1), 215.2(A)(1); energy-storage
 *    circuits are treated as continuous, 706.30), else `I`.
 * 2. Each candidate's ampacity is Table 310.16 in the chosen insulation column, times the ambient
 *    correction of Table 310.15(B)(1) and the adjustment of Table 310.15(C)(1) for more than three
 *    current-carrying conductors. Passes when the corrected ampacity ≥ the required ampacity (the 125 % is
 *    applied after the corrections, which is the stricter reading and the rule of the Ohmstead contract).
 *    Metric sizes use derived ampacities (see conductors.ts).
 * 3. Voltage drop over the round trip, `V = I × R′(T) × 2L` (standard DC practice; NEC Ch. 9 Table 8 for
 *    R′), with R′ at the insulation temperature (60/75/90 °C): the hottest the conductor may run, so the drop
 *    is not understated. Passes when `V / systemVoltageV ≤ maxVoltageDropPct` (NEC 210.19(A) Informational
 *    Note 4 suggests 3 %; it is informational, the limit is the caller's).
 * 4. Protection: the device the current needs is the smallest NEC 240.6(A) standard rating at or above the
 *    required ampacity. The conductor can be protected by it when that rating ≤ the corrected ampacity and
 *    ≤ the 240.4(D) small-conductor limit (copper 14 AWG 15 A, 12 AWG 20 A, 10 AWG 30 A; 18/16 AWG 7/10 A).
 *    The 240.4(B) "next size up" allowance is not used.
 * The recommendation is the smallest size passing all three. Each criterion passes from some size upward,
 * so `limitedBy` is the criterion whose smallest passing size is the largest (ties: ampacity, then voltage
 * drop, then protection).
 *
 * Throws CalcError only for inputs the schema cannot catch; "nothing in the table fits" is an answer
 * (recommended: null, with a danger check).
 */
import type { WireCriterion, WireSizeData, WireSizeInput } from '../../schemas/wire-size.ts';
import { ambientCorrectionFactor, bundlingAdjustmentFactor } from '../tables/ampacity-corrections.ts';
import { conductorsOf, resistanceOhmPerKmAt, type ConductorRow } from '../tables/conductors.ts';
import { smallestStandardRatingAtLeast } from '../tables/overcurrent.ts';
import { batteryWorkCautions } from '../tables/safety-cautions.ts';
import { CalcError } from '../errors.ts';
import type { CalcOutput, Check } from '../types.ts';
import { feetToM, mToFeet, roundTo } from '../units.ts';

/** Continuous-load factor, NEC 2023 210.19(A)(1) / 215.2(A)(1) / 706.30. */
export const CONTINUOUS_FACTOR = 1.25;
const EPS = 1e-9;

/** The one-way length in metres from whichever of oneWayLengthM / oneWayLengthFt was given. */
export function resolveOneWayLengthM(v: { oneWayLengthM?: number; oneWayLengthFt?: number }, pointer = '#/oneWayLengthM'): number {
  if (v.oneWayLengthM !== undefined && v.oneWayLengthFt !== undefined) throw new CalcError('length_twice', 'Give the one-way length once: oneWayLengthM or oneWayLengthFt.', pointer);
  if (v.oneWayLengthM !== undefined) return v.oneWayLengthM;
  if (v.oneWayLengthFt !== undefined) return feetToM(v.oneWayLengthFt);
  throw new CalcError('length_missing', 'Give the one-way length as oneWayLengthM or oneWayLengthFt.', pointer);
}

interface Evaluated {
  row: ConductorRow;
  ampacityA: number | null;
  deratedAmpacityA: number | null;
  maxOvercurrentProtectionA: number | null;
  resistanceOhm: number;
  voltageDropV: number;
  voltageDropPct: number;
  powerLossW: number;
  pass: Record<WireCriterion, boolean>;
  reasons: string[];
}

const fmt = (x: number, d = 1) => String(roundTo(x, d));

/**
 * Sizes a copper conductor for a DC run (model above). Input units: currentA (A), systemVoltageV (V),
 * oneWayLengthM (m) or oneWayLengthFt (ft), maxVoltageDropPct (%), ambientTempC (°C). Returns the
 * recommendation (or null with a danger check), `limitedBy`, the fuse the current needs and every candidate.
 */
export function computeWireSize(input: WireSizeInput): CalcOutput<WireSizeData> {
  const currentA = input.currentA;
  const lengthM = resolveOneWayLengthM(input);
  const column = input.temperatureRatingC;
  const requiredAmpacityA = input.continuous ? currentA * CONTINUOUS_FACTOR : currentA;
  const fuseRatingA = smallestStandardRatingAtLeast(requiredAmpacityA) ?? null;
  const ambientFactor = ambientCorrectionFactor(input.ambientTempC, column);
  const bundlingFactor = bundlingAdjustmentFactor(input.currentCarryingConductors);
  const conductorTempC = column;
  const requiredText = input.continuous ? `${fmt(requiredAmpacityA)} A needed (125 % of ${fmt(currentA, 2)} A continuous)` : `${fmt(requiredAmpacityA)} A needed`;

  const evaluated: Evaluated[] = conductorsOf(input.sizeSystem).map((row) => {
    const ampacityA = row.ampacityA[column];
    const deratedAmpacityA = ampacityA === null || ambientFactor === null ? null : ampacityA * ambientFactor * bundlingFactor;
    const maxOvercurrentProtectionA = deratedAmpacityA === null ? null : Math.min(deratedAmpacityA, row.smallConductorMaxOcpdA ?? Number.POSITIVE_INFINITY);
    const resistanceOhm = (resistanceOhmPerKmAt(row, conductorTempC) * 2 * lengthM) / 1000;
    const voltageDropV = currentA * resistanceOhm;
    const voltageDropPct = (voltageDropV / input.systemVoltageV) * 100;
    const powerLossW = currentA * currentA * resistanceOhm;

    const passAmpacity = deratedAmpacityA !== null && deratedAmpacityA >= requiredAmpacityA - EPS;
    const passDrop = voltageDropPct <= input.maxVoltageDropPct + EPS;
    const passProtection = fuseRatingA !== null && maxOvercurrentProtectionA !== null && fuseRatingA <= maxOvercurrentProtectionA + EPS;

    const reasons: string[] = [];
    if (ampacityA === null) reasons.push(`ampacity: fails — no ampacity listed for ${row.size} in the ${column} °C column`);
    else if (deratedAmpacityA === null) reasons.push(`ampacity: fails — a ${column} °C conductor may not be used at ${input.ambientTempC} °C ambient`);
    else
      reasons.push(
        `ampacity: ${passAmpacity ? 'passes' : 'fails'} — ${fmt(deratedAmpacityA)} A after corrections (${fmt(ampacityA, 0)} A × ${ambientFactor} ambient × ${bundlingFactor} bundling) vs ${requiredText}`,
      );
    reasons.push(`voltage drop: ${passDrop ? 'passes' : 'fails'} — ${fmt(voltageDropV, 3)} V (${fmt(voltageDropPct, 2)} %) over ${fmt(2 * lengthM, 2)} m round trip vs ${input.maxVoltageDropPct} % allowed`);
    if (fuseRatingA === null) reasons.push('protection: fails — no standard rating is large enough for this current');
    else if (maxOvercurrentProtectionA === null) reasons.push('protection: fails — the conductor has no usable ampacity here');
    else {
      const cap =
        row.smallConductorMaxOcpdA !== null && row.smallConductorMaxOcpdA <= (deratedAmpacityA ?? 0)
          ? `NEC 240.4(D) limit ${row.smallConductorMaxOcpdA} A`
          : `corrected ampacity ${fmt(maxOvercurrentProtectionA)} A`;
      reasons.push(`protection: ${passProtection ? 'passes' : 'fails'} — the ${fuseRatingA} A device this current needs vs ${cap}`);
    }

    return {
      row,
      ampacityA,
      deratedAmpacityA,
      maxOvercurrentProtectionA,
      resistanceOhm,
      voltageDropV,
      voltageDropPct,
      powerLossW,
      pass: { ampacity: passAmpacity, voltage_drop: passDrop, protection: passProtection },
      reasons,
    };
  });

  const criteria: WireCriterion[] = ['ampacity', 'voltage_drop', 'protection'];
  const chosenIndex = evaluated.findIndex((e) => criteria.every((c) => e.pass[c]));
  const firstPass = (c: WireCriterion) => {
    const i = evaluated.findIndex((e) => e.pass[c]);
    return i === -1 ? Number.POSITIVE_INFINITY : i;
  };
  let limitedBy: WireCriterion = 'ampacity';
  if (chosenIndex !== -1) {
    let worst = -1;
    for (const c of criteria) {
      const i = firstPass(c);
      if (i > worst) {
        worst = i;
        limitedBy = c;
      }
    }
  } else {
    const largest = evaluated[evaluated.length - 1]!;
    limitedBy = criteria.find((c) => !largest.pass[c]) ?? 'ampacity';
  }

  const checks: Check[] = [];
  const chosen = chosenIndex === -1 ? undefined : evaluated[chosenIndex]!;
  if (!chosen) {
    const largest = evaluated[evaluated.length - 1]!.row.size;
    checks.push({
      code: 'no_size_fits',
      level: 'danger',
      message: `No ${input.sizeSystem === 'awg' ? 'AWG' : 'metric'} size up to ${largest} meets every criterion (first failing: ${limitedBy.replace('_', ' ')}). Shorten the run, raise the system voltage, split the current over parallel conductors designed by a qualified person, or choose larger conductors than this table covers.`,
    });
  }
  if (ambientFactor === null) {
    checks.push({ code: 'ambient_exceeds_rating', level: 'danger', message: `NEC Table 310.15(B)(1) gives no correction for ${column} °C conductors at ${input.ambientTempC} °C ambient: use a higher insulation rating.` });
  }
  if (fuseRatingA !== null && chosen) {
    checks.push({
      code: 'overcurrent_device',
      level: 'info',
      message: `Protect this run with a ${fuseRatingA} A DC-rated fuse or breaker (the smallest NEC 240.6(A) standard rating at or above ${fmt(requiredAmpacityA)} A), placed as close to the battery as practical.`,
    });
  }
  if (input.continuous) {
    checks.push({ code: 'continuous_125_pct', level: 'info', message: 'Sized for a continuous current: conductor ampacity of at least 125 % of the current after ambient and bundling corrections.' });
  }
  if (input.maxVoltageDropPct > 3) {
    checks.push({ code: 'voltage_drop_above_3_pct', level: 'info', message: `A ${input.maxVoltageDropPct} % drop is allowed; 3 % is the usual aim for a branch circuit (NEC 210.19(A) Informational Note 4), and inverters and chargers can trip on low input voltage.` });
  }
  if (column === 90) {
    checks.push({
      code: 'termination_rating',
      level: 'warning',
      message: 'The 90 °C column is used. Terminals and devices are usually rated 60 or 75 °C, and NEC 110.14(C) then limits the conductor to that column; check every termination.',
    });
  }
  if (input.sizeSystem === 'metric') {
    checks.push({
      code: 'metric_ampacity_derived',
      level: 'warning',
      message: 'Metric ampacities are derived, not published values: interpolated on area between the NEC Table 310.16 AWG rows. Where IEC 60364-5-52 or a local code applies, use its tables.',
    });
  }
  if (chosen && chosenIndex === 0 && chosen.row.system === 'awg') {
    checks.push({ code: 'smallest_size', level: 'info', message: `${chosen.row.size} is the smallest size in the table; mechanical strength may call for larger.` });
  }

  const r4 = (x: number) => roundTo(x, 4);
  return {
    data: {
      recommended: chosen
        ? {
            size: chosen.row.size,
            areaMm2: r4(chosen.row.areaMm2),
            ampacityA: chosen.ampacityA!,
            deratedAmpacityA: roundTo(chosen.deratedAmpacityA!, 2),
            voltageDropV: r4(chosen.voltageDropV),
            voltageDropPct: roundTo(chosen.voltageDropPct, 3),
            powerLossW: roundTo(chosen.powerLossW, 3),
            resistanceOhm: roundTo(chosen.resistanceOhm, 6),
            maxOvercurrentProtectionA: roundTo(chosen.maxOvercurrentProtectionA!, 2),
          }
        : null,
      limitedBy,
      requiredAmpacityA: roundTo(requiredAmpacityA, 3),
      fuseRatingA,
      oneWayLengthM: r4(lengthM),
      oneWayLengthFt: r4(mToFeet(lengthM)),
      conductorTempC,
      ambientCorrectionFactor: ambientFactor,
      bundlingAdjustmentFactor: bundlingFactor,
      candidates: evaluated.map((e) => ({
        size: e.row.size,
        areaMm2: r4(e.row.areaMm2),
        ampacityA: e.ampacityA,
        deratedAmpacityA: e.deratedAmpacityA === null ? null : roundTo(e.deratedAmpacityA, 2),
        maxOvercurrentProtectionA: e.maxOvercurrentProtectionA === null ? null : roundTo(e.maxOvercurrentProtectionA, 2),
        resistanceOhm: roundTo(e.resistanceOhm, 6),
        voltageDropV: r4(e.voltageDropV),
        voltageDropPct: roundTo(e.voltageDropPct, 3),
        powerLossW: roundTo(e.powerLossW, 3),
        passes: criteria.every((c) => e.pass[c]),
        failed: criteria.filter((c) => !e.pass[c]),
        reasons: e.reasons,
      })),
    },
    checks,
    cautions: batteryWorkCautions(),
    basis: [
      'NFPA 70 National Electrical Code, 2023 edition, Table 310.16 (copper, ' + column + ' °C column) with Table 310.15(B)(1) ambient correction and Table 310.15(C)(1) adjustment',
      'Continuous current: ampacity ≥ 125 % of the current after corrections (NEC 2023 210.19(A)(1), 215.2(A)(1), 706.30)',
      'NEC 2023 240.6(A) standard ratings and 240.4(D) small-conductor limits for protectability',
      input.sizeSystem === 'awg'
        ? 'NEC 2023 Chapter 9 Table 8: stranded uncoated copper DC resistance, corrected to ' + conductorTempC + ' °C (α20 = 0.00393 /°C)'
        : 'IEC 60228:2004 class 5 copper DC resistance at 20 °C, corrected to ' + conductorTempC + ' °C with k_t = 250/(230 + t); ampacity derived from NEC Table 310.16 (not a published value)',
      'Voltage drop over the round trip: V = I × R′ × 2 × one-way length',
    ],
  };
}
