import fc from 'fast-check';
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { CalcError } from '../errors.ts';
import { CapacityTestInputSchema, CapacityTestResultSchema, capacityTestCsvExample } from '../../schemas/capacity-test.ts';
import { computeCapacityTest, integrateSamples, parseCapacityLogCsv, type CapacitySample } from './capacity-test.ts';
import { allFinite, num, positive } from '../pack-energy/fixtures/arbitraries.ts';

/** Samples of f(t) every dt seconds over [0, T]. */
function sampled(f: (tS: number) => number, totalS: number, dtS: number, v?: (tS: number) => number): CapacitySample[] {
  const out: CapacitySample[] = [];
  for (let k = 0; k * dtS <= totalS + 1e-9; k += 1) {
    const tS = k * dtS;
    out.push({ tS, currentA: f(tS), ...(v ? { voltageV: v(tS) } : {}) });
  }
  return out;
}

describe('computeCapacityTest — figures', () => {
  it('when 105 Ah is measured on a 100 Ah rating at 20 A, then state of health is 105 % at 0.2C and the test passes', () => {
    // Trade facts (common practice): 105 Ah / 100 Ah = 105 %; 0.2C of a 100 Ah pack is 20 A.
    const { data } = computeCapacityTest({ ratedAh: 100, measuredAh: 105, dischargeCurrentA: 20 });
    expect(data.stateOfHealthPct).toBeCloseTo(105, 12);
    expect(data.cRate).toBeCloseTo(0.2, 15);
    expect(data.verdict).toBe('pass');
  });

  it('when capacity is below 80 % of rating, then the verdict is fail with a warning; 80–90 % is marginal', () => {
    // 80 % of rated capacity: the usual end-of-life line (IEEE Std 450 / 1188 replacement criterion, from memory).
    const low = computeCapacityTest({ ratedAh: 100, measuredAh: 79.9, dischargeCurrentA: 20 });
    expect(low.data.verdict).toBe('fail');
    expect(low.checks.find((c) => c.code === 'capacity_below_80_pct')?.level).toBe('warning');
    expect(computeCapacityTest({ ratedAh: 100, measuredAh: 80, dischargeCurrentA: 20 }).data.verdict).toBe('marginal');
    expect(computeCapacityTest({ ratedAh: 100, measuredAh: 89.99, dischargeCurrentA: 20 }).data.verdict).toBe('marginal');
    expect(computeCapacityTest({ ratedAh: 100, measuredAh: 90, dischargeCurrentA: 20 }).data.verdict).toBe('pass');
  });

  it('when the current is unknown, then cRate is null and a check asks for it; a fast lead-acid test is flagged', () => {
    const unknown = computeCapacityTest({ ratedAh: 100, measuredAh: 95 });
    expect(unknown.data.cRate).toBeNull();
    expect(unknown.data.dischargeCurrentA).toBeNull();
    expect(unknown.checks.map((c) => c.code)).toContain('discharge_current_missing');
    // Lead-acid is rated at the 20-hour rate (0.05C); a 0.2C test reads low.
    const fast = computeCapacityTest({ ratedAh: 100, measuredAh: 80, dischargeCurrentA: 20, chemistry: 'lead_acid_agm' });
    expect(fast.checks.map((c) => c.code)).toContain('test_rate_above_rating_rate');
    expect(computeCapacityTest({ ratedAh: 100, measuredAh: 98, dischargeCurrentA: 20, chemistry: 'lfp' }).checks.map((c) => c.code)).not.toContain(
      'test_rate_above_rating_rate',
    );
  });
});

