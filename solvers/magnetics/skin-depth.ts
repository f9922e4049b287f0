import { COPPER_RESISTIVITY_20C_OHM_M, copperResistance } from '../materials/copper-resistance.js';

/**
 * Magnetic constant, H/m: the pre-2019 exact 4π×10⁻⁷. The 2019 SI value, 1.25663706212e-6
 * (CODATA 2018), differs by 5.5e-10 relative, far below any tolerance of winding models.
 */
const MU_0_H_PER_M = 4e-7 * Math.PI;

/** Options for {@link skinDepth}. */
export interface SkinDepthOptions {
  /** Copper temperature, °C (resistivity by IEC 60028's linear law). @defaultValue 20 */
  temperatureC?: number;
  /** Relative permeability of the conductor. @defaultValue 1 (copper) */
  relativePermeability?: number;
}

const DEFAULTS = { temperatureC: 20, relativePermeability: 1 } satisfies Required<SkinDepthOptions>;

/**
 * Returns the skin depth in annealed copper at `frequencyHz` (> 0), m:
 * δ = sqrt(ρ/(π·f·μ0·μr)), ρ at the temperature.
 * @throws RangeError for a non-positive or non-finite frequency or permeability, or a
 *   temperature where the linear resistivity law gives ρ ≤ 0.
 */
export function skinDepth(frequencyHz: number, options: SkinDepthOptions = {}): number {
  const temperatureC = options.temperatureC ?? DEFAULTS.temperatureC;
  const relativePermeability = options.relativePermeability ?? DEFAULTS.relativePermeability;
  if (!(Number.isFinite(frequencyHz) && frequencyHz > 0)) {
    throw new RangeError(`skinDepth: frequencyHz must be finite and > 0, got ${frequencyHz}`);
  }
  if (!(Number.isFinite(relativePermeability) && relativePermeability > 0)) {
    throw new RangeError(
      `skinDepth: relativePermeability must be > 0, got ${relativePermeability}`,
    );
  }
  const resistivityOhmM = copperResistance(COPPER_RESISTIVITY_20C_OHM_M, temperatureC);
  if (!(Number.isFinite(resistivityOhmM) && resistivityOhmM > 0)) {
    throw new RangeError(`skinDepth: temperature out of range: ${temperatureC}`);
  }
  // ref: Kazimierczuk, High-Frequency Magnetic Components, 2nd ed., skin effect: δ = sqrt(ρ/(πμf)).
  return Math.sqrt(resistivityOhmM / (Math.PI * frequencyHz * MU_0_H_PER_M * relativePermeability));
}
