import { average } from './average.js';
import { rms } from './rms.js';
import type { Waveform } from './waveform.js';

/** Returns the RMS of the waveform less its mean (√(rms² − mean²), floored at 0), in its unit. */
export function acRms(w: Waveform): number {
  return Math.sqrt(Math.max(0, rms(w) ** 2 - average(w) ** 2));
}
