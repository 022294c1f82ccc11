/**
 * Capacity-test evaluation: the capacity a pack delivered against its rating.
 *
 * Model
 * - From figures: measured Ah as given.
 * - From samples (tᵢ in s, Iᵢ in A, optionally Vᵢ in V): the trapezoidal rule,
 *   Ah = Σ (|Iᵢ| + |Iᵢ₊₁|)/2 · (tᵢ₊₁ − tᵢ) / 3600 and Wh = Σ (Vᵢ|Iᵢ| + Vᵢ₊₁|Iᵢ₊₁|)/2 · (tᵢ₊₁ − tᵢ) / 3600.
 *   The current is the discharge current and its magnitude counts (the v1 contract's rule), so logs that
 *   record discharge as negative work unchanged. The trapezoidal rule is exact for currents that vary
 *   linearly between samples; its error for a smooth current is −(Δt²/12)·∫ I″ dt.
 * - state of health (%) = measured Ah ÷ rated Ah × 100, not capped at 100 (a new pack often tests above its
 *   rating); C-rate = discharge current ÷ rated Ah (with samples, the average current, measured Ah ÷ duration).
 * - Verdict: `pass` at 90 % or more, `marginal` from 80 % to 90 %, `fail` below 80 %. 80 % of rated capacity
 *   is the usual end-of-life criterion (IEEE Std 450 and IEEE Std 1188 call for replacement below 80 %; from
 *   memory); the 90 % line is common practice (no published source) for "watch this pack".
 *
 * Ratings are usually quoted at 0.2C for lithium-ion cells (IEC 61960's 0.2 It discharge; from memory) and at
 * the 20-hour rate (0.05C) for lead-acid; a test at a much higher rate reads low, which a check points out.
 * Units: A, Ah, V, Wh, seconds in samples, hours in results.
 */
import Papa from 'papaparse';
import type { CalcOutput, Check } from '../types.ts';
import { CalcError } from '../errors.ts';
import { chemistries, type ChemistryId } from '../chemistry/presets.ts';
import { assertFiniteNumbers } from '../pack-energy/pack-energy.ts';
import type { CapacityTestData, CapacityTestInput } from '../../schemas/capacity-test.ts';
import { MAX_CAPACITY_SAMPLES } from '../../schemas/capacity-test.ts';

export const PASS_MIN_PCT = 90;
export const END_OF_LIFE_PCT = 80;

/** The discharge rate at which capacity is usually rated, C. */
export const RATING_C_RATE: Record<ChemistryId, number> = {
  lfp: 0.2, // IEC 61960 0.2 It rating discharge (from memory); LFP cell datasheets quote 0.2C "standard"
  nmc: 0.2, // same
  lto: 0.2, // same (from memory)
  lead_acid_agm: 0.05, // 20-hour rate (trade practice)
  lead_acid_flooded: 0.05,
};

export interface CapacitySample {
  tS: number;
  currentA: number;
  voltageV?: number;
}

export interface TrapezoidResult {
  ampHours: number;
  /** Present only when every sample has a voltage. */
  wattHours?: number;
  durationS: number;
}

/**
 * Trapezoidal integration of |I| (and V·|I|) over time. Samples must be in strictly increasing time; the first
 * one out of order raises a CalcError pointing at it (`#/samples/i/tS`).
 */
export function integrateSamples(samples: readonly CapacitySample[]): TrapezoidResult {
  if (samples.length < 2) throw new CalcError('too_few_samples', 'Give at least two samples.', '#/samples');
  const withVoltage = samples.every((s) => s.voltageV !== undefined);
  let asS = 0; // ampere-seconds
  let wsS = 0; // watt-seconds
  for (let i = 1; i < samples.length; i += 1) {
    const a = samples[i - 1]!;
    const b = samples[i]!;
    const dt = b.tS - a.tS;
    if (!(dt > 0)) {
      throw new CalcError('time_not_increasing', `Sample ${i}: tS ${b.tS} is not after the previous sample’s ${a.tS}; times must increase.`, `#/samples/${i}/tS`);
    }
    asS += ((Math.abs(a.currentA) + Math.abs(b.currentA)) / 2) * dt;
    if (withVoltage) wsS += ((a.voltageV! * Math.abs(a.currentA) + b.voltageV! * Math.abs(b.currentA)) / 2) * dt;
  }
  return {
    ampHours: asS / 3600,
    ...(withVoltage ? { wattHours: wsS / 3600 } : {}),
    durationS: samples.at(-1)!.tS - samples[0]!.tS,
  };
}

