/**
 * Pack energy and value.
 *
 * Model (trade practice, the same arithmetic every cell and module datasheet uses):
 * - pack voltages = series cells × the chemistry's per-cell nominal / full-charge / cut-off voltage (V);
 * - energy (Wh) = nominal voltage (V) × rated capacity (Ah). Example from an LFP module datasheet:
 *   16 cells × 3.2 V = 51.2 V, × 100 Ah = 5 120 Wh;
 * - usable energy (Wh) = energy × depth of discharge / 100, the depth being the caller's plan or the
 *   chemistry preset's default (common practice: LFP and NMC 80 %, LTO 90 %, lead-acid 50 %);
 * - cost per usable kWh = price ÷ usable kWh (price currency per kWh);
 * - lifetime throughput (kWh) = usable kWh × rated cycles; cost per kWh cycled = price ÷ lifetime throughput.
 *   Capacity fade over the life is not modelled: a rated cycle life usually ends at 80 % of rated capacity
 *   (so the true throughput is roughly 10 % lower than this straight product; from memory).
 *
 * Units: volts, ampere-hours, watt-hours and kilowatt-hours; prices in the caller's currency.
 * Sources: the chemistry presets (shared/calc/chemistry/presets.ts) name theirs per chemistry.
 */
import type { CalcOutput, Check } from '../types.ts';
import { CalcError } from '../errors.ts';
import { packVoltages } from '../chemistry/pack.ts';
import { chemistries } from '../chemistry/presets.ts';
import type { PackSpec } from '../../schemas/common.ts';
import type { PackEnergyData, PackEnergyInput } from '../../schemas/pack-energy.ts';
import { whToKwh } from '../units.ts';

/**
 * Full-charge voltages above this are outside the ES1 (touch-safe) class of IEC 62368-1 for DC
 * (60 V; from memory), and several electrical codes treat batteries above 60 V DC as needing
 * guarding and a disconnect (NEC Art. 480/706; from memory).
 */
export const TOUCH_SAFE_DC_LIMIT_V = 60;

export interface PackEnergyFigures {
  nominalVoltageV: number;
  fullChargeVoltageV: number;
  cutoffVoltageV: number;
  energyWh: number;
  depthOfDischargePct: number;
  usableEnergyWh: number;
}

/** The energy figures of one pack: voltages, energy, usable energy at a depth of discharge (%, default the chemistry's). */
export function packEnergyFigures(pack: PackSpec, depthOfDischargePct?: number): PackEnergyFigures {
  const voltages = packVoltages(pack);
  const dod = depthOfDischargePct ?? chemistries[pack.chemistry].defaultDepthOfDischargePct;
  const energyWh = voltages.nominalVoltageV * pack.capacityAh;
  return { ...voltages, energyWh, depthOfDischargePct: dod, usableEnergyWh: (energyWh * dod) / 100 };
}

/** Checks on the depth of discharge against the chemistry preset; `where` is the JSON Pointer prefix for messages. */
export function depthOfDischargeChecks(pack: PackSpec, depthOfDischargePct: number, who = 'The pack'): Check[] {
  const chem = chemistries[pack.chemistry];
  const checks: Check[] = [];
  if (depthOfDischargePct > chem.maxRecommendedDepthOfDischargePct) {
    checks.push({
      code: 'depth_of_discharge_high',
      level: 'warning',
      message: `${who}: a ${depthOfDischargePct} % depth of discharge is beyond the ${chem.maxRecommendedDepthOfDischargePct} % usually recommended for ${chem.name} (common practice); expect a much shorter cycle life than rated.`,
    });
  } else if (depthOfDischargePct > chem.defaultDepthOfDischargePct) {
    checks.push({
      code: 'depth_of_discharge_above_default',
      level: 'info',
      message: `${who}: ${depthOfDischargePct} % is deeper than the ${chem.defaultDepthOfDischargePct} % default for ${chem.name}; make sure the cycle life you compare with is rated at this depth.`,
    });
  }
  return checks;
}

