import type { Waveform } from './waveform.js';
import { waveformStats, type WaveformStats, type WaveformStatsMemo } from './waveform-stats.js';

/** Scratch for {@link acRms} (it calls nothing that uses it again). */
const STATS: WaveformStats = { peak: 0, rms: 0, average: 0 };

/**
 * Returns the RMS of the waveform less its mean (√(rms² − mean²), floored at 0), in its unit:
 * `rms` and `average` from one pass over the points (`waveformStats`, the same numbers), or from
 * `memo`.
 */
export function acRms(w: Waveform, memo?: WaveformStatsMemo): number {
  const stats = memo === undefined ? waveformStats(w, STATS) : memo.of(w);
  return Math.sqrt(Math.max(0, stats.rms ** 2 - stats.average ** 2));
}
