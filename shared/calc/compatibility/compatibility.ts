/**
 * Compatibility of an external pack with a host unit, by two methods.
 *
 * `dc_input` — the pack feeds the host's DC (solar-style) input:
 * - Verdict (Ohmstead contract): `incompatible` when the pack's full-charge voltage exceeds the input's
 *   maximum (a charged pack would over-voltage the input), and also when the input's minimum is at or above
 *   the full-charge voltage (no part of the pack is reachable); `limited` when the input's minimum is above the
 *   pack's cut-off voltage (the pack's lower part is unreachable); otherwise `compatible`. Current and power
 *   caps are reported in `reasons`, not as a downgrade.
 * - Input power at a pack voltage V is min(V × maxCurrentA, maxPowerW): at full charge and at cut-off (0 when
 *   cut-off is below the input's minimum, where the input has stopped).
 * - Energy: the pack's energy from its present state of charge down to the lowest reachable one (where
 *   its open-circuit voltage meets max(input minimum, cut-off)), integrated exactly on the piecewise-linear
 *   OCV curve: E = capacityAh × Σ ∫ OCV(s) ds / 100. Added energy = that × efficiencyPct / 100 (default
 *   90 %, common practice, no published source). Time = ∫ dE / P(OCV(s)) (midpoint rule, 400 slices).
 *   Open-circuit voltage stands in for the loaded terminal voltage (a small optimism that internal
 *   resistance would reduce).
 *
 * `direct_parallel` — the pack wired straight onto the host's battery bus:
 * - `incompatible` unless chemistry and series count match (never parallel packs of different chemistry or
 *   voltage); otherwise `compatible`, always with cautions. Added energy is the pack's stored energy to
 *   cut-off (no conversion). State-of-charge matching guidance comes from the connection model
 *   (../parallel-connect): the largest safe resting-voltage difference is the pack's continuous limit times
 *   the loop resistance, taken here as the external pack's internal resistance alone (the host's is unknown,
 *   so this understates the resistance and the figure errs low, i.e. safe).
 */
import type { CompatibilityData, CompatibilityInput } from '../../schemas/compatibility.ts';
import type { PackSpec } from '../../schemas/common.ts';
import { cellOcvAtSoc, cellOcvSlopeAtSoc, socAtCellOcv } from '../chemistry/ocv.ts';
import { packPresentState, packVoltages } from '../chemistry/pack.ts';
import { chemistries, type OcvPoint } from '../chemistry/presets.ts';
import { minDefined } from '../parallel-connect/parallel-connect.ts';
import { batteryWorkCautions } from '../tables/safety-cautions.ts';
import type { CalcOutput, Check } from '../types.ts';
import { milliohmToOhm, roundTo } from '../units.ts';

/** ∫ OCV_cell(s) ds over [lowPct, highPct] on a piecewise-linear curve, V·% (exact: trapezoids per segment). */
export function integrateCellOcv(curve: readonly OcvPoint[], lowPct: number, highPct: number): number {
  if (highPct <= lowPct) return 0;
  const points = [lowPct, ...curve.map((p) => p.socPct).filter((s) => s > lowPct && s < highPct), highPct];
  let sum = 0;
  for (let k = 1; k < points.length; k += 1) {
    const s0 = points[k - 1]!;
    const s1 = points[k]!;
    sum += ((cellOcvAtSoc(curve, s0) + cellOcvAtSoc(curve, s1)) / 2) * (s1 - s0);
  }
  return sum;
}

/** A pack's energy between two states of charge on its OCV curve, Wh. */
export function packEnergyBetweenSocWh(pack: Pick<PackSpec, 'chemistry' | 'seriesCells' | 'capacityAh'>, lowPct: number, highPct: number): number {
  return (pack.capacityAh * pack.seriesCells * integrateCellOcv(chemistries[pack.chemistry].ocvCurve, lowPct, highPct)) / 100;
}

const SLICES = 400;

/**
 * Checks an external pack against a host (model above): one entry in `methods` per way the host was
 * described (dcInput → `dc_input`, battery → `direct_parallel`). Powers in W, energy in Wh, time in h.
 */
