import { useEffect, useId, useRef, useState, type KeyboardEvent } from 'react';

/** Copies text to the clipboard and says so (for assistive technology too). */
export function CopyButton({ text, label = 'Copy', className = '' }: { text: string; label?: string; className?: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  const timer = useRef<number | undefined>(undefined);
  useEffect(() => () => window.clearTimeout(timer.current), []);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(text);
      setState('copied');
    } catch {
      setState('failed');
    }
    window.clearTimeout(timer.current);
    timer.current = window.setTimeout(() => setState('idle'), 2500);
  };
  return (
    <button
      type="button"
      onClick={() => void copy()}
      className={`min-h-8 rounded-md border border-line bg-white px-3 py-1 text-sm font-medium text-graphite hover:bg-paper-deep ${className}`}
    >
      <span aria-live="polite">{state === 'copied' ? 'Copied' : state === 'failed' ? 'Copy failed: select the text' : label}</span>
    </button>
  );
}

/** Preformatted code with a copy button above it. */
export function CodeBlock({ code, label }: { code: string; label: string }) {
  return (
    <div className="overflow-hidden rounded-lg bg-graphite">
      <div className="flex items-center justify-between gap-2 border-b border-white/10 px-4 py-1.5">
        <span className="text-xs text-[#d8d1c6]">{label}</span>
        <CopyButton text={code} label="Copy" />
      </div>
      <pre aria-label={label} tabIndex={0} className="overflow-x-auto p-4 font-mono text-[13px] leading-relaxed text-[#f3eee6]">
        <code>{code}</code>
      </pre>
    </div>
  );
}

/** Code in several languages behind tabs (WAI-ARIA tabs pattern: arrow keys move between tabs). */
export function CodeTabs({ label, snippets }: { label: string; snippets: ReadonlyArray<{ id: string; label: string; code: string }> }) {
  const [active, setActive] = useState(snippets[0]?.id ?? '');
  const base = useId();
  const tabs = useRef<Array<HTMLButtonElement | null>>([]);
  const onKeyDown = (e: KeyboardEvent, index: number) => {
    const next = e.key === 'ArrowRight' ? index + 1 : e.key === 'ArrowLeft' ? index - 1 : e.key === 'Home' ? 0 : e.key === 'End' ? snippets.length - 1 : null;
    if (next === null) return;
    e.preventDefault();
    const i = (next + snippets.length) % snippets.length;
    setActive(snippets[i]!.id);
    tabs.current[i]?.focus();
  };
  const current = snippets.find((s) => s.id === active) ?? snippets[0];
  return (
    <div>
      <div role="tablist" aria-label={label} className="flex gap-1 border-b border-line">
        {snippets.map((s, i) => (
          <button
            key={s.id}
            ref={(el) => {
              tabs.current[i] = el;
            }}
            type="button"
            role="tab"
            id={`${base}-tab-${s.id}`}
            aria-selected={s.id === current?.id}
            aria-controls={`${base}-panel`}
            tabIndex={s.id === current?.id ? 0 : -1}
            onClick={() => setActive(s.id)}
            onKeyDown={(e) => onKeyDown(e, i)}
            className={`-mb-px min-h-9 border-b-2 px-3 py-2 text-sm ${s.id === current?.id ? 'border-copper font-medium text-copper' : 'border-transparent text-graphite-soft hover:text-graphite'}`}
          >
            {s.label}
          </button>
        ))}
      </div>
      {current ? (
        <div role="tabpanel" id={`${base}-panel`} aria-labelledby={`${base}-tab-${current.id}`} className="pt-3">
          <CodeBlock code={current.code} label={`${current.label} snippet`} />
        </div>
      ) : null}
    </div>
  );
}
