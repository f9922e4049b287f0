/**
 * The unit suffixes every dimensional name in code, JSON and OpenAPI ends in, and the few
 * conversions the trade needs. SI base units throughout; temperatures in degrees Celsius.
 */
export const UNIT_SUFFIXES = {
  V: 'volt',
  A: 'ampere',
  W: 'watt',
  J: 'joule',
  Hz: 'hertz',
  H: 'henry',
  F: 'farad',
  C: 'degree Celsius (temperatures) or coulomb (charges, as gateChargeC)',
  K: 'kelvin (temperature differences, as temperatureRiseK)',
  Ohm: 'ohm',
  T: 'tesla',
  M: 'metre',
  M2: 'square metre',
  M3: 'cubic metre',
  S: 'second',
  PerS: 'per second (rates, as ratePerS)',
  Ms: 'millisecond (queue and HTTP layers only)',
} as const;

/** Offset between the Celsius and Kelvin scales, K. ref: SI Brochure, 9th ed., 2.3.1 */
export const CELSIUS_TO_KELVIN_OFFSET_K = 273.15;

/** Converts a temperature in degrees Celsius to kelvin. */
export function celsiusToKelvin(temperatureC: number): number {
  return temperatureC + CELSIUS_TO_KELVIN_OFFSET_K;
}
