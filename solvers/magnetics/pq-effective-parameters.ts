import type { PqShape } from './core-shape.js';
import {
  iec60205FromCoreConstants,
  type EffectiveParameters,
} from './iec-60205-effective-parameters.js';
import type { MagneticPathSection } from './magnetic-path-section.js';

/** Radial steps of the numerical median radius of the outer legs (only that is numerical). */
const MEDIAN_STEPS = 4000;

/** What the PQ sectioning gives besides the effective parameters, for tests and documents. */
export interface PqSections {
  /** Centre leg, outer legs and the two corners, each a uniform series section (m, m²). */
  uniform: MagneticPathSection[];
  /** Half-angle about the A axis of the sector of each plate that faces one outer leg, rad. */
  sectorHalfAngleRad: number;
  /** Cross-section of both outer legs together, m². */
  outerLegsAreaM2: number;
  /** Radius that splits the outer legs' area in half (about the core axis), m. */
  outerLegsMedianRadiusM: number;
}

/**
 * Returns the series sections of a PQ core pair: centre leg (2D long, π·F²/4), outer legs (2D
 * long, the plate outline A × C outside the circle of diameter E and outside the wire exits
 * |x| < G/2), and the corner at each end of both legs by IEC 60205's rule for sharp corners (a
 * mean circular path joining the centres of area of the two sections, over their mean area).
 * The back plates are not among them: see {@link pqEffectiveParameters}.
 * @throws RangeError when the dimensions leave no leg, plate or window.
 */
export function pqSections(shape: PqShape): PqSections {
  const { overallWidthM: a, halfHeightM: b, depthM: c, halfWindowHeightM: d } = shape;
  const e = shape.windowSpanM;
  const f = shape.centreLegDiameterM;
  const g = shape.slotWidthM;
  if (!(a > e && e > f && f > 0 && b > d && d > 0 && c > f && g >= 0 && g < a && c < a)) {
    throw new RangeError(`pqSections: inconsistent dimensions for ${shape.designation}`);
  }
  const r2 = f / 2;
  const r3 = e / 2;
  const plateM = b - d;
  const sectorHalfAngleRad = Math.min(
    r3 > c / 2 ? Math.asin(c / (2 * r3)) : Math.PI / 2,
    g / 2 < r3 ? Math.acos(g / (2 * r3)) : 0,
  );
  const outerLegsAreaM2 = legsArea(a, c, g, r3);
  if (!(sectorHalfAngleRad > 0 && outerLegsAreaM2 > 0)) {
    throw new RangeError(`pqSections: no outer leg faces the window in ${shape.designation}`);
  }
  const outerLegsMedianRadiusM = legsMedianRadius(a, c, g, r3, outerLegsAreaM2);
  const centreAreaM2 = Math.PI * r2 * r2;
  // Corners (IEC 60205, rule for sharp corners; the pot-core form, from memory): the centre of
  // area of a round leg lies s1 = r2 − √(r2²/2) inside its edge (the radius halving its area),
  // of the legs s2 = (median radius) − r3 outside the window; that of the plate h/2 from the
  // window. A quarter circle of the mean of the two offsets, top and bottom: (π/4)(2s + h).
  const s1 = r2 - Math.sqrt((r2 * r2) / 2);
  const s2 = outerLegsMedianRadiusM - r3;
  const sectorLengthAt = (r: number) => 4 * sectorHalfAngleRad * r;
  return {
    uniform: [
      { lengthM: 2 * d, areaM2: centreAreaM2 },
      { lengthM: 2 * d, areaM2: outerLegsAreaM2 },
      {
        lengthM: (Math.PI / 4) * (2 * s1 + plateM),
        areaM2: (centreAreaM2 + 2 * Math.PI * r2 * plateM) / 2,
      },
      {
        lengthM: (Math.PI / 4) * (2 * s2 + plateM),
        areaM2: (outerLegsAreaM2 + sectorLengthAt(r3) * plateM) / 2,
      },
    ],
    sectorHalfAngleRad,
    outerLegsAreaM2,
    outerLegsMedianRadiusM,
  };
}

