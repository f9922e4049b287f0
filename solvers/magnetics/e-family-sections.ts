import type { EfdShape, EShape, RoundLegShape } from './core-shape.js';
import type { MagneticPathSection } from './magnetic-path-section.js';

/**
 * Returns the five series sections of an E-family core pair for IEC 60205 (m, m²): outer legs,
 * yokes, centre leg, outer corners, inner corners. Exact for the E shape as IEC 60205 sections
 * it; a documented simplification for EFD, ETD and EQ (see the comments in the body).
 * @throws RangeError when the dimensions leave no leg, yoke or window.
 */
export function eFamilySections(shape: EShape | EfdShape | RoundLegShape): MagneticPathSection[] {
  const { overallWidthM: a, halfHeightM: b, depthM: c, halfWindowHeightM: d } = shape;
  const e = shape.windowSpanM;
  const f = 'centreLegDiameterM' in shape ? shape.centreLegDiameterM : shape.centreLegWidthM;
  const yokeHeightM = b - d;
  if (!(a > e && e > f && f > 0 && b > d && d > 0 && c > 0)) {
    throw new RangeError(`eFamilySections: inconsistent dimensions for ${shape.designation}`);
  }
  const outerLegsAreaM2 = outerLegsArea(shape, a, c, e);
  // Simplification for EFD/ETD/EQ: the yoke is a plain slab h × C on both sides of the centre
  // leg; IEC 60205 integrates the section that widens around a round leg.
  const yokeAreaM2 = 2 * yokeHeightM * c;
  const centreLegAreaM2 =
    'centreLegDiameterM' in shape
      ? (Math.PI * f * f) / 4
      : shape.family === 'efd'
        ? f * shape.centreLegDepthM
        : f * c;
  // Corners: a quarter-ellipse mean path between a limb of width w and the yoke of height h is
  // (π/8)(w + h); top and bottom in series give (π/4)(w + h), over the mean of the two areas.
  // ref: IEC 60205, E cores (corner sections l4, l5) (from memory). For round and arc-faced legs
  // w is the width of a rectangle of the same area, a simplification.
  const outerLegWidthM = outerLegsAreaM2 / (2 * c);
  const centreHalfWidthM = f / 2;
  return [
    { lengthM: 2 * d, areaM2: outerLegsAreaM2 },
    { lengthM: e - f, areaM2: yokeAreaM2 },
    { lengthM: 2 * d, areaM2: centreLegAreaM2 },
    {
      lengthM: (Math.PI / 4) * (outerLegWidthM + yokeHeightM),
      areaM2: (outerLegsAreaM2 + yokeAreaM2) / 2,
    },
    {
      lengthM: (Math.PI / 4) * (centreHalfWidthM + yokeHeightM),
      areaM2: (yokeAreaM2 + centreLegAreaM2) / 2,
    },
  ];
}

/** Section of both outer legs together, m². */
function outerLegsArea(
  shape: EShape | EfdShape | RoundLegShape,
  a: number,
  c: number,
  e: number,
): number {
  if (!('centreLegDiameterM' in shape)) return (a - e) * c;
  // Arc-faced legs: the rectangle A × C less the disc of diameter E clipped to |y| ≤ C/2.
  // ∫_{−c}^{c} √(R² − y²) dy = c·√(R² − c²) + R²·asin(c/R) for half-depth c and R = E/2 (exact
  // for this idealized outline; the drawings' chamfers and slots are ignored).
  const r = e / 2;
  const halfDepth = Math.min(c / 2, r);
  const inside =
    halfDepth * Math.sqrt(r * r - halfDepth * halfDepth) + r * r * Math.asin(halfDepth / r);
  return a * c - 2 * inside;
}