export function capacityVerdict(stateOfHealthPct: number): CapacityTestData['verdict'] {
  if (stateOfHealthPct >= PASS_MIN_PCT) return 'pass';
  if (stateOfHealthPct >= END_OF_LIFE_PCT) return 'marginal';
  return 'fail';
}

export function computeCapacityTest(input: CapacityTestInput): CalcOutput<CapacityTestData> {
  const { ratedAh } = input;
  const checks: Check[] = [];
  const basis: string[] = ['State of health = measured Ah ÷ rated Ah × 100 (not capped); C-rate = discharge current ÷ rated Ah.'];
  let measuredAh: number;
  let measuredWh: number | undefined;
  let dischargeCurrentA: number | null = null;
  let durationHours: number | undefined;
  let sampleCount: number | undefined;

  if (input.samples !== undefined) {
    const samples = input.samples;
    const r = integrateSamples(samples);
    measuredAh = r.ampHours;
    measuredWh = r.wattHours;
    durationHours = r.durationS / 3600;
    dischargeCurrentA = measuredAh / durationHours;
    sampleCount = samples.length;
    basis.push('Measured Ah (and Wh) by the trapezoidal rule over the samples, |current| counted.');
    if (samples.some((s) => s.currentA > 0) && samples.some((s) => s.currentA < 0)) {
      checks.push({
        code: 'current_sign_changes',
        level: 'warning',
        message: 'The log has currents of both signs; every magnitude was counted as discharge. If the pack was charged during the test, remove those rows.',
      });
    }
    if (samples.some((s) => s.voltageV !== undefined) && measuredWh === undefined) {
      checks.push({ code: 'voltage_incomplete', level: 'info', message: 'Only some samples carry a voltage, so no energy (Wh) is given.' });
    }
    const gaps = samples.slice(1).map((s, i) => s.tS - samples[i]!.tS).sort((a, b) => a - b);
    const median = gaps[Math.floor(gaps.length / 2)]!;
    const largest = gaps.at(-1)!;
    if (gaps.length >= 3 && largest > 10 * median) {
      checks.push({
        code: 'sample_gap',
        level: 'info',
        message: `The log has a gap of ${Math.round(largest)} s against a usual spacing of ${Math.round(median)} s; the current is taken as linear across it.`,
      });
    }
  } else if (input.measuredAh !== undefined) {
    measuredAh = input.measuredAh;
    dischargeCurrentA = input.dischargeCurrentA ?? null;
  } else {
    throw new CalcError('measurement_missing', 'Give measuredAh or samples.', '#/measuredAh');
  }

  const stateOfHealthPct = (measuredAh / ratedAh) * 100;
  const cRate = dischargeCurrentA === null ? null : dischargeCurrentA / ratedAh;
  const verdict = capacityVerdict(stateOfHealthPct);
  const data: CapacityTestData = {
    ...(input.label !== undefined ? { label: input.label } : {}),
    ratedAh,
    measuredAh,
    ...(measuredWh !== undefined ? { measuredWh } : {}),
    dischargeCurrentA,
    cRate,
    ...(durationHours !== undefined ? { durationHours } : {}),
    ...(measuredWh !== undefined && measuredAh > 0 ? { averageVoltageV: measuredWh / measuredAh } : {}),
    ...(sampleCount !== undefined ? { sampleCount } : {}),
    stateOfHealthPct,
    verdict,
  };
  assertFiniteNumbers(data, input.samples ? '#/samples' : '#/measuredAh');

  if (stateOfHealthPct < END_OF_LIFE_PCT) {
    checks.push({
      code: 'capacity_below_80_pct',
      level: 'warning',
      message: `The pack delivered ${round(stateOfHealthPct, 1)} % of its rating, below the 80 % usually taken as end of life; plan to replace it, and check for a weak cell.`,
    });
  } else if (stateOfHealthPct < PASS_MIN_PCT) {
    checks.push({
      code: 'capacity_below_90_pct',
      level: 'info',
      message: `The pack delivered ${round(stateOfHealthPct, 1)} % of its rating: still usable, but test it again sooner.`,
    });
  }
  if (stateOfHealthPct > 110) {
    checks.push({
      code: 'capacity_above_rating',
      level: 'info',
      message: `${round(stateOfHealthPct, 1)} % of the rating is unusually high: check the rating, the meter’s calibration and that the test ran from full to cut-off.`,
    });
  }
  if (cRate !== null) {
    const chem = input.chemistry ? chemistries[input.chemistry] : undefined;
    const ratingC = input.chemistry ? RATING_C_RATE[input.chemistry] : 0.2;
    if (cRate > ratingC * 2.5) {
      checks.push({
        code: 'test_rate_above_rating_rate',
        level: 'info',
        message: `The test ran at ${round(cRate, 3)}C; ${chem ? chem.name : 'lithium-ion'} capacity is usually rated at ${ratingC}C, and a faster test reads lower.`,
      });
    }
  } else {
    checks.push({ code: 'discharge_current_missing', level: 'info', message: 'Give dischargeCurrentA to get the test’s C-rate.' });
  }

  return {
    data,
    checks,
    cautions: [
      'Discharge tests put sustained current through the pack and its wiring: use fused leads rated for the test current, stop at the maker’s cut-off voltage, and watch the pack’s temperature.',
    ],
    basis,
  };
}

