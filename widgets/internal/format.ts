/** Numbers, durations, money and lengths for people, in the page's language; metric or imperial. */
import { feetToM, fahrenheitToCelsius, mToFeet } from '#shared/calc/units.ts';

export type Units = 'metric' | 'imperial';

export const unitsOf = (value: string | null): Units => (value === 'imperial' ? 'imperial' : 'metric');

const formatters = new Map<string, Intl.NumberFormat>();
export function num(value: number, maxDigits = 1, locale?: string): string {
  const id = `${locale ?? ''}|${maxDigits}`;
  let f = formatters.get(id);
  if (!f) {
    f = new Intl.NumberFormat(locale, { maximumFractionDigits: maxDigits });
    formatters.set(id, f);
  }
  return f.format(value);
}

export function money(amount: number, currency: string, locale?: string): string {
  try {
    return new Intl.NumberFormat(locale, { style: 'currency', currency, maximumFractionDigits: 2 }).format(amount);
  } catch {
    return `${num(amount, 2, locale)} ${currency}`;
  }
}

/** 3.42 h → "3 h 25 min"; under an hour in minutes. */
export function hoursText(hours: number): string {
  if (!Number.isFinite(hours)) return '—';
  const totalMin = Math.round(hours * 60);
  const h = Math.floor(totalMin / 60);
  const m = totalMin % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}

/** The length field's unit and its conversion to the API's fields. */
export const lengthUnit = (units: Units) => (units === 'imperial' ? 'ft' : 'm');
export const temperatureUnit = (units: Units) => (units === 'imperial' ? '°F' : '°C');
/** A temperature typed in the widget's units, in °C for the API. */
export const toCelsius = (value: number, units: Units) => (units === 'imperial' ? fahrenheitToCelsius(value) : value);
/** Both lengths, for showing a result in the widget's units. */
export const lengthText = (m: number, units: Units) => (units === 'imperial' ? `${num(mToFeet(m), 1)} ft` : `${num(m, 2)} m`);
export const metres = (value: number, units: Units) => (units === 'imperial' ? feetToM(value) : value);

export const chemistryNames: Record<string, string> = {
  lfp: 'LFP (lithium iron phosphate)',
  nmc: 'NMC (lithium nickel manganese cobalt)',
  lto: 'LTO (lithium titanate)',
  lead_acid_agm: 'Lead-acid, AGM',
  lead_acid_flooded: 'Lead-acid, flooded',
};
