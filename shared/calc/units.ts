/** Unit conversions, named xToY. Exact definitions unless noted. */

/** International foot, exactly 0.3048 m (1959 international yard and pound agreement). */
export const M_PER_FT = 0.3048;

export const feetToM = (ft: number) => ft * M_PER_FT;
export const mToFeet = (m: number) => m / M_PER_FT;
export const celsiusToFahrenheit = (c: number) => (c * 9) / 5 + 32;
export const fahrenheitToCelsius = (f: number) => ((f - 32) * 5) / 9;
export const celsiusToK = (c: number) => c + 273.15;
export const milliohmToOhm = (mOhm: number) => mOhm / 1000;
export const ohmToMilliohm = (ohm: number) => ohm * 1000;
export const whToKwh = (wh: number) => wh / 1000;
export const kwhToWh = (kwh: number) => kwh * 1000;
export const hoursToSeconds = (h: number) => h * 3600;
export const secondsToHours = (s: number) => s / 3600;
/** Ampere-hours to coulombs (1 Ah = 3600 C). */
export const ampHoursToCoulombs = (ah: number) => ah * 3600;
export const coulombsToAmpHours = (c: number) => c / 3600;

/** Rounds to a number of significant decimals for presentation; never used inside a model. */
export function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
