import fc from 'fast-check';
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { CalcError } from '../errors.ts';
import { packOcvAtSoc } from '../chemistry/pack.ts';
import { chemistries } from '../chemistry/presets.ts';
import { ChargeTimeInputSchema, ChargeTimeResultSchema, chargeTimeInputExample } from '../../schemas/charge-time.ts';
import { computeChargeTime, MAX_PROFILE_POINTS, simulateCcCv, TAPER_TIME_CONSTANT_H, type CcCvModel } from './charge-time.ts';
import { allFinite, anyPack, everydayPack, num } from '../pack-energy/fixtures/arbitraries.ts';

const lfp16 = { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } as const;
const big = math.bignumber;

/** A pack with a straight OCV line, 10 V at 0 % to 14 V at 100 %, for the analytic checks. */
function linearModel(overrides: Partial<CcCvModel>): CcCvModel {
  return {
    capacityAh: 100,
    coulombicEfficiency: 1,
    chargeVoltageV: 14.05,
    terminationCurrentA: 5,
    taperTimeConstantH: 0.25,
    ohmicResistanceOhm: 0.01,
    ocvV: (q) => 10 + 0.04 * q,
    ocvBreakpointsPct: [0, 100],
    sources: [{ currentA: 50, efficiency: 1 }],
    ...overrides,
  };
}

describe('CC/CV integrator against closed forms', () => {
  it('when the current stays constant, then the CC time is Ah ÷ A exactly', () => {
    // Analytic: 60 Ah at 10 A is 6 h (t = Q / I for a constant current).
    const run = simulateCcCv(linearModel({ sources: [{ currentA: 10, efficiency: 1 }], taperTimeConstantH: 0.01 }), 20, 80);
    expect(run.totalHours).toBeCloseTo(6, 12);
    expect(run.constantCurrentHours).toBeCloseTo(6, 12);
    expect(run.taperHours).toBe(0);
  });

  it('when the reference CC–CV vector is run, then the taper matches the exponential decay’s closed form', () => {
    // Reference values §6.5 (analytic model, self-consistent mathematics): 100 Ah from empty, I₀ = 50 A,
    // I_term = 5 A, τ = 0.25 h → t_CV = τ·ln(I₀/I_term) = 0.5756 h, Q_CV = τ·(I₀ − I_term) = 11.25 Ah,
    // Q_CC = 88.75 Ah, t_CC = 1.775 h, total 2.351 h.
    const run = simulateCcCv(linearModel({}), 0, 100);
    // mathjs BigNumber (64 digits) evaluates the closed form as the outside reference.
    const tCv = Number(math.multiply(big(0.25), math.log(big(10))));
    expect(run.taperHours).toBeCloseTo(tCv, 12);
    expect(run.taperHours).toBeCloseTo(0.5756, 4);
    expect(run.constantCurrentHours).toBeCloseTo(1.775, 12);
    expect(run.totalHours).toBeCloseTo(2.351, 3);
    expect(run.totalHours).toBeCloseTo(1.775 + tCv, 12);
    // The taper starts where 11.25 Ah remain: full current just below 88.75 %, less just above it.
    expect(run.currentAt(88.75)).toBeCloseTo(50, 9);
    expect(run.currentAt(88.7)).toBe(50);
    expect(run.currentAt(88.8)).toBeLessThan(50);
    expect(run.currentAt(100)).toBeCloseTo(5, 12);
    // The charge voltage is reached exactly where CV starts: OCV(88.75 %) + 50 A × 10 mΩ = 13.55 + 0.5 V.
    expect(run.voltageAt(88.75)).toBeCloseTo(14.05, 9);
  });

  it('when the profile is read during the taper, then the current follows I₀·e^(−t/τ)', () => {
    // LFP preset (τ = 0.05 h), 50 A charger: in CV, I(t) = 50·e^(−(t − t_CC)/τ) (reference values §6.5).
    const out = computeChargeTime({ pack: lfp16, fromPct: 0, toPct: 100, sources: [{ currentA: 50 }] });
    const tau = TAPER_TIME_CONSTANT_H.lfp;
    const tCc = out.data.constantCurrentHours;
    const inTaper = out.data.profile.filter((p) => p.minute / 60 > tCc + 1e-9);
    expect(inTaper.length).toBeGreaterThan(0);
    for (const p of inTaper) {
      const expected = 50 * Math.exp(-(p.minute / 60 - tCc) / tau);
      expect(p.currentA / expected).toBeCloseTo(1, 9);
      expect(p.voltageV).toBeCloseTo(58.4, 12);
    }
    // Closed-form taper duration: τ·ln(50 / 5), the LFP termination being 0.05C = 5 A.
    expect(out.data.taperHours).toBeCloseTo(tau * Math.log(10), 12);
    // Stored charge in the taper η·τ·(I₀ − I_term); the CC part then takes the rest at 50 A.
    const eta = chemistries.lfp.coulombicEfficiency;
    const ccStoredAh = 100 - eta * tau * (50 - 5);
    expect(out.data.constantCurrentHours).toBeCloseTo(ccStoredAh / (eta * 50), 12);
  });

  it('when a power source charges along a straight stretch of the OCV curve, then the time equals ∫OCV dQ ÷ P (mathjs BigNumber)', () => {
    // LFP curve is linear between its 29.72 % and 98.33 % breakpoints (Sunil et al. 2025). From 30 % to 90 %,
    // with a 500 W source at 100 % efficiency: I = P / OCV(Q), t = ∫ dQ / (η·I) = (Ah/100)/(η·P) · ∫ OCV dq.
    const out = computeChargeTime({ pack: lfp16, fromPct: 30, toPct: 90, sources: [{ powerW: 500 }] });
    const eta = big(chemistries.lfp.coulombicEfficiency);
    const v30 = big(packOcvAtSoc(lfp16, 30));
    const v90 = big(packOcvAtSoc(lfp16, 90));
    // ∫ of a straight line over 60 % is 60 × the mean of its ends.
    const integral = math.multiply(big(60), math.divide(math.add(v30, v90), big(2)));
    const expected = Number(math.divide(math.multiply(big(1), integral), math.multiply(eta, big(500))));
    expect(out.data.totalHours).toBeCloseTo(expected, 10);
    expect(out.data.taperHours).toBe(0);
    expect(out.data.chargeCurrentA).toBeCloseTo(500 / packOcvAtSoc(lfp16, 30), 12);
  });
});

