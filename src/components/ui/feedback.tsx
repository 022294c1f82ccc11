import type { ReactNode } from 'react';

type Tone = 'info' | 'ok' | 'warn' | 'danger';
const tones: Record<Tone, string> = {
  info: 'border-line bg-paper-deep text-graphite',
  ok: 'border-ok/40 bg-[#eef5ef] text-ok',
  warn: 'border-warn/40 bg-[#fbf3e2] text-warn',
  danger: 'border-danger/40 bg-[#fbecea] text-danger',
};

/** A message box; errors are announced (role=alert), the rest politely (role=status). */
export function Alert({ tone = 'info', title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`rounded-md border px-4 py-3 text-sm ${tones[tone]}`}>
      {title ? <p className="font-semibold">{title}</p> : null}
      {children ? <div className={title ? 'mt-1' : ''}>{children}</div> : null}
    </div>
  );
}

export function LoadingState({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-2 py-6 text-sm text-graphite-soft">
      <span aria-hidden="true" className="h-4 w-4 animate-spin rounded-full border-2 border-copper border-t-transparent" />
      {label}
    </div>
  );
}

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-line bg-paper-deep px-5 py-6">
      <p className="font-medium">{title}</p>
      {children ? <div className="mt-1 text-sm text-graphite-soft">{children}</div> : null}
    </div>
  );
}

export function ErrorState({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  const detail = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <div role="alert" className="rounded-md border border-danger/40 bg-[#fbecea] px-4 py-3 text-sm text-danger">
      <p className="font-semibold">This could not be loaded.</p>
      <p className="mt-1">{detail}</p>
      {onRetry ? (
        <button type="button" onClick={onRetry} className="mt-2 min-h-9 font-medium underline underline-offset-2">
          Try again
        </button>
      ) : null}
    </div>
  );
}

/** A page's title and summary. */
export function PageHeader({ title, summary, actions }: { title: string; summary?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 id="page-title" className="text-2xl font-semibold tracking-tight">
          {title}
        </h1>
        {summary ? <p className="mt-1 max-w-2xl text-graphite-soft">{summary}</p> : null}
      </div>
      {actions}
    </header>
  );
}

export function Panel({ title, children, tone = 'plain' }: { title: string; children: ReactNode; tone?: 'plain' | 'danger' }) {
  const id = `panel-${title.toLowerCase().replace(/[^a-z0-9]+/g, '-')}`;
  return (
    <section aria-labelledby={id} className={`rounded-lg border bg-white/60 p-5 ${tone === 'danger' ? 'border-danger/40' : 'border-line'}`}>
      <h2 id={id} className={`text-lg font-semibold ${tone === 'danger' ? 'text-danger' : ''}`}>
        {title}
      </h2>
      <div className="mt-3">{children}</div>
    </section>
  );
}

/** A date and time in the viewer's locale, in the mono face, with the exact instant on hover. */
export function Time({ iso }: { iso: string }) {
  const date = new Date(iso);
  return (
    <time dateTime={iso} title={date.toISOString()} className="font-mono text-sm">
      {date.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}
    </time>
  );
}
