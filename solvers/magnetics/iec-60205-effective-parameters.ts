import type { MagneticPathSection } from './magnetic-path-section.js';

/** Effective parameters of a core by IEC 60205, SI units. */
export interface EffectiveParameters {
  /** Core constant C1 = Σ l/A, 1/m. */
  coreConstantC1PerM: number;
  /** Core constant C2 = Σ l/A², 1/m³. */
  coreConstantC2PerM3: number;
  /** Effective magnetic path length le = C1²/C2, m. */
  effectiveLengthM: number;
  /** Effective cross-section Ae = C1/C2, m². */
  effectiveAreaM2: number;
  /** Effective volume Ve = le·Ae = C1³/C2², m³. */
  effectiveVolumeM3: number;
  /** Smallest cross-section along the path, Amin, m² (where saturation starts). */
  minimumAreaM2: number;
}

/**
 * Returns le, Ae, Ve and Amin of a core from its path sections in series, by the core constants
 * C1 = Σ l_i/A_i and C2 = Σ l_i/A_i². ref: IEC 60205, Calculation of the effective parameters of
 * magnetic piece parts (definitions of C1, C2, le, Ae, Ve, Amin).
 * @throws RangeError for no sections, or a length or area that is not finite and > 0.
 */
export function iec60205EffectiveParameters(
  sections: readonly MagneticPathSection[],
): EffectiveParameters {
  if (sections.length === 0) {
    throw new RangeError('iec60205EffectiveParameters: need at least one section');
  }
  let c1 = 0;
  let c2 = 0;
  let minimumAreaM2 = Infinity;
  for (const [index, { lengthM, areaM2 }] of sections.entries()) {
    if (!(Number.isFinite(lengthM) && lengthM > 0 && Number.isFinite(areaM2) && areaM2 > 0)) {
      throw new RangeError(
        `iec60205EffectiveParameters: section ${index} needs finite length and area > 0, ` +
          `got ${lengthM} m, ${areaM2} m²`,
      );
    }
    c1 += lengthM / areaM2;
    c2 += lengthM / (areaM2 * areaM2);
    minimumAreaM2 = Math.min(minimumAreaM2, areaM2);
  }
  return iec60205FromCoreConstants(c1, c2, minimumAreaM2);
}

/**
 * Returns the effective parameters from the core constants C1 (1/m) and C2 (1/m³), for shapes
 * whose constants come in closed form (ring cores), with Amin as given (m²).
 */
export function iec60205FromCoreConstants(
  coreConstantC1PerM: number,
  coreConstantC2PerM3: number,
  minimumAreaM2: number,
): EffectiveParameters {
  // ref: IEC 60205: le = C1²/C2, Ae = C1/C2, Ve = le·Ae.
  const effectiveLengthM = (coreConstantC1PerM * coreConstantC1PerM) / coreConstantC2PerM3;
  const effectiveAreaM2 = coreConstantC1PerM / coreConstantC2PerM3;
  return {
    coreConstantC1PerM,
    coreConstantC2PerM3,
    effectiveLengthM,
    effectiveAreaM2,
    effectiveVolumeM3: effectiveLengthM * effectiveAreaM2,
    minimumAreaM2,
  };
}
