/**
 * Fuse sizing for a battery circuit.
 *
 * Model (NFPA 70 NEC **2023 edition**):
 * - Minimum rating: 125 % of the continuous current (NEC 210.20(A), 215.3; energy-storage circuits 706.31),
 *   rounded up to a standard rating of 240.6(A).
 * - Maximum rating: the protected conductor's ampacity (Table 310.16 in its insulation column, 30 °C,
 *   ≤ 3 current-carrying conductors; 240.4), capped for 18–10 AWG copper by the 240.4(D) limits. 18 and 16 AWG
 *   have no 60/75 °C ampacity in the table; for them the 240.4(D) limit alone is the maximum. The 240.4(B)
 *   "next size up" allowance is not used. When the minimum exceeds the maximum the conductor cannot be
 *   protected: that is an answer (recommendedRatingA null, a danger check, and the smallest size that would
 *   work), not an error.
 * - Recommended: the smallest standard rating ≥ the minimum (it protects the conductor with the most margin).
 * - Prospective short-circuit current: the source pack's full-charge voltage ÷ (its internal resistance +
 *   the link resistance; no link given: zero). Full-charge rather than nominal voltage, and no arc or
 *   contact resistance, make it an upper estimate. `requiredInterruptRatingA` is that current;
 *   `preferredInterruptRatingA` the next UL 248 preferred DC rating (grade B source).
 * - Voltage rating: at least the source's full-charge voltage (or systemMaxVoltageV when higher).
 *
 * Throws CalcError when a source has no resistance at all (internal and link both zero or absent): the
 * short-circuit current would be unbounded.
 */
import type { FuseSizeData, FuseSizeInput } from '../../schemas/fuse-size.ts';
import { packVoltages } from '../chemistry/pack.ts';
import { conductorsOf, findConductor } from '../tables/conductors.ts';
import { overcurrentSources, preferredInterruptRatingAtLeast, smallestStandardRatingAtLeast, interruptRatingSources } from '../tables/overcurrent.ts';
import { batteryWorkCautions } from '../tables/safety-cautions.ts';
import { CalcError } from '../errors.ts';
import type { CalcOutput, Check } from '../types.ts';
import { milliohmToOhm, roundTo } from '../units.ts';

export const FUSE_CONTINUOUS_FACTOR = 1.25;

/** The largest rating a conductor may be protected at: ampacity in its column, capped by 240.4(D). */
export function conductorMaxProtectionA(row: { ampacityA: Record<60 | 75 | 90, number | null>; smallConductorMaxOcpdA: number | null }, column: 60 | 75 | 90): number | null {
  const ampacity = row.ampacityA[column];
  const limit = row.smallConductorMaxOcpdA;
  if (ampacity === null) return limit;
  return limit === null ? ampacity : Math.min(ampacity, limit);
}

/**
 * Sizes a fuse (model above). Input units: continuousCurrentA (A), linkResistanceMOhm (mΩ),
 * prospectiveShortCircuitA (A), systemMaxVoltageV (V). Returns the rating window in A, the prospective
 * short-circuit current in A and the DC voltage rating in V.
 */
