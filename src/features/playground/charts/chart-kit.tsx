/** What every chart shares: colours with enough contrast on the paper background, a frame with a caption, and the data as a table. */
import type { ReactNode } from 'react';
import { formatNumber } from '../../../lib/format.ts';

// Each ≥ 3:1 against white (WCAG 2.2 1.4.11 for graphics); lines are also told apart by dash and legend.
export const colors = {
  copper: '#a85a23',
  graphite: '#2b2a28',
  green: '#2f6b3f',
  blue: '#2f5d8a',
  danger: '#a3261b',
  warn: '#8a5a00',
  passing: '#4f7d5c',
  failing: '#8c857b',
  grid: '#ddd5c8',
} as const;

export const axisStyle = { fontSize: 12, fill: '#57534d', fontFamily: 'JetBrains Mono, ui-monospace, monospace' };

/** At most `max` points, evenly picked, always keeping the last. */
export function downsample<T>(points: readonly T[], max: number): T[] {
  if (points.length <= max) return [...points];
  const step = (points.length - 1) / (max - 1);
  return Array.from({ length: max }, (_, i) => points[Math.round(i * step)]!);
}

export interface TableColumn<T> {
  label: string;
  value: (row: T) => number | string | null | undefined;
}

export function ChartFrame<T>({ title, description, children, rows, columns }: { title: string; description: ReactNode; children: ReactNode; rows: readonly T[]; columns: TableColumn<T>[] }) {
  const shown = downsample(rows, 25);
  return (
    <figure className="rounded-lg border border-line bg-white/80 p-4" data-chart={title}>
      <figcaption>
        <p className="text-sm font-semibold">{title}</p>
        <p className="text-xs text-graphite-soft">{description}</p>
      </figcaption>
      <div className="mt-3 h-72 w-full">{children}</div>
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer text-copper">Show the data as a table{rows.length > shown.length ? ` (${shown.length} of ${rows.length} points)` : ''}</summary>
        <div className="mt-2 max-h-64 overflow-auto">
          <table className="w-full text-right text-xs">
            <thead>
              <tr>
                {columns.map((c) => (
                  <th key={c.label} scope="col" className="px-2 py-1 font-medium">
                    {c.label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody className="font-mono">
              {shown.map((row, i) => (
                <tr key={i} className="border-t border-line">
                  {columns.map((c) => {
                    const v = c.value(row);
                    return (
                      <td key={c.label} className="px-2 py-1">
                        {typeof v === 'number' ? formatNumber(v) : (v ?? '—')}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </figure>
  );
}
