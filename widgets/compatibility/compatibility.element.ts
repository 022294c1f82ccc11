/**
 * `<ohmstead-compatibility>`: will this battery work with the unit a shopper owns? Pick the unit and the
 * pack from the organization's catalog (or type their specifications); the answer shows the verdict for
 * each way of connecting, the power through the DC input, the energy the unit gains, how long that takes,
 * the reasons and the safety cautions. Calls `POST /v1/compatibility/check`.
 *
 * Attributes: the common ones (see ../internal/base-element.ts), with `host-sku` and `pack-sku` to
 * preselect catalog items. Events: `ohmstead-ready`, `ohmstead-result`, `ohmstead-error`.
 */
import type { CompatibilityData } from '#shared/schemas/compatibility.ts';
import { OhmsteadElement, type FieldHandle } from '../internal/base-element.ts';
import { h, replace } from '../internal/dom.ts';
import { chemistryNames, hoursText, num } from '../internal/format.ts';
import { figures, findings, verdictBadge } from '../internal/result-view.ts';
import { compatibilityCss } from './compatibility.styles.ts';
import { compact, hostFromCatalog, initialChoice, OTHER, packFromCatalog, type CompatibilityRequest } from './compatibility.model.ts';

const ENDPOINT = '/v1/compatibility/check';

export class OhmsteadCompatibilityElement extends OhmsteadElement {
  protected readonly widget = 'compatibility';
  protected readonly heading = 'Will this battery work with your unit?';
  protected readonly summary = 'Pick your unit and a battery pack to see whether and how they connect, what power flows and how much energy you gain.';
  protected readonly submitLabel = 'Check compatibility';
  protected readonly css = compatibilityCss;

  private host!: { select: FieldHandle | null; group: HTMLElement; fields: Record<'min' | 'max' | 'current' | 'power', FieldHandle> };
  private pack!: { select: FieldHandle | null; group: HTMLElement; chemistry: FieldHandle; series: FieldHandle; capacity: FieldHandle };
  private soc!: FieldHandle;

  protected buildForm(form: HTMLFormElement): void {
    const { hosts, packs } = this.catalog;
    const hostChoice = initialChoice(hosts, this.getAttribute('host-sku'));
    const packChoice = initialChoice(packs, this.getAttribute('pack-sku'));

    const hostSelect = hosts.length
      ? this.selectField({ label: 'Your unit', options: [...hosts.map((x) => ({ value: x.sku, label: x.name })), { value: OTHER, label: 'Another unit (enter its DC input)' }], value: hostChoice })
      : null;
    const f = (pointer: string, label: string, unit: string, hint?: string) => this.numberField({ endpoint: ENDPOINT, pointer: `/host/dcInput/${pointer}`, label, unit, hint });
    const hostFields = {
      min: f('minVoltageV', 'Lowest input voltage', 'V'),
      max: f('maxVoltageV', 'Highest input voltage', 'V'),
      current: f('maxCurrentA', 'Input current limit', 'A'),
      power: f('maxPowerW', 'Input power limit', 'W', 'Optional'),
    };
    const hostGroup = h('div', { class: 'grid', hidden: hostChoice !== OTHER }, ...Object.values(hostFields).map((x) => x.wrap));
    this.host = { select: hostSelect, group: hostGroup, fields: hostFields };

    const packSelect = packs.length
      ? this.selectField({ label: 'Battery pack', options: [...packs.map((x) => ({ value: x.sku, label: x.name })), { value: OTHER, label: 'Another pack (enter its specifications)' }], value: packChoice })
      : null;
    const chemistry = this.selectField({
      endpoint: ENDPOINT,
      pointer: '/external/chemistry',
      label: 'Chemistry',
      options: Object.entries(chemistryNames).map(([value, label]) => ({ value, label })),
    });
    const series = this.numberField({ endpoint: ENDPOINT, pointer: '/external/seriesCells', label: 'Cells in series', hint: 'A 12 V LFP pack has 4, a 48 V one 16.' });
    const capacity = this.numberField({ endpoint: ENDPOINT, pointer: '/external/capacityAh', label: 'Capacity', unit: 'Ah' });
    const packGroup = h('div', { class: 'grid', hidden: packChoice !== OTHER }, chemistry.wrap, series.wrap, capacity.wrap);
    this.pack = { select: packSelect, group: packGroup, chemistry, series, capacity };
    this.soc = this.numberField({ endpoint: ENDPOINT, pointer: '/external/stateOfChargePct', label: 'Pack charged to', unit: '%', value: 100 });

    hostSelect?.control.addEventListener('change', () => (hostGroup.hidden = hostSelect.control.value !== OTHER));
    packSelect?.control.addEventListener('change', () => (packGroup.hidden = packSelect.control.value !== OTHER));

    form.append(
      h('fieldset', {}, h('legend', {}, 'Unit'), hostSelect?.wrap, hostGroup),
      h('fieldset', {}, h('legend', {}, 'Battery pack'), packSelect?.wrap, packGroup, h('div', { class: 'grid' }, this.soc.wrap)),
    );
  }