describe('computeChargeTime — trade facts and rules', () => {
  it('when an 18 A charger fills an empty 100 Ah LFP pack, then it takes about six hours', () => {
    // Common practice: 100 Ah ÷ 18 A ≈ 5.6 h of constant current, plus a short taper: "about six hours".
    const { data } = computeChargeTime({ pack: lfp16, fromPct: 0, toPct: 100, sources: [{ currentA: 18 }] });
    expect(Math.round(data.totalHours)).toBe(6);
    expect(data.totalHours).toBeGreaterThan(100 / 18);
    expect(data.chargeCurrentA).toBe(18);
    expect(data.limitedBy).toBe('source');
    expect(data.terminationCurrentA).toBeCloseTo(5, 12);
  });

  it('when a 20 → 80 % charge stays in CC, then its time is the Ah moved ÷ the current ÷ the coulombic efficiency', () => {
    // Analytic: 60 Ah stored at 10 A with η = 0.99 (preset) → 60 / (0.99 × 10) h.
    const { data } = computeChargeTime({ pack: lfp16, fromPct: 20, toPct: 80, sources: [{ currentA: 10 }] });
    expect(data.constantCurrentHours).toBeCloseTo(60 / (0.99 * 10), 12);
    expect(data.taperHours).toBe(0);
    expect(data.chargeAh).toBeCloseTo(60 / 0.99, 12);
  });

  it('when a source is given as power, then it delivers power × efficiency ÷ the OCV at the present state of charge', () => {
    // The v1 contract's rule for powerW sources.
    const { data } = computeChargeTime({ pack: lfp16, fromPct: 50, toPct: 60, sources: [{ powerW: 1000, efficiencyPct: 90 }] });
    expect(data.chargeCurrentA).toBeCloseTo(900 / packOcvAtSoc(lfp16, 50), 12);
    expect(data.sourceCurrentA).toBeCloseTo(900 / packOcvAtSoc(lfp16, 50), 12);
    // Energy from the source is the energy into the pack ÷ 0.9.
    expect(data.energyFromSourceWh).toBeCloseTo(data.energyIntoPackWh / 0.9, 9);
  });

  it('when a source gives both current and power, then the lower current applies', () => {
    const ocv = packOcvAtSoc(lfp16, 40);
    const a = computeChargeTime({ pack: lfp16, fromPct: 40, toPct: 50, sources: [{ currentA: 5, powerW: 1000 }] });
    expect(a.data.chargeCurrentA).toBe(5);
    const b = computeChargeTime({ pack: lfp16, fromPct: 40, toPct: 50, sources: [{ currentA: 50, powerW: 1000 }] });
    expect(b.data.chargeCurrentA).toBeCloseTo(1000 / ocv, 12);
  });

  it('when the sources exceed the pack’s charge limit, then the limit sets the current and a warning says so', () => {
    const { data, checks } = computeChargeTime({ pack: { ...lfp16, maxChargeA: 30 }, fromPct: 10, toPct: 90, sources: [{ currentA: 40 }, { currentA: 20 }] });
    expect(data.chargeCurrentA).toBe(30);
    expect(data.sourceCurrentA).toBe(60);
    expect(data.limitedBy).toBe('pack_limit');
    expect(data.constantCurrentHours).toBeCloseTo(80 / (0.99 * 30), 12);
    expect(checks.find((c) => c.code === 'source_above_pack_charge_limit')?.level).toBe('warning');
  });

  it('when the charge current is above 1C with no pack limit given, then a warning appears; within a stated limit, only information', () => {
    // LFP cell datasheet protocol charges at 1C (reference values §6.5).
    const high = computeChargeTime({ pack: lfp16, fromPct: 10, toPct: 90, sources: [{ currentA: 150 }] });
    expect(high.checks.find((c) => c.code === 'charge_current_above_1c')?.level).toBe('warning');
    const allowed = computeChargeTime({ pack: { ...lfp16, maxChargeA: 200 }, fromPct: 10, toPct: 90, sources: [{ currentA: 150 }] });
    expect(allowed.checks.find((c) => c.code === 'charge_current_above_1c')?.level).toBe('info');
    const fine = computeChargeTime({ pack: lfp16, fromPct: 10, toPct: 90, sources: [{ currentA: 50 }] });
    expect(fine.checks.map((c) => c.code)).not.toContain('charge_current_above_1c');
  });

  it('when lead-acid is charged faster than 0.3C, then a warning appears and the caution is about hydrogen', () => {
    const out = computeChargeTime({ pack: { chemistry: 'lead_acid_flooded', seriesCells: 6, capacityAh: 100 }, fromPct: 50, toPct: 100, sources: [{ currentA: 50 }] });
    expect(out.checks.find((c) => c.code === 'charge_rate_above_chemistry_practice')?.level).toBe('warning');
    // At 50 % a 0.5C charger already meets the taper line (τ = 2.5 h, η = 0.85, 0.02C termination):
    // I = 2 A + 50 Ah ÷ (0.85 × 2.5 h) ≈ 25.5 A at once, then decays.
    expect(out.data.chargeCurrentA).toBe(50);
    expect(out.data.constantCurrentHours).toBe(0);
    expect(out.data.profile[0]!.currentA).toBeCloseTo(2 + 50 / (0.85 * 2.5), 9);
    expect(out.data.taperHours).toBeCloseTo(2.5 * Math.log(out.data.profile[0]!.currentA / 2), 9);
    expect(out.checks.map((c) => c.code)).toContain('starts_in_taper');
    expect(out.cautions.join(' ')).toMatch(/hydrogen/);
    expect(out.cautions.join(' ')).toMatch(/local electrical codes/);
  });

  it('when a lithium pack is charged, then the cautions name the 0 °C (32 °F) charging limit', () => {
    expect(computeChargeTime({ pack: lfp16, fromPct: 0, toPct: 50, sources: [{ currentA: 10 }] }).cautions.join(' ')).toMatch(/0 °C \(32 °F\)/);
  });

  it('when no source can charge at all, then a CalcError points at the sources; a dead one among live ones is a warning', () => {
    expect(() => computeChargeTime({ pack: lfp16, fromPct: 0, toPct: 50, sources: [{ currentA: 0 }, { powerW: 0 }] })).toThrow(
      expect.objectContaining({ code: 'no_charge_current', pointer: '#/sources' }),
    );
    const one = computeChargeTime({ pack: lfp16, fromPct: 0, toPct: 50, sources: [{ currentA: 0 }, { currentA: 10 }] });
    expect(one.checks.find((c) => c.code === 'source_delivers_nothing')?.level).toBe('warning');
  });

  it('when the target is not above the start, then a CalcError points at toPct, and the schema names it too', () => {
    expect(() => computeChargeTime({ pack: lfp16, fromPct: 80, toPct: 80, sources: [{ currentA: 10 }] })).toThrow(expect.objectContaining({ pointer: '#/toPct' }));
    const r = ChargeTimeInputSchema.safeParse({ pack: lfp16, fromPct: 80, toPct: 20, sources: [{ currentA: 10 }] });
    expect(r.error!.issues[0]!.path).toEqual(['toPct']);
    const noFigure = ChargeTimeInputSchema.safeParse({ pack: lfp16, fromPct: 0, toPct: 20, sources: [{ efficiencyPct: 90 }] });
    expect(noFigure.error!.issues[0]!.path).toEqual(['sources', 0]);
  });

  it('when the sources are weaker than the termination current, then a warning says the charger may never signal full', () => {
    const { checks } = computeChargeTime({ pack: lfp16, fromPct: 90, toPct: 100, sources: [{ currentA: 2 }] });
    expect(checks.find((c) => c.code === 'source_below_termination_current')?.level).toBe('warning');
  });

  it('when the worked example is computed, then its profile is bounded, starts at the start and ends at the target', () => {
    const { data } = computeChargeTime(ChargeTimeInputSchema.parse(chargeTimeInputExample));
    expect(data.profile.length).toBeLessThanOrEqual(MAX_PROFILE_POINTS);
    expect(data.profile[0]).toMatchObject({ minute: 0, socPct: 20 });
    expect(data.profile.at(-1)!.socPct).toBe(100);
    expect(data.profile.at(-1)!.minute).toBeCloseTo(data.totalHours * 60, 9);
    expect(data.totalHours).toBeCloseTo(data.constantCurrentHours + data.taperHours, 12);
  });
});

