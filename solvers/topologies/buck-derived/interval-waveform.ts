import { drawnWaveform } from '../../waveform/piecewise-linear.js';
import type { Waveform } from '../../waveform/waveform.js';

/**
 * Break fractions already put in order by {@link intervalBreaks}: the waveforms of one interval
 * set share them instead of sorting the same fractions again each.
 */
export interface IntervalBreaks {
  readonly sortedFractions: readonly number[];
}

/**
 * The distinct breaks of `breakFractions` clamped to [0, 1], with 0 and 1, in ascending order,
 * for several {@link intervalWaveform} calls over the same intervals.
 */
export function intervalBreaks(breakFractions: readonly number[]): IntervalBreaks {
  return { sortedFractions: sortedBreaks(breakFractions) };
}

/**
 * Returns a waveform over one period from its break fractions (0..1, any order; or put in order
 * once by {@link intervalBreaks}) and a function `value(fraction, midFraction)` that is linear in
 * `fraction` inside each interval, which is named by its midpoint; a value that differs across a
 * break becomes a jump.
 */
export function intervalWaveform(
  periodS: number,
  breakFractions: readonly number[] | IntervalBreaks,
  value: (fraction: number, midFraction: number) => number,
): Waveform {
  const breaks = Array.isArray(breakFractions)
    ? sortedBreaks(breakFractions as readonly number[])
    : (breakFractions as IntervalBreaks).sortedFractions;
  // Two columns, not a [time, value] pair per point: the pairs were a fifth of a forward
  // design's garbage (every waveform of every corner is built here).
  const timesS: number[] = [];
  const values: number[] = [];
  for (let i = 1; i < breaks.length; i++) {
    const a = breaks[i - 1] as number;
    const b = breaks[i] as number;
    if (b - a <= 1e-12) continue;
    const mid = (a + b) / 2;
    timesS.push(a * periodS, b * periodS);
    values.push(value(a, mid), value(b, mid));
  }
  // Compacted in place: the columns are this call's own.
  return drawnWaveform(periodS, { timesS, values });
}

/**
 * The distinct breaks clamped to [0, 1], with 0 and 1, in ascending order. They are few, so each
 * is inserted in place (Array.prototype.sort allocated about as much as the waveform did); a NaN
 * break takes the plain path, push then sort, so that even its order is as before.
 */
function sortedBreaks(breakFractions: readonly number[]): number[] {
  const breaks = [0, 1];
  if (breakFractions.some((f) => Number.isNaN(f))) {
    for (const f of breakFractions) {
      const clamped = Math.min(1, Math.max(0, f));
      if (!breaks.includes(clamped)) breaks.push(clamped);
    }
    return breaks.sort((a, b) => a - b);
  }
  for (const f of breakFractions) insertDistinctAscending(breaks, Math.min(1, Math.max(0, f)));
  return breaks;
}

/**
 * Inserts `value` in place into `sorted` (ascending, distinct, no NaN) unless it is already
 * there. For the few fractions a waveform's breaks or samples are, this beats a sort, which
 * allocated about as much as the waveform did.
 */
export function insertDistinctAscending(sorted: number[], value: number): void {
  if (sorted.includes(value)) return;
  let i = sorted.length;
  sorted.push(value);
  while (i > 0 && (sorted[i - 1] as number) > value) {
    sorted[i] = sorted[i - 1] as number;
    i--;
  }
  sorted[i] = value;
}
