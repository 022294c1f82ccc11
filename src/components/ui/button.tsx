import type { ButtonHTMLAttributes } from 'react';

type Tone = 'primary' | 'secondary' | 'danger' | 'quiet';

const tones: Record<Tone, string> = {
  primary: 'bg-copper text-white hover:bg-[#8f4b1c] disabled:bg-copper/60',
  secondary: 'border border-line bg-paper text-graphite hover:bg-paper-deep',
  danger: 'bg-danger text-white hover:bg-[#861e15] disabled:bg-danger/60',
  quiet: 'text-copper underline-offset-2 hover:underline',
};

/** A button at least 36 px tall (WCAG 2.2 target size), with a busy state. */
export function Button({ tone = 'primary', busy = false, className = '', children, disabled, ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: Tone; busy?: boolean }) {
  return (
    <button
      type="button"
      {...rest}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex min-h-9 items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-medium disabled:cursor-not-allowed ${tones[tone]} ${className}`}
    >
      {busy ? <span aria-hidden="true" className="h-3 w-3 animate-spin rounded-full border-2 border-current border-t-transparent" /> : null}
      {children}
    </button>
  );
}
