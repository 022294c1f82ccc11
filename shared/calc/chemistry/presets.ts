/**
 * Chemistry presets: per-cell voltages, default depth of discharge, coulombic efficiency, typical cycle
 * life and a rested open-circuit-voltage (OCV) curve, state of charge → cell volts.
 *
 * The per-cell nominal / full-charge / cutoff voltages are the contract values of the Ohmstead API
 * (LFP 3.2 / 3.65 / 2.5; NMC 3.7 / 4.2 / 3.0; LTO 2.4 / 2.8 / 1.5; lead-acid 2.0 / 2.4 / 1.75). Their
 * published sources are named per chemistry in `sources`. Values that are common trade practice without a
 * single published source, or that are from memory, say so beside them.
 */

export type ChemistryId = 'lfp' | 'nmc' | 'lto' | 'lead_acid_agm' | 'lead_acid_flooded';

export const chemistryIds = ['lfp', 'nmc', 'lto', 'lead_acid_agm', 'lead_acid_flooded'] as const satisfies readonly ChemistryId[];

export interface OcvPoint {
  socPct: number;
  cellVoltageV: number;
}

export interface ChemistryPreset {
  id: ChemistryId;
  name: string;
  nominalCellVoltageV: number;
  /** Charge (absorption / CV) voltage per cell. */
  fullChargeCellVoltageV: number;
  /** End-of-discharge voltage per cell under load. */
  cutoffCellVoltageV: number;
  defaultDepthOfDischargePct: number;
  /** Deepest routine depth of discharge before a warning. */
  maxRecommendedDepthOfDischargePct: number;
  /** Ah out / Ah in over a cycle, as a fraction. */
  coulombicEfficiency: number;
  /** Cycles to 80 % of rated capacity at the default depth of discharge. */
  typicalCycleLife: number;
  /** CV-phase termination current as a fraction of C (e.g. 0.05 = 0.05C). */
  terminationCurrentC: number;
  /** Rested OCV per cell, strictly increasing in both columns, 0 % and 100 % included. */
  ocvCurve: OcvPoint[];
  sources: string[];
}

const curve = (pairs: Array<[number, number]>): OcvPoint[] => pairs.map(([socPct, cellVoltageV]) => ({ socPct, cellVoltageV }));

/**
 * BCI rested OCV vs state of charge for a 12 V lead-acid battery at 26.7 °C (80 °F), divided by 6 cells:
 * 100 % 12.65 V, 75 % 12.45 V, 50 % 12.24 V, 25 % 12.06 V, 0 % 11.89 V (published SoC-measurement document).
 * AGM and flooded batteries share it.
 */
const leadAcidOcvCurve = curve([
  [0, 11.89 / 6],
  [25, 12.06 / 6],
  [50, 12.24 / 6],
  [75, 12.45 / 6],
  [100, 12.65 / 6],
]);

