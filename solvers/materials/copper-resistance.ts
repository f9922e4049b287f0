/**
 * Resistivity of annealed copper at 20 °C, Ω·m: 1/58 Ω·mm²/m.
 * ref: IEC 60028, International standard of resistance for copper.
 */
export const COPPER_RESISTIVITY_20C_OHM_M = 1 / 58e6;

/**
 * Temperature coefficient of resistance of annealed copper at 20 °C, 1/K (constant mass).
 * ref: IEC 60028.
 */
export const COPPER_TEMPERATURE_COEFFICIENT_20C = 0.00393;

/**
 * Returns the resistance of a copper conductor at `temperatureC` (°C), Ω, from its resistance at
 * 20 °C: R(T) = R20·(1 + α20·(T − 20)) with α20 of IEC 60028 (linear; valid roughly −50…200 °C).
 */
export function copperResistance(resistanceAt20COhm: number, temperatureC: number): number {
  return resistanceAt20COhm * (1 + COPPER_TEMPERATURE_COEFFICIENT_20C * (temperatureC - 20));
}
