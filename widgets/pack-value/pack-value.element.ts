/**
 * `<ohmstead-pack-value>`: which pack gives the most for the money? Ranks the organization's priced packs
 * (and any typed in) by what a usable kWh costs, or, when every option has a rated cycle life, by what a
 * kWh cycled over the pack's life costs. Calls `POST /v1/packs/compare`.
 *
 * Attributes: the common ones (see ../internal/base-element.ts); every priced catalog pack starts ticked.
 * Events: `ohmstead-ready`, `ohmstead-result`, `ohmstead-error`.
 */
import type { PackCompareData } from '#shared/schemas/pack-compare.ts';
import { OhmsteadElement, type FieldHandle } from '../internal/base-element.ts';
import { h, replace } from '../internal/dom.ts';
import { chemistryNames, money, num } from '../internal/format.ts';
import { findings } from '../internal/result-view.ts';
import { distinctLabels, optionFromCatalog, pricedPacks, type PackCompareOption } from './pack-value.model.ts';
import { packValueCss } from './pack-value.styles.ts';

const ENDPOINT = '/v1/packs/compare';
const MAX_TYPED = 6;

interface TypedRow {
  index: number;
  el: HTMLElement;
  name: FieldHandle;
  chemistry: FieldHandle;
  series: FieldHandle;
  capacity: FieldHandle;
  price: FieldHandle;
  cycles: FieldHandle;
}

export class OhmsteadPackValueElement extends OhmsteadElement {
  protected readonly widget = 'pack-value';
  protected readonly heading = 'Which pack is the better buy?';
  protected readonly summary = 'Packs ranked by what each usable kilowatt-hour costs, and over its rated life where the cycle life is known.';
  protected readonly submitLabel = 'Compare';
  protected readonly css = packValueCss;

  private picks: Array<{ input: HTMLInputElement; option: PackCompareOption; wrap: HTMLElement }> = [];
  private rows: TypedRow[] = [];
  private rowsEl!: HTMLElement;
  private currency!: HTMLInputElement;
  private addButton!: HTMLButtonElement;
  private sent: Array<{ row?: TypedRow }> = [];
  private nextRow = 0;

  protected buildForm(form: HTMLFormElement): void {
    const priced = pricedPacks(this.catalog.packs);
    this.picks = priced.map((p) => ({ ...this.checkboxField(`${p.name} — ${money(p.price!.amount, p.price!.currency)}`, true), option: optionFromCatalog(p) }));
    this.rows = [];
    this.rowsEl = h('div', { class: 'picks' });
    const currencyId = this.uid('cur');
    this.currency = h('input', { id: currencyId, type: 'text', maxlength: 3, autocomplete: 'off', part: 'input', pattern: '[A-Za-z]{3}' });
    this.currency.value = priced[0]?.price?.currency ?? 'USD';
    this.addButton = h('button', { type: 'button' }, 'Add a pack');
    this.addButton.addEventListener('click', () => this.addRow(true));
    if (priced.length) form.append(h('fieldset', {}, h('legend', {}, 'From the catalog'), h('div', { class: 'picks' }, ...this.picks.map((p) => p.wrap))));
    form.append(
      h(
        'fieldset',
        {},
        h('legend', {}, 'Other packs'),
        h('div', { class: 'field', part: 'field' }, h('label', { for: currencyId, part: 'label' }, 'Currency of their prices'), this.currency, h('span', { class: 'hint' }, 'Three letters, e.g. USD or EUR: every price in one currency.')),
        this.rowsEl,
        h('div', { class: 'actions' }, this.addButton),
      ),
    );
    for (let i = priced.length; i < 2; i += 1) this.addRow(false);
  }

