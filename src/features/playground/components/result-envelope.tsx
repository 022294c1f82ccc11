import type { Envelope } from '../definition.ts';

const levels = [
  { level: 'danger', title: 'Danger', box: 'border-danger/50 bg-[#fbecea]', text: 'text-danger' },
  { level: 'warning', title: 'Warning', box: 'border-warn/50 bg-[#fbf3e2]', text: 'text-warn' },
  { level: 'info', title: 'Note', box: 'border-line bg-paper-deep', text: 'text-graphite' },
] as const;

/** The result's checks, grouped by level, most severe first. */
export function Checks({ checks }: { checks: Envelope['checks'] }) {
  if (checks.length === 0) return <p className="text-sm text-graphite-soft">No checks were raised for these inputs.</p>;
  return (
    <div className="space-y-3">
      {levels.map(({ level, title, box, text }) => {
        const items = checks.filter((c) => c.level === level);
        if (items.length === 0) return null;
        return (
          <section key={level} aria-label={`${title} checks`} className={`rounded-md border px-4 py-3 ${box}`}>
            <h4 className={`text-sm font-semibold ${text}`}>
              {title} ({items.length})
            </h4>
            <ul className="mt-1 space-y-1 text-sm text-graphite">
              {items.map((c) => (
                <li key={c.code + c.message}>
                  {c.message} <span className="font-mono text-xs text-graphite-soft">{c.code}</span>
                </li>
              ))}
            </ul>
          </section>
        );
      })}
    </div>
  );
}

/** Safety cautions: always shown in full next to a result, never folded away. */
export function Cautions({ cautions }: { cautions: string[] }) {
  if (cautions.length === 0) return null;
  return (
    <section aria-labelledby="cautions-title" className="rounded-lg border-2 border-warn/60 bg-[#fbf3e2] px-4 py-3">
      <h3 id="cautions-title" className="text-sm font-semibold text-warn">
        Cautions
      </h3>
      <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-graphite">
        {cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}

export function Basis({ basis }: { basis: string[] }) {
  if (basis.length === 0) return null;
  return (
    <section aria-labelledby="basis-title">
      <h3 id="basis-title" className="text-sm font-semibold">
        How this was worked out
      </h3>
      <ol className="mt-1 list-decimal space-y-1 pl-5 text-sm text-graphite-soft">
        {basis.map((b) => (
          <li key={b}>{b}</li>
        ))}
      </ol>
    </section>
  );
}