describe('trapezoidal integration against analytic integrals', () => {
  it('when the current falls linearly, then the trapezoid rule is exact: ∫(30 − 20t/T) dt over 5 h = 100 Ah', () => {
    // Analytic: the mean of a straight line is the mean of its ends, (30 + 10)/2 A × 5 h = 100 Ah.
    const T = 5 * 3600;
    const r = integrateSamples(sampled((t) => 30 - (20 * t) / T, T, 60));
    expect(r.ampHours).toBeCloseTo(100, 10);
    expect(r.durationS).toBe(T);
  });

  it('when the current decays exponentially, then the error matches the trapezoid rule’s leading error term', () => {
    // I(t) = 40·e^(−t/τ), τ = 2 h: ∫₀ᵀ I dt = 40·τ·(1 − e^(−T/τ)) = 76.0 Ah (analytic). The composite trapezoid's
    // error is (h²/12)·[I′(T) − I′(0)] − (h⁴/720)·[I‴(T) − I‴(0)] + O(h⁶) (Euler–Maclaurin formula): here about
    // +0.0110 Ah for 5-minute samples, the second term −3.2e-7 Ah, and the rest below 1e-10 Ah.
    const tauS = 2 * 3600;
    const T = 6 * 3600;
    const h = 300;
    const r = integrateSamples(sampled((t) => 40 * Math.exp(-t / tauS), T, h));
    const exact = (40 * tauS * (1 - Math.exp(-T / tauS))) / 3600;
    expect(exact).toBeCloseTo(76.02, 2);
    const d1 = (t: number) => (-40 / tauS) * Math.exp(-t / tauS);
    const d3 = (t: number) => (-40 / tauS ** 3) * Math.exp(-t / tauS);
    const predictedError = (((h * h) / 12) * (d1(T) - d1(0)) - (h ** 4 / 720) * (d3(T) - d3(0))) / 3600;
    expect(r.ampHours - exact).toBeCloseTo(predictedError, 9);
    expect(r.ampHours - exact).toBeGreaterThan(0.0109);
  });

  it('when voltage is logged too, then Wh = ∫V·|I| dt (exact here: constant current, linear voltage)', () => {
    // 20 A for 5 h while the voltage falls linearly 53.6 → 48 V: 20 A × mean 50.8 V × 5 h = 5 080 Wh.
    const T = 5 * 3600;
    const r = integrateSamples(sampled(() => 20, T, 900, (t) => 53.6 - (5.6 * t) / T));
    expect(r.ampHours).toBeCloseTo(100, 10);
    expect(r.wattHours).toBeCloseTo(5080, 8);
  });

  it('when mathjs computes the same trapezoid with vector algebra, then it agrees', () => {
    // mathjs (npm): Σ Δt · (Iₖ + Iₖ₊₁)/2 via dot products, on irregular samples.
    const samples: CapacitySample[] = [0, 7, 20, 41, 60, 95, 130, 131, 200].map((tS, i) => ({ tS, currentA: 10 + 3 * Math.sin(i) }));
    const t = samples.map((s) => s.tS);
    const I = samples.map((s) => s.currentA);
    const dts = math.subtract(t.slice(1), t.slice(0, -1)) as number[];
    const means = math.divide(math.add(I.slice(1), I.slice(0, -1)), 2) as number[];
    const expected = (math.dot(dts, means) as number) / 3600;
    expect(integrateSamples(samples).ampHours).toBeCloseTo(expected, 14);
  });

  it('when discharge is logged as negative current, then the magnitude counts and the result is the same', () => {
    const pos = sampled(() => 20, 3600, 60);
    const neg = pos.map((s) => ({ ...s, currentA: -s.currentA }));
    expect(integrateSamples(neg).ampHours).toBeCloseTo(integrateSamples(pos).ampHours, 14);
    const mixed = computeCapacityTest({ ratedAh: 100, samples: [...pos.slice(0, 30), ...neg.slice(30)] });
    expect(mixed.data.measuredAh).toBeCloseTo(20, 10);
    expect(mixed.checks.map((c) => c.code)).toContain('current_sign_changes');
  });

  it('when samples are out of order, then a CalcError points at the first bad time', () => {
    expect(() => integrateSamples([{ tS: 0, currentA: 1 }, { tS: 10, currentA: 1 }, { tS: 10, currentA: 1 }])).toThrow(
      expect.objectContaining({ code: 'time_not_increasing', pointer: '#/samples/2/tS' }),
    );
  });
});