describe('computeChargeTime — properties', () => {
  const source = fc.record({ currentA: num(0.5, 500), powerW: num(10, 20_000), efficiencyPct: num(50, 100) }, { requiredKeys: [] }).filter(
    (s) => s.currentA !== undefined || s.powerW !== undefined,
  );
  const range = fc.tuple(num(0, 100), num(0, 100)).filter(([a, b]) => Math.abs(a - b) > 1e-6).map(([a, b]) => [Math.min(a, b), Math.max(a, b)] as const);

  it('when anything is charged, then the time is never below Ah × ΔSoC ÷ the starting current, and the profile is ordered', () => {
    fc.assert(
      fc.property(everydayPack, range, fc.array(source, { minLength: 1, maxLength: 4 }), (pack, [from, to], sources) => {
        const { data } = computeChargeTime({ pack, fromPct: from, toPct: to, sources });
        const floorHours = (pack.capacityAh * (to - from)) / 100 / data.chargeCurrentA;
        expect(data.totalHours).toBeGreaterThanOrEqual(floorHours * (1 - 1e-12));
        expect(data.totalHours).toBeGreaterThanOrEqual(((pack.capacityAh * (to - from)) / 100 / data.sourceCurrentA) * (1 - 1e-12));
        expect(data.profile.length).toBeLessThanOrEqual(MAX_PROFILE_POINTS);
        for (let i = 1; i < data.profile.length; i += 1) {
          expect(data.profile[i]!.minute).toBeGreaterThanOrEqual(data.profile[i - 1]!.minute);
          expect(data.profile[i]!.socPct).toBeGreaterThanOrEqual(data.profile[i - 1]!.socPct - 1e-9);
          expect(data.profile[i]!.currentA).toBeLessThanOrEqual(data.profile[i - 1]!.currentA * (1 + 1e-9));
        }
      }),
      { seed: 13, numRuns: 300 },
    );
  });

  it('when any input in the schema’s range is given, then the result is finite and matches the result schema, or a CalcError names a field', () => {
    const anySource = fc.record({ currentA: num(0, 100_000), powerW: num(0, 10_000_000), efficiencyPct: fc.double({ min: 1e-9, max: 100, noNaN: true }) }, { requiredKeys: [] });
    fc.assert(
      fc.property(anyPack, range, fc.array(anySource, { minLength: 1, maxLength: 20 }), (pack, [from, to], sources) => {
        const parsed = ChargeTimeInputSchema.safeParse({ pack, fromPct: from, toPct: to, sources });
        if (!parsed.success) {
          // Only a source with neither figure may fail here; every other generated value is in range.
          expect(parsed.error.issues.every((i) => i.path[0] === 'sources' && i.message === 'Give currentA, powerW or both')).toBe(true);
          return;
        }
        let out: ReturnType<typeof computeChargeTime>;
        try {
          out = computeChargeTime(parsed.data);
        } catch (error) {
          expect(error).toBeInstanceOf(CalcError);
          expect((error as CalcError).pointer).toMatch(/^#\//);
          return;
        }
        expect(allFinite(out)).toBe(true);
        expect(ChargeTimeResultSchema.safeParse(out).success).toBe(true);
      }),
      { seed: 9, numRuns: 300 },
    );
  });
});