/**
 * Returns le, Ae, Ve and Amin of a PQ core pair from its nominal dimensions, by the IEC 60205
 * core constants over {@link pqSections} plus the two back plates. In each plate the flux runs
 * radially from the centre leg (r2 = F/2) to the winding space (r3 = E/2) as in IEC 60205's pot
 * cores (ln(r3/r2) terms), but only within the two sectors that face the outer legs, of total
 * angle 4θ with θ the half-angle the legs subtend at r3: C1 = ln(r3/r2)/(2θh) and
 * C2 = (1/r2 − 1/r3)/(8θ²h²) for both plates, h = B − D. A simplification of this version (the
 * plate near the centre leg also carries flux outside the sectors; IEC 60205's own PQ formulas
 * are not reproduced). Amin is the smallest physical section: centre leg, outer legs, the
 * plate's sectors at r3, or the plate's full ring 2π·r2·h at the centre leg (the sectors' area
 * there is a modelling device, not a section the flux is confined to).
 * @throws RangeError for inconsistent dimensions.
 */
export function pqEffectiveParameters(shape: PqShape): EffectiveParameters {
  const sections = pqSections(shape);
  const r2 = shape.centreLegDiameterM / 2;
  const r3 = shape.windowSpanM / 2;
  const plateM = shape.halfHeightM - shape.halfWindowHeightM;
  const theta = sections.sectorHalfAngleRad;
  let c1 = Math.log(r3 / r2) / (2 * theta * plateM);
  let c2 = (1 / r2 - 1 / r3) / (8 * theta * theta * plateM * plateM);
  for (const { lengthM, areaM2 } of sections.uniform) {
    c1 += lengthM / areaM2;
    c2 += lengthM / (areaM2 * areaM2);
  }
  const minimumAreaM2 = Math.min(
    Math.PI * r2 * r2,
    sections.outerLegsAreaM2,
    4 * theta * r3 * plateM,
    2 * Math.PI * r2 * plateM,
  );
  return iec60205FromCoreConstants(c1, c2, minimumAreaM2);
}

/** ∫ √(r² − x²) dx from 0 to x (|x| ≤ r): half the area under a circle's arc. */
function circleStrip(x: number, r: number): number {
  const u = Math.min(Math.max(x, -r), r);
  return (u * Math.sqrt(r * r - u * u) + r * r * Math.asin(u / r)) / 2;
}

/**
 * Area of both outer legs: the rectangle A × C where |x| ≥ G/2 and outside the circle of
 * radius r3. Per side: ∫ over x from G/2 to A/2 of C − 2·min(C/2, √(r3² − x²)) (closed form).
 */
function legsArea(a: number, c: number, g: number, r3: number): number {
  const x0 = g / 2;
  const x1 = a / 2;
  // Where the circle meets the faces y = ±C/2 (0 when the circle is inside the depth).
  const xc = r3 > c / 2 ? Math.sqrt(r3 * r3 - (c * c) / 4) : 0;
  const inside = (from: number, to: number) => {
    if (!(to > from)) return 0;
    // min(C/2, √(r3² − x²)) is C/2 below xc, the arc from xc to r3, and 0 beyond r3.
    const flatEnd = Math.min(to, xc);
    const flat = flatEnd > from ? (flatEnd - from) * (c / 2) : 0;
    const arcFrom = Math.max(from, xc);
    const arcTo = Math.min(to, r3);
    const arc = arcTo > arcFrom ? circleStrip(arcTo, r3) - circleStrip(arcFrom, r3) : 0;
    return flat + arc;
  };
  const perSide = (x1 - x0) * c - 2 * inside(x0, x1);
  return 2 * perSide;
}

/** Length of the circle of radius r inside the outer legs (all four quarters), m. */
function legsArcLength(r: number, a: number, c: number, g: number): number {
  if (r <= g / 2) return 0;
  const from = r > a / 2 ? Math.acos(a / (2 * r)) : 0;
  const to = Math.min(r > c / 2 ? Math.asin(c / (2 * r)) : Math.PI / 2, Math.acos(g / (2 * r)));
  return 4 * r * Math.max(0, to - from);
}

/** The radius about the core axis inside which half the outer legs' area lies (midpoint sums). */
function legsMedianRadius(a: number, c: number, g: number, r3: number, areaM2: number): number {
  const outerM = Math.hypot(a / 2, c / 2);
  const stepM = (outerM - r3) / MEDIAN_STEPS;
  let cumulative = 0;
  for (let i = 0; i < MEDIAN_STEPS; i++) {
    const strip = legsArcLength(r3 + (i + 0.5) * stepM, a, c, g) * stepM;
    if (cumulative + strip >= areaM2 / 2) {
      return r3 + (i + (areaM2 / 2 - cumulative) / strip) * stepM;
    }
    cumulative += strip;
  }
  return outerM;
}
