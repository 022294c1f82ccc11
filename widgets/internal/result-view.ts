/** Pieces every widget's result shows: figures, findings, the safety cautions (always) and the basis. */
import type { CalcOutput } from '#shared/calc/types.ts';
import { h } from './dom.ts';

/** A definition list of labelled figures (numbers in tabular digits). */
export function figures(items: Array<[string, string] | null | false>): HTMLElement {
  return h('dl', { class: 'figures', part: 'figures' }, ...items.filter((i): i is [string, string] => Boolean(i)).map(([term, value]) => h('div', {}, h('dt', {}, term), h('dd', {}, value))));
}

/** Checks (danger first), then the cautions and the basis of the answer. */
export function findings(result: Pick<CalcOutput<unknown>, 'checks' | 'cautions' | 'basis'>): HTMLElement[] {
  const order = { danger: 0, warning: 1, info: 2 } as const;
  const checks = [...result.checks].sort((a, b) => order[a.level] - order[b.level]);
  const parts: Array<HTMLElement | null> = [
    checks.length ? h('ul', { class: 'checks', 'aria-label': 'Findings' }, ...checks.map((c) => h('li', { class: c.level }, c.level === 'danger' ? 'Danger: ' : c.level === 'warning' ? 'Warning: ' : '', c.message))) : null,
    result.cautions.length
      ? h('div', { class: 'cautions', part: 'cautions' }, h('h3', {}, 'Safety'), h('ul', {}, ...result.cautions.map((c) => h('li', {}, c))))
      : null,
    result.basis.length ? h('details', {}, h('summary', {}, 'How this was worked out'), h('ul', {}, ...result.basis.map((b) => h('li', {}, b)))) : null,
  ];
  return parts.filter((x): x is HTMLElement => x !== null);
}

const verdictWords = { compatible: 'Compatible', limited: 'Limited', incompatible: 'Not compatible' } as const;

/** The verdict badge; its word is the API's verdict, readable as text and in `data-verdict`. */
export function verdictBadge(verdict: keyof typeof verdictWords): HTMLElement {
  return h('span', { class: `verdict ${verdict}`, part: 'verdict', 'data-verdict': verdict }, verdictWords[verdict]);
}
