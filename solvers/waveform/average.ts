import type { Waveform } from './waveform.js';

/**
 * Returns the mean of the waveform over one period, in its unit: the exact integral of each
 * linear segment, Δt·(a + b)/2, divided by the period. Jumps (zero-length segments) add nothing.
 */
export function average(w: Waveform): number {
  const { timesS, values } = w;
  let t0 = timesS[0] as number;
  let a = values[0] as number;
  let sum = 0;
  for (let i = 1; i < timesS.length; i++) {
    const t1 = timesS[i] as number;
    const b = values[i] as number;
    sum += (t1 - t0) * (a + b);
    t0 = t1;
    a = b;
  }
  return sum / (2 * w.periodS);
}
