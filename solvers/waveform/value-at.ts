import type { Waveform } from './waveform.js';

/**
 * Returns the waveform's value at `timeS` (s, taken modulo the period), in its unit, by linear
 * interpolation. At a jump it returns the value just after the jump (right-continuous), and at
 * whole multiples of the period the value at the start of the period.
 * @throws RangeError when timeS is not finite.
 */
export function valueAt(w: Waveform, timeS: number): number {
  if (!Number.isFinite(timeS)) {
    throw new RangeError(`valueAt: timeS must be finite, got ${timeS}`);
  }
  const { periodS, timesS, values } = w;
  let t = timeS % periodS;
  if (t < 0) t += periodS;
  if (t >= periodS) {
    // A tiny negative remainder plus the period rounds to the period: the time lies just before
    // the end, so it takes the value before any jump there.
    const last = timesS.length - 1;
    return (timesS[last - 1] === periodS ? values[last - 1] : values[last]) as number;
  }
  // Binary search for the last breakpoint at or before t, so a jump resolves to its later side.
  let low = 0;
  let high = timesS.length - 1;
  while (low < high) {
    const middle = (low + high + 1) >> 1;
    if ((timesS[middle] as number) <= t) low = middle;
    else high = middle - 1;
  }
  return interpolatedFrom(timesS, values, low, t);
}

/** The value at t on the segment from breakpoint `low` (its own value at or past the last). */
function interpolatedFrom(
  timesS: readonly number[],
  values: readonly number[],
  low: number,
  t: number,
): number {
  const t0 = timesS[low] as number;
  const v0 = values[low] as number;
  const t1 = timesS[low + 1];
  const v1 = values[low + 1];
  if (t1 === undefined || v1 === undefined || t === t0) return v0;
  return v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);
}

/**
 * {@link valueAt} of `wave` for times read in ascending order: the breakpoint found last is
 * where the next search starts, instead of a binary search each time (the same breakpoint, the
 * same arithmetic, so the same value). A time outside [0, T), or before the last one read, is
 * handed to `valueAt`.
 */
export function ascendingSampler(wave: Waveform): (timeS: number) => number {
  const { timesS, values, periodS } = wave;
  let low = 0;
  return (t: number): number => {
    if (!(t >= 0 && t < periodS) || t < (timesS[low] as number)) return valueAt(wave, t);
    while (low + 1 < timesS.length && (timesS[low + 1] as number) <= t) low++;
    return interpolatedFrom(timesS, values, low, t);
  };
}
