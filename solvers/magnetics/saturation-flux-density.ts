import type { MaterialClass } from './material-class.js';

/**
 * Returns the saturation flux density at `temperatureC` (°C), T, by linear interpolation between
 * the material's two points, extrapolated linearly outside them and floored at 0.
 */
export function saturationFluxDensity(material: MaterialClass, temperatureC: number): number {
  const { lowTemperatureC, lowFluxDensityT, highTemperatureC, highFluxDensityT } =
    material.saturation;
  const slopeTPerC = (highFluxDensityT - lowFluxDensityT) / (highTemperatureC - lowTemperatureC);
  return Math.max(0, lowFluxDensityT + slopeTPerC * (temperatureC - lowTemperatureC));
}
