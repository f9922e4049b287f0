import { minimum } from './minimum.js';
import { peak } from './peak.js';
import type { Waveform } from './waveform.js';

/** Returns the peak minus the minimum of the waveform, in its unit (≥ 0). */
export function peakToPeak(w: Waveform): number {
  return peak(w) - minimum(w);
}
