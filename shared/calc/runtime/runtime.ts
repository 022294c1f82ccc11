/**
 * Runtime of AC and DC loads from a battery, the AC loads through an inverter.
 *
 * Model (energy balance at the battery, trade practice):
 * - average AC load P_ac = Σ powerW × dutyCyclePct / 100 over the AC loads; likewise P_dc for DC loads;
 * - battery power P_batt = P_ac ÷ (inverterEfficiencyPct / 100) + P_dc + idleDrawW;
 * - runtime (h) = usable energy (Wh) ÷ P_batt (W);
 * - battery current (A) = P_batt ÷ nominal voltage (pack nominal, or `nominalVoltageV` with `usableEnergyWh`);
 *   the peak figures assume every load on at once, which is what wires and fuses must carry.
 * With a pack, usable energy = nominal energy × the share of capacity between the present state of charge
 * (`stateOfChargePct`, or `restingVoltageV` on the chemistry's OCV curve, else 100 %) and the floor
 * 100 − depthOfDischargePct.
 *
 * Not modelled: the fall of usable capacity at high discharge rates (Peukert, 1897; significant for
 * lead-acid, whose capacity is rated at the 20-hour rate), temperature, and the sag of voltage under load.
 * A check says when the rate is high enough for this to matter.
 *
 * Defaults: inverter efficiency 90 % (common practice, no published source: off-grid inverters run about
 * 85–95 % at moderate load); duty cycle 100 %; loads are AC unless `ac: false`.
 * Units: W, Wh, V, A, hours.
 */
import type { CalcOutput, Check } from '../types.ts';
import { CalcError } from '../errors.ts';
import { packPresentState } from '../chemistry/pack.ts';
import { chemistries } from '../chemistry/presets.ts';
import { assertFiniteNumbers, depthOfDischargeChecks, packEnergyFigures } from '../pack-energy/pack-energy.ts';
import type { RuntimeData, RuntimeInput } from '../../schemas/runtime.ts';
import { whToKwh } from '../units.ts';

/** Common practice (no published source). */
export const DEFAULT_INVERTER_EFFICIENCY_PCT = 90;

/** The rate at which lead-acid capacity is usually rated: the 20-hour rate, 0.05C (trade practice). */
const LEAD_ACID_RATING_C = 0.05;