  private request(): CompatibilityRequest {
    const hostSku = this.host.select?.control.value ?? OTHER;
    const packSku = this.pack.select?.control.value ?? OTHER;
    const catalogHost = this.catalog.hosts.find((x) => x.sku === hostSku);
    const catalogPack = this.catalog.packs.find((x) => x.sku === packSku);
    const n = (handle: FieldHandle) => this.numberOf(handle);
    const host = catalogHost
      ? hostFromCatalog(catalogHost)
      : {
          label: 'Your unit',
          dcInput: compact({ minVoltageV: n(this.host.fields.min)!, maxVoltageV: n(this.host.fields.max)!, maxCurrentA: n(this.host.fields.current)!, maxPowerW: n(this.host.fields.power) }),
        };
    const pack = catalogPack
      ? packFromCatalog(catalogPack)
      : { label: 'Your pack', chemistry: this.pack.chemistry.control.value as 'lfp', seriesCells: n(this.pack.series)!, capacityAh: n(this.pack.capacity)! };
    return { host, external: compact({ ...pack, stateOfChargePct: n(this.soc) }) };
  }

  protected async run() {
    const request = this.request();
    const result = await this.calculate<CompatibilityData>(ENDPOINT, request);
    this.show(request, result.data, result);
    return { request, result };
  }

  private show(request: CompatibilityRequest, data: CompatibilityData, result: Parameters<typeof findings>[0]): void {
    const title = { dc_input: 'Through the unit\'s DC input', direct_parallel: 'Wired onto the unit\'s battery' } as const;
    replace(
      this.els.result,
      h('p', {}, `${request.external.label} with ${request.host.label}`),
      ...data.methods.map((m) =>
        h(
          'section',
          { class: 'method', 'data-method': m.method },
          h('h3', {}, title[m.method], verdictBadge(m.verdict)),
          m.verdict === 'incompatible'
            ? null
            : figures([
                m.inputPowerWAtFull !== undefined && ['Power at full charge', `${num(m.inputPowerWAtFull, 0)} W`],
                m.inputPowerWAtCutoff !== undefined && ['Power near empty', `${num(m.inputPowerWAtCutoff, 0)} W`],
                m.addedEnergyWh !== undefined && ['Energy the unit gains', `${num(m.addedEnergyWh, 0)} Wh`],
                m.hoursToTransfer !== undefined && ['Time to transfer it', hoursText(m.hoursToTransfer)],
                m.recommendedMaxDifferenceV != null && ['Connect within', `${num(m.recommendedMaxDifferenceV, 2)} V of each other`],
              ]),
          h('ul', {}, ...m.reasons.map((r) => h('li', {}, r))),
        ),
      ),
      ...findings(result),
    );
  }
}