/** A problem in one row of a CSV log; `row` counts lines of the file from 1 (the header). */
export interface CsvRowError {
  /** Absent only on the closing "and N more" entry. */
  row?: number;
  column?: string;
  detail: string;
}

export type CsvParseResult = { ok: true; samples: CapacitySample[] } | { ok: false; errors: CsvRowError[] };

/** Header names accepted for each column, compared after lower-casing and dropping spaces, _ - ( ) [ ]. */
const COLUMN_NAMES: Record<'tS' | 'currentA' | 'voltageV', readonly string[]> = {
  tS: ['ts', 'times', 'timesec', 'timeseconds'],
  currentA: ['currenta', 'ia', 'currentamps'],
  voltageV: ['voltagev', 'vv', 'voltagevolts'],
};

const normalizeHeader = (h: string) => h.toLowerCase().replace(/[\s_\-()[\]]/g, '');

/** At most this many row errors are reported (the rest are counted). */
const MAX_ROW_ERRORS = 20;

/**
 * Parses a capacity-test log in CSV (RFC 4180, via papaparse): a header row naming the columns `tS`,
 * `currentA` and optionally `voltageV` (also `t_s`, `time (s)`, `current_a`, `current (A)`, `voltage_v`,
 * `voltage (V)`; other columns are ignored), then one sample per row. Blank lines are skipped; rows are
 * numbered as lines of the file, the header being row 1. Returns the samples, or every bad row (up to 20).
 */
