/**
 * Ampacity correction and adjustment factors, NFPA 70 National Electrical Code, **2023 edition**.
 *
 * - Table 310.15(B)(1) "Ambient Temperature Correction Factors Based on 30 °C" (numbered 310.15(B)(2)(a)
 *   in the 2014/2017 editions), by the conductor's insulation temperature column. Rows up to 56–60 °C are
 *   published values (grade A). The 61–85 °C rows are from memory (grade C); every entry, those included,
 *   equals the NEC 310.15(B) formula F = √((Tc − Ta)/(Tc − 30)) at the row's upper ambient to two decimals,
 *   which the tests check. A dash in the table (conductor not usable at that ambient) is `null` here.
 * - Table 310.15(C)(1) "Adjustment Factors for More Than Three Current-Carrying Conductors" (310.15(B)(3)(a)
 *   in 2014/2017): 4–6 80 %, 7–9 70 %, 10–20 50 %, 21–30 45 %, 31–40 40 %, 41 and above 35 %.
 */
import type { TemperatureRatingC } from './conductors.ts';

export interface AmbientCorrectionRow {
  /** The row covers ambients above the previous row's `upToAmbientC` and up to this value, °C. */
  upToAmbientC: number;
  factor: Record<TemperatureRatingC, number | null>;
  grade: 'published' | 'from_memory';
}

const row = (upToAmbientC: number, f60: number | null, f75: number | null, f90: number | null, grade: AmbientCorrectionRow['grade'] = 'published'): AmbientCorrectionRow => ({
  upToAmbientC,
  factor: { 60: f60, 75: f75, 90: f90 },
  grade,
});

// NEC 2023 Table 310.15(B)(1), 30 °C basis: 60 °C, 75 °C, 90 °C columns.
export const ambientCorrectionRows: readonly AmbientCorrectionRow[] = [
  row(10, 1.29, 1.2, 1.15), // "10 or less"
  row(15, 1.22, 1.15, 1.12),
  row(20, 1.15, 1.11, 1.08),
  row(25, 1.08, 1.05, 1.04),
  row(30, 1.0, 1.0, 1.0),
  row(35, 0.91, 0.94, 0.96),
  row(40, 0.82, 0.88, 0.91),
  row(45, 0.71, 0.82, 0.87),
  row(50, 0.58, 0.75, 0.82),
  row(55, 0.41, 0.67, 0.76),
  row(60, null, 0.58, 0.71),
  row(65, null, 0.47, 0.65, 'from_memory'),
  row(70, null, 0.33, 0.58, 'from_memory'),
  row(75, null, null, 0.5, 'from_memory'),
  row(80, null, null, 0.41, 'from_memory'),
  row(85, null, null, 0.29, 'from_memory'),
];

/**
 * Ambient-temperature correction factor for a conductor column; null when the table gives none (the
 * conductor may not be used at that ambient). Ambients between whole degrees fall in the next row up
 * (30.5 °C is in 31–35 °C), which is the conservative reading.
 */
export function ambientCorrectionFactor(ambientTempC: number, column: TemperatureRatingC): number | null {
  for (const r of ambientCorrectionRows) if (ambientTempC <= r.upToAmbientC) return r.factor[column];
  return null;
}

export interface BundlingAdjustmentRow {
  fromConductors: number;
  toConductors: number;
  factor: number;
}

// NEC 2023 Table 310.15(C)(1). Three or fewer current-carrying conductors need no adjustment (factor 1).
export const bundlingAdjustmentRows: readonly BundlingAdjustmentRow[] = [
  { fromConductors: 1, toConductors: 3, factor: 1 },
  { fromConductors: 4, toConductors: 6, factor: 0.8 },
  { fromConductors: 7, toConductors: 9, factor: 0.7 },
  { fromConductors: 10, toConductors: 20, factor: 0.5 },
  { fromConductors: 21, toConductors: 30, factor: 0.45 },
  { fromConductors: 31, toConductors: 40, factor: 0.4 },
  { fromConductors: 41, toConductors: Number.POSITIVE_INFINITY, factor: 0.35 },
];

/** Adjustment factor for the number of current-carrying conductors in a raceway or cable. */
export function bundlingAdjustmentFactor(currentCarryingConductors: number): number {
  for (const r of bundlingAdjustmentRows) if (currentCarryingConductors <= r.toConductors) return r.factor;
  return bundlingAdjustmentRows[bundlingAdjustmentRows.length - 1]!.factor;
}

export const ampacityCorrectionSources: readonly string[] = [
  'NFPA 70 National Electrical Code, 2023 edition, Table 310.15(B)(1): ambient temperature correction factors, 30 °C basis (rows above 60 °C from memory; all rows match the 310.15(B) formula)',
  'NFPA 70 National Electrical Code, 2023 edition, Table 310.15(C)(1): adjustment factors for more than three current-carrying conductors',
];
