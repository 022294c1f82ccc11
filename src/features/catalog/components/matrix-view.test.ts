import { describe, expect, it } from 'vitest';
import type { CompatibilityMatrixData } from '#shared/schemas/compatibility-matrix.ts';
import { matrixCsv, matrixRows } from './matrix-view.ts';

const pack = { source: 'catalog' as const, nominalVoltageV: 51.2, fullChargeVoltageV: 58.4, cutoffVoltageV: 40, stateOfChargePct: 100, storedEnergyWh: 2600 };
const data: CompatibilityMatrixData = {
  hosts: [{ label: 'Unit, "one"', sku: 'H-1', source: 'catalog' }],
  packs: [{ ...pack, label: 'Pack A', sku: 'P-A' }, { ...pack, label: '=Pack B', sku: 'P-B' }],
  pairs: [
    { hostIndex: 0, packIndex: 0, verdict: 'compatible', method: 'dc_input', methods: [{ method: 'dc_input', verdict: 'compatible', inputPowerWAtFull: 500, addedEnergyWh: 2300, hoursToTransfer: 5.2, reasons: [] }], checks: [] },
    { hostIndex: 0, packIndex: 1, verdict: 'incompatible', method: 'dc_input', methods: [{ method: 'dc_input', verdict: 'incompatible', reasons: [] }], checks: [] },
  ],
  counts: { compatible: 1, limited: 0, incompatible: 1 },
};

describe('the matrix table', () => {
  it('when filtered by verdict, host or pack, then only matching pairs remain', () => {
    expect(matrixRows(data, { verdict: '', host: '', pack: '' })).toHaveLength(2);
    expect(matrixRows(data, { verdict: 'incompatible', host: '', pack: '' }).map((r) => r.packSku)).toEqual(['P-B']);
    expect(matrixRows(data, { verdict: '', host: 'H-1', pack: 'P-A' }).map((r) => r.verdict)).toEqual(['compatible']);
  });

  it('when exported, then the CSV quotes what it must and neutralises formulas', () => {
    const csv = matrixCsv(matrixRows(data, { verdict: '', host: '', pack: '' }));
    const lines = csv.split('\r\n');
    expect(lines[0]).toBe('hostSku,host,packSku,pack,verdict,method,dcInputVerdict,inputPowerWAtFull,addedEnergyWh,hoursToTransfer,directParallelVerdict');
    expect(lines[1]).toBe('H-1,"Unit, ""one""",P-A,Pack A,compatible,dc_input,compatible,500,2300,5.2,');
    expect(lines[2]).toBe(`H-1,"Unit, ""one""",P-B,'=Pack B,incompatible,dc_input,incompatible,,,,`);
  });
});
