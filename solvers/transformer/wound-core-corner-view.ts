import type { TransformerCorner } from './evaluate-transformer.js';

/** The flux and core-loss fields of an evaluated corner, as a design carries them. */
export function woundCoreFluxView(corner: TransformerCorner) {
  return {
    label: corner.label,
    peakFluxDensityT: corner.peakFluxDensityT,
    fluxDensitySwingT: corner.fluxDensitySwingT,
    saturationFluxDensityT: corner.saturationFluxDensityT,
    fluxDensityUtilization: corner.fluxDensityUtilization,
    coreLossW: corner.coreLossW,
  };
}

/** The total-loss and temperature fields of an evaluated corner, as a design carries them. */
export function woundCoreThermalView(corner: TransformerCorner) {
  return {
    totalLossW: corner.totalLossW,
    temperatureRiseK: corner.temperatureRiseK,
    temperatureC: corner.temperatureC,
  };
}

/** The largest value of `pick` over `items` (0 for none). */
export function largestOver<T>(items: readonly T[], pick: (item: T) => number): number {
  return items.reduce((most, item) => Math.max(most, pick(item)), 0);
}