export function computeRuntime(input: RuntimeInput): CalcOutput<RuntimeData> {
  const efficiency = (input.inverterEfficiencyPct ?? DEFAULT_INVERTER_EFFICIENCY_PCT) / 100;
  const idleDrawW = input.idleDrawW ?? 0;
  const checks: Check[] = [];
  const basis: string[] = [
    'Battery power = Σ AC load × duty cycle ÷ inverter efficiency + Σ DC load × duty cycle + idle draw; runtime = usable Wh ÷ battery W.',
  ];

  let usableEnergyWh: number;
  let nominalVoltageV: number | undefined;
  if (input.pack) {
    const pack = input.pack;
    const f = packEnergyFigures(pack, input.depthOfDischargePct);
    const { stateOfChargePct } = packPresentState(pack, 100);
    const floorPct = 100 - f.depthOfDischargePct;
    const availablePct = Math.max(0, stateOfChargePct - floorPct);
    usableEnergyWh = (f.energyWh * availablePct) / 100;
    nominalVoltageV = f.nominalVoltageV;
    checks.push(...depthOfDischargeChecks(pack, f.depthOfDischargePct));
    if (availablePct === 0) {
      checks.push({
        code: 'no_usable_energy',
        level: 'warning',
        message: `The pack is at ${round(stateOfChargePct, 1)} %, at or below its ${round(floorPct, 1)} % floor for a ${f.depthOfDischargePct} % depth of discharge: nothing is left to use.`,
      });
    }
    basis.push(
      `Usable energy from ${round(stateOfChargePct, 1)} % down to ${round(floorPct, 1)} % of the nominal energy (series cells × nominal cell voltage × Ah); chemistry preset ${pack.chemistry}: ${chemistries[pack.chemistry].sources.join('; ')}.`,
    );
  } else if (input.usableEnergyWh !== undefined) {
    usableEnergyWh = input.usableEnergyWh;
    nominalVoltageV = input.nominalVoltageV;
  } else {
    throw new CalcError('energy_missing', 'Give usableEnergyWh or pack.', '#/usableEnergyWh');
  }

  let acLoadPowerW = 0;
  let dcLoadPowerW = 0;
  let acPeakW = 0;
  let dcPeakW = 0;
  for (const load of input.loads) {
    const duty = (load.dutyCyclePct ?? 100) / 100;
    if (load.ac ?? true) {
      acLoadPowerW += load.powerW * duty;
      acPeakW += load.powerW;
    } else {
      dcLoadPowerW += load.powerW * duty;
      dcPeakW += load.powerW;
    }
  }
  const inverterLossW = acLoadPowerW / efficiency - acLoadPowerW;
  const batteryPowerW = acLoadPowerW / efficiency + dcLoadPowerW + idleDrawW;
  const peakBatteryPowerW = acPeakW / efficiency + dcPeakW + idleDrawW;
  if (!(batteryPowerW > 0)) throw new CalcError('no_load', 'The loads draw no power, so the runtime is unbounded.', '#/loads');
  const runtimeHours = usableEnergyWh / batteryPowerW;

  const data: RuntimeData = {
    ...(input.label !== undefined ? { label: input.label } : {}),
    usableEnergyWh,
    usableEnergyKWh: whToKwh(usableEnergyWh),
    acLoadPowerW,
    dcLoadPowerW,
    inverterLossW,
    idleDrawW,
    batteryPowerW,
    ...(nominalVoltageV !== undefined ? { batteryCurrentA: batteryPowerW / nominalVoltageV } : {}),
    peakBatteryPowerW,
    ...(nominalVoltageV !== undefined ? { peakBatteryCurrentA: peakBatteryPowerW / nominalVoltageV, nominalVoltageV } : {}),
    runtimeHours,
    runtimeMinutes: runtimeHours * 60,
  };
  assertFiniteNumbers(data, input.pack ? '#/pack/capacityAh' : '#/usableEnergyWh');

  const cautions = [
    'Size wires, fuses and the battery disconnect for the peak battery current, not the average; follow local electrical codes, the equipment maker’s instructions and licensed practice.',
  ];
  if (input.pack && data.peakBatteryCurrentA !== undefined) {
    const pack = input.pack;
    const peakA = data.peakBatteryCurrentA;
    if (pack.maxContinuousDischargeA !== undefined && peakA > pack.maxContinuousDischargeA) {
      checks.push({
        code: 'discharge_current_above_rating',
        level: 'danger',
        message: `With every load on, the pack supplies about ${round(peakA, 1)} A, above its ${pack.maxContinuousDischargeA} A continuous rating: its BMS may shut it off, and cables and fuses sized for the rating will be overloaded.`,
      });
    }
    const cRate = data.batteryCurrentA! / pack.capacityAh;
    if (pack.chemistry.startsWith('lead_acid') && cRate > LEAD_ACID_RATING_C * 2) {
      checks.push({
        code: 'peukert_effect',
        level: 'warning',
        message: `Lead-acid capacity is rated at the 20-hour rate (0.05C); at about ${round(cRate, 2)}C it delivers noticeably less (Peukert’s law), so expect less runtime than shown.`,
      });
    }
    if (peakA / pack.capacityAh > 1) {
      checks.push({
        code: 'discharge_above_1c',
        level: 'warning',
        message: `The peak draw is about ${round(peakA / pack.capacityAh, 2)}C; check it against the pack’s discharge rating.`,
      });
    }
  }
  if (acLoadPowerW === 0 && idleDrawW === 0 && input.loads.every((l) => l.ac === false)) {
    checks.push({
      code: 'no_inverter',
      level: 'info',
      message: 'Every load is on DC, so no inverter loss is counted; add idleDrawW if an inverter stays on anyway.',
    });
  }

  return { data, checks, cautions, basis };
}

function round(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
