/**
 * Value comparison of 2–20 priced packs.
 *
 * Model: each option's energy, usable energy, cost per usable kWh and (with a rated cycle life) cost per kWh
 * cycled come from the pack-energy model (shared/calc/pack-energy). The ranking figure is the cost per kWh
 * cycled when every option has `cycleLife`, otherwise the cost per usable kWh (the v1 contract's rule). Lower
 * is better; ties keep the order given (a stable sort). `relativeToBest` = ranking figure ÷ the best
 * option's ranking figure (1 for the best).
 *
 * Units: Wh and kWh; prices in the one currency of every option.
 */
import { CalcError } from '../errors.ts';
import type { CalcOutput, Check } from '../types.ts';
import { assertFiniteNumbers, depthOfDischargeChecks, packEnergyFigures } from '../pack-energy/pack-energy.ts';
import type { PackCompareData, PackCompareInput } from '../../schemas/pack-compare.ts';
import { whToKwh } from '../units.ts';

export function computePackCompare(input: PackCompareInput): CalcOutput<PackCompareData> {
  const { options } = input;
  if (options.length < 2) throw new CalcError('too_few_options', 'Compare at least two options.', '#/options');
  const currency = options[0]!.price.currency;
  options.forEach((o, i) => {
    if (o.price.currency !== currency) {
      throw new CalcError('mixed_currencies', `Every option must be priced in one currency; option 0 is in ${currency}, option ${i} in ${o.price.currency}.`, `#/options/${i}/price/currency`);
    }
    if (o.price.amount === 0) {
      throw new CalcError('zero_price', `Option ${i} (“${o.label}”) has a price of zero, which cannot be compared per kWh.`, `#/options/${i}/price/amount`);
    }
  });

  const rankedBy = options.every((o) => o.cycleLife !== undefined) ? 'costPerKWhCycled' : 'costPerUsableKWh';
  const checks: Check[] = [];

  const evaluated = options.map((o, index) => {
    const f = packEnergyFigures(o.pack, o.depthOfDischargePct);
    const usableKWh = whToKwh(f.usableEnergyWh);
    const lifetimeThroughputKWh = o.cycleLife !== undefined ? usableKWh * o.cycleLife : undefined;
    const costPerUsableKWh = o.price.amount / usableKWh;
    const costPerKWhCycled = lifetimeThroughputKWh !== undefined ? o.price.amount / lifetimeThroughputKWh : undefined;
    checks.push(...depthOfDischargeChecks(o.pack, f.depthOfDischargePct, `“${o.label}”`));
    const figure = rankedBy === 'costPerKWhCycled' ? costPerKWhCycled! : costPerUsableKWh;
    return {
      index,
      figure,
      option: {
        label: o.label,
        energyWh: f.energyWh,
        energyKWh: whToKwh(f.energyWh),
        depthOfDischargePct: f.depthOfDischargePct,
        usableEnergyWh: f.usableEnergyWh,
        usableEnergyKWh: usableKWh,
        price: { amount: o.price.amount, currency: o.price.currency },
        costPerUsableKWh,
        ...(o.cycleLife !== undefined ? { cycleLife: o.cycleLife, lifetimeThroughputKWh, costPerKWhCycled } : {}),
      },
    };
  });
  evaluated.forEach((e) => assertFiniteNumbers(e, `#/options/${e.index}/pack/capacityAh`));

  // Array.prototype.sort is stable (ES2019), so equal figures keep the order given.
  const ranked = [...evaluated].sort((a, b) => a.figure - b.figure);
  const best = ranked[0]!.figure;
  const rankedOptions = ranked.map((e, i) => ({ rank: i + 1, ...e.option, relativeToBest: e.figure / best }));
  // A price so small against the energy that the figure underflows leaves nothing to compare against.
  if (!(best > 0)) {
    throw new CalcError('figure_out_of_range', 'This option’s cost per kWh is too small to compare against.', `#/options/${ranked[0]!.index}/price/amount`);
  }
  assertFiniteNumbers(rankedOptions, `#/options/${ranked[0]!.index}/price/amount`);

  const labels = new Set<string>();
  options.forEach((o) => {
    if (labels.has(o.label)) {
      checks.push({ code: 'duplicate_label', level: 'info', message: `Two options are labelled “${o.label}”; the ranking may be hard to read.` });
    }
    labels.add(o.label);
  });
  if (rankedBy === 'costPerUsableKWh' && options.some((o) => o.cycleLife !== undefined)) {
    checks.push({
      code: 'cycle_life_incomplete',
      level: 'info',
      message: 'Only some options have a cycleLife, so they are ranked by cost per usable kWh; give every option a cycleLife to rank by cost per kWh cycled.',
    });
  }

  return {
    data: {
      rankedBy,
      currency,
      options: rankedOptions,
    },
    checks,
    cautions: [],
    basis: [
      'Energy = series cells × nominal cell voltage × rated Ah; usable = energy × depth of discharge (trade practice).',
      rankedBy === 'costPerKWhCycled'
        ? 'Ranked by price ÷ (usable kWh × rated cycles), lowest first; capacity fade over the life is not modelled.'
        : 'Ranked by price ÷ usable kWh, lowest first.',
    ],
  };
}
