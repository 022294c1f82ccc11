/**
 * The base of every Ohmstead widget: an open shadow root (focus delegated to the first control) with the
 * shared and the widget's constructed stylesheets, a labelled form whose fields are checked against the
 * shared schemas' rules, an alert region (errors, role=alert) and a polite status region, the result area,
 * and typed events.
 *
 * Attributes (every widget):
 * - `key` — the organization's embed key (`ohs_emb_…`); it works only from the origins listed on it.
 * - `api-base` — the API's origin; default: the origin the script was loaded from.
 * - `units` — `metric` (default) or `imperial` (feet and °F where lengths and temperatures appear).
 * - `theme` — `light` (default), `dark` or `auto` (follows the visitor's colour scheme).
 * - `catalog` — `none` to skip the organization's catalog and ask for specifications only.
 * - `host-sku`, `pack-sku` — preselect a catalog item (a product page's own SKU).
 * CSS parts: container, title, form, field, label, input, hint, submit, error, status, result, verdict,
 * figures, cautions, table. Custom properties: see theme.ts (`--ohmstead-accent`, `--ohmstead-bg`, …) and
 * `--ohmstead-font`, `--ohmstead-radius`, `--ohmstead-max-width`.
 */
import type { CalcOutput } from '#shared/calc/types.ts';
import type { Catalog } from '#shared/schemas/catalog.ts';
import { createApiClient, sharedCatalog, WidgetApiError, type ApiClient, type ApiConfig, type FieldProblem } from './api-client.ts';
import { baseCss, sheetFor } from './base.styles.ts';
import { h, replace } from './dom.ts';
import type { OhmsteadErrorDetail, OhmsteadEventMap } from './events.ts';
import { checkValue, ruleFor, type Endpoint, type FieldRule } from './field-rules.ts';
import { unitsOf, type Units } from './format.ts';

/** The origin the bundle was loaded from: the API's default address. */
const loadedFrom = (() => {
  if (typeof document === 'undefined') return '';
  const current = document.currentScript as HTMLScriptElement | null;
  const src = current?.src || [...document.querySelectorAll<HTMLScriptElement>('script[src*="ohmstead-widgets"]')].pop()?.src;
  try {
    return src ? new URL(src).origin : location.origin;
  } catch {
    return location.origin;
  }
})();

export interface FieldHandle {
  endpoint: Endpoint;
  pointer: string;
  label: string;
  control: HTMLInputElement | HTMLSelectElement;
  error: HTMLElement;
  wrap: HTMLElement;
  /** A value typed in other units than the API's (°F, ft): converts for the API and its rule back for messages. */
  convert?: { toApi: (v: number) => number; fromApi: (v: number) => number };
}

interface NumberFieldOptions {
  endpoint: Endpoint;
  pointer: string;
  label: string;
  unit?: string;
  hint?: string;
  value?: number | string;
  placeholder?: string;
  convert?: FieldHandle['convert'];
}

interface SelectFieldOptions {
  endpoint?: Endpoint;
  pointer?: string;
  label: string;
  options: ReadonlyArray<{ value: string; label: string }>;
  value?: string;
  hint?: string;
}

export const widgetAttributes = ['key', 'api-base', 'units', 'theme', 'catalog', 'host-sku', 'pack-sku'] as const;

export abstract class OhmsteadElement extends HTMLElement {
  static observedAttributes: readonly string[] = widgetAttributes;

  /** The widget's short name, in events. */
  protected abstract readonly widget: string;
  protected abstract readonly heading: string;
  protected abstract readonly summary: string;
  protected abstract readonly submitLabel: string;
  protected abstract readonly css: string;
  /** Whether the widget offers catalog items. */
  protected readonly usesCatalog: boolean = true;

  protected readonly root: ShadowRoot;
  protected catalog: Catalog = { hosts: [], packs: [] };
  protected fields = new Map<string, FieldHandle>();
  protected els!: { form: HTMLFormElement; alert: HTMLElement; status: HTMLElement; result: HTMLElement; submit: HTMLButtonElement };
  private nextId = 0;
  private generation = 0;

  constructor() {
    super();
    this.root = this.attachShadow({ mode: 'open', delegatesFocus: true });
  }

  connectedCallback(): void {
    if (!this.els) void this.render();
  }