/** Throws a CalcError when any number in a result is NaN or infinite (inputs at the extremes of their ranges). */
export function assertFiniteNumbers(value: unknown, field: string): void {
  const walk = (v: unknown): boolean => {
    if (typeof v === 'number') return Number.isFinite(v);
    if (Array.isArray(v)) return v.every(walk);
    if (v && typeof v === 'object') return Object.values(v).every(walk);
    return true;
  };
  if (!walk(value)) {
    throw new CalcError('result_out_of_range', 'These inputs give a result too large or too small to represent; check the figures.', field);
  }
}

const presetBasisCache = new Map<string, string>();
/** "Chemistry preset <id>: <sources>." — built once per chemistry (the presets are constants). */
function presetBasis(chem: { id: string; sources: readonly string[] }): string {
  let text = presetBasisCache.get(chem.id);
  if (text === undefined) {
    text = `Chemistry preset ${chem.id}: ${chem.sources.join('; ')}.`;
    presetBasisCache.set(chem.id, text);
  }
  return text;
}

export function computePackEnergy(input: PackEnergyInput): CalcOutput<PackEnergyData> {
  const { pack, price, cycleLife } = input;
  const chem = chemistries[pack.chemistry];
  const f = packEnergyFigures(pack, input.depthOfDischargePct);
  const usableKWh = whToKwh(f.usableEnergyWh);
  const lifetimeThroughputKWh = cycleLife !== undefined ? usableKWh * cycleLife : undefined;

  const data: PackEnergyData = {
    ...(input.label !== undefined ? { label: input.label } : pack.label !== undefined ? { label: pack.label } : {}),
    chemistry: pack.chemistry,
    seriesCells: pack.seriesCells,
    nominalVoltageV: f.nominalVoltageV,
    fullChargeVoltageV: f.fullChargeVoltageV,
    cutoffVoltageV: f.cutoffVoltageV,
    capacityAh: pack.capacityAh,
    energyWh: f.energyWh,
    energyKWh: whToKwh(f.energyWh),
    depthOfDischargePct: f.depthOfDischargePct,
    usableEnergyWh: f.usableEnergyWh,
    usableEnergyKWh: usableKWh,
    ...(price ? { currency: price.currency, costPerUsableKWh: price.amount / usableKWh } : {}),
    ...(cycleLife !== undefined ? { cycleLife, lifetimeThroughputKWh } : {}),
    ...(price && lifetimeThroughputKWh !== undefined ? { costPerKWhCycled: price.amount / lifetimeThroughputKWh } : {}),
  };
  assertFiniteNumbers(data, '#/pack/capacityAh');

  const checks: Check[] = depthOfDischargeChecks(pack, f.depthOfDischargePct);
  if (price && cycleLife === undefined) {
    checks.push({
      code: 'cycle_life_missing',
      level: 'info',
      message: 'Give cycleLife (from the pack’s datasheet, at this depth of discharge) to get the cost per kWh cycled, the fairer figure for comparing chemistries.',
    });
  }
  const cautions: string[] = [];
  if (f.fullChargeVoltageV > TOUCH_SAFE_DC_LIMIT_V) {
    checks.push({
      code: 'voltage_above_60v_dc',
      level: 'warning',
      message: `At full charge this pack reaches ${round2(f.fullChargeVoltageV)} V DC, above the 60 V DC touch-safe limit: live parts must be guarded.`,
    });
    cautions.push(
      'Above 60 V DC a shock hazard exists: keep terminals covered and follow local electrical codes, the equipment maker’s instructions and licensed practice.',
    );
  }

  return {
    data,
    checks,
    cautions,
    basis: [
      'Energy = series cells × nominal cell voltage × rated Ah; usable = energy × depth of discharge (trade practice).',
      presetBasis(chem),
      ...(lifetimeThroughputKWh !== undefined ? ['Lifetime throughput = usable kWh × rated cycles; capacity fade over the life is not modelled.'] : []),
    ],
  };
}

const round2 = (v: number) => Math.round(v * 100) / 100;
