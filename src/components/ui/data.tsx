import type { ReactNode } from 'react';
import { formatNumber } from '../../lib/format.ts';

/** A number in the mono face, with its unit in the text face. */
export function Num({ value, unit, maxDecimals, significant }: { value: number | null | undefined; unit?: string; maxDecimals?: number; significant?: number }) {
  return (
    <span className="whitespace-nowrap">
      <span className="font-mono">{formatNumber(value, { maxDecimals, significant })}</span>
      {unit && value !== null && value !== undefined ? <span className="ml-1 text-graphite-soft">{unit}</span> : null}
    </span>
  );
}

/** One figure of a result: what it is, its value, and a line on how to read it. */
export function Stat({ label, children, note, emphasis = false }: { label: string; children: ReactNode; note?: ReactNode; emphasis?: boolean }) {
  return (
    <div className={`rounded-lg border p-4 ${emphasis ? 'border-copper/50 bg-copper-wash/60' : 'border-line bg-white/70'}`}>
      <dt className="text-sm text-graphite-soft">{label}</dt>
      <dd className={`mt-1 ${emphasis ? 'text-2xl' : 'text-xl'} font-medium`}>{children}</dd>
      {note ? <dd className="mt-1 text-xs text-graphite-soft">{note}</dd> : null}
    </div>
  );
}

export function StatGrid({ children, label }: { children: ReactNode; label?: string }) {
  return (
    <dl aria-label={label} className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
      {children}
    </dl>
  );
}

/** A small status word with a tone (verdicts, key states). Text, not colour alone, carries the meaning. */
export function Badge({ tone = 'info', children }: { tone?: 'info' | 'ok' | 'warn' | 'danger'; children: ReactNode }) {
  const tones = {
    info: 'border-line bg-paper-deep text-graphite',
    ok: 'border-ok/40 bg-[#eef5ef] text-ok',
    warn: 'border-warn/40 bg-[#fbf3e2] text-warn',
    danger: 'border-danger/40 bg-[#fbecea] text-danger',
  } as const;
  return <span className={`inline-flex items-center rounded-full border px-2.5 py-0.5 text-xs font-semibold uppercase tracking-wide ${tones[tone]}`}>{children}</span>;
}
