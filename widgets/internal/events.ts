/**
 * The widgets' events. Each bubbles and crosses the shadow boundary (`composed`), so a page can listen on
 * the element or on document:
 *   document.addEventListener('ohmstead-result', (e) => console.log(e.detail.widget, e.detail.result.data));
 * - `ohmstead-ready`: the widget has its catalog (or none) and can be used.
 * - `ohmstead-result`: a calculation answered; `detail.request` is what was sent, `detail.result` the answer
 *   (`{ data, checks, cautions, basis }`).
 * - `ohmstead-error`: a calculation or the catalog failed; `detail.kind` says how (refused, invalid,
 *   limited, unavailable, failed).
 */
import type { CalcOutput } from '#shared/calc/types.ts';
import type { WidgetErrorKind } from './api-client.ts';

export interface OhmsteadReadyDetail {
  widget: string;
  hosts: number;
  packs: number;
}
export interface OhmsteadResultDetail<T = unknown> {
  widget: string;
  request: unknown;
  result: CalcOutput<T>;
}
export interface OhmsteadErrorDetail {
  widget: string;
  kind: WidgetErrorKind;
  status: number;
  message: string;
}

export interface OhmsteadEventMap {
  'ohmstead-ready': CustomEvent<OhmsteadReadyDetail>;
  'ohmstead-result': CustomEvent<OhmsteadResultDetail>;
  'ohmstead-error': CustomEvent<OhmsteadErrorDetail>;
}

declare global {
  interface HTMLElementEventMap extends OhmsteadEventMap {}
}
