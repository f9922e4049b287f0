/**
 * Returns McLyman's fringing flux factor F = 1 + (lg/√Ae)·ln(2G/lg) (≥ 1, dimensionless) for a
 * gap lg (m) in a leg of section Ae (m²) with a window height G (m); 1 for lg = 0.
 * ref: C. W. T. McLyman, Transformer and Inductor Design Handbook, 4th ed., ch. 8 (fringing
 * flux factor; equation number not recalled). Meant for lg well below G; ln(2G/lg) > 0 needs lg < 2G.
 * @throws RangeError for lg < 0, Ae ≤ 0 or G ≤ 0.
 */
export function fringingFactor(gapLengthM: number, areaM2: number, windowHeightM: number): number {
  if (!(gapLengthM >= 0 && areaM2 > 0 && windowHeightM > 0)) {
    throw new RangeError(`fringingFactor: need lg ≥ 0, Ae > 0, G > 0`);
  }
  if (gapLengthM === 0) return 1;
  return 1 + (gapLengthM / Math.sqrt(areaM2)) * Math.log((2 * windowHeightM) / gapLengthM);
}
