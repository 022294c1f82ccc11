/**
 * Copper conductor table: AWG 18 – 4/0 and metric 1.5 – 120 mm².
 *
 * Sources and edition (pinned: tables differ between editions):
 * - NFPA 70, National Electrical Code (NEC), **2023 edition**:
 *   - Chapter 9, Table 8 "Conductor Properties": area in circular mils and DC resistance at 75 °C of
 *     stranded, uncoated copper (Ω/kft). Note 2 gives the temperature correction R2 = R1·[1 + α(T2 − 75)],
 *     α = 0.00323 /°C for copper (the IACS 20 °C coefficient 0.00393 /°C re-referenced to 75 °C).
 *   - Table 310.16: allowable ampacity of insulated copper conductors, not more than three current-carrying
 *     conductors, 30 °C ambient, by the 60 / 75 / 90 °C insulation column. 18 and 16 AWG are listed in the
 *     90 °C column only (14 A, 18 A); those two values are from memory (grade C), all others published (grade A).
 *   - 240.4(D): small-conductor overcurrent-protection limits (copper 18 AWG 7 A, 16 AWG 10 A, 14 AWG 15 A,
 *     12 AWG 20 A, 10 AWG 30 A).
 * - IACS (NBS Circular 31, 1914): annealed copper, 1/58 Ω·mm²/m and α = 0.00393 /°C at 20 °C.
 * - IEC 60228:2004 "Conductors of insulated cables", Table 3 (class 5, flexible): maximum DC resistance at
 *   20 °C of plain annealed copper. IEC 60228 Annex B corrects resistance with k_t = 250 / (230 + t),
 *   i.e. α = 0.004 /°C at 20 °C, so metric rows carry that coefficient. Class 2 (stranded) values are kept
 *   for reference. Class 5 is used because flexible cable is the usual battery-cable construction, and
 *   its resistance is the higher (conservative for voltage drop).
 *
 * Derived values (not published, computed here and marked as such):
 * - AWG `resistanceOhmPerKm20C` = Table 8 value at 75 °C ÷ (1 + 0.00393 × 55), per km (÷ 0.3048 km/kft).
 *   It agrees with Note 2's 0.00323 /°C form to 0.01 %.
 * - AWG `areaMm2` = Table 8 circular mils × π/4 × 0.0254² mm² (exact unit conversion).
 * - Metric ampacities: the NEC has no metric rows. Each metric ampacity is **derived, not a published
 *   value**: linear interpolation on conductor area between the two AWG rows of Table 310.16 that bracket
 *   the metric area, in the same temperature column, rounded down to a whole ampere. Ampacity grows more
 *   slowly than area, so a straight line between two table points lies below the table's own trend
 *   (conservative). Above 4/0 AWG (107.2 mm²) the 4/0 value is used unchanged (no extrapolation); below
 *   the smallest AWG row listed in a column there is no value (null).
 * - Metric small-conductor limit: 240.4(D) names AWG sizes only. A metric size takes the limit of the
 *   largest AWG size whose area does not exceed it (e.g. 2.5 mm² → 14 AWG's 15 A), which is conservative.
 *   Derived here, not a published rule.
 */
import { M_PER_FT } from '../units.ts';

export type ConductorSystem = 'awg' | 'metric';
export type TemperatureRatingC = 60 | 75 | 90;
export const temperatureRatingsC = [60, 75, 90] as const satisfies readonly TemperatureRatingC[];

/** How trustworthy a value is: published in the named source, from memory, or derived here. */
export type ValueGrade = 'published' | 'from_memory' | 'derived';

export interface ConductorRow {
  /** Display spelling used in every output: "10 AWG", "1/0 AWG", "16 mm²". */
  size: string;
  system: ConductorSystem;
  /** Cross-section, mm². AWG: from the NEC circular mils; metric: the IEC nominal cross-section. */
  areaMm2: number;
  /** AWG only: NEC Chapter 9 Table 8 area, circular mils. */
  areaCmil: number | null;
  /** DC resistance at 20 °C, Ω/km. */
  resistanceOhmPerKm20C: number;
  /** DC resistance at 75 °C, Ω/km. AWG: NEC Table 8 (published); metric: derived with the IEC coefficient. */
  resistanceOhmPerKm75C: number;
  /** Temperature coefficient of resistance referred to 20 °C, 1/°C: R(T) = R20·[1 + α20·(T − 20)]. */
  temperatureCoefficientPerC: number;
  /** Allowable ampacity at 30 °C ambient, ≤ 3 current-carrying conductors, by insulation column; null if not listed. */
  ampacityA: Record<TemperatureRatingC, number | null>;
  ampacityGrade: Record<TemperatureRatingC, ValueGrade | null>;
  /** NEC 240.4(D) maximum overcurrent protection for this size (copper), A; null when 240.4(D) does not apply. */
  smallConductorMaxOcpdA: number | null;
  smallConductorGrade: ValueGrade | null;
  /** Metric rows: IEC 60228 class 2 (stranded) maximum resistance at 20 °C, Ω/km, for reference. */
  resistanceOhmPerKm20CClass2?: number;
}

