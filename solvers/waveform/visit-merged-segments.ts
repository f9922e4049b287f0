import { TIME_ROUND_OFF } from './time-round-off.js';
import type { Waveform } from './waveform.js';

/**
 * Receives one common linear piece of two waveforms: its start and end times (s), then the values
 * of `a` and of `b` at the start and at the end, each taken from inside the piece.
 */
export type MergedSegmentVisitor = (
  startS: number,
  endS: number,
  aStart: number,
  aEnd: number,
  bStart: number,
  bEnd: number,
) => void;

/**
 * Calls `visit` for each interval of positive length between the merged breakpoints of `a` and
 * `b`, in time order; both are linear on each. Values at the ends are the limits from inside, so
 * a jump in either waveform splits pieces cleanly. Internal to solvers/waveform.
 * @throws RangeError when the periods differ by more than round-off.
 */
export function visitMergedSegments(a: Waveform, b: Waveform, visit: MergedSegmentVisitor): void {
  const periodS = a.periodS;
  if (!(Math.abs(a.periodS - b.periodS) <= TIME_ROUND_OFF * periodS)) {
    throw new RangeError(`waveforms differ in period: ${a.periodS} s and ${b.periodS} s`);
  }
  const lastA = a.timesS.length - 1;
  const lastB = b.timesS.length - 1;
  let i = 0;
  let j = 0;
  let startS = 0;
  for (;;) {
    // Step past zero-length segments (jumps) and past segments ending at or before startS.
    while (i < lastA && timeAt(a, i + 1, lastA, periodS) <= startS) i++;
    while (j < lastB && timeAt(b, j + 1, lastB, periodS) <= startS) j++;
    if (i >= lastA || j >= lastB) return;
    const aEndS = timeAt(a, i + 1, lastA, periodS);
    const bEndS = timeAt(b, j + 1, lastB, periodS);
    const endS = Math.min(aEndS, bEndS);
    const aStartS = timeAt(a, i, lastA, periodS);
    const bStartS = timeAt(b, j, lastB, periodS);
    const a0 = a.values[i] as number;
    const a1 = a.values[i + 1] as number;
    const b0 = b.values[j] as number;
    const b1 = b.values[j + 1] as number;
    visit(
      startS,
      endS,
      interpolate(aStartS, aEndS, a0, a1, startS),
      interpolate(aStartS, aEndS, a0, a1, endS),
      interpolate(bStartS, bEndS, b0, b1, startS),
      interpolate(bStartS, bEndS, b0, b1, endS),
    );
    startS = endS;
  }
}

/** Breakpoint time k of w, held within [0, periodS] so round-off between periods cannot leak. */
function timeAt(w: Waveform, k: number, last: number, periodS: number): number {
  return k >= last ? periodS : Math.min(w.timesS[k] as number, periodS);
}

/** Value at t on the segment (t0, v0)–(t1, v1); exact at either end, so breakpoints stay exact. */
function interpolate(t0: number, t1: number, v0: number, v1: number, t: number): number {
  if (t <= t0) return v0;
  if (t >= t1) return v1;
  return v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);
}
