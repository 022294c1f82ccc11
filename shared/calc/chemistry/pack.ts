/**
 * Pack-level voltages from a chemistry preset: per-cell values × cells in series. The open-circuit voltage
 * is the measured rested voltage when given, otherwise the chemistry's OCV curve at the state of charge.
 */
import type { PackSpec } from '../../schemas/common.ts';
import { cellOcvAtSoc, socAtCellOcv } from './ocv.ts';
import { chemistries, type ChemistryPreset } from './presets.ts';

export interface PackVoltages {
  nominalVoltageV: number;
  fullChargeVoltageV: number;
  cutoffVoltageV: number;
}

export function packChemistry(pack: Pick<PackSpec, 'chemistry'>): ChemistryPreset {
  return chemistries[pack.chemistry];
}

export function packVoltages(pack: Pick<PackSpec, 'chemistry' | 'seriesCells'>): PackVoltages {
  const c = chemistries[pack.chemistry];
  return {
    nominalVoltageV: c.nominalCellVoltageV * pack.seriesCells,
    fullChargeVoltageV: c.fullChargeCellVoltageV * pack.seriesCells,
    cutoffVoltageV: c.cutoffCellVoltageV * pack.seriesCells,
  };
}

/** Pack OCV (V) at a state of charge (%), from the chemistry curve. */
export function packOcvAtSoc(pack: Pick<PackSpec, 'chemistry' | 'seriesCells'>, socPct: number): number {
  return cellOcvAtSoc(chemistries[pack.chemistry].ocvCurve, socPct) * pack.seriesCells;
}

/** State of charge (%) at a pack OCV, by inverting the chemistry curve (clamped to 0–100 %). */
export function packSocAtOcv(pack: Pick<PackSpec, 'chemistry' | 'seriesCells'>, voltageV: number): number {
  return socAtCellOcv(chemistries[pack.chemistry].ocvCurve, voltageV / pack.seriesCells);
}

/**
 * The pack's present state: its open-circuit voltage and state of charge. `restingVoltageV` wins over
 * `stateOfChargePct` for the voltage (the brief's rule); the state of charge is then the curve's inverse of
 * that voltage unless it was given too. With neither, `defaultSocPct` is assumed.
 */
export function packPresentState(pack: PackSpec, defaultSocPct = 100): { openCircuitVoltageV: number; stateOfChargePct: number } {
  if (pack.restingVoltageV !== undefined) {
    return {
      openCircuitVoltageV: pack.restingVoltageV,
      stateOfChargePct: pack.stateOfChargePct ?? packSocAtOcv(pack, pack.restingVoltageV),
    };
  }
  const soc = pack.stateOfChargePct ?? defaultSocPct;
  return { openCircuitVoltageV: packOcvAtSoc(pack, soc), stateOfChargePct: soc };
}
