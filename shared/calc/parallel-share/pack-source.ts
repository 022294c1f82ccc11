/**
 * A pack as a voltage source for the parallel models: its open-circuit voltage follows the chemistry's
 * OCV curve as its state of charge moves, behind a resistance.
 *
 * When `restingVoltageV` is given it overrides the curve at the start (the contract's rule). The difference
 * between the measured and the curve voltage is kept as a constant offset while the state of charge moves,
 * so the model starts exactly at the measured voltage and then follows the curve's shape. (A measured
 * voltage off the curve usually means surface charge or a curve mismatch; the offset keeps the model
 * conservative for the first, largest current, which is what matters for safety.)
 */
import type { PackSpec } from '../../schemas/common.ts';
import { cellOcvAtSoc, cellOcvSlopeAtSoc } from '../chemistry/ocv.ts';
import { packPresentState, packVoltages } from '../chemistry/pack.ts';
import { chemistries, type OcvPoint } from '../chemistry/presets.ts';
import { milliohmToOhm } from '../units.ts';

export interface PackSource {
  label: string;
  seriesCells: number;
  capacityAh: number;
  curve: readonly OcvPoint[];
  /** Measured minus curve voltage at the start, V (0 unless restingVoltageV is off the curve). */
  offsetV: number;
  initialSocPct: number;
  initialOcvV: number;
  /** Internal resistance, Ω (0 when not given). */
  internalOhm: number;
  internalGiven: boolean;
  cutoffVoltageV: number;
  fullChargeVoltageV: number;
  /** The state of charge was assumed (neither stateOfChargePct nor restingVoltageV given). */
  socAssumed: boolean;
}

export function packSource(pack: PackSpec, fallbackLabel: string, defaultSocPct = 100): PackSource {
  const state = packPresentState(pack, defaultSocPct);
  const curve = chemistries[pack.chemistry].ocvCurve;
  const curveV = cellOcvAtSoc(curve, state.stateOfChargePct) * pack.seriesCells;
  const v = packVoltages(pack);
  return {
    label: pack.label ?? fallbackLabel,
    seriesCells: pack.seriesCells,
    capacityAh: pack.capacityAh,
    curve,
    offsetV: state.openCircuitVoltageV - curveV,
    initialSocPct: state.stateOfChargePct,
    initialOcvV: state.openCircuitVoltageV,
    internalOhm: milliohmToOhm(pack.internalResistanceMOhm ?? 0),
    internalGiven: pack.internalResistanceMOhm !== undefined,
    cutoffVoltageV: v.cutoffVoltageV,
    fullChargeVoltageV: v.fullChargeVoltageV,
    socAssumed: pack.stateOfChargePct === undefined && pack.restingVoltageV === undefined,
  };
}

/** Pack OCV (V) at a state of charge (%), including the start offset. */
export function sourceOcvV(s: PackSource, socPct: number): number {
  return cellOcvAtSoc(s.curve, socPct) * s.seriesCells + s.offsetV;
}

/** dOCV/dSoC of the pack, V per %, on the curve segment at socPct; 0 beyond the curve's ends (clamped). */
export function sourceSlopeVPerPct(s: PackSource, socPct: number): number {
  if (socPct < 0 || socPct >= 100) return 0;
  return cellOcvSlopeAtSoc(s.curve, socPct) * s.seriesCells;
}
