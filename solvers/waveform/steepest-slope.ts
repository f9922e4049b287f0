import type { Waveform } from './waveform.js';

/** The largest |dv/dt| over the waveform's segments of non-zero length, unit per second. */
export function steepestSlope(w: Waveform): number {
  let steepest = 0;
  for (let i = 0; i + 1 < w.timesS.length; i++) {
    const durationS = (w.timesS[i + 1] as number) - (w.timesS[i] as number);
    if (durationS > 0) {
      const slope = Math.abs((w.values[i + 1] as number) - (w.values[i] as number)) / durationS;
      if (slope > steepest) steepest = slope;
    }
  }
  return steepest;
}
