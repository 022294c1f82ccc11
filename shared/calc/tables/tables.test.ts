import { describe, expect, it } from 'vitest';
import { ambientCorrectionFactor, ambientCorrectionRows, bundlingAdjustmentFactor } from './ampacity-corrections.ts';
import { awgConductors, findConductor, metricConductors, parseConductorSize, resistanceOhmPerKmAt } from './conductors.ts';
import { nec240_6StandardRatingsA, smallestStandardRatingAtLeast } from './overcurrent.ts';

const M_PER_KFT = 304.8;
const row = (size: string) => {
  const r = findConductor(size);
  if (!r) throw new Error(`no row ${size}`);
  return r;
};
const ohmPerKft75 = (size: string) => (row(size).resistanceOhmPerKm75C * M_PER_KFT) / 1000;

describe('conductor table against NEC 2023 Chapter 9 Table 8', () => {
  it.each([
    // NEC 2023 Ch. 9 Table 8: stranded uncoated copper, DC resistance at 75 °C, Ω/kft
    ['18 AWG', 7.95],
    ['14 AWG', 3.14],
    ['12 AWG', 1.98],
    ['10 AWG', 1.24], // NEC 2023 Ch. 9 Table 8: 10 AWG stranded uncoated copper, 1.24 Ω/kft at 75 °C
    ['8 AWG', 0.778],
    ['6 AWG', 0.491],
    ['4 AWG', 0.308],
    ['2 AWG', 0.194],
    ['1/0 AWG', 0.122],
    ['2/0 AWG', 0.0967],
    ['4/0 AWG', 0.0608],
  ])('when %s is read at 75 °C, then it is Table 8\'s %s Ω/kft', (size, expected) => {
    expect(ohmPerKft75(size)).toBeCloseTo(expected, 10);
  });

  it('when 12 AWG is corrected to 20 °C, then it matches Table 8 Note 2 (α = 0.00323 /°C at 75 °C): 1.98 × (1 − 0.00323 × 55) = 1.628 Ω/kft', () => {
    // NEC Ch. 9 Table 8 Note 2: R2 = R1 [1 + α (T2 − 75)], α_Cu = 0.00323.
    const note2 = 1.98 * (1 - 0.00323 * 55);
    const ours = (row('12').resistanceOhmPerKm20C * M_PER_KFT) / 1000;
    expect(Math.abs(ours / note2 - 1)).toBeLessThan(2e-4);
    // And the coefficient form used for other temperatures gives Table 8 back at 75 °C.
    expect(resistanceOhmPerKmAt(row('12'), 75)).toBeCloseTo(row('12').resistanceOhmPerKm75C, 12);
  });

  it('when the AWG areas are compared with the ASTM B258 diameter formula, then they agree within 0.5 % (NEC rounds its areas)', () => {
    // ASTM B258: d(n) = 0.005 in × 92^((36 − n)/39); m/0 sizes use n = 1 − m. Area in cmil = (d in mils)².
    const gaugeNumber = (size: string) => {
      const g = size.replace(' AWG', '');
      return g.includes('/0') ? 1 - Number(g[0]) : Number(g);
    };
    for (const r of awgConductors) {
      const dMils = 5 * 92 ** ((36 - gaugeNumber(r.size)) / 39);
      const cmil = dMils * dMils;
      expect(Math.abs(r.areaCmil! / cmil - 1)).toBeLessThan(0.005);
      // mm² from cmil is an exact unit conversion: π/4 × 0.0254² mm² per cmil.
      expect(Math.abs(r.areaMm2 / ((Math.PI / 4) * (dMils * 0.0254) ** 2) - 1)).toBeLessThan(0.005);
    }
  });

  it('when stranded resistances are compared with IACS copper (1/58 Ω·mm²/m at 20 °C) over the ASTM area, then they run 0–4 % higher (stranding lay)', () => {
    // IACS, NBS Circular 31; reference check: NEC stranded values run 2–3 % above the solid-wire computation.
    for (const r of awgConductors) {
      const iacsOhmPerKm = (1 / 58 / r.areaMm2) * 1000;
      const ratio = r.resistanceOhmPerKm20C / iacsOhmPerKm;
      expect(ratio).toBeGreaterThan(1.0);
      expect(ratio).toBeLessThan(1.04);
    }
  });
});