/** Exact: one circular mil is the area of a circle one mil (0.0254 mm) across. */
export const MM2_PER_CMIL = (Math.PI / 4) * 0.0254 * 0.0254;

/** IACS annealed copper, NBS Circular 31: temperature coefficient at 20 °C, 1/°C. */
export const COPPER_ALPHA_20C_IACS = 0.00393;
/** NEC 2023 Ch. 9 Table 8 Note 2: copper coefficient referred to 75 °C, 1/°C. */
export const COPPER_ALPHA_75C_NEC = 0.00323;
/** IEC 60228 Annex B: k_t = 250/(230 + t) ⇔ α = 1/250 = 0.004 /°C at 20 °C. */
export const COPPER_ALPHA_20C_IEC60228 = 1 / 250;

interface AwgSource {
  gauge: string;
  /** NEC 2023 Ch. 9 Table 8, circular mils. */
  areaCmil: number;
  /** NEC 2023 Ch. 9 Table 8, stranded uncoated copper at 75 °C, Ω/kft. */
  ohmPerKft75C: number;
  /** NEC 2023 Table 310.16 copper, 60 / 75 / 90 °C columns, A (null: not listed). */
  ampacity: [number | null, number | null, number | null];
  /** NEC 2023 240.4(D) copper limit, A. */
  smallConductorMaxOcpdA: number | null;
  /** The 90 °C values of 18 and 16 AWG are from memory (grade C). */
  ampacityFromMemory?: boolean;
}

// NEC 2023 Ch. 9 Table 8 (area, stranded resistance at 75 °C); Table 310.16 (ampacity); 240.4(D) (limits).
const awgSource: AwgSource[] = [
  { gauge: '18', areaCmil: 1620, ohmPerKft75C: 7.95, ampacity: [null, null, 14], smallConductorMaxOcpdA: 7, ampacityFromMemory: true },
  { gauge: '16', areaCmil: 2580, ohmPerKft75C: 4.99, ampacity: [null, null, 18], smallConductorMaxOcpdA: 10, ampacityFromMemory: true },
  { gauge: '14', areaCmil: 4110, ohmPerKft75C: 3.14, ampacity: [15, 20, 25], smallConductorMaxOcpdA: 15 },
  { gauge: '12', areaCmil: 6530, ohmPerKft75C: 1.98, ampacity: [20, 25, 30], smallConductorMaxOcpdA: 20 },
  { gauge: '10', areaCmil: 10380, ohmPerKft75C: 1.24, ampacity: [30, 35, 40], smallConductorMaxOcpdA: 30 },
  { gauge: '8', areaCmil: 16510, ohmPerKft75C: 0.778, ampacity: [40, 50, 55], smallConductorMaxOcpdA: null },
  { gauge: '6', areaCmil: 26240, ohmPerKft75C: 0.491, ampacity: [55, 65, 75], smallConductorMaxOcpdA: null },
  { gauge: '4', areaCmil: 41740, ohmPerKft75C: 0.308, ampacity: [70, 85, 95], smallConductorMaxOcpdA: null },
  { gauge: '3', areaCmil: 52620, ohmPerKft75C: 0.245, ampacity: [85, 100, 115], smallConductorMaxOcpdA: null },
  { gauge: '2', areaCmil: 66360, ohmPerKft75C: 0.194, ampacity: [95, 115, 130], smallConductorMaxOcpdA: null },
  { gauge: '1', areaCmil: 83690, ohmPerKft75C: 0.154, ampacity: [110, 130, 145], smallConductorMaxOcpdA: null },
  { gauge: '1/0', areaCmil: 105600, ohmPerKft75C: 0.122, ampacity: [125, 150, 170], smallConductorMaxOcpdA: null },
  { gauge: '2/0', areaCmil: 133100, ohmPerKft75C: 0.0967, ampacity: [145, 175, 195], smallConductorMaxOcpdA: null },
  { gauge: '3/0', areaCmil: 167800, ohmPerKft75C: 0.0766, ampacity: [165, 200, 225], smallConductorMaxOcpdA: null },
  { gauge: '4/0', areaCmil: 211600, ohmPerKft75C: 0.0608, ampacity: [195, 230, 260], smallConductorMaxOcpdA: null },
];

