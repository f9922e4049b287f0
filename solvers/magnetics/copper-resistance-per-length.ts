import {
  COPPER_RESISTIVITY_20C_OHM_M,
  COPPER_TEMPERATURE_COEFFICIENT_20C,
  copperResistance,
} from '../materials/copper-resistance.js';

/** Options for {@link copperResistancePerLength}. */
export interface CopperResistancePerLengthOptions {
  /** Conductor temperature, °C. @defaultValue 20 */
  temperatureC?: number;
  /** Copper length per unit length of conductor (≥ 1; litz lay, 1 for solid wire and foil). @defaultValue 1 */
  takeUpFactor?: number;
}

const DEFAULTS = {
  temperatureC: 20,
  takeUpFactor: 1,
} satisfies Required<CopperResistancePerLengthOptions>;

/**
 * Returns the DC resistance per metre of annealed copper of cross-section `copperAreaM2` (m²),
 * Ω/m: ρ20·takeUp/A at 20 °C, scaled linearly to `temperatureC` (IEC 60028).
 * @throws RangeError for a non-positive area, a take-up below 1 or a temperature at or below
 *   the intercept of the linear law (20 − 1/α20 ≈ −234 °C).
 */
export function copperResistancePerLength(
  copperAreaM2: number,
  options: CopperResistancePerLengthOptions = {},
): number {
  const { temperatureC, takeUpFactor } = { ...DEFAULTS, ...options };
  if (!Number.isFinite(copperAreaM2) || copperAreaM2 <= 0) {
    throw new RangeError(`copperResistancePerLength: area must be > 0, got ${copperAreaM2}`);
  }
  if (!Number.isFinite(takeUpFactor) || takeUpFactor < 1) {
    throw new RangeError(
      `copperResistancePerLength: takeUpFactor must be ≥ 1, got ${takeUpFactor}`,
    );
  }
  if (
    !Number.isFinite(temperatureC) ||
    temperatureC <= 20 - 1 / COPPER_TEMPERATURE_COEFFICIENT_20C
  ) {
    throw new RangeError(`copperResistancePerLength: temperature out of range: ${temperatureC}`);
  }
  // R' = ρ·l/A per unit length, the strand path being takeUp times the conductor's length.
  return copperResistance(
    (COPPER_RESISTIVITY_20C_OHM_M * takeUpFactor) / copperAreaM2,
    temperatureC,
  );
}