describe('computeCapacityTest — samples', () => {
  it('when a 0.2C log is evaluated, then measured Ah, Wh, average current, C-rate and duration follow', () => {
    const T = 5 * 3600;
    const { data } = computeCapacityTest({ ratedAh: 100, samples: sampled(() => 20, T, 60, () => 51.2), chemistry: 'lfp' });
    expect(data.measuredAh).toBeCloseTo(100, 10);
    expect(data.measuredWh).toBeCloseTo(5120, 8);
    expect(data.averageVoltageV).toBeCloseTo(51.2, 10);
    expect(data.dischargeCurrentA).toBeCloseTo(20, 10);
    expect(data.cRate).toBeCloseTo(0.2, 12);
    expect(data.durationHours).toBe(5);
    expect(data.sampleCount).toBe(301);
    expect(data.stateOfHealthPct).toBeCloseTo(100, 10);
  });

  it('when only some samples carry a voltage, then no Wh is given and a check says why', () => {
    const { data, checks } = computeCapacityTest({ ratedAh: 10, samples: [{ tS: 0, currentA: 1, voltageV: 12 }, { tS: 3600, currentA: 1 }] });
    expect(data.measuredWh).toBeUndefined();
    expect(checks.map((c) => c.code)).toContain('voltage_incomplete');
  });

  it('when any input in the schema’s range is given, then the result is finite and matches the result schema, or a CalcError names a field', () => {
    const sample = fc.record({ tS: num(-1e9, 1e9), currentA: num(-1e6, 1e6), voltageV: positive(2000) }, { requiredKeys: ['tS', 'currentA'] });
    const bySamples = fc.record({ ratedAh: positive(100_000), samples: fc.array(sample, { minLength: 2, maxLength: 50 }).map((s) => [...s].sort((a, b) => a.tS - b.tS)) });
    const byFigures = fc.record({ ratedAh: positive(100_000), measuredAh: num(0, 1_000_000), dischargeCurrentA: positive(1_000_000) }, { requiredKeys: ['ratedAh', 'measuredAh'] });
    fc.assert(
      fc.property(fc.oneof(bySamples, byFigures), (raw) => {
        const parsed = CapacityTestInputSchema.parse(raw);
        let out: ReturnType<typeof computeCapacityTest>;
        try {
          out = computeCapacityTest(parsed);
        } catch (error) {
          expect(error).toBeInstanceOf(CalcError);
          expect((error as CalcError).pointer).toMatch(/^#\//);
          return;
        }
        expect(allFinite(out)).toBe(true);
        expect(CapacityTestResultSchema.safeParse(out).success).toBe(true);
      }),
      { seed: 17, numRuns: 400 },
    );
  });
});

describe('parseCapacityLogCsv', () => {
  it('when the documented example is parsed, then it gives its three samples', () => {
    const r = parseCapacityLogCsv(capacityTestCsvExample);
    expect(r).toEqual({
      ok: true,
      samples: [
        { tS: 0, currentA: 20, voltageV: 53.2 },
        { tS: 1800, currentA: 20, voltageV: 52.9 },
        { tS: 3600, currentA: 20, voltageV: 52.8 },
      ],
    });
  });

  it('when headers use other spellings, the file has a BOM, CRLF, blank lines, extra columns and quotes, then it still reads', () => {
    const text = '\uFEFFTime (s);Current (A);Note;Voltage (V)\r\n0;"-20";start;53\r\n\r\n600;-20;"a; b";52.9\r\n1200;-19.5;;52.7\r\n';
    const r = parseCapacityLogCsv(text);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.samples).toEqual([
      { tS: 0, currentA: -20, voltageV: 53 },
      { tS: 600, currentA: -20, voltageV: 52.9 },
      { tS: 1200, currentA: -19.5, voltageV: 52.7 },
    ]);
  });

  it('when rows are bad, then each error names its row (the header is row 1) and the column', () => {
    const text = ['tS,currentA', '0,20', '60,abc', '', '120,', '180,20', '150,20'].join('\n');
    const r = parseCapacityLogCsv(text);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors).toEqual([
        { row: 3, column: 'currentA', detail: 'Row 3: currentA “abc” is not a number.' },
        { row: 5, column: 'currentA', detail: 'Row 5: currentA is empty.' },
        { row: 7, column: 'tS', detail: 'Row 7: tS 150 is not after the previous row’s 180; times must increase.' },
      ]);
    }
  });

  it('when the header lacks a required column, or the file is empty or too short, then row 1 / the last row is named', () => {
    const noCurrent = parseCapacityLogCsv('tS,voltageV\n0,12\n1,12\n');
    expect(noCurrent.ok === false && noCurrent.errors[0]!.row === 1 && /currentA/.test(noCurrent.errors[0]!.detail)).toBe(true);
    const empty = parseCapacityLogCsv('');
    expect(empty.ok === false && empty.errors[0]!.row === 1).toBe(true);
    const short = parseCapacityLogCsv('tS,currentA\n0,1\n');
    expect(short.ok === false && /at least two samples/.test(short.errors[0]!.detail)).toBe(true);
  });

  it('when a voltage is out of range, then its row is reported', () => {
    const r = parseCapacityLogCsv('tS,currentA,voltageV\n0,1,12\n1,1,-3\n');
    expect(r.ok === false && r.errors[0]!.row === 3 && r.errors[0]!.column === 'voltageV').toBe(true);
  });

  it('when a log has many bad rows, then at most 20 are listed and the rest are counted', () => {
    const rows = ['tS,currentA', ...Array.from({ length: 30 }, (_, i) => `${i},x`)];
    const r = parseCapacityLogCsv(rows.join('\n'));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors).toHaveLength(21);
      expect(r.errors.at(-1)!.detail).toBe('…and 10 more problems.');
    }
  });
});
