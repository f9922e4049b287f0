import { copperResistancePerLength } from './copper-resistance-per-length.js';

/** A copper foil conductor of rectangular cross-section. */
export interface FoilConductor {
  thicknessM: number;
  widthM: number;
  /** thickness·width, m². */
  copperAreaM2: number;
  /** DC resistance per metre at `temperatureC`, Ω/m. */
  resistancePerLengthOhmPerM: number;
  temperatureC: number;
}

/** Options for {@link foilConductor}. */
export interface FoilConductorOptions {
  /** Temperature for the resistance, °C. @defaultValue 20 */
  temperatureC?: number;
}

const DEFAULTS = { temperatureC: 20 } satisfies Required<FoilConductorOptions>;

/**
 * Returns a foil of `thicknessM` × `widthM` (m, both > 0): its area and DC resistance per metre
 * ρ/(t·w) of annealed copper at temperature (IEC 60028). Edge rounding is ignored.
 * @throws RangeError for a non-positive or non-finite dimension.
 */
export function foilConductor(
  thicknessM: number,
  widthM: number,
  options: FoilConductorOptions = {},
): FoilConductor {
  const { temperatureC } = { ...DEFAULTS, ...options };
  if (!(Number.isFinite(thicknessM) && thicknessM > 0 && Number.isFinite(widthM) && widthM > 0)) {
    throw new RangeError(`foilConductor: dimensions must be > 0, got ${thicknessM} × ${widthM}`);
  }
  const copperAreaM2 = thicknessM * widthM;
  return {
    thicknessM,
    widthM,
    copperAreaM2,
    resistancePerLengthOhmPerM: copperResistancePerLength(copperAreaM2, { temperatureC }),
    temperatureC,
  };
}