describe('ampacity against NEC 2023 Table 310.16 (copper, 30 °C, ≤ 3 conductors)', () => {
  it.each([
    ['14 AWG', 15, 20, 25],
    ['12 AWG', 20, 25, 30],
    ['10 AWG', 30, 35, 40],
    ['8 AWG', 40, 50, 55],
    ['6 AWG', 55, 65, 75],
    ['2 AWG', 95, 115, 130],
    ['1 AWG', 110, 130, 145],
    ['1/0 AWG', 125, 150, 170],
    ['2/0 AWG', 145, 175, 195],
    ['4/0 AWG', 195, 230, 260],
  ])('when %s is looked up, then 60/75/90 °C give %s/%s/%s A', (size, a60, a75, a90) => {
    // NEC 2023 Table 310.16 (14 AWG 60 °C is 15 A in 2017+ editions, not the 20 A of older transcriptions).
    expect(row(size).ampacityA).toEqual({ 60: a60, 75: a75, 90: a90 });
  });

  it('when 18 and 16 AWG are looked up, then only the 90 °C column has a value and it is marked from memory', () => {
    // NEC 2017+ Table 310.16: 18 AWG 14 A and 16 AWG 18 A at 90 °C only (grade C: from memory).
    expect(row('18').ampacityA).toEqual({ 60: null, 75: null, 90: 14 });
    expect(row('16').ampacityA).toEqual({ 60: null, 75: null, 90: 18 });
    expect(row('16').ampacityGrade[90]).toBe('from_memory');
  });

  it('when the 240.4(D) limits are read, then copper 18/16/14/12/10 AWG give 7/10/15/20/30 A and larger sizes none', () => {
    // NEC 2023 240.4(D)(1)–(7), copper.
    expect(['18', '16', '14', '12', '10', '8'].map((g) => row(g).smallConductorMaxOcpdA)).toEqual([7, 10, 15, 20, 30, null]);
  });
});

describe('metric sizes against IEC 60228', () => {
  it.each([
    // IEC 60228:2004 Table 3, class 5 plain copper, maximum Ω/km at 20 °C
    ['1.5 mm²', 13.3],
    ['2.5 mm²', 7.98],
    ['4 mm²', 4.95],
    ['6 mm²', 3.3],
    ['10 mm²', 1.91],
    ['16 mm²', 1.21],
    ['25 mm²', 0.78],
    ['35 mm²', 0.554],
    ['50 mm²', 0.386],
    ['70 mm²', 0.272],
    ['95 mm²', 0.206],
    ['120 mm²', 0.161],
  ])('when %s is read at 20 °C, then it is IEC 60228 class 5\'s %s Ω/km', (size, expected) => {
    expect(row(size).resistanceOhmPerKm20C).toBe(expected);
  });

  it('when a metric resistance is corrected to 75 °C, then it matches IEC 60228 Annex B k_75 = 0.820 (R20 = k_t × R_t)', () => {
    // uecables "IEC 60228" correction factors: 75 °C 0.820, 90 °C 0.781 (= 250/(230 + t)).
    for (const r of metricConductors) {
      expect(Math.abs((r.resistanceOhmPerKm20C / r.resistanceOhmPerKm75C) / 0.82 - 1)).toBeLessThan(1e-3);
      expect(Math.abs((r.resistanceOhmPerKm20C / resistanceOhmPerKmAt(r, 90)) / 0.781 - 1)).toBeLessThan(1e-3);
    }
  });

  it('when IEC maxima are compared with pure IACS copper of the nominal area, then none is below it and none more than 20 % above', () => {
    // IACS 1/58 Ω·mm²/m: a maximum resistance cannot be below the ideal conductor of that area.
    for (const r of metricConductors) {
      const ideal = (1 / 58 / r.areaMm2) * 1000;
      expect(r.resistanceOhmPerKm20C).toBeGreaterThanOrEqual(ideal * 0.97);
      expect(r.resistanceOhmPerKm20C).toBeLessThan(ideal * 1.2);
    }
  });

  it('when metric ampacities are derived, then each lies between the bracketing AWG rows, grows with area, and is marked derived', () => {
    for (const col of [60, 75, 90] as const) {
      let last = 0;
      for (const m of metricConductors) {
        const a = m.ampacityA[col];
        if (a === null) continue;
        const below = awgConductors.filter((r) => r.areaMm2 <= m.areaMm2 && r.ampacityA[col] !== null).at(-1);
        const above = awgConductors.find((r) => r.areaMm2 > m.areaMm2 && r.ampacityA[col] !== null);
        if (below) expect(a).toBeGreaterThanOrEqual(below.ampacityA[col]!);
        if (above) expect(a).toBeLessThanOrEqual(above.ampacityA[col]!);
        expect(a).toBeGreaterThanOrEqual(last);
        expect(m.ampacityGrade[col]).toBe('derived');
        last = a;
      }
    }
    // Below the smallest listed AWG row of a column there is nothing to interpolate from.
    expect(row('1.5 mm²').ampacityA[75]).toBeNull();
    // Above 4/0 AWG the 4/0 value is kept (no extrapolation): 230 A at 75 °C.
    expect(row('120 mm²').ampacityA[75]).toBe(230);
    // 2.5 mm² lies between 14 AWG (2.08 mm², 20 A) and 12 AWG (3.31 mm², 25 A) at 75 °C: 20 + 5 × 0.341 → 21 A.
    expect(row('2.5 mm²').ampacityA[75]).toBe(21);
  });
});

