import type { Waveform } from './waveform.js';

/**
 * Returns the root-mean-square value over one period, in the waveform's unit (≥ 0). Each linear
 * segment from a to b contributes exactly Δt·(a² + ab + b²)/3 to the integral of the square.
 */
export function rms(w: Waveform): number {
  return rmsAbout(w, 0);
}

/**
 * Returns the RMS of the waveform less `offset` (in its unit): rms() of the shifted values,
 * without a shifted copy. With the waveform's mean it is the RMS of its AC part, computed from
 * the shifted values so that a large mean does not cancel it.
 */
export function rmsAbout(w: Waveform, offset: number): number {
  const { timesS, values } = w;
  let t0 = timesS[0] as number;
  let a = (values[0] as number) - offset;
  let sum = 0;
  for (let i = 1; i < timesS.length; i++) {
    const t1 = timesS[i] as number;
    const b = (values[i] as number) - offset;
    // The trapezoidal-segment relation of Erickson & Maksimović, Fundamentals of Power
    // Electronics, 2nd ed., App. A; a² + ab + b² ≥ 0 for all a, b, so the root is real.
    sum += (t1 - t0) * (a * a + a * b + b * b);
    t0 = t1;
    a = b;
  }
  return Math.sqrt(sum / (3 * w.periodS));
}