export function parseCapacityLogCsv(text: string): CsvParseResult {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t'] });
  const rows = parsed.data;
  if (rows.length === 0) return { ok: false, errors: [{ row: 1, detail: 'The CSV is empty: send a header row (tS,currentA[,voltageV]) and at least two samples.' }] };

  const header = rows[0]!.map(normalizeHeader);
  const find = (names: readonly string[]) => header.findIndex((h) => names.includes(h));
  const tCol = find(COLUMN_NAMES.tS);
  const iCol = find(COLUMN_NAMES.currentA);
  const vCol = find(COLUMN_NAMES.voltageV);
  const missing = [tCol < 0 ? 'tS' : '', iCol < 0 ? 'currentA' : ''].filter(Boolean);
  if (missing.length > 0) {
    return {
      ok: false,
      errors: [{ row: 1, detail: `The header row must name the columns ${missing.join(' and ')} (found: ${rows[0]!.join(', ') || 'nothing'}).` }],
    };
  }

  const lineOf = lineNumbers(text, rows.length);
  // papaparse reports structural problems (unbalanced quotes) against records, 0-based, the header included.
  const errors: CsvRowError[] = parsed.errors.map((e) => {
    const row = lineOf[e.row ?? 0] ?? (e.row ?? 0) + 1;
    return { row, detail: `Row ${row}: unreadable CSV (${e.message}).` };
  });
  let errorCount = errors.length;
  const add = (e: CsvRowError) => {
    errorCount += 1;
    if (errors.length < MAX_ROW_ERRORS) errors.push(e);
  };

  const dataRows = rows.length - 1;
  if (dataRows < 2) add({ row: rows.length, detail: `A log needs at least two samples; this one has ${dataRows}.` });
  if (dataRows > MAX_CAPACITY_SAMPLES) add({ row: MAX_CAPACITY_SAMPLES + 2, detail: `A log may have at most ${MAX_CAPACITY_SAMPLES} samples; this one has ${dataRows}.` });

  const samples: CapacitySample[] = [];
  for (let r = 1; r < rows.length && r <= MAX_CAPACITY_SAMPLES; r += 1) {
    const cells = rows[r]!;
    const row = lineOf[r] ?? r + 1;
    const num = (col: number, name: string, check: (v: number) => string | undefined): number | undefined => {
      const raw = (cells[col] ?? '').trim();
      if (raw === '') {
        add({ row, column: name, detail: `Row ${row}: ${name} is empty.` });
        return undefined;
      }
      const v = Number(raw);
      if (!Number.isFinite(v)) {
        add({ row, column: name, detail: `Row ${row}: ${name} “${raw.slice(0, 40)}” is not a number.` });
        return undefined;
      }
      const problem = check(v);
      if (problem) {
        add({ row, column: name, detail: `Row ${row}: ${name} ${v} ${problem}.` });
        return undefined;
      }
      return v;
    };
    const tS = num(tCol, 'tS', (v) => (Math.abs(v) > 1e9 ? 'is out of range (±1e9 s)' : undefined));
    const currentA = num(iCol, 'currentA', (v) => (Math.abs(v) > 1e6 ? 'is out of range (±1e6 A)' : undefined));
    const voltageRaw = vCol >= 0 ? (cells[vCol] ?? '').trim() : '';
    const voltageV =
      vCol >= 0 && voltageRaw !== '' ? num(vCol, 'voltageV', (v) => (v <= 0 || v > 2000 ? 'must be above 0 and at most 2000' : undefined)) : undefined;
    if (tS === undefined || currentA === undefined || (voltageRaw !== '' && voltageV === undefined)) continue;
    const previous = samples.at(-1);
    if (previous && !(tS > previous.tS)) {
      add({ row, column: 'tS', detail: `Row ${row}: tS ${tS} is not after the previous row’s ${previous.tS}; times must increase.` });
      continue;
    }
    samples.push({ tS, currentA, ...(voltageV !== undefined ? { voltageV } : {}) });
  }

  if (errorCount > 0) {
    if (errorCount > errors.length) errors.push({ detail: `…and ${errorCount - errors.length} more problems.` });
    return { ok: false, errors };
  }
  return { ok: true, samples };
}

/** Line number (1-based) of each non-empty CSV record; assumes no quoted line breaks (none are meaningful in a numeric log). */
function lineNumbers(text: string, count: number): number[] {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  const out: number[] = [];
  for (let i = 0; i < lines.length && out.length < count; i += 1) {
    if (lines[i]!.trim() !== '' && !/^[\s,;\t]*$/.test(lines[i]!)) out.push(i + 1);
  }
  return out;
}

function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