  attributeChangedCallback(name: string, previous: string | null, value: string | null): void {
    // The theme is pure CSS (:host([theme=…])); everything else rebuilds the form.
    if (name !== 'theme' && previous !== value && this.els) void this.render();
  }

  get units(): Units {
    return unitsOf(this.getAttribute('units'));
  }

  protected apiConfig(): ApiConfig {
    return { base: (this.getAttribute('api-base') || loadedFrom).replace(/\/+$/, ''), key: (this.getAttribute('key') ?? '').trim() };
  }

  protected get api(): ApiClient {
    return createApiClient(this.apiConfig());
  }

  protected uid(part: string): string {
    this.nextId += 1;
    return `${this.widget}-${part}-${this.nextId}`;
  }

  protected emit<K extends keyof OhmsteadEventMap>(type: K, detail: OhmsteadEventMap[K]['detail']): void {
    this.dispatchEvent(new CustomEvent(type, { detail, bubbles: true, composed: true }));
  }

  private async render(): Promise<void> {
    const generation = ++this.generation;
    this.root.adoptedStyleSheets = [sheetFor(baseCss), sheetFor(this.css)];
    this.fields.clear();
    const titleId = this.uid('title');
    const form = h('form', { part: 'form', novalidate: true, 'aria-labelledby': titleId });
    const alert = h('div', { class: 'alert', part: 'error', role: 'alert' });
    const status = h('div', { class: 'status', part: 'status', role: 'status', 'aria-live': 'polite' });
    const result = h('div', { class: 'result', part: 'result', 'aria-live': 'polite' });
    const submit = h('button', { type: 'submit', class: 'primary', part: 'submit' }, this.submitLabel);
    this.els = { form, alert, status, result, submit };
    replace(
      this.root,
      h(
        'section',
        { class: 'card', part: 'container', 'aria-labelledby': titleId },
        h('h2', { id: titleId, part: 'title' }, this.heading),
        h('p', { class: 'sub' }, this.summary),
        form,
        alert,
        status,
        result,
        h('p', { class: 'brand' }, 'Calculated by Ohmstead. Planning figures only: follow local electrical codes and the equipment maker\'s instructions.'),
      ) as unknown as Node,
    );
    form.addEventListener('submit', (event) => {
      event.preventDefault();
      void this.submit();
    });

    if (this.usesCatalog && this.getAttribute('catalog') !== 'none') {
      status.textContent = 'Loading the catalog…';
      try {
        this.catalog = await sharedCatalog(this.api, this.apiConfig());
      } catch (error) {
        this.catalog = { hosts: [], packs: [] };
        this.fail(error);
      }
      if (generation !== this.generation) return;
      status.textContent = '';
    }
    this.buildForm(form);
    form.append(h('div', { class: 'actions' }, submit));
    this.emit('ohmstead-ready', { widget: this.widget, hosts: this.catalog.hosts.length, packs: this.catalog.packs.length });
  }

  /** Adds the widget's fields to the form (the submit button follows). */
  protected abstract buildForm(form: HTMLFormElement): void;
  /** Reads the form into the calls to make; field problems are reported by `checkFields` before. */
  protected abstract run(): Promise<{ request: unknown; result: CalcOutput<unknown> } | null>;

  // ── Fields ──────────────────────────────────────────────────────────────────────────────────────────
  private describe(control: HTMLElement, hintId: string | null, errorId: string) {
    control.setAttribute('aria-describedby', [hintId, errorId].filter(Boolean).join(' '));
  }

  private register(handle: FieldHandle): FieldHandle {
    this.fields.set(`${handle.endpoint} ${handle.pointer}`, handle);
    return handle;
  }

  /** A labelled number input (label, hint and error in this shadow root) for one field of a request. */
  protected numberField(o: NumberFieldOptions): FieldHandle {
    const inputId = this.uid('in');
    const hintId = o.hint ? this.uid('hint') : null;
    const errorId = this.uid('err');
    const rule = this.displayRule(ruleFor(o.endpoint, o.pointer), o.convert);
    const label = o.unit ? `${o.label} (${o.unit})` : o.label;
    const input = h('input', {
      id: inputId,
      name: o.pointer,
      type: 'number',
      inputmode: 'decimal',
      step: rule?.type === 'integer' ? 1 : 'any',
      min: rule?.min,
      max: rule?.max,
      required: rule?.required ?? false,
      placeholder: o.placeholder,
      part: 'input',
    });
    if (o.value !== undefined) input.value = String(o.value);
    const error = h('p', { id: errorId, class: 'field-error', part: 'field-error', hidden: true });
    const wrap = h('div', { class: 'field', part: 'field' }, h('label', { for: inputId, part: 'label' }, label), input, o.hint ? h('span', { id: hintId!, class: 'hint', part: 'hint' }, o.hint) : null, error);
    this.describe(input, hintId, errorId);
    return this.register({ endpoint: o.endpoint, pointer: o.pointer, label: o.label, control: input, error, wrap, convert: o.convert });
  }

