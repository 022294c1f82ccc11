/**
 * Open-circuit voltage lookups on a chemistry's curve: piecewise-linear interpolation between published
 * breakpoints, clamped to the curve's ends (0 % and 100 %), and its inverse.
 */
import type { OcvPoint } from './presets.ts';

/** Cell OCV (V) at a state of charge (%), linear between breakpoints, clamped to [0, 100] %. */
export function cellOcvAtSoc(curve: readonly OcvPoint[], socPct: number): number {
  const first = curve[0]!;
  const last = curve[curve.length - 1]!;
  if (socPct <= first.socPct) return first.cellVoltageV;
  if (socPct >= last.socPct) return last.cellVoltageV;
  // Binary search for the segment; curves are short but this runs inside time-stepped simulations.
  let lo = 0;
  let hi = curve.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (curve[mid]!.socPct <= socPct) lo = mid;
    else hi = mid;
  }
  const a = curve[lo]!;
  const b = curve[hi]!;
  return a.cellVoltageV + ((socPct - a.socPct) / (b.socPct - a.socPct)) * (b.cellVoltageV - a.cellVoltageV);
}

/** State of charge (%) whose OCV is the given cell voltage; clamped to 0 / 100 % outside the curve. */
export function socAtCellOcv(curve: readonly OcvPoint[], cellVoltageV: number): number {
  const first = curve[0]!;
  const last = curve[curve.length - 1]!;
  if (cellVoltageV <= first.cellVoltageV) return first.socPct;
  if (cellVoltageV >= last.cellVoltageV) return last.socPct;
  let lo = 0;
  let hi = curve.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (curve[mid]!.cellVoltageV <= cellVoltageV) lo = mid;
    else hi = mid;
  }
  const a = curve[lo]!;
  const b = curve[hi]!;
  return a.socPct + ((cellVoltageV - a.cellVoltageV) / (b.cellVoltageV - a.cellVoltageV)) * (b.socPct - a.socPct);
}

/** Slope dV/dSoC of the cell curve (V per %) on the segment containing socPct (right-hand at breakpoints). */
export function cellOcvSlopeAtSoc(curve: readonly OcvPoint[], socPct: number): number {
  let i = 0;
  while (i < curve.length - 2 && curve[i + 1]!.socPct <= socPct) i += 1;
  const a = curve[i]!;
  const b = curve[i + 1]!;
  return (b.cellVoltageV - a.cellVoltageV) / (b.socPct - a.socPct);
}