export function computeFuseSize(input: FuseSizeInput): CalcOutput<FuseSizeData> {
  const checks: Check[] = [];
  const basis: string[] = [...overcurrentSources];
  const neededA = input.continuousCurrentA * FUSE_CONTINUOUS_FACTOR;
  const minimumRatingA = smallestStandardRatingAtLeast(neededA);
  if (minimumRatingA === undefined) {
    throw new CalcError('current_above_standard_ratings', `125 % of ${input.continuousCurrentA} A is above the largest NEC 240.6(A) standard rating (6000 A).`, '#/continuousCurrentA');
  }

  let maximumRatingA: number | null = null;
  let recommendedRatingA: number | null = minimumRatingA;
  let conductor: FuseSizeData['conductor'] = null;
  if (input.conductor) {
    const row = findConductor(input.conductor.size);
    if (!row) throw new CalcError('unknown_conductor', `Unknown conductor size "${input.conductor.size}".`, '#/conductor/size');
    const column = input.conductor.temperatureRatingC;
    maximumRatingA = conductorMaxProtectionA(row, column);
    const protectable = maximumRatingA !== null && minimumRatingA <= maximumRatingA + 1e-9;
    const smallest = conductorsOf(row.system).find((r) => {
      const max = conductorMaxProtectionA(r, column);
      return max !== null && minimumRatingA <= max + 1e-9;
    });
    conductor = {
      size: row.size,
      temperatureRatingC: column,
      ampacityA: row.ampacityA[column],
      smallConductorMaxOcpdA: row.smallConductorMaxOcpdA,
      smallestProtectableSize: smallest?.size ?? null,
    };
    basis.push(`NFPA 70 National Electrical Code, 2023 edition, Table 310.16: ${row.size} copper, ${column} °C column${row.system === 'metric' ? ' (metric ampacity derived, not a published value)' : ''}`);
    if (!protectable) {
      recommendedRatingA = null;
      checks.push({
        code: 'conductor_unprotectable',
        level: 'danger',
        message: `${row.size} (${column} °C) can be protected at no more than ${maximumRatingA ?? 0} A, but ${input.continuousCurrentA} A continuous needs at least a ${minimumRatingA} A fuse. The conductor is too small: use ${smallest ? `${smallest.size} or larger` : 'a larger conductor than this table covers'}.`,
      });
    }
    if (row.system === 'metric') {
      checks.push({ code: 'metric_ampacity_derived', level: 'warning', message: 'Metric ampacities are derived, not published values (interpolated between NEC Table 310.16 AWG rows).' });
    }
    if (row.ampacityA[column] === null && row.smallConductorMaxOcpdA !== null) {
      checks.push({ code: 'small_conductor_limit_only', level: 'warning', message: `NEC Table 310.16 lists no ${column} °C ampacity for ${row.size}; the 240.4(D) limit of ${row.smallConductorMaxOcpdA} A is used as the maximum.` });
    }
  } else {
    checks.push({ code: 'no_conductor', level: 'info', message: 'No conductor given: the fuse must also be no larger than the ampacity of the conductor it protects.' });
  }

  let prospectiveShortCircuitA: number | null = null;
  let requiredVoltageRatingV: number | null = input.systemMaxVoltageV ?? null;
  if (input.source) {
    const fullV = packVoltages(input.source).fullChargeVoltageV;
    const internalMOhm = input.source.internalResistanceMOhm;
    const linkMOhm = input.linkResistanceMOhm ?? 0;
    const totalOhm = milliohmToOhm((internalMOhm ?? 0) + linkMOhm);
    if (!(totalOhm > 0)) {
      throw new CalcError(
        'source_resistance_missing',
        "The source's internal resistance is needed for its short-circuit current (give source.internalResistanceMOhm, from the pack maker's data, or prospectiveShortCircuitA instead).",
        '#/source/internalResistanceMOhm',
      );
    }
    if (internalMOhm === undefined) {
      checks.push({ code: 'internal_resistance_assumed_zero', level: 'warning', message: "The source's internal resistance was not given: only the link resistance limits the fault current here (an upper estimate)." });
    }
    prospectiveShortCircuitA = fullV / totalOhm;
    requiredVoltageRatingV = Math.max(fullV, requiredVoltageRatingV ?? 0);
    basis.push(`Prospective short-circuit current = full-charge voltage ${roundTo(fullV, 3)} V ÷ (internal + link resistance ${roundTo(totalOhm * 1000, 4)} mΩ)`);
  } else if (input.prospectiveShortCircuitA !== undefined) {
    prospectiveShortCircuitA = input.prospectiveShortCircuitA;
  } else {
    checks.push({
      code: 'short_circuit_unknown',
      level: 'warning',
      message: "No source or prospective short-circuit current given: the fuse's interrupt rating cannot be checked. A lithium pack can deliver thousands of amperes into a short.",
    });
  }
  if (requiredVoltageRatingV === null) {
    checks.push({ code: 'voltage_unknown', level: 'warning', message: "No source or systemMaxVoltageV given: the fuse's DC voltage rating must be at least the highest voltage of the circuit." });
  }

  const preferred = prospectiveShortCircuitA === null ? undefined : preferredInterruptRatingAtLeast(prospectiveShortCircuitA);
  if (prospectiveShortCircuitA !== null) {
    basis.push(...interruptRatingSources);
    checks.push({
      code: 'interrupt_rating',
      level: prospectiveShortCircuitA > 10_000 ? 'warning' : 'info',
      message: `Choose a fuse listed for DC that interrupts at least ${Math.ceil(prospectiveShortCircuitA)} A at ${requiredVoltageRatingV === null ? 'the circuit voltage' : `${roundTo(requiredVoltageRatingV, 2)} V DC`}${preferred ? ` (e.g. a ${preferred / 1000} kA DC rating)` : ''}. Many small blade and glass fuses interrupt only about 1 kA or less.`,
    });
  }

  return {
    data: {
      minimumRatingA,
      maximumRatingA: maximumRatingA === null ? null : roundTo(maximumRatingA, 2),
      recommendedRatingA,
      prospectiveShortCircuitA: prospectiveShortCircuitA === null ? null : roundTo(prospectiveShortCircuitA, 1),
      requiredInterruptRatingA: prospectiveShortCircuitA === null ? null : Math.ceil(prospectiveShortCircuitA - 1e-9),
      preferredInterruptRatingA: preferred ?? null,
      requiredVoltageRatingV: requiredVoltageRatingV === null ? null : roundTo(requiredVoltageRatingV, 3),
      conductor,
    },
    checks,
    cautions: batteryWorkCautions('A fuse protects the conductor; it does not make a connection between packs at different voltages safe.'),
    basis: ['Minimum rating: 125 % of the continuous current (NEC 2023 210.20(A), 215.3, 706.31), rounded up to a 240.6(A) standard rating', ...basis],
  };
}
