import type { ReactNode } from 'react';

/**
 * The horizontal scroll area around a wide table. Focusable and named, so that someone on a keyboard can
 * scroll it when it is wider than the screen (WCAG 2.1.1; axe rule scrollable-region-focusable).
 */
export function TableScroll({ label, className = '', children }: { label: string; className?: string; children: ReactNode }) {
  return (
    <div role="region" aria-label={label} tabIndex={0} className={`overflow-x-auto rounded-sm focus-visible:outline-2 focus-visible:outline-offset-2 ${className}`.trim()}>
      {children}
    </div>
  );
}
