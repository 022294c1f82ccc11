import { useId, useMemo, useState } from 'react';
import type { CompatibilityMatrixData } from '#shared/schemas/compatibility-matrix.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { EmptyState, ErrorState, LoadingState } from '../../../components/ui/feedback.tsx';
import { useMatrix } from '../api/get-matrix.ts';
import { matrixCsv, matrixRows, type MatrixFilter } from './matrix-view.ts';
import { TableScroll } from '../../../components/ui/table-scroll.tsx';

const verdictStyle = { compatible: 'bg-ok text-white', limited: 'bg-warn text-white', incompatible: 'bg-danger text-white' } as const;
const fmt = (n: number | null, digits = 0) => (n === null ? '—' : n.toLocaleString(undefined, { maximumFractionDigits: digits }));

/** Every host unit × pack of the catalog with its verdict; filters and a CSV of what is shown. */
export function MatrixPanel({ enabled }: { enabled: boolean }) {
  const matrix = useMatrix(enabled);
  if (!enabled) return <EmptyState title="Add at least one host unit and one pack to see the matrix." />;
  if (matrix.isPending) return <LoadingState label="Checking every pair…" />;
  if (matrix.isError) return <ErrorState error={matrix.error} onRetry={() => void matrix.refetch()} />;
  return <MatrixTable data={matrix.data.data} cautions={matrix.data.cautions} />;
}

function MatrixTable({ data, cautions }: { data: CompatibilityMatrixData; cautions: string[] }) {
  const [filter, setFilter] = useState<MatrixFilter>({ verdict: '', host: '', pack: '' });
  const rows = useMemo(() => matrixRows(data, filter), [data, filter]);
  const statusId = useId();
  const download = () => {
    const url = URL.createObjectURL(new Blob([matrixCsv(rows)], { type: 'text/csv' }));
    const a = document.createElement('a');
    a.href = url;
    a.download = 'compatibility-matrix.csv';
    a.click();
    URL.revokeObjectURL(url);
  };
  return (
    <div className="space-y-4">
      <p className="text-sm text-graphite-soft">
        {data.counts.compatible} compatible, {data.counts.limited} limited, {data.counts.incompatible} not compatible (packs taken at full charge; a pair's verdict is the best of its ways of
        connecting).
      </p>
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField
          label="Verdict"
          name="verdict"
          value={filter.verdict}
          onChange={(e) => setFilter((f) => ({ ...f, verdict: e.target.value as MatrixFilter['verdict'] }))}
          options={[{ value: '', label: 'All verdicts' }, { value: 'compatible', label: 'Compatible' }, { value: 'limited', label: 'Limited' }, { value: 'incompatible', label: 'Not compatible' }]}
        />
        <SelectField label="Host unit" name="host" value={filter.host} onChange={(e) => setFilter((f) => ({ ...f, host: e.target.value }))} options={[{ value: '', label: 'All host units' }, ...data.hosts.map((h) => ({ value: h.sku ?? '', label: h.label }))]} />
        <SelectField label="Pack" name="pack" value={filter.pack} onChange={(e) => setFilter((f) => ({ ...f, pack: e.target.value }))} options={[{ value: '', label: 'All packs' }, ...data.packs.map((p) => ({ value: p.sku ?? '', label: p.label }))]} />
      </div>
      <div className="flex items-center gap-3">
        <Button tone="secondary" onClick={download}>
          Download these rows as CSV
        </Button>
        <span id={statusId} role="status" className="text-sm text-graphite-soft">
          {rows.length} of {data.pairs.length} pairs shown
        </span>
      </div>
      <TableScroll label="Compatibility matrix">
        <table className="w-full min-w-[44rem] text-left text-sm" aria-describedby={statusId}>
          <caption className="sr-only">Compatibility of each host unit with each pack</caption>
          <thead className="border-b border-line text-graphite-soft">
            <tr>
              <th scope="col" className="py-2 pr-3 font-medium">Host unit</th>
              <th scope="col" className="py-2 pr-3 font-medium">Pack</th>
              <th scope="col" className="py-2 pr-3 font-medium">Verdict</th>
              <th scope="col" className="py-2 pr-3 font-medium">How</th>
              <th scope="col" className="py-2 pr-3 text-right font-medium">Power at full (W)</th>
              <th scope="col" className="py-2 pr-3 text-right font-medium">Energy added (Wh)</th>
              <th scope="col" className="py-2 text-right font-medium">Hours</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={`${r.hostSku}|${r.packSku}`} className="border-b border-line/60">
                <th scope="row" className="py-2 pr-3 font-normal">{r.host}</th>
                <td className="py-2 pr-3">{r.pack}</td>
                <td className="py-2 pr-3">
                  <span className={`rounded-full px-2 py-0.5 text-xs font-semibold ${verdictStyle[r.verdict as keyof typeof verdictStyle]}`}>{r.verdict}</span>
                </td>
                <td className="py-2 pr-3">{r.method === 'dc_input' ? 'DC input' : 'Onto its battery'}</td>
                <td className="py-2 pr-3 text-right font-mono">{fmt(r.powerAtFullW)}</td>
                <td className="py-2 pr-3 text-right font-mono">{fmt(r.addedEnergyWh)}</td>
                <td className="py-2 text-right font-mono">{fmt(r.hoursToTransfer, 1)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </TableScroll>
      <details className="text-sm text-graphite-soft">
        <summary className="cursor-pointer">Safety cautions that come with these results</summary>
        <ul className="mt-2 list-disc pl-5">{cautions.map((c) => <li key={c}>{c}</li>)}</ul>
      </details>
    </div>
  );
}
