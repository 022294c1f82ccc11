/**
 * `<ohmstead-wire-fuse>`: which wire and which fuse for a DC run? Takes the current, the system voltage
 * and the one-way length (metres or feet by `units`), sizes the conductor (`POST /v1/wires/size`: NEC
 * 310.16 ampacity at 125 % for continuous loads, voltage drop, protectable size; mm² in metric, AWG in
 * imperial), then the fuse for it (`POST /v1/fuses/size`). Two metered calls per answer.
 *
 * Attributes: the common ones (see ../internal/base-element.ts); no catalog. Events: `ohmstead-ready`,
 * `ohmstead-result` (detail.result is the fuse answer when there is one, else the wire's), `ohmstead-error`.
 */
import type { CalcOutput } from '#shared/calc/types.ts';
import type { FuseSizeData } from '#shared/schemas/fuse-size.ts';
import type { WireSizeData } from '#shared/schemas/wire-size.ts';
import { celsiusToFahrenheit } from '#shared/calc/units.ts';
import { OhmsteadElement, type FieldHandle } from '../internal/base-element.ts';
import { h, replace } from '../internal/dom.ts';
import { lengthUnit, num, temperatureUnit, toCelsius } from '../internal/format.ts';
import { figures, findings } from '../internal/result-view.ts';
import { fuseRequest, limitedByText, wireRequest, type WireFuseValues } from './wire-fuse.model.ts';
import { wireFuseCss } from './wire-fuse.styles.ts';

const WIRES = '/v1/wires/size';

export class OhmsteadWireFuseElement extends OhmsteadElement {
  protected readonly widget = 'wire-fuse';
  protected readonly heading = 'Wire and fuse for a DC run';
  protected readonly summary = 'The smallest copper conductor that carries the current, keeps the voltage drop in bounds and can be protected, and the fuse for it.';
  protected readonly submitLabel = 'Size the wire and fuse';
  protected readonly css = wireFuseCss;
  protected override readonly usesCatalog = false;

  private f!: { current: FieldHandle; voltage: FieldHandle; length: FieldHandle; drop: FieldHandle; ambient: FieldHandle; rating: FieldHandle; continuous: HTMLInputElement };

  protected buildForm(form: HTMLFormElement): void {
    const imperial = this.units === 'imperial';
    const continuous = this.checkboxField('Continuous load (3 hours or more; battery circuits usually are)', true);
    this.f = {
      current: this.numberField({ endpoint: WIRES, pointer: '/currentA', label: 'Current', unit: 'A' }),
      voltage: this.numberField({ endpoint: WIRES, pointer: '/systemVoltageV', label: 'System voltage', unit: 'V', value: 12 }),
      length: this.numberField({ endpoint: WIRES, pointer: imperial ? '/oneWayLengthFt' : '/oneWayLengthM', label: 'One-way length', unit: lengthUnit(this.units), hint: 'From the source to the load; the return run is counted too.' }),
      drop: this.numberField({ endpoint: WIRES, pointer: '/maxVoltageDropPct', label: 'Largest voltage drop', unit: '%', value: 3 }),
      ambient: this.numberField({
        endpoint: WIRES,
        pointer: '/ambientTempC',
        label: 'Surrounding temperature',
        unit: temperatureUnit(this.units),
        value: imperial ? 86 : 30,
        convert: imperial ? { toApi: (v) => toCelsius(v, 'imperial'), fromApi: celsiusToFahrenheit } : undefined,
      }),
      rating: this.selectField({
        endpoint: WIRES,
        pointer: '/temperatureRatingC',
        label: 'Insulation rating',
        options: [
          { value: '60', label: `60 °C (${num(celsiusToFahrenheit(60), 0)} °F)` },
          { value: '75', label: `75 °C (${num(celsiusToFahrenheit(75), 0)} °F)` },
          { value: '90', label: `90 °C (${num(celsiusToFahrenheit(90), 0)} °F)` },
        ],
        value: '75',
      }),
      continuous: continuous.input,
    };
    const { current, voltage, length, drop, ambient, rating } = this.f;
    form.append(h('div', { class: 'grid' }, current.wrap, voltage.wrap, length.wrap, drop.wrap, ambient.wrap, rating.wrap), continuous.wrap);
  }

  protected async run() {
    // The schema takes the length in metres or in feet (exactly one), so neither is required on its own.
    const length = this.numberOf(this.f.length);
    if (length === undefined) {
      this.reportProblems([{ handle: this.f.length, message: 'Enter the length of the run.' }]);
      return null;
    }
    const v: WireFuseValues = {
      currentA: this.numberOf(this.f.current)!,
      systemVoltageV: this.numberOf(this.f.voltage)!,
      oneWayLength: length,
      maxVoltageDropPct: this.numberOf(this.f.drop),
      ambientTempC: this.numberOf(this.f.ambient),
      temperatureRatingC: Number(this.f.rating.control.value) as 60 | 75 | 90,
      continuous: this.f.continuous.checked,
    };
    const wireReq = wireRequest(v, this.units);
    const wire = await this.calculate<WireSizeData>(WIRES, wireReq);
    const fuseReq = fuseRequest(v, wire.data);
    const fuse = fuseReq ? await this.calculate<FuseSizeData>('/v1/fuses/size', fuseReq) : null;
    this.show(wire, fuse);
    return { request: { wire: wireReq, fuse: fuseReq }, result: (fuse ?? wire) as CalcOutput<unknown> };
  }

  private show(wire: CalcOutput<WireSizeData>, fuse: CalcOutput<FuseSizeData> | null): void {
    const w = wire.data;
    const r = w.recommended;
    const lengthShown = this.units === 'imperial' ? `${num(w.oneWayLengthFt, 1)} ft` : `${num(w.oneWayLengthM, 2)} m`;
    const cautions = [...new Set([...wire.cautions, ...(fuse?.cautions ?? [])])];
    replace(
      this.els.result,
      r
        ? h('section', { class: 'method' }, h('h3', {}, 'Wire'), h('p', { class: 'size', 'data-size': r.size }, r.size), h('p', {}, `Set by ${limitedByText[w.limitedBy]}, over ${lengthShown} one way.`), figures([
            ['Carries (derated)', `${num(r.deratedAmpacityA, 0)} A`],
            ['Voltage drop', `${num(r.voltageDropV, 2)} V (${num(r.voltageDropPct, 2)} %)`],
            ['Heat in the wire', `${num(r.powerLossW, 1)} W`],
            ['Needs to carry', `${num(w.requiredAmpacityA, 1)} A`],
          ]))
        : h('p', { class: 'alert' }, 'No conductor in the table meets every requirement for this run: shorten it, raise the voltage or split the current.'),
      fuse
        ? h('section', { class: 'method' }, h('h3', {}, 'Fuse'), h('p', { class: 'size' }, fuse.data.recommendedRatingA !== null ? `${num(fuse.data.recommendedRatingA, 0)} A` : 'No rating fits'), figures([
            ['At least', `${num(fuse.data.minimumRatingA, 0)} A`],
            fuse.data.maximumRatingA !== null && ['At most (protects the wire)', `${num(fuse.data.maximumRatingA, 0)} A`],
            fuse.data.requiredVoltageRatingV !== null && ['DC voltage rating', `≥ ${num(fuse.data.requiredVoltageRatingV, 1)} V`],
          ]))
        : null,
      ...findings({ checks: [...wire.checks, ...(fuse?.checks ?? [])], cautions, basis: [...wire.basis, ...(fuse?.basis ?? [])] }),
    );
  }
}
