import type { RingShape } from './core-shape.js';
import {
  iec60205FromCoreConstants,
  type EffectiveParameters,
} from './iec-60205-effective-parameters.js';

/**
 * Returns le, Ae, Ve and Amin of a ring core of rectangular section by the logarithmic formulas
 * of IEC 60205: C1 = 2π/(h·ln(r2/r1)), C2 = 2π·(1/r1 − 1/r2)/(h²·ln³(r2/r1)); chamfers ignored.
 * Amin is the section h·(r2 − r1), above Ae; the peak flux density, at r1, is Φ/(h·r1·ln(r2/r1)).
 * @throws RangeError unless 0 < inner diameter < outer diameter and height > 0.
 */
export function ringEffectiveParameters(shape: RingShape): EffectiveParameters {
  const r1 = shape.innerDiameterM / 2;
  const r2 = shape.outerDiameterM / 2;
  const h = shape.heightM;
  if (!(r1 > 0 && r2 > r1 && h > 0 && Number.isFinite(r2) && Number.isFinite(h))) {
    throw new RangeError(
      `ringEffectiveParameters: inconsistent dimensions for ${shape.designation}`,
    );
  }
  // ref: IEC 60205, ring cores. Derivation: with H = NI/(2πr), ∫dl/A matches the flux
  // (C1) and the B³-weighted volume integral ∫(1/r³)·2πr·h dr matches C2; the result tends to
  // the mean-path values 2πr/(h·Δr) and 2πr/(h·Δr)² as r2/r1 → 1.
  const logRatio = Math.log(r2 / r1);
  const c1 = (2 * Math.PI) / (h * logRatio);
  const c2 = (2 * Math.PI * (1 / r1 - 1 / r2)) / (h * h * logRatio ** 3);
  return iec60205FromCoreConstants(c1, c2, h * (r2 - r1));
}
