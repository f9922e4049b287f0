import type { Waveform } from './waveform.js';

/** The peak, RMS and mean of one waveform, in its unit. */
export interface WaveformStats {
  peak: number;
  rms: number;
  average: number;
}

/**
 * Writes the waveform's peak, RMS and mean into `into` (and returns it) from one pass over its
 * points: each the very sum, in the same order, of `peak`, `rms` and `average` (the same numbers
 * to the bit), where the three calls read every point three times. A device's or a winding's
 * stress reads all three of each current at every corner.
 */
export function waveformStats(w: Waveform, into: WaveformStats): WaveformStats {
  const { timesS, values } = w;
  const count = values.length;
  let highest = -Infinity;
  let t0 = timesS[0] as number;
  let a = values[0] as number;
  if (count > 0 && a > highest) highest = a;
  let squares = 0;
  let sum = 0;
  for (let i = 1; i < timesS.length; i++) {
    const t1 = timesS[i] as number;
    const b = values[i] as number;
    if (b > highest) highest = b;
    const dt = t1 - t0;
    // The trapezoidal-segment relations of rms.ts and average.ts (Erickson & Maksimović,
    // Fundamentals of Power Electronics, 2nd ed., App. A).
    squares += dt * (a * a + a * b + b * b);
    sum += dt * (a + b);
    t0 = t1;
    a = b;
  }
  into.peak = highest;
  into.rms = Math.sqrt(squares / (3 * w.periodS));
  into.average = sum / (2 * w.periodS);
  return into;
}
