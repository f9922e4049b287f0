import { peakToPeak } from './peak-to-peak.js';
import { valueAt } from './value-at.js';
import type { Waveform } from './waveform.js';

/**
 * Returns the frequency, Hz, at which the waveform repeats: twice 1/periodS when its second half
 * period repeats its first (a double-ended converter's output inductor current, say), else
 * 1/periodS. Checked at every breakpoint of either half, to `relativeTolerance` of the
 * peak-to-peak value.
 */
export function repetitionFrequencyHz(w: Waveform, relativeTolerance = 1e-6): number {
  const halfS = w.periodS / 2;
  const toleranceA = relativeTolerance * peakToPeak(w);
  const repeats = w.timesS.every(
    (t) => Math.abs(valueAt(w, t) - valueAt(w, t + halfS)) <= toleranceA,
  );
  return repeats ? 2 / w.periodS : 1 / w.periodS;
}
