import type { Waveform } from './waveform.js';

/**
 * Returns the root-mean-square value over one period, in the waveform's unit (≥ 0). Each linear
 * segment from a to b contributes exactly Δt·(a² + ab + b²)/3 to the integral of the square.
 */
export function rms(w: Waveform): number {
  const { timesS, values } = w;
  let t0 = timesS[0] as number;
  let a = values[0] as number;
  let sum = 0;
  for (let i = 1; i < timesS.length; i++) {
    const t1 = timesS[i] as number;
    const b = values[i] as number;
    // The trapezoidal-segment relation of Erickson & Maksimović, Fundamentals of Power
    // Electronics, 2nd ed., App. A; a² + ab + b² ≥ 0 for all a, b, so the root is real.
    sum += (t1 - t0) * (a * a + a * b + b * b);
    t0 = t1;
    a = b;
  }
  return Math.sqrt(sum / (3 * w.periodS));
}
