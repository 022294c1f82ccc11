import { describe, expect, it } from 'vitest';
import { cellOcvAtSoc, socAtCellOcv } from './ocv.ts';
import { packOcvAtSoc, packPresentState, packVoltages } from './pack.ts';
import { chemistries, chemistryIds } from './presets.ts';

describe('chemistry presets', () => {
  it('when a 16-cell LFP pack is described, then it is 51.2 V nominal, 58.4 V full and 40.0 V at cut-off', () => {
    // LFP cell datasheets: 3.2 V nominal, 3.65 V charge limit, 2.5 V cut-off; 16S pack values are 16 × cell
    // (a 51.2 V pack datasheet states a 58.4 V charge limit).
    const v = packVoltages({ chemistry: 'lfp', seriesCells: 16 });
    expect(v.nominalVoltageV).toBeCloseTo(51.2, 10);
    expect(v.fullChargeVoltageV).toBeCloseTo(58.4, 10);
    expect(v.cutoffVoltageV).toBeCloseTo(40.0, 10);
  });

  it('when a 6-cell lead-acid battery is described, then it is the familiar 12 V / 14.4 V / 10.5 V', () => {
    // Lead-acid practice (universal): 2.0 V/cell nominal, 2.40 V/cell absorption (14.4 V), 1.75 V/cell end of discharge.
    const v = packVoltages({ chemistry: 'lead_acid_agm', seriesCells: 6 });
    expect(v.nominalVoltageV).toBeCloseTo(12, 10);
    expect(v.fullChargeVoltageV).toBeCloseTo(14.4, 10);
    expect(v.cutoffVoltageV).toBeCloseTo(10.5, 10);
  });

  it('when every curve is inspected, then it runs from 0 % to 100 % and rises strictly in both columns', () => {
    for (const id of chemistryIds) {
      const curve = chemistries[id].ocvCurve;
      expect(curve[0]!.socPct).toBe(0);
      expect(curve.at(-1)!.socPct).toBe(100);
      for (let i = 1; i < curve.length; i += 1) {
        expect(curve[i]!.socPct).toBeGreaterThan(curve[i - 1]!.socPct);
        expect(curve[i]!.cellVoltageV).toBeGreaterThan(curve[i - 1]!.cellVoltageV);
      }
    }
  });
});

describe('OCV interpolation', () => {
  it('when the LFP curve is read at 10 % steps, then it matches linear interpolation of the published breakpoints', () => {
    // Sunil et al., IEEE TIM 2025, LFP 18650 breakpoints, interpolated at 10 % steps
    // (values derived by linear interpolation of the published breakpoints; see reference-values 5.2a).
    const expected = [2.0102, 3.1988, 3.2385, 3.2775, 3.2883, 3.299, 3.3098, 3.3206, 3.3314, 3.3421, 3.5981];
    expected.forEach((v, i) => expect(cellOcvAtSoc(chemistries.lfp.ocvCurve, i * 10)).toBeCloseTo(v, 3));
  });

  it('when the NMC curve is read at 10 % steps, then it matches the same paper\'s interpolated values', () => {
    // Sunil et al., IEEE TIM 2025, NMC 21700 breakpoints interpolated at 10 % steps (reference-values 5.4).
    const expected = [2.5061, 3.3311, 3.4749, 3.5803, 3.6575, 3.7427, 3.8388, 3.9348, 4.0309, 4.0849, 4.1932];
    expected.forEach((v, i) => expect(cellOcvAtSoc(chemistries.nmc.ocvCurve, i * 10)).toBeCloseTo(v, 3));
  });

  it('when a 6-cell lead-acid battery is at 50 %, then its rested voltage is the BCI table\'s 12.24 V', () => {
    // BCI OCV table for 12 V lead-acid at 80 °F: 50 % → 12.24 V, 75 % → 12.45 V.
    expect(packOcvAtSoc({ chemistry: 'lead_acid_flooded', seriesCells: 6 }, 50)).toBeCloseTo(12.24, 6);
    expect(packOcvAtSoc({ chemistry: 'lead_acid_flooded', seriesCells: 6 }, 75)).toBeCloseTo(12.45, 6);
  });

  it('when a voltage is looked up and inverted, then the state of charge comes back (analytic inverse of a linear map)', () => {
    for (const id of chemistryIds) {
      for (const soc of [0.5, 7, 33, 50, 81, 99.7]) {
        const v = cellOcvAtSoc(chemistries[id].ocvCurve, soc);
        expect(socAtCellOcv(chemistries[id].ocvCurve, v)).toBeCloseTo(soc, 8);
      }
    }
  });

  it('when a state of charge lies outside 0–100 %, then the curve is clamped to its ends', () => {
    expect(cellOcvAtSoc(chemistries.lfp.ocvCurve, -5)).toBe(2.0102);
    expect(cellOcvAtSoc(chemistries.lfp.ocvCurve, 120)).toBe(3.5981);
  });

  it('when a resting voltage is given, then it overrides the voltage looked up from the state of charge', () => {
    const state = packPresentState({ chemistry: 'lfp', seriesCells: 16, capacityAh: 100, stateOfChargePct: 50, restingVoltageV: 53.6 });
    expect(state.openCircuitVoltageV).toBe(53.6);
    expect(state.stateOfChargePct).toBe(50);
  });
});
