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

/**
 * {@link waveformStats} of the waveforms one corner reads again and again (a switch's current for
 * its conduction loss, its turn-off loss and its stress; a rectifier's for its loss and its
 * stress), each computed once: looked up by identity among the few kept. A corner clears it when
 * it starts and when it is done, so that it holds no waveform past its corner. Waveforms are not
 * changed once made, so a kept entry is the waveform's.
 */
export class WaveformStatsMemo {
  private readonly waves: (Waveform | undefined)[] = [];
  private readonly kept: WaveformStats[] = [];
  private count = 0;

  /** Forgets every waveform. */
  clear(): void {
    for (let i = 0; i < this.count; i++) this.waves[i] = undefined;
    this.count = 0;
  }

  /** The stats of `w` (the memo's own object: read it, do not keep it). */
  of(w: Waveform): WaveformStats {
    const count = this.count;
    for (let i = 0; i < count; i++) {
      if (this.waves[i] === w) return this.kept[i] as WaveformStats;
    }
    const into = this.kept[count] ?? { peak: 0, rms: 0, average: 0 };
    this.kept[count] = into;
    this.waves[count] = w;
    this.count = count + 1;
    return waveformStats(w, into);
  }
}