  /** A labelled select. With an endpoint and pointer it is checked like a field of that request. */
  protected selectField(o: SelectFieldOptions): FieldHandle {
    const id = this.uid('sel');
    const hintId = o.hint ? this.uid('hint') : null;
    const errorId = this.uid('err');
    const select = h('select', { id, name: o.pointer ?? id, part: 'input' }, ...o.options.map((opt) => h('option', { value: opt.value }, opt.label)));
    if (o.value !== undefined) select.value = o.value;
    const error = h('p', { id: errorId, class: 'field-error', part: 'field-error', hidden: true });
    const wrap = h('div', { class: 'field', part: 'field' }, h('label', { for: id, part: 'label' }, o.label), select, o.hint ? h('span', { id: hintId!, class: 'hint', part: 'hint' }, o.hint) : null, error);
    this.describe(select, hintId, errorId);
    const handle: FieldHandle = { endpoint: o.endpoint ?? ('' as Endpoint), pointer: o.pointer ?? id, label: o.label, control: select, error, wrap };
    return o.endpoint && o.pointer ? this.register(handle) : handle;
  }

  /** A labelled text input (a name or label a request carries). */
  protected textField(label: string, value = '', hint?: string): FieldHandle {
    const id = this.uid('txt');
    const errorId = this.uid('err');
    const input = h('input', { id, type: 'text', part: 'input', maxlength: 80, autocomplete: 'off' });
    input.value = value;
    const error = h('p', { id: errorId, class: 'field-error', part: 'field-error', hidden: true });
    const wrap = h('div', { class: 'field', part: 'field' }, h('label', { for: id, part: 'label' }, label), input, hint ? h('span', { class: 'hint', part: 'hint' }, hint) : null, error);
    this.describe(input, null, errorId);
    return { endpoint: '' as Endpoint, pointer: id, label, control: input, error, wrap };
  }

  /** Shows problems the widget found itself (a rule no single field carries). */
  protected reportProblems(problems: Array<{ handle: FieldHandle; message: string }>): void {
    this.showFieldProblems(problems);
  }

  /** The widget's field pointer for a pointer in the API's answer (widgets whose rows move override it). */
  protected fieldPointerFor(pointer: string): string {
    return pointer;
  }

  /** A labelled checkbox. */
  protected checkboxField(label: string, checked: boolean): { wrap: HTMLElement; input: HTMLInputElement } {
    const id = this.uid('chk');
    const input = h('input', { id, type: 'checkbox', part: 'input', checked });
    return { wrap: h('div', { class: 'check', part: 'field' }, input, h('label', { for: id, part: 'label' }, label)), input };
  }

  /** The field's number for the API (converted from the widget's units), or undefined when blank. */
  protected numberOf(handle: FieldHandle): number | undefined {
    const input = handle.control as HTMLInputElement;
    if (input.value.trim() === '') return undefined;
    const n = input.valueAsNumber;
    return handle.convert && Number.isFinite(n) ? handle.convert.toApi(n) : n;
  }

  private displayRule(rule: FieldRule | undefined, convert?: FieldHandle['convert']): FieldRule | undefined {
    if (!rule || !convert) return rule;
    const round = (v: number | undefined) => (v === undefined ? undefined : Math.round(convert.fromApi(v) * 10) / 10);
    return { ...rule, min: round(rule.min), max: round(rule.max) };
  }

  /** Whether a field is part of the form right now (not inside a hidden or disabled group). */
  private active(handle: FieldHandle): boolean {
    return handle.wrap.isConnected && !handle.wrap.closest('[hidden]') && !(handle.control as HTMLInputElement).disabled;
  }

