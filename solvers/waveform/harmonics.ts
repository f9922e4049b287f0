import { fourierCoefficients } from './fourier-coefficients.js';
import type { Waveform } from './waveform.js';

/** One Fourier component of a periodic waveform: amplitude·cos(2π·frequencyHz·t + phaseRad). */
export interface Harmonic {
  /** Harmonic order n ≥ 1 (multiple of the fundamental). */
  order: number;
  /** n divided by the period, Hz. */
  frequencyHz: number;
  /** Peak amplitude of the sinusoid, in the waveform's unit (≥ 0). */
  amplitude: number;
  /** Phase of the cosine, rad, in [−π, π]; 0 when the amplitude is exactly 0. */
  phaseRad: number;
}

/**
 * Returns harmonics 1..count of the waveform (the average is `average(w)`), from its Fourier
 * coefficients (`fourierCoefficients`); w(t) = average + Σ amplitude·cos(2π·f·t + phase).
 * Accurate for orders in the thousands and for segments much shorter than the period.
 * @throws RangeError when count is not a non-negative integer.
 */
export function harmonics(w: Waveform, count: number): Harmonic[] {
  if (!Number.isInteger(count) || count < 0) {
    throw new RangeError(`harmonics: count must be a non-negative integer, got ${count}`);
  }
  const re = new Float64Array(count);
  const im = new Float64Array(count);
  fourierCoefficients(w, count, re, im);
  const result: Harmonic[] = [];
  for (let n = 1; n <= count; n++) {
    const x = re[n - 1] as number;
    const y = im[n - 1] as number;
    // The real series' cosine amplitude is 2·|Xn| and its phase arg(Xn).
    const amplitude = 2 * Math.sqrt(x * x + y * y);
    const phaseRad = amplitude === 0 ? 0 : Math.atan2(y, x);
    result.push({ order: n, frequencyHz: n / w.periodS, amplitude, phaseRad });
  }
  return result;
}
