/**
 * `<ohmstead-charge-time>`: how long will it take to charge? A pack from the catalog (or typed in), from
 * and to a state of charge, and a charger's current and/or power: constant current, then the
 * constant-voltage taper (`POST /v1/charge/time`), with the state-of-charge curve.
 *
 * Attributes: the common ones (see ../internal/base-element.ts), with `pack-sku` to preselect a pack.
 * Events: `ohmstead-ready`, `ohmstead-result`, `ohmstead-error`.
 */
import type { CalcOutput } from '#shared/calc/types.ts';
import type { ChargeTimeData } from '#shared/schemas/charge-time.ts';
import { OhmsteadElement, type FieldHandle } from '../internal/base-element.ts';
import { h, replace, svg } from '../internal/dom.ts';
import { chemistryNames, hoursText, num } from '../internal/format.ts';
import { figures, findings } from '../internal/result-view.ts';
import { compact, initialChoice, OTHER, packFromCatalog } from '../compatibility/compatibility.model.ts';
import { limitedByText, profilePoints, type ChargeTimeRequest } from './charge-time.model.ts';
import { chargeTimeCss } from './charge-time.styles.ts';

const ENDPOINT = '/v1/charge/time';

export class OhmsteadChargeTimeElement extends OhmsteadElement {
  protected readonly widget = 'charge-time';
  protected readonly heading = 'How long to charge?';
  protected readonly summary = 'Charge time from one state of charge to another: full current first, then the slower finish as the pack tops up.';
  protected readonly submitLabel = 'Estimate charge time';
  protected readonly css = chargeTimeCss;

  private f!: {
    select: FieldHandle | null;
    group: HTMLElement;
    chemistry: FieldHandle;
    series: FieldHandle;
    capacity: FieldHandle;
    maxCharge: FieldHandle;
    from: FieldHandle;
    to: FieldHandle;
    current: FieldHandle;
    power: FieldHandle;
    efficiency: FieldHandle;
  };

  protected buildForm(form: HTMLFormElement): void {
    const packs = this.catalog.packs;
    const choice = initialChoice(packs, this.getAttribute('pack-sku'));
    const select = packs.length
      ? this.selectField({ label: 'Battery pack', options: [...packs.map((p) => ({ value: p.sku, label: p.name })), { value: OTHER, label: 'Another pack (enter its specifications)' }], value: choice })
      : null;
    const n = (pointer: string, label: string, unit?: string, hint?: string, value?: number) => this.numberField({ endpoint: ENDPOINT, pointer, label, unit, hint, value });
    const chemistry = this.selectField({ endpoint: ENDPOINT, pointer: '/pack/chemistry', label: 'Chemistry', options: Object.entries(chemistryNames).map(([value, label]) => ({ value, label })) });
    const series = n('/pack/seriesCells', 'Cells in series');
    const capacity = n('/pack/capacityAh', 'Capacity', 'Ah');
    const maxCharge = n('/pack/maxChargeA', 'Pack charge limit', 'A', 'Optional');
    const group = h('div', { class: 'grid', hidden: choice !== OTHER }, chemistry.wrap, series.wrap, capacity.wrap, maxCharge.wrap);
    select?.control.addEventListener('change', () => (group.hidden = select.control.value !== OTHER));
    this.f = {
      select,
      group,
      chemistry,
      series,
      capacity,
      maxCharge,
      from: n('/fromPct', 'From', '%', undefined, 20),
      to: n('/toPct', 'To', '%', undefined, 100),
      current: n('/sources/0/currentA', 'Charger current', 'A', 'Its rated output current; or give its power.'),
      power: n('/sources/0/powerW', 'Charger power', 'W', 'Optional when the current is given.'),
      efficiency: n('/sources/0/efficiencyPct', 'Charger efficiency', '%', 'Optional; for a power rating.'),
    };
    const f = this.f;
    form.append(
      h('fieldset', {}, h('legend', {}, 'Battery pack'), select?.wrap, group, h('div', { class: 'grid' }, f.from.wrap, f.to.wrap)),
      h('fieldset', {}, h('legend', {}, 'Charger'), h('div', { class: 'grid' }, f.current.wrap, f.power.wrap, f.efficiency.wrap)),
    );
  }

  protected async run() {
    const f = this.f;
    const v = (handle: FieldHandle) => this.numberOf(handle);
    const source = compact({ currentA: v(f.current), powerW: v(f.power), efficiencyPct: v(f.efficiency) });
    if (source.currentA === undefined && source.powerW === undefined) {
      this.reportProblems([{ handle: f.current, message: 'Enter the charger\'s current or its power.' }]);
      return null;
    }
    const catalogPack = this.catalog.packs.find((p) => p.sku === f.select?.control.value);
    const pack = catalogPack
      ? packFromCatalog(catalogPack)
      : compact({ label: 'Your pack', chemistry: f.chemistry.control.value as 'lfp', seriesCells: v(f.series)!, capacityAh: v(f.capacity)!, maxChargeA: v(f.maxCharge) });
    const request: ChargeTimeRequest = { pack, fromPct: v(f.from)!, toPct: v(f.to)!, sources: [source] };
    const result = await this.calculate<ChargeTimeData>(ENDPOINT, request);
    this.show(result);
    return { request, result };
  }

  private show(result: CalcOutput<ChargeTimeData>): void {
    const d = result.data;
    const W = 300;
    const H = 120;
    const points = profilePoints(d.profile, W, H);
    replace(
      this.els.result,
      h('p', { class: 'total', 'data-hours': String(d.totalHours) }, hoursText(d.totalHours)),
      h('p', {}, `From ${num(d.fromPct, 0)} % to ${num(d.toPct, 0)} %, limited by ${limitedByText[d.limitedBy]}.`),
      figures([
        ['At full current', hoursText(d.constantCurrentHours)],
        ['Topping up', hoursText(d.taperHours)],
        ['Charge current', `${num(d.chargeCurrentA, 1)} A (${num(d.chargeCRate, 2)} C)`],
        ['Energy from the charger', `${num(d.energyFromSourceWh, 0)} Wh`],
      ]),
      points
        ? h(
            'div',
            { class: 'chart' },
            svg(
              'svg',
              { viewBox: `-30 -8 ${W + 40} ${H + 28}`, role: 'img', 'aria-label': `State of charge rising from ${num(d.fromPct, 0)} % to ${num(d.toPct, 0)} % over ${hoursText(d.totalHours)}` },
              svg('line', { x1: 0, y1: H, x2: W, y2: H }),
              svg('line', { x1: 0, y1: 0, x2: 0, y2: H }),
              svg('text', { x: -28, y: 4 }, document.createTextNode('100%')),
              svg('text', { x: -20, y: H }, document.createTextNode('0%')),
              svg('text', { x: W - 40, y: H + 16 }, document.createTextNode(hoursText(d.totalHours))),
              svg('polyline', { points }),
            ),
          )
        : null,
      ...findings(result),
    );
  }
}
