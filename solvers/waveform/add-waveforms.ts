import { visitMergedSegments } from './visit-merged-segments.js';
import type { Waveform } from './waveform.js';

/**
 * Returns the pointwise sum a(t) + b(t), exact: breakpoints of both are merged and a jump in
 * either becomes a jump of the sum. Both must share one period and one unit.
 * @throws RangeError when the periods differ by more than round-off (1e-12 relative).
 */
export function addWaveforms(a: Waveform, b: Waveform): Waveform {
  const timesS: number[] = [];
  const values: number[] = [];
  visitMergedSegments(a, b, (startS, endS, aStart, aEnd, bStart, bEnd) => {
    const start = aStart + bStart;
    const count = timesS.length;
    // Continue from the previous piece's end unless the sum jumps here.
    if (count === 0 || timesS[count - 1] !== startS || values[count - 1] !== start) {
      timesS.push(startS);
      values.push(start);
    }
    timesS.push(endS);
    values.push(aEnd + bEnd);
  });
  return { periodS: a.periodS, timesS, values };
}
