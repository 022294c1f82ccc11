import { describe, expect, it } from 'vitest';
import { FuseSizeInputSchema } from '../../schemas/fuse-size.ts';
import { CalcError } from '../errors.ts';
import { findConductor } from '../tables/conductors.ts';
import { computeFuseSize } from './fuse-size.ts';

const fuse = (input: Record<string, unknown>) => computeFuseSize(FuseSizeInputSchema.parse(input));

describe('computeFuseSize', () => {
  it('when 80 A is continuous, then the minimum is 100 A (125 %, a 240.6(A) standard rating) and 2 AWG 75 °C allows up to 115 A', () => {
    // NEC 2023 240.6(A): 100 A is standard; NEC 2023 Table 310.16: 2 AWG copper 75 °C = 115 A.
    const r = fuse({ continuousCurrentA: 80, conductor: { size: '2' } });
    expect(r.data.minimumRatingA).toBe(100);
    expect(r.data.maximumRatingA).toBe(115);
    expect(r.data.recommendedRatingA).toBe(100);
    expect(r.data.conductor!.size).toBe('2 AWG');
  });

  it('when 125 % falls between ratings, then it rounds up: 81 A → 101.25 A → 110 A; 33 A → 41.25 A → 45 A', () => {
    // NEC 2023 240.6(A): …, 90, 100, 110, 125 …; …, 40, 45, 50 …
    expect(fuse({ continuousCurrentA: 81 }).data.minimumRatingA).toBe(110);
    expect(fuse({ continuousCurrentA: 33 }).data.minimumRatingA).toBe(45);
  });

  it('when 20 A continuous is to be carried on 12 AWG, then the conductor cannot be protected: a danger check, no recommendation, and 10 AWG named', () => {
    // NEC 2023 240.4(D)(5): 12 AWG copper at most 20 A; the current needs a 25 A device.
    const r = fuse({ continuousCurrentA: 20, conductor: { size: '12 AWG' } });
    expect(r.data.minimumRatingA).toBe(25);
    expect(r.data.maximumRatingA).toBe(20);
    expect(r.data.recommendedRatingA).toBeNull();
    expect(r.data.conductor!.smallestProtectableSize).toBe('10 AWG');
    expect(r.checks).toContainEqual(expect.objectContaining({ code: 'conductor_unprotectable', level: 'danger' }));
  });

  it('when the conductor is in the 60 °C column, then its lower ampacity caps the fuse', () => {
    // NEC 2023 Table 310.16: 6 AWG copper 60 °C = 55 A; 40 A continuous needs 50 A: protectable.
    const r = fuse({ continuousCurrentA: 40, conductor: { size: '6 AWG', temperatureRatingC: 60 } });
    expect(r.data.maximumRatingA).toBe(55);
    expect(r.data.recommendedRatingA).toBe(50);
  });

  it('when a 4S LFP pack of 2 mΩ is the source, then the prospective short-circuit current is 14.6 V / 2 mΩ = 7.3 kA', () => {
    // I_sc = V / (R_batt + R_link) (reference values §4, D); 12.8 V module data: 2 mΩ battery resistance (B).
    // Full-charge voltage per the contract: 4 × 3.65 V = 14.6 V.
    const r = fuse({ continuousCurrentA: 80, source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100, internalResistanceMOhm: 2 } });
    expect(r.data.prospectiveShortCircuitA).toBeCloseTo(7300, 6);
    expect(r.data.requiredInterruptRatingA).toBe(7300);
    expect(r.data.preferredInterruptRatingA).toBe(10_000); // UL 248 preferred DC ratings (secondary source)
    expect(r.data.requiredVoltageRatingV).toBeCloseTo(14.6, 10);
  });

  it('when 2 m each way of 2/0 AWG joins the same pack to the fault, then its 1.27 mΩ (Table 8, 75 °C) lowers the current to about 4.47 kA', () => {
    // NEC Ch. 9 Table 8: 2/0 stranded 0.0967 Ω/kft × 13.12 ft = 1.27 mΩ (reference values §4).
    const linkMOhm = findConductor('2/0')!.resistanceOhmPerKm75C * 4; // Ω/km = mΩ/m, over 4 m
    expect(linkMOhm).toBeCloseTo(1.269, 3);
    const r = fuse({ continuousCurrentA: 80, source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100, internalResistanceMOhm: 2 }, linkResistanceMOhm: linkMOhm });
    expect(r.data.prospectiveShortCircuitA!).toBeCloseTo(14.6 / 0.003269, -1);
  });

  it('when a 16S LFP pack of 8 mΩ is the source, then 58.4 V / 8 mΩ = 7.3 kA and the voltage rating is 58.4 V', () => {
    // 51.2 V module data: 8 mΩ (B); full charge 16 × 3.65 V = 58.4 V (A/D).
    const r = fuse({ continuousCurrentA: 100, source: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100, internalResistanceMOhm: 8 } });
    expect(r.data.prospectiveShortCircuitA).toBeCloseTo(7300, 6);
    expect(r.data.requiredVoltageRatingV).toBeCloseTo(58.4, 10);
  });

  it('when a known short-circuit current and a system voltage are given instead, then they are used as they are', () => {
    const r = fuse({ continuousCurrentA: 10, prospectiveShortCircuitA: 12_000, systemMaxVoltageV: 29.2 });
    expect(r.data.requiredInterruptRatingA).toBe(12_000);
    expect(r.data.preferredInterruptRatingA).toBe(20_000);
    expect(r.data.requiredVoltageRatingV).toBe(29.2);
    expect(r.data.maximumRatingA).toBeNull();
  });

  it('when a source has no resistance at all, then it is a calculation error naming its internal resistance', () => {
    expect(() => fuse({ continuousCurrentA: 10, source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 } })).toThrow(CalcError);
    try {
      fuse({ continuousCurrentA: 10, source: { chemistry: 'lfp', seriesCells: 4, capacityAh: 100 } });
    } catch (e) {
      expect((e as CalcError).pointer).toBe('#/source/internalResistanceMOhm');
    }
  });

  it('when neither a source nor a current is given, then warnings say the interrupt and voltage ratings are unchecked', () => {
    const r = fuse({ continuousCurrentA: 10 });
    expect(r.data.prospectiveShortCircuitA).toBeNull();
    expect(r.checks.map((c) => c.code)).toEqual(expect.arrayContaining(['short_circuit_unknown', 'voltage_unknown', 'no_conductor']));
  });

  it('when 16 AWG (no 75 °C ampacity) is protected, then the 240.4(D) 10 A limit is the maximum', () => {
    // NEC 2023 240.4(D)(2): 16 AWG copper, 10 A.
    const r = fuse({ continuousCurrentA: 4, conductor: { size: '16' } });
    expect(r.data.maximumRatingA).toBe(10);
    expect(r.data.recommendedRatingA).toBe(6); // 5 A → 6 A, an additional standard fuse rating
  });

  it('when the minimum rating never exceeds the maximum for a protectable size, then the recommendation sits inside the window (property)', () => {
    for (let i = 1; i <= 300; i += 1) {
      const current = i * 0.7;
      for (const s of ['14', '10', '6', '1/0', '4/0', '25 mm2']) {
        const r = fuse({ continuousCurrentA: current, conductor: { size: s } });
        if (r.data.recommendedRatingA === null) {
          expect(r.data.minimumRatingA).toBeGreaterThan(r.data.maximumRatingA!);
        } else {
          expect(r.data.recommendedRatingA).toBeGreaterThanOrEqual(1.25 * current - 1e-9);
          expect(r.data.recommendedRatingA).toBeLessThanOrEqual(r.data.maximumRatingA!);
        }
      }
    }
  });
});