describe('conductor size spelling', () => {
  it('when sizes are written the accepted ways, then they read back in the output spelling', () => {
    expect(parseConductorSize('10')).toBe('10 AWG');
    expect(parseConductorSize('10 AWG')).toBe('10 AWG');
    expect(parseConductorSize('1/0')).toBe('1/0 AWG');
    expect(parseConductorSize('4/0 awg')).toBe('4/0 AWG');
    expect(parseConductorSize('16 mm2')).toBe('16 mm²');
    expect(parseConductorSize('16mm²')).toBe('16 mm²');
    expect(parseConductorSize('16 mm²')).toBe('16 mm²');
    expect(parseConductorSize('1.5 mm2')).toBe('1.5 mm²');
    expect(parseConductorSize('16')).toBe('16 AWG');
  });

  it('when a size is not in the table, then it is not accepted', () => {
    for (const s of ['5', '20 AWG', '0', '5/0', '3 mm2', '16 mm', 'ten', '']) expect(parseConductorSize(s)).toBeUndefined();
  });
});

describe('ampacity corrections, NEC 2023 Tables 310.15(B)(1) and 310.15(C)(1)', () => {
  it('when every ambient factor is compared with the 310.15(B) formula √((Tc − Ta)/(Tc − 30)) at the row\'s upper ambient, then it agrees to two decimals', () => {
    for (const r of ambientCorrectionRows) {
      for (const tc of [60, 75, 90] as const) {
        const f = r.factor[tc];
        if (f === null) {
          expect(r.upToAmbientC).toBeGreaterThanOrEqual(tc - 5); // a dash only where the ambient nears the rating
          continue;
        }
        expect(Math.abs(f - Math.sqrt((tc - r.upToAmbientC) / (tc - 30)))).toBeLessThanOrEqual(0.005 + 1e-9);
      }
    }
  });

  it('when 12 AWG 75 °C runs at 40 °C, then 25 A × 0.88 = 22 A (worked example, secondary source)', () => {
    expect(row('12').ampacityA[75]! * ambientCorrectionFactor(40, 75)!).toBeCloseTo(22, 10);
    // 36–40 °C row: 60 °C 0.82, 75 °C 0.88, 90 °C 0.91; 30.5 °C falls in the 31–35 °C row.
    expect([ambientCorrectionFactor(40, 60), ambientCorrectionFactor(40, 90), ambientCorrectionFactor(30.5, 75)]).toEqual([0.82, 0.91, 0.94]);
    expect(ambientCorrectionFactor(60, 60)).toBeNull();
  });

  it('when conductors are bundled, then 4–6 give 80 %, 7–9 70 %, 10–20 50 %, 21–30 45 %, 31–40 40 %, 41+ 35 %', () => {
    // NEC 2023 Table 310.15(C)(1).
    expect([2, 3, 4, 6, 7, 9, 10, 20, 21, 30, 31, 40, 41, 100].map(bundlingAdjustmentFactor)).toEqual([1, 1, 0.8, 0.8, 0.7, 0.7, 0.5, 0.5, 0.45, 0.45, 0.4, 0.4, 0.35, 0.35]);
  });
});

describe('standard ratings, NEC 2023 240.6(A)', () => {
  it('when currents are rounded up, then they land on standard ratings', () => {
    expect(nec240_6StandardRatingsA.slice(0, 13)).toEqual([15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100]);
    expect(smallestStandardRatingAtLeast(1.25 * 16)).toBe(20); // 20.000000000000004 is still 20
    expect(smallestStandardRatingAtLeast(25.1)).toBe(30);
    expect(smallestStandardRatingAtLeast(101.25)).toBe(110);
    expect(smallestStandardRatingAtLeast(5)).toBe(6); // additional fuse rating (from memory)
    expect(smallestStandardRatingAtLeast(6001)).toBeUndefined();
  });
});