interface MetricSource {
  areaMm2: number;
  /** IEC 60228 Table 3, class 5 plain copper, maximum Ω/km at 20 °C. */
  class5OhmPerKm20C: number;
  /** IEC 60228 Table 2, class 2 plain copper, maximum Ω/km at 20 °C. */
  class2OhmPerKm20C: number;
}

// IEC 60228:2004 Tables 2 and 3 (plain annealed copper). At 50 mm² class 5 (0.386) is below class 2 (0.387):
// that is what the standard prints.
const metricSource: MetricSource[] = [
  { areaMm2: 1.5, class5OhmPerKm20C: 13.3, class2OhmPerKm20C: 12.1 },
  { areaMm2: 2.5, class5OhmPerKm20C: 7.98, class2OhmPerKm20C: 7.41 },
  { areaMm2: 4, class5OhmPerKm20C: 4.95, class2OhmPerKm20C: 4.61 },
  { areaMm2: 6, class5OhmPerKm20C: 3.3, class2OhmPerKm20C: 3.08 },
  { areaMm2: 10, class5OhmPerKm20C: 1.91, class2OhmPerKm20C: 1.83 },
  { areaMm2: 16, class5OhmPerKm20C: 1.21, class2OhmPerKm20C: 1.15 },
  { areaMm2: 25, class5OhmPerKm20C: 0.78, class2OhmPerKm20C: 0.727 },
  { areaMm2: 35, class5OhmPerKm20C: 0.554, class2OhmPerKm20C: 0.524 },
  { areaMm2: 50, class5OhmPerKm20C: 0.386, class2OhmPerKm20C: 0.387 },
  { areaMm2: 70, class5OhmPerKm20C: 0.272, class2OhmPerKm20C: 0.268 },
  { areaMm2: 95, class5OhmPerKm20C: 0.206, class2OhmPerKm20C: 0.193 },
  { areaMm2: 120, class5OhmPerKm20C: 0.161, class2OhmPerKm20C: 0.153 },
];

/** kft per km: 1000 m ÷ 0.3048 m/ft ÷ 1000 ft/kft (exact). */
const KFT_PER_KM = 1 / M_PER_FT;

function awgRow(s: AwgSource): ConductorRow {
  const r75 = s.ohmPerKft75C * KFT_PER_KM;
  const grade = (v: number | null): ValueGrade | null => (v === null ? null : s.ampacityFromMemory ? 'from_memory' : 'published');
  return {
    size: `${s.gauge} AWG`,
    system: 'awg',
    areaMm2: s.areaCmil * MM2_PER_CMIL,
    areaCmil: s.areaCmil,
    resistanceOhmPerKm20C: r75 / (1 + COPPER_ALPHA_20C_IACS * 55),
    resistanceOhmPerKm75C: r75,
    temperatureCoefficientPerC: COPPER_ALPHA_20C_IACS,
    ampacityA: { 60: s.ampacity[0], 75: s.ampacity[1], 90: s.ampacity[2] },
    ampacityGrade: { 60: grade(s.ampacity[0]), 75: grade(s.ampacity[1]), 90: grade(s.ampacity[2]) },
    smallConductorMaxOcpdA: s.smallConductorMaxOcpdA,
    smallConductorGrade: s.smallConductorMaxOcpdA === null ? null : 'published',
  };
}

/** AWG rows, smallest first. */
export const awgConductors: readonly ConductorRow[] = awgSource.map(awgRow);

/**
 * Metric ampacity derived from the AWG rows of one column (see the file comment): linear on area between
 * the bracketing rows, rounded down; the 4/0 value above 4/0; null below the column's smallest listed row.
 */
export function interpolateAmpacityOnArea(areaMm2: number, column: TemperatureRatingC): number | null {
  const listed = awgConductors.filter((r) => r.ampacityA[column] !== null);
  const first = listed[0]!;
  const last = listed[listed.length - 1]!;
  if (areaMm2 < first.areaMm2) return null;
  if (areaMm2 >= last.areaMm2) return last.ampacityA[column];
  let i = 0;
  while (listed[i + 1]!.areaMm2 <= areaMm2) i += 1;
  const lo = listed[i]!;
  const hi = listed[i + 1]!;
  const vLo = lo.ampacityA[column]!;
  const vHi = hi.ampacityA[column]!;
  return Math.floor(vLo + ((areaMm2 - lo.areaMm2) / (hi.areaMm2 - lo.areaMm2)) * (vHi - vLo) + 1e-9);
}

function metricSmallConductorLimit(areaMm2: number): number | null {
  let limit: number | null = null;
  for (const r of awgConductors) if (r.areaMm2 <= areaMm2) limit = r.smallConductorMaxOcpdA;
  return limit;
}