export function computeCompatibility(input: CompatibilityInput): CalcOutput<CompatibilityData> {
  const ext = input.external;
  const checks: Check[] = [];
  const cautions = batteryWorkCautions();
  const v = packVoltages(ext);
  const curve = chemistries[ext.chemistry].ocvCurve;
  const state = packPresentState(ext);
  const socNow = state.stateOfChargePct;
  const label = ext.label ?? 'External pack';
  const socAt = (packV: number) => socAtCellOcv(curve, packV / ext.seriesCells);
  const cutoffSoc = socAt(v.cutoffVoltageV);
  const storedEnergyWh = packEnergyBetweenSocWh(ext, cutoffSoc, socNow);
  const fmtV = (x: number) => `${roundTo(x, 2)} V`;
  if (ext.stateOfChargePct === undefined && ext.restingVoltageV === undefined) {
    checks.push({ code: 'soc_assumed', level: 'info', message: `${label}: no stateOfChargePct or restingVoltageV given; a full pack (100 %) is assumed.` });
  }

  const methods: CompatibilityData['methods'] = [];

  if (input.host.dcInput) {
    const dc = input.host.dcInput;
    const reasons: string[] = [];
    const powerAt = (packV: number) => Math.min(packV * dc.maxCurrentA, dc.maxPowerW ?? Number.POSITIVE_INFINITY);
    let verdict: 'compatible' | 'limited' | 'incompatible';
    if (v.fullChargeVoltageV > dc.maxVoltageV) {
      verdict = 'incompatible';
      reasons.push(`The pack reaches ${fmtV(v.fullChargeVoltageV)} at full charge, above the input's ${fmtV(dc.maxVoltageV)} maximum: it can damage the input or be refused.`);
      checks.push({ code: 'dc_input_overvoltage', level: 'danger', message: `${label} at full charge (${fmtV(v.fullChargeVoltageV)}) exceeds the DC input's ${fmtV(dc.maxVoltageV)} maximum. Do not connect it.` });
    } else if (dc.minVoltageV >= v.fullChargeVoltageV) {
      verdict = 'incompatible';
      reasons.push(`The input needs at least ${fmtV(dc.minVoltageV)}, at or above the pack's full-charge ${fmtV(v.fullChargeVoltageV)}: none of the pack is reachable.`);
    } else if (dc.minVoltageV > v.cutoffVoltageV) {
      verdict = 'limited';
      reasons.push(`The input stops at ${fmtV(dc.minVoltageV)}, above the pack's ${fmtV(v.cutoffVoltageV)} cut-off: the part of the pack below about ${roundTo(socAt(dc.minVoltageV), 1)} % state of charge is unreachable.`);
    } else {
      verdict = 'compatible';
      reasons.push(`The pack's whole range, ${fmtV(v.cutoffVoltageV)} to ${fmtV(v.fullChargeVoltageV)}, lies within the input's ${fmtV(dc.minVoltageV)}–${fmtV(dc.maxVoltageV)} window.`);
    }
    const method: CompatibilityData['methods'][number] = { method: 'dc_input', verdict, reasons };
    if (verdict !== 'incompatible') {
      const lowV = Math.max(dc.minVoltageV, v.cutoffVoltageV);
      const lowSoc = socAt(lowV);
      const pFull = powerAt(v.fullChargeVoltageV);
      const pCut = v.cutoffVoltageV >= dc.minVoltageV ? powerAt(v.cutoffVoltageV) : 0;
      const drawnWh = packEnergyBetweenSocWh(ext, lowSoc, socNow);
      let hours = 0;
      if (socNow > lowSoc) {
        const ds = (socNow - lowSoc) / SLICES;
        for (let k = 0; k < SLICES; k += 1) {
          const s = lowSoc + (k + 0.5) * ds;
          const packV = cellOcvAtSoc(curve, s) * ext.seriesCells;
          hours += (ext.capacityAh * packV * ds) / 100 / powerAt(packV);
        }
      }
      method.inputPowerWAtFull = roundTo(pFull, 1);
      method.inputPowerWAtCutoff = roundTo(pCut, 1);
      method.addedEnergyWh = roundTo((drawnWh * dc.efficiencyPct) / 100, 1);
      method.hoursToTransfer = roundTo(hours, 3);
      method.usableSocRangePct = { fromPct: roundTo(socNow, 2), toPct: roundTo(Math.min(lowSoc, socNow), 2) };
      const currentCapW = v.fullChargeVoltageV * dc.maxCurrentA;
      if (dc.maxPowerW !== undefined && dc.maxPowerW < currentCapW) reasons.push(`The input's ${dc.maxPowerW} W power limit caps the draw (${roundTo(pFull, 0)} W at full charge).`);
      else reasons.push(`The input's ${dc.maxCurrentA} A current limit caps the draw: ${roundTo(pFull, 0)} W at full charge, falling with the pack's voltage.`);
      reasons.push(
        `From ${roundTo(socNow, 1)} % the input can draw about ${roundTo(drawnWh, 0)} Wh in ${roundTo(hours, 2)} h; after ${dc.efficiencyPct} % conversion efficiency the host gains about ${roundTo((drawnWh * dc.efficiencyPct) / 100, 0)} Wh.`,
      );
      const peakDrawA = Math.min(dc.maxCurrentA, (dc.maxPowerW ?? Number.POSITIVE_INFINITY) / Math.max(lowV, 1e-9));
      if (ext.maxContinuousDischargeA !== undefined && peakDrawA > ext.maxContinuousDischargeA) {
        reasons.push(`The input may draw up to ${roundTo(peakDrawA, 1)} A, above the pack's ${ext.maxContinuousDischargeA} A continuous rating.`);
        checks.push({ code: 'pack_discharge_limit', level: 'warning', message: `${label}'s ${ext.maxContinuousDischargeA} A continuous rating is below the ${roundTo(peakDrawA, 1)} A the input may draw: its protection may trip.` });
      }
      if (input.host.battery?.capacityAh !== undefined) {
        const hostWh = packVoltages(input.host.battery).nominalVoltageV * input.host.battery.capacityAh;
        if ((drawnWh * dc.efficiencyPct) / 100 > hostWh) reasons.push(`That is more than the host battery holds (about ${roundTo(hostWh, 0)} Wh): expect to recharge it from the pack more than once while using the host.`);
      }
    }
    methods.push(method);
  }

  if (input.host.battery) {
    const hb = input.host.battery;
    const reasons: string[] = [];
    let verdict: 'compatible' | 'incompatible' = 'compatible';
    if (hb.chemistry !== ext.chemistry) {
      verdict = 'incompatible';
      reasons.push(`The host battery is ${hb.chemistry} and the pack is ${ext.chemistry}: never parallel packs of different chemistry.`);
    }
    if (hb.seriesCells !== ext.seriesCells) {
      verdict = 'incompatible';
      reasons.push(`The host battery has ${hb.seriesCells} cells in series and the pack ${ext.seriesCells}: never parallel packs of different voltage.`);
    }
    const method: CompatibilityData['methods'][number] = { method: 'direct_parallel', verdict, reasons };
    if (verdict === 'incompatible') {
      checks.push({ code: 'direct_parallel_mismatch', level: 'danger', message: `${label} must not be wired onto the host's battery: ${reasons.join(' ')}` });
    } else {
      reasons.push(`Same chemistry (${ext.chemistry}) and series count (${ext.seriesCells}S): the packs can share a bus, with the precautions below.`);
      method.addedEnergyWh = roundTo(storedEnergyWh, 1);
      const limitA = minDefined(ext.maxContinuousDischargeA, ext.maxChargeA);
      const rOhm = ext.internalResistanceMOhm === undefined ? undefined : milliohmToOhm(ext.internalResistanceMOhm);
      const maxDiffV = limitA !== null && rOhm !== undefined && rOhm > 0 ? limitA * rOhm : null;
      method.recommendedMaxDifferenceV = maxDiffV === null ? null : roundTo(maxDiffV, 4);
      if (maxDiffV !== null) {
        // Mid-range (50 %) is where packs usually sit when they are not full; the slope there translates volts to %.
        const slope = cellOcvSlopeAtSoc(curve, 50) * ext.seriesCells;
        const socText = slope > 0 ? ` (around 50 % state of charge on this chemistry's curve, ${roundTo(maxDiffV, 3)} V spans about ${roundTo(maxDiffV / slope, 1)} % of state of charge)` : '';
        reasons.push(
          `Connect only when the two resting voltages are within ${roundTo(maxDiffV, 3)} V${socText}. With the pack's ${ext.internalResistanceMOhm} mΩ alone in the loop, that keeps the first current within its ${limitA} A limit (the host's own resistance only lowers it).`,
        );
      } else {
        reasons.push('Give the pack\'s internalResistanceMOhm and maxContinuousDischargeA for a voltage-matching figure; until then, charge both to full separately, let them rest, and connect only when their resting voltages agree.');
      }
      if (ext.chemistry === 'lfp') reasons.push('LFP voltage is flat through most of its range: a small voltage difference can hide a large state-of-charge difference, so matching both at full charge is the most reliable.');
      if (hb.capacityAh !== undefined) {
        const ratio = ext.capacityAh / hb.capacityAh;
        reasons.push(`The pack is ${roundTo(ratio, 2)} × the host battery's capacity; in parallel, currents divide by internal resistance, so the host's own wiring and protection must carry the combined charge and discharge currents.`);
      }
      reasons.push("Direct connection bypasses the host's input electronics and may void its warranty: do it only where the maker allows it, with a fuse on each pack.");
      checks.push({
        code: 'direct_parallel_cautions',
        level: 'warning',
        message: 'Wiring a pack straight onto a host battery joins two high-current sources: match their voltages first, fuse each as close to its terminal as practical, and follow the host maker\'s instructions.',
      });
      cautions.push('Connecting a pack directly to a host battery bypasses the host\'s input protection; only do it where the host\'s maker allows it.');
    }
    methods.push(method);
  }

  return {
    data: {
      external: {
        label,
        nominalVoltageV: roundTo(v.nominalVoltageV, 3),
        fullChargeVoltageV: roundTo(v.fullChargeVoltageV, 3),
        cutoffVoltageV: roundTo(v.cutoffVoltageV, 3),
        openCircuitVoltageV: roundTo(state.openCircuitVoltageV, 4),
        stateOfChargePct: roundTo(socNow, 3),
        storedEnergyWh: roundTo(storedEnergyWh, 1),
      },
      methods,
    },
    checks,
    cautions,
    basis: [
      'Pack voltages from the chemistry presets (per-cell nominal / full-charge / cut-off × series cells); energy integrated on the chemistry OCV curve',
      'DC input: voltage window over the pack\'s whole range; power = min(V × current cap, power cap); added energy after the conversion efficiency',
      'Direct parallel: same chemistry and series count required; voltage matching from the connection model (continuous limit × loop resistance)',
    ],
  };
}
