import { visitMergedSegments } from './visit-merged-segments.js';
import type { Waveform } from './waveform.js';

/**
 * Returns the exact mean of a(t)·b(t) over the shared period, in the product of their units (for
 * a current and a voltage, W). On each common linear piece the product is quadratic.
 * @throws RangeError when the periods differ by more than round-off (1e-12 relative).
 */
export function productAverage(a: Waveform, b: Waveform): number {
  let sum = 0;
  visitMergedSegments(a, b, (startS, endS, a0, a1, b0, b1) => {
    // ∫₀¹ (a0 + (a1 − a0)s)(b0 + (b1 − b0)s) ds = (2·a0b0 + 2·a1b1 + a0b1 + a1b0)/6.
    sum += (endS - startS) * (2 * (a0 * b0 + a1 * b1) + a0 * b1 + a1 * b0);
  });
  return sum / (6 * a.periodS);
}