function metricRow(s: MetricSource): ConductorRow {
  const a = (c: TemperatureRatingC) => interpolateAmpacityOnArea(s.areaMm2, c);
  const g = (c: TemperatureRatingC): ValueGrade | null => (a(c) === null ? null : 'derived');
  const limit = metricSmallConductorLimit(s.areaMm2);
  return {
    size: `${s.areaMm2} mm²`,
    system: 'metric',
    areaMm2: s.areaMm2,
    areaCmil: null,
    resistanceOhmPerKm20C: s.class5OhmPerKm20C,
    resistanceOhmPerKm75C: s.class5OhmPerKm20C * (1 + COPPER_ALPHA_20C_IEC60228 * 55),
    temperatureCoefficientPerC: COPPER_ALPHA_20C_IEC60228,
    ampacityA: { 60: a(60), 75: a(75), 90: a(90) },
    ampacityGrade: { 60: g(60), 75: g(75), 90: g(90) },
    smallConductorMaxOcpdA: limit,
    smallConductorGrade: limit === null ? null : 'derived',
    resistanceOhmPerKm20CClass2: s.class2OhmPerKm20C,
  };
}

/** Metric rows, smallest first. */
export const metricConductors: readonly ConductorRow[] = metricSource.map(metricRow);

/** Every row, AWG first then metric, each group smallest first. */
export const conductors: readonly ConductorRow[] = [...awgConductors, ...metricConductors];

export function conductorsOf(system: ConductorSystem): readonly ConductorRow[] {
  return system === 'awg' ? awgConductors : metricConductors;
}

/** DC resistance of a row at a conductor temperature, Ω/km: R20·[1 + α20·(T − 20)]. */
export function resistanceOhmPerKmAt(row: ConductorRow, conductorTempC: number): number {
  return row.resistanceOhmPerKm20C * (1 + row.temperatureCoefficientPerC * (conductorTempC - 20));
}

const bySize = new Map(conductors.map((r) => [r.size, r]));

/**
 * Reads a conductor size as people write it and returns the canonical spelling, or undefined.
 * Accepted: "10 AWG", "10", "10awg", "#10", "1/0", "1/0 AWG", "2/0" … "4/0" (bare numbers are AWG);
 * "16 mm²", "16 mm2", "16mm²", "16 mm^2", "16 sq mm", "1.5 mm2" (metric needs its unit).
 */
export function parseConductorSize(text: string): string | undefined {
  const t = text.trim().toLowerCase().replace(/\s+/g, ' ');
  const awg = /^#?\s?(\d{1,2}|[1-4]\/0)\s?(awg)?$/.exec(t);
  if (awg) {
    const size = `${awg[1]} AWG`;
    return bySize.has(size) ? size : undefined;
  }
  const metric = /^(\d+(?:[.,]\d+)?)\s?(mm²|mm2|mm\^2|sq ?mm|sqmm)$/.exec(t);
  if (metric) {
    const area = Number(metric[1]!.replace(',', '.'));
    const size = `${area} mm²`;
    return bySize.has(size) ? size : undefined;
  }
  return undefined;
}

/** The row for a size in any accepted spelling, or undefined. */
export function findConductor(text: string): ConductorRow | undefined {
  const size = parseConductorSize(text);
  return size === undefined ? undefined : bySize.get(size);
}

/** Every size in its canonical spelling, for messages and the OpenAPI description. */
export const conductorSizes: readonly string[] = conductors.map((r) => r.size);

export const conductorTableSources: readonly string[] = [
  'NFPA 70 National Electrical Code, 2023 edition, Chapter 9 Table 8: copper area (circular mils) and DC resistance at 75 °C, stranded uncoated; Note 2 temperature correction',
  'NFPA 70 National Electrical Code, 2023 edition, Table 310.16: copper ampacity, 60/75/90 °C columns, 30 °C ambient, not more than three current-carrying conductors (18 and 16 AWG 90 °C values from memory, not yet confirmed)',
  'NFPA 70 National Electrical Code, 2023 edition, 240.4(D): small-conductor overcurrent-protection limits, copper',
  'ASTM B258: AWG diameters d(n) = 0.005 in × 92^((36 − n)/39)',
  'IACS (NBS Circular 31): annealed copper 1/58 Ω·mm²/m and 0.00393 /°C at 20 °C',
  'IEC 60228:2004 Tables 2 and 3: maximum DC resistance at 20 °C of plain copper, class 5 (used) and class 2; Annex B correction k_t = 250/(230 + t)',
  'Metric ampacities: derived, not a published value — interpolated on area between the bracketing AWG rows of NEC Table 310.16 in the same column, rounded down; the 4/0 value above 4/0',
];