export const chemistries: Record<ChemistryId, ChemistryPreset> = {
  lfp: {
    id: 'lfp',
    name: 'Lithium iron phosphate (LFP, LiFePO₄/graphite)',
    nominalCellVoltageV: 3.2,
    fullChargeCellVoltageV: 3.65,
    cutoffCellVoltageV: 2.5,
    defaultDepthOfDischargePct: 80, // common practice (no published source): cycle-life ratings are usually quoted at 80 % DoD
    maxRecommendedDepthOfDischargePct: 100,
    coulombicEfficiency: 0.99, // from memory
    typicalCycleLife: 3000, // from memory: typical cell datasheet rating at 80 % DoD
    terminationCurrentC: 0.05, // prismatic LFP cell datasheet: "1C CC, CV 3.65 V, 0.05C cut-off"
    // Pseudo-OCV breakpoints of an LFP 18650 cell, C/32 at room temperature: Sunil, Pattipati, Balasingam,
    // "Piecewise Linear Approximation of Battery Open-Circuit Voltage Characteristics Using Dynamic
    // Programming", IEEE Trans. Instrum. Meas., 2025 (breakpoints as published in the paper's repository README).
    ocvCurve: curve([
      [0, 2.0102],
      [0.33, 2.4177],
      [1.17, 2.7405],
      [2.67, 2.9299],
      [5.34, 3.0872],
      [8.85, 3.1942],
      [29.72, 3.2772],
      [98.33, 3.3511],
      [99.5, 3.418],
      [100, 3.5981],
    ]),
    sources: [
      'LFP cell datasheets (26650 and prismatic): 3.2 V nominal, 3.65 V CC/CV charge limit, 2.5 V discharge cut-off',
      'Sunil, Pattipati, Balasingam, IEEE Trans. Instrum. Meas. (2025): LFP 18650 pseudo-OCV breakpoints (C/32)',
    ],
  },
  nmc: {
    id: 'nmc',
    name: 'Lithium nickel manganese cobalt oxide (NMC)',
    nominalCellVoltageV: 3.7,
    fullChargeCellVoltageV: 4.2,
    cutoffCellVoltageV: 3.0,
    defaultDepthOfDischargePct: 80, // common practice (no published source)
    maxRecommendedDepthOfDischargePct: 90, // common practice (no published source)
    coulombicEfficiency: 0.99, // from memory
    typicalCycleLife: 1000, // from memory
    terminationCurrentC: 0.03, // Li-ion guidance: "full" when current falls to about 3 % of rating (Battery University BU-409, secondary)
    // NMC 21700 pseudo-OCV breakpoints (C/32), same paper as LFP: Sunil et al., IEEE TIM 2025.
    ocvCurve: curve([
      [0, 2.5061],
      [1.51, 2.8981],
      [4.52, 3.1461],
      [9.55, 3.3231],
      [15.08, 3.4218],
      [29.15, 3.5737],
      [45.73, 3.7017],
      [83.42, 4.0637],
      [94.97, 4.1009],
      [100, 4.1932],
    ]),
    sources: [
      'Li-ion (NMC) cell datasheets: 3.6–3.7 V nominal, 4.2 V charge limit, 2.5–3.0 V cut-off',
      'Sunil, Pattipati, Balasingam, IEEE Trans. Instrum. Meas. (2025): NMC 21700 pseudo-OCV breakpoints (C/32)',
    ],
  },
  lto: {
    id: 'lto',
    name: 'Lithium titanate (LTO)',
    nominalCellVoltageV: 2.4,
    fullChargeCellVoltageV: 2.8,
    cutoffCellVoltageV: 1.5,
    defaultDepthOfDischargePct: 90, // common practice (no published source)
    maxRecommendedDepthOfDischargePct: 100,
    coulombicEfficiency: 0.995, // from memory
    typicalCycleLife: 10000, // from memory
    terminationCurrentC: 0.05, // common practice (no published source)
    // From memory: the usual shape of an LTO cell's rested OCV (flat near 2.2–2.5 V). No published table found.
    ocvCurve: curve([
      [0, 1.9],
      [5, 2.1],
      [10, 2.2],
      [20, 2.25],
      [30, 2.28],
      [40, 2.31],
      [50, 2.34],
      [60, 2.37],
      [70, 2.4],
      [80, 2.44],
      [90, 2.5],
      [95, 2.56],
      [100, 2.7],
    ]),
    sources: ['LTO cell datasheets: 2.3–2.4 V nominal, 2.7–2.8 V charge limit, 1.5 V cut-off (from memory)', 'OCV curve: from memory (no published table found)'],
  },
  lead_acid_agm: {
    id: 'lead_acid_agm',
    name: 'Lead-acid, absorbed glass mat (AGM)',
    nominalCellVoltageV: 2.0,
    fullChargeCellVoltageV: 2.4,
    cutoffCellVoltageV: 1.75,
    defaultDepthOfDischargePct: 50, // common practice (no published source)
    maxRecommendedDepthOfDischargePct: 80, // common practice (no published source)
    coulombicEfficiency: 0.9, // from memory: lead-acid charge efficiency 85–95 %
    typicalCycleLife: 500, // from memory, at 50 % DoD
    terminationCurrentC: 0.02, // common practice (no published source): absorption ends near 2 % of C
    ocvCurve: leadAcidOcvCurve,
    sources: [
      'Lead-acid practice: 2.0 V/cell nominal, about 2.40 V/cell absorption, 1.75 V/cell end of discharge',
      'BCI open-circuit voltage vs state-of-charge table for 12 V lead-acid at 80 °F (26.7 °C)',
    ],
  },
  lead_acid_flooded: {
    id: 'lead_acid_flooded',
    name: 'Lead-acid, flooded',
    nominalCellVoltageV: 2.0,
    fullChargeCellVoltageV: 2.4,
    cutoffCellVoltageV: 1.75,
    defaultDepthOfDischargePct: 50, // common practice (no published source)
    maxRecommendedDepthOfDischargePct: 80, // common practice (no published source)
    coulombicEfficiency: 0.85, // from memory
    typicalCycleLife: 400, // from memory, at 50 % DoD
    terminationCurrentC: 0.02, // common practice (no published source)
    ocvCurve: leadAcidOcvCurve,
    sources: [
      'Lead-acid practice: 2.0 V/cell nominal, about 2.40 V/cell absorption, 1.75 V/cell end of discharge',
      'BCI open-circuit voltage vs state-of-charge table for 12 V lead-acid at 80 °F (26.7 °C)',
    ],
  },
};

export function getChemistry(id: ChemistryId): ChemistryPreset {
  return chemistries[id];
}