  /** Checks every active field against its rule; shows each problem beside its field. */
  protected checkFields(): boolean {
    const problems: Array<{ handle: FieldHandle; message: string }> = [];
    for (const handle of this.fields.values()) {
      if (!this.active(handle)) continue;
      // Checked in the field's own units: the rule's bounds are converted for fields typed in °F or ft.
      const rule = this.displayRule(ruleFor(handle.endpoint, handle.pointer), handle.convert);
      const control = handle.control;
      const value =
        control instanceof HTMLSelectElement ? control.value : control.value.trim() === '' ? (control.validity.badInput ? Number.NaN : undefined) : control.valueAsNumber;
      const message = checkValue(rule, value);
      if (message) problems.push({ handle, message });
    }
    this.showFieldProblems(problems);
    return problems.length === 0;
  }

  protected clearProblems(): void {
    for (const handle of this.fields.values()) {
      handle.control.removeAttribute('aria-invalid');
      handle.error.hidden = true;
      handle.error.textContent = '';
    }
    this.els.alert.textContent = '';
  }

  private showFieldProblems(problems: Array<{ handle: FieldHandle; message: string }>, extra: string[] = []): void {
    for (const { handle, message } of problems) {
      handle.control.setAttribute('aria-invalid', 'true');
      handle.error.hidden = false;
      handle.error.textContent = message;
    }
    const lines = [...problems.map((p) => `${p.handle.label}: ${p.message}`), ...extra];
    if (lines.length) {
      replace(this.els.alert, `Check ${lines.length === 1 ? 'this' : `these ${lines.length}`}: `, lines.join(' · '));
      problems[0]?.handle.control.focus();
    }
  }

  /** A problem the API reported: beside its field when the widget has it, else in the alert. */
  private showApiProblems(problems: FieldProblem[], fallback: string, endpoint?: string): void {
    const matched: Array<{ handle: FieldHandle; message: string }> = [];
    const rest: string[] = [];
    for (const p of problems) {
      const pointer = this.fieldPointerFor(p.pointer);
      const handle = [...this.fields.values()].find((f) => (!endpoint || f.endpoint === endpoint) && f.pointer === pointer && this.active(f));
      if (handle) matched.push({ handle, message: p.detail });
      else rest.push(p.detail);
    }
    if (!matched.length && !rest.length) rest.push(fallback);
    this.showFieldProblems(matched, rest);
  }

  // ── Calling ─────────────────────────────────────────────────────────────────────────────────────────
  private async submit(): Promise<void> {
    this.clearProblems();
    if (!this.checkFields()) return;
    const { submit, form, status } = this.els;
    submit.disabled = true;
    form.setAttribute('aria-busy', 'true');
    status.textContent = 'Calculating…';
    try {
      const outcome = await this.run();
      status.textContent = outcome ? 'Result below.' : '';
      if (outcome) this.emit('ohmstead-result', { widget: this.widget, request: outcome.request, result: outcome.result });
    } catch (error) {
      status.textContent = '';
      this.fail(error);
    } finally {
      submit.disabled = false;
      form.removeAttribute('aria-busy');
    }
  }

  /** Calls the API for one request; field problems in its answer are shown beside the fields of `endpoint`. */
  protected async calculate<T>(endpoint: Endpoint | string, body: unknown): Promise<CalcOutput<T>> {
    try {
      return await this.api.calculate<T>(endpoint, body);
    } catch (error) {
      if (error instanceof WidgetApiError && error.kind === 'invalid') {
        this.showApiProblems(error.fieldProblems, error.message, endpoint);
        this.emitError(error);
        throw new HandledError();
      }
      throw error;
    }
  }

  private emitError(error: WidgetApiError) {
    const detail: OhmsteadErrorDetail = { widget: this.widget, kind: error.kind, status: error.status, message: error.message };
    this.emit('ohmstead-error', detail);
  }

  protected fail(error: unknown): void {
    if (error instanceof HandledError) return;
    const e = error instanceof WidgetApiError ? error : new WidgetApiError('failed', 'Something went wrong in this calculator. Try again.', 0);
    replace(this.els.alert, e.message);
    this.emitError(e);
  }
}

/** An error already shown beside the fields. */
class HandledError extends Error {}

/** Defines a tag once: loading the script twice (or two versions) leaves the first definition in place. */
export function defineElement(tag: string, element: CustomElementConstructor): void {
  if (typeof customElements !== 'undefined' && !customElements.get(tag)) customElements.define(tag, element);
}