  private addRow(focus: boolean): void {
    if (this.rows.length >= MAX_TYPED) return;
    const index = 100 + this.nextRow++;
    const p = (tail: string) => `/options/${index}/${tail}`;
    const row: TypedRow = {
      index,
      el: h('div', { class: 'row' }),
      name: this.textField('Pack name', `Pack ${String.fromCharCode(65 + this.rows.length)}`),
      chemistry: this.selectField({ endpoint: ENDPOINT, pointer: p('pack/chemistry'), label: 'Chemistry', options: Object.entries(chemistryNames).map(([value, label]) => ({ value, label })) }),
      series: this.numberField({ endpoint: ENDPOINT, pointer: p('pack/seriesCells'), label: 'Cells in series' }),
      capacity: this.numberField({ endpoint: ENDPOINT, pointer: p('pack/capacityAh'), label: 'Capacity', unit: 'Ah' }),
      price: this.numberField({ endpoint: ENDPOINT, pointer: p('price/amount'), label: 'Price' }),
      cycles: this.numberField({ endpoint: ENDPOINT, pointer: p('cycleLife'), label: 'Rated cycles', hint: 'Optional' }),
    };
    const remove = h('button', { type: 'button', 'aria-label': 'Remove this pack' }, 'Remove');
    remove.addEventListener('click', () => {
      row.el.remove();
      this.rows = this.rows.filter((r) => r !== row);
      for (const f of [row.chemistry, row.series, row.capacity, row.price, row.cycles]) this.fields.delete(`${f.endpoint} ${f.pointer}`);
      this.addButton.focus();
    });
    row.el.append(h('div', { class: 'grid' }, row.name.wrap, row.chemistry.wrap, row.series.wrap, row.capacity.wrap, row.price.wrap, row.cycles.wrap), h('div', { class: 'actions' }, remove));
    this.rows.push(row);
    this.rowsEl.append(row.el);
    if (focus) row.name.control.focus();
  }

  /** The API's `/options/<i>/…` → the typed row that option came from. */
  protected override fieldPointerFor(pointer: string): string {
    const m = /^\/options\/(\d+)(\/.*)$/.exec(pointer);
    const row = m ? this.sent[Number(m[1])]?.row : undefined;
    return row ? `/options/${row.index}${m![2]}` : pointer;
  }

  protected async run() {
    const options: PackCompareOption[] = [];
    this.sent = [];
    for (const pick of this.picks) {
      if (!pick.input.checked) continue;
      options.push(pick.option);
      this.sent.push({});
    }
    const currency = this.currency.value.trim().toUpperCase();
    for (const row of this.rows) {
      const cycles = this.numberOf(row.cycles);
      options.push({
        label: (row.name.control.value.trim() || 'Pack').slice(0, 80),
        pack: { chemistry: row.chemistry.control.value as 'lfp', seriesCells: this.numberOf(row.series)!, capacityAh: this.numberOf(row.capacity)! },
        price: { amount: this.numberOf(row.price)!, currency },
        ...(cycles !== undefined ? { cycleLife: cycles } : {}),
      });
      this.sent.push({ row });
    }
    if (options.length < 2) {
      replace(this.els.alert, 'Choose at least two packs to compare: tick catalog packs or add packs of your own.');
      this.addButton.focus();
      return null;
    }
    const request = { options: distinctLabels(options) };
    const result = await this.calculate<PackCompareData>(ENDPOINT, request);
    const d = result.data;
    const cycled = d.rankedBy === 'costPerKWhCycled';
    replace(
      this.els.result,
      h('p', {}, cycled ? 'Ranked by what a kWh costs over each pack\'s rated life (price ÷ usable kWh × cycles).' : 'Ranked by what a usable kWh costs (price ÷ usable kWh).'),
      h(
        'div',
        { class: 'table-wrap' },
        h(
          'table',
          { part: 'table' },
          h('caption', { class: 'visually-hidden' }, 'Packs, best value first'),
          h('thead', {}, h('tr', {}, h('th', { scope: 'col' }, 'Rank'), h('th', { scope: 'col' }, 'Pack'), h('th', { scope: 'col', class: 'num' }, 'Usable'), h('th', { scope: 'col', class: 'num' }, 'Price'), h('th', { scope: 'col', class: 'num' }, 'Per usable kWh'), cycled ? h('th', { scope: 'col', class: 'num' }, 'Per kWh cycled') : null)),
          h(
            'tbody',
            {},
            ...d.options.map((o) =>
              h(
                'tr',
                { class: o.rank === 1 ? 'best' : '' },
                h('td', {}, String(o.rank)),
                h('th', { scope: 'row' }, o.label),
                h('td', { class: 'num' }, `${num(o.usableEnergyKWh, 2)} kWh`),
                h('td', { class: 'num' }, money(o.price.amount, d.currency)),
                h('td', { class: 'num' }, money(o.costPerUsableKWh, d.currency)),
                cycled ? h('td', { class: 'num' }, money(o.costPerKWhCycled ?? Number.NaN, d.currency)) : null,
              ),
            ),
          ),
        ),
      ),
      ...findings(result),
    );
    return { request, result };
  }
}
