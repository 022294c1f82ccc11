import { describe, expect, it } from 'vitest';
import { WireSizeInputSchema, type WireSizeData } from '../../schemas/wire-size.ts';
import { awgConductors } from '../tables/conductors.ts';
import { computeWireSize } from './wire-size.ts';

const size = (input: Record<string, unknown>) => computeWireSize(WireSizeInputSchema.parse(input));
const candidate = (data: WireSizeData, s: string) => data.candidates.find((c) => c.size === s)!;

/** Seeded PRNG (mulberry32) so property checks are repeatable. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

describe('computeWireSize', () => {
  it('when a 20 A DC input lead runs a few feet from a 48 V-class pack, then it is 10 AWG', () => {
    // Trade fact (common practice, no published source): 20 A DC input leads on 48 V-class packs are 10 AWG.
    // 12 AWG carries 25 A (NEC 310.16, 75 °C) but 240.4(D) caps its protection at 20 A, below the 25 A fuse 20 A needs.
    for (const ft of [3, 6, 10, 15]) {
      const r = size({ currentA: 20, systemVoltageV: 48, oneWayLengthFt: ft });
      expect(r.data.recommended!.size).toBe('10 AWG');
      expect(r.data.limitedBy).toBe('protection');
      expect(r.data.fuseRatingA).toBe(25);
    }
  });

  it('when 25 A runs 50 ft one way at 12 V, then 10 AWG drops 3.10 V (25.8 %) and 4 AWG 0.77 V (6.4 %)', () => {
    // Derived from NEC Ch. 9 Table 8 (75 °C): V = 2 × 50 ft × 25 A × 1.24 Ω/kft = 3.10 V; 4 AWG 0.308 Ω/kft → 0.77 V.
    const r = size({ currentA: 25, systemVoltageV: 12, oneWayLengthFt: 50 });
    expect(candidate(r.data, '10 AWG').voltageDropV).toBeCloseTo(3.1, 3);
    expect(candidate(r.data, '10 AWG').voltageDropPct).toBeCloseTo(25.83, 1);
    expect(candidate(r.data, '4 AWG').voltageDropV).toBeCloseTo(0.77, 3);
    expect(r.data.limitedBy).toBe('voltage_drop');
  });

  it('when 16 A runs 100 ft of 12 AWG at 120 V, then the drop is the circular-mil formula\'s 6.32 V within 0.5 %', () => {
    // K = 12.9 Ω·cmil/ft (copper at 75 °C, US practice): V = 2 × 12.9 × 16 × 100 / 6530 = 6.32 V (5.27 %).
    const r = size({ currentA: 16, systemVoltageV: 120, oneWayLengthFt: 100, maxVoltageDropPct: 10 });
    const c = candidate(r.data, '12 AWG');
    expect(Math.abs(c.voltageDropV / 6.32 - 1)).toBeLessThan(0.005);
    expect(c.powerLossW).toBeCloseTo(16 * c.voltageDropV, 2);
  });

  it('when 10 A runs 30 ft one way at 12 V with a 3 % limit, then voltage drop sets 6 AWG, as the ABYC E-11 formula does', () => {
    // ABYC E-11: CM = 10.75 × I × L_round-trip / E = 10.75 × 10 × 60 / 0.36 = 17 917 cmil → 6 AWG (26 240; 8 AWG has 16 510).
    const r = size({ currentA: 10, systemVoltageV: 12, oneWayLengthFt: 30 });
    expect(r.data.recommended!.size).toBe('6 AWG');
    expect(r.data.limitedBy).toBe('voltage_drop');
    const abycCmil = (10.75 * 10 * 60) / 0.36;
    const abycChoice = awgConductors.find((c) => c.areaCmil! >= abycCmil)!.size;
    expect(abycChoice).toBe('6 AWG');
  });

  it('when 100 A continuous runs 1 m, then ampacity sets 1 AWG: 125 A needed, 2 AWG has 115 A and 1 AWG 130 A', () => {
    // NEC 2023 Table 310.16, 75 °C column: 2 AWG 115 A, 1 AWG 130 A.
    const r = size({ currentA: 100, systemVoltageV: 48, oneWayLengthM: 1 });
    expect(r.data.requiredAmpacityA).toBe(125);
    expect(r.data.recommended!.size).toBe('1 AWG');
    expect(r.data.limitedBy).toBe('ampacity');
    expect(r.data.fuseRatingA).toBe(125);
  });

  it('when the current is not continuous, then 100 % of it is enough', () => {
    // 20 A non-continuous: 12 AWG (25 A at 75 °C) and its 20 A 240.4(D) limit both suffice.
    const r = size({ currentA: 20, continuous: false, systemVoltageV: 48, oneWayLengthM: 1 });
    expect(r.data.requiredAmpacityA).toBe(20);
    expect(r.data.recommended!.size).toBe('12 AWG');
  });

  it('when the ambient is 40 °C and six conductors share a raceway, then the table ampacity is multiplied by 0.88 and 0.8', () => {
    // NEC 2023 Table 310.15(B)(1): 75 °C conductor at 36–40 °C → 0.88; Table 310.15(C)(1): 4–6 conductors → 80 %.
    const r = size({ currentA: 30, systemVoltageV: 48, oneWayLengthM: 1, ambientTempC: 40, currentCarryingConductors: 6 });
    expect(r.data.ambientCorrectionFactor).toBe(0.88);
    expect(r.data.bundlingAdjustmentFactor).toBe(0.8);
    expect(candidate(r.data, '8 AWG').deratedAmpacityA).toBeCloseTo(50 * 0.88 * 0.8, 6);
    // 37.5 A needed: 8 AWG gives 35.2 A, 6 AWG 65 × 0.704 = 45.76 A.
    expect(r.data.recommended!.size).toBe('6 AWG');
  });

  it('when the ambient is beyond what the column allows, then nothing fits and a danger check says so', () => {
    // NEC 2023 Table 310.15(B)(1) has no 60 °C factor above 55 °C.
    const r = size({ currentA: 10, systemVoltageV: 12, oneWayLengthM: 1, temperatureRatingC: 60, ambientTempC: 58 });
    expect(r.data.recommended).toBeNull();
    expect(r.checks.map((c) => c.level)).toContain('danger');
  });

  it('when the 90 °C column is chosen, then a termination warning accompanies the answer', () => {
    const r = size({ currentA: 20, systemVoltageV: 48, oneWayLengthM: 1, temperatureRatingC: 90 });
    expect(r.checks.map((c) => c.code)).toContain('termination_rating');
  });

  it('when every candidate is listed, then each has one reason per criterion and `failed` agrees with `passes`', () => {
    const r = size({ currentA: 60, systemVoltageV: 24, oneWayLengthM: 4 });
    for (const c of r.data.candidates) {
      expect(c.reasons).toHaveLength(3);
      expect(c.passes).toBe(c.failed.length === 0);
      for (const f of c.failed) expect(c.reasons.find((x) => x.startsWith(f.replace('_', ' ')))).toMatch(/fails/);
    }
    expect(r.data.candidates.find((c) => c.passes)!.size).toBe(r.data.recommended!.size);
  });

  it('when the current or the length grows, then the recommended size never shrinks (property, 300 seeded cases)', () => {
    const order = awgConductors.map((c) => c.size);
    const index = (d: WireSizeData) => (d.recommended ? order.indexOf(d.recommended.size) : order.length);
    const next = rng(20261202);
    for (let k = 0; k < 300; k += 1) {
      const base = {
        currentA: 1 + next() * 200,
        systemVoltageV: [12, 24, 48][Math.floor(next() * 3)]!,
        oneWayLengthM: 0.2 + next() * 15,
        ambientTempC: 10 + next() * 40,
        currentCarryingConductors: 1 + Math.floor(next() * 8),
        temperatureRatingC: ([60, 75, 90] as const)[Math.floor(next() * 3)]!,
      };
      const i0 = index(size(base).data);
      expect(index(size({ ...base, currentA: base.currentA * (1 + next()) }).data)).toBeGreaterThanOrEqual(i0);
      expect(index(size({ ...base, oneWayLengthM: base.oneWayLengthM * (1 + next()) }).data)).toBeGreaterThanOrEqual(i0);
    }
  });

  it('when the length is given in feet, then the result equals the same length in metres', () => {
    const ft = size({ currentA: 35, systemVoltageV: 24, oneWayLengthFt: 12 });
    const m = size({ currentA: 35, systemVoltageV: 24, oneWayLengthM: 12 * 0.3048 });
    expect(ft.data.recommended).toEqual(m.data.recommended);
  });
});
