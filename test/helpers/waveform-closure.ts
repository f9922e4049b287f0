import type { Waveform } from '../../solvers/index.js';

/**
 * Checks of a drawn periodic waveform (common practice: a steady state's waveform ends the period
 * where it began, and a current through an inductance does not jump).
 */

/** Difference between the value at the start and at the end of the period, per unit of peak. */
export function closureError(w: Waveform): number {
  const scale = Math.max(...w.values.map(Math.abs), 1e-12);
  return Math.abs((w.values[0] ?? NaN) - (w.values[w.values.length - 1] ?? NaN)) / scale;
}

/** Largest jump between two points at the same instant, per unit of the waveform's peak. */
export function largestStep(w: Waveform): number {
  const scale = Math.max(...w.values.map(Math.abs), 1e-12);
  let step = 0;
  for (let i = 1; i < w.values.length; i++) {
    if (w.timesS[i] === w.timesS[i - 1]) {
      step = Math.max(step, Math.abs((w.values[i] ?? 0) - (w.values[i - 1] ?? 0)) / scale);
    }
  }
  return step;
}
