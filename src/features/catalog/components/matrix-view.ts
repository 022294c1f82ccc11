/** The matrix table's filters and its CSV download (pure). */
import type { CompatibilityMatrixData } from '#shared/schemas/compatibility-matrix.ts';

export interface MatrixFilter {
  verdict: '' | 'compatible' | 'limited' | 'incompatible';
  host: string;
  pack: string;
}

export interface MatrixRow {
  host: string;
  hostSku: string;
  pack: string;
  packSku: string;
  verdict: string;
  method: string;
  dcInputVerdict: string;
  powerAtFullW: number | null;
  addedEnergyWh: number | null;
  hoursToTransfer: number | null;
  directParallelVerdict: string;
}

export function matrixRows(data: CompatibilityMatrixData, filter: MatrixFilter): MatrixRow[] {
  return data.pairs
    .map((pair) => {
      const host = data.hosts[pair.hostIndex]!;
      const pack = data.packs[pair.packIndex]!;
      const dc = pair.methods.find((m) => m.method === 'dc_input');
      const direct = pair.methods.find((m) => m.method === 'direct_parallel');
      return {
        host: host.label,
        hostSku: host.sku ?? '',
        pack: pack.label,
        packSku: pack.sku ?? '',
        verdict: pair.verdict,
        method: pair.method,
        dcInputVerdict: dc?.verdict ?? '',
        powerAtFullW: dc?.inputPowerWAtFull ?? null,
        addedEnergyWh: dc?.addedEnergyWh ?? direct?.addedEnergyWh ?? null,
        hoursToTransfer: dc?.hoursToTransfer ?? null,
        directParallelVerdict: direct?.verdict ?? '',
      };
    })
    .filter((r) => (!filter.verdict || r.verdict === filter.verdict) && (!filter.host || r.hostSku === filter.host) && (!filter.pack || r.packSku === filter.pack));
}

const columns: Array<[keyof MatrixRow, string]> = [
  ['hostSku', 'hostSku'],
  ['host', 'host'],
  ['packSku', 'packSku'],
  ['pack', 'pack'],
  ['verdict', 'verdict'],
  ['method', 'method'],
  ['dcInputVerdict', 'dcInputVerdict'],
  ['powerAtFullW', 'inputPowerWAtFull'],
  ['addedEnergyWh', 'addedEnergyWh'],
  ['hoursToTransfer', 'hoursToTransfer'],
  ['directParallelVerdict', 'directParallelVerdict'],
];

/** RFC 4180 CSV of the rows shown (quotes doubled; formulas neutralised as in the catalog export). */
export function matrixCsv(rows: MatrixRow[]): string {
  const cell = (v: unknown) => {
    let s = v === null || v === undefined ? '' : String(v);
    if (typeof v === 'string' && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
    return /[",\r\n]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s;
  };
  return [columns.map(([, h]) => h).join(','), ...rows.map((r) => columns.map(([k]) => cell(r[k])).join(','))].join('\r\n') + '\r\n';
}
