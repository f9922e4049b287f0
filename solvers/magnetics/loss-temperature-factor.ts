import type { MaterialClass } from './material-class.js';

/**
 * Returns the factor (≥ about 1, dimensionless) that multiplies the Steinmetz loss density at
 * `temperatureC` (°C): ct2·T² − ct1·T + ct0. ref: common practice (quadratic temperature fit of
 * power-ferrite loss, normalized to 1 at the minimum-loss temperature).
 */
export function lossTemperatureFactor(material: MaterialClass, temperatureC: number): number {
  const { ct2, ct1, ct0 } = material.lossTemperatureFactor;
  return ct2 * temperatureC * temperatureC - ct1 * temperatureC + ct0;
}
