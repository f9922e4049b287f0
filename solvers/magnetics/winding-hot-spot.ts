/**
 * Effective thermal conductivity across the layers of a bobbin winding of enamelled round wire
 * with interlayer tape and air (not impregnated), W/(m·K): 0.4. Common practice puts such
 * windings at about 0.2–0.5 across the layers, and at about 0.5–1.5 once varnish-impregnated
 * (recalled, from memory): 0.4 lies inside the first range and below the second, so the
 * estimate errs hot for an impregnated winding and is typical for a dry one.
 */
export const WINDING_THERMAL_CONDUCTIVITY_W_PER_M_K = 0.4;

/**
 * Returns the rise of the hottest point of a plane slab over its cooled face, K: a slab of
 * thickness `thicknessM` (m) with uniform heat generation `heatDensityWPerM3` (W/m³) and
 * conductivity `conductivityWPerMK` (W/(m·K)), insulated on one face and held at a uniform
 * temperature on the other, peaks at the insulated face at ΔT = q·t²/(2k).
 * ref: F. P. Incropera, D. P. DeWitt et al., Fundamentals of Heat and Mass Transfer, plane wall
 * with uniform generation (ch. 3, T(x) − Ts = q·L²/(2k)·(1 − x²/L²) for half-thickness L; its
 * adiabatic mid-plane is the insulated face here) (from memory).
 * @throws RangeError for a negative or non-finite density, or a thickness or conductivity
 * that is not finite and > 0.
 */
export function slabConductionRise(
  heatDensityWPerM3: number,
  thicknessM: number,
  conductivityWPerMK: number,
): number {
  if (!(heatDensityWPerM3 >= 0 && Number.isFinite(heatDensityWPerM3))) {
    throw new RangeError(
      `slabConductionRise: heat density must be finite and ≥ 0, got ${heatDensityWPerM3}`,
    );
  }
  if (!(thicknessM > 0 && Number.isFinite(thicknessM))) {
    throw new RangeError(`slabConductionRise: thickness must be finite and > 0, got ${thicknessM}`);
  }
  if (!(conductivityWPerMK > 0 && Number.isFinite(conductivityWPerMK))) {
    throw new RangeError(
      `slabConductionRise: conductivity must be finite and > 0, got ${conductivityWPerMK}`,
    );
  }
  return (heatDensityWPerM3 * thicknessM * thicknessM) / (2 * conductivityWPerMK);
}

/** The winding stack whose hot spot {@link windingHotSpotRisePerWatt} estimates, SI units. */
export interface WindingBuild {
  /** Height of the whole winding stack across the window (the build), m. */
  buildM: number;
  /** Length of the stack along the leg (the layers' breadth), m. */
  breadthM: number;
  /** Mean length of a turn, m. */
  meanTurnLengthM: number;
  /** Effective conductivity across the layers, W/(m·K). */
  conductivityWPerMK: number;
}

/**
 * Returns the conduction rise of a winding's hottest point over its outer surface per watt of
 * copper loss, K/W: the stack as a slab {@link slabConductionRise} whose inner face (on the
 * bobbin, next to the core) passes no heat and whose outer face is the cooled surface, copper
 * loss spread evenly over its volume MLT·b·t: ΔT/P = t/(2k·MLT·b). Conservative: heat that
 * leaves through the bobbin into the core, or along the wire to the window's ends, is ignored.
 * @throws RangeError for a dimension or conductivity that is not finite and > 0.
 */
export function windingHotSpotRisePerWatt(build: WindingBuild): number {
  const { buildM, breadthM, meanTurnLengthM, conductivityWPerMK } = build;
  if (!(breadthM > 0 && meanTurnLengthM > 0 && Number.isFinite(breadthM * meanTurnLengthM))) {
    throw new RangeError('windingHotSpotRisePerWatt: breadth and mean turn must be finite and > 0');
  }
  const volumeM3 = meanTurnLengthM * breadthM * buildM;
  return slabConductionRise(1 / volumeM3, buildM, conductivityWPerMK);
}
