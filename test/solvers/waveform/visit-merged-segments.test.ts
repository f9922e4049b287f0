import { describe, expect, it } from 'vitest';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { visitMergedSegments } from '../../../solvers/waveform/visit-merged-segments.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;

describe('visitMergedSegments', () => {
  it('visitMergedSegments(a, b) visits each positive-length piece of the merged breakpoints once', () => {
    const a = piecewiseLinear(T, [
      [0, 0],
      [0.3 * T, 3],
      [0.3 * T, 1],
      [T, 0],
    ]);
    const b = piecewiseLinear(T, [
      [0, 2],
      [0.6 * T, 2],
      [0.6 * T, -2],
      [T, -2],
    ]);
    const pieces: number[][] = [];
    visitMergedSegments(a, b, (...piece) => pieces.push(piece));
    // ref: common practice (the common refinement of two partitions is the union of their points)
    expect(pieces.map(([startS, endS]) => [startS, endS])).toEqual([
      [0, 0.3 * T],
      [0.3 * T, 0.6 * T],
      [0.6 * T, T],
    ]);
    const [, second] = pieces;
    // Inside (0.3·T, 0.6·T): a falls linearly from 1 towards 0 at T; b holds 2 before its jump.
    // ref: common practice (one-sided limits at a jump; linear interpolation inside a segment)
    expectClose(second?.[2] ?? NaN, 1, { abs: 0 });
    // ref: common practice (linear interpolation: 1 − (0.3/0.7) at 0.6·T)
    expectClose(second?.[3] ?? NaN, 1 - 0.3 / 0.7, { rel: 1e-12 });
    // ref: common practice (one-sided limit from the left of b's jump at 0.6·T)
    expectClose(second?.[5] ?? NaN, 2, { abs: 0 });
  });

  it('visitMergedSegments(a, b) ends at a.periodS when the periods differ only by round-off', () => {
    const a = piecewiseLinear(T, [
      [0, 0],
      [T, 1],
    ]);
    for (const periodS of [T * (1 + 5e-13), T * (1 - 5e-13)]) {
      const b = piecewiseLinear(periodS, [
        [0, 2],
        [0.5 * periodS, 4],
        [periodS, 2],
      ]);
      const pieces: number[][] = [];
      visitMergedSegments(a, b, (...piece) => pieces.push(piece));
      const last = pieces[pieces.length - 1] ?? [];
      // ref: IEEE 754 binary64 rounding (periods equal to within round-off are one period)
      expectClose(last[1] ?? NaN, T, { abs: 0 });
      // ref: IEEE 754 binary64 rounding (b's final breakpoint is read at the shared period end)
      expectClose(last[5] ?? NaN, 2, { abs: 0 });
    }
  });

  it('visitMergedSegments throws RangeError for periods that differ beyond round-off', () => {
    const a = piecewiseLinear(T, [
      [0, 0],
      [T, 0],
    ]);
    const b = piecewiseLinear(T * (1 + 1e-9), [
      [0, 0],
      [T * (1 + 1e-9), 0],
    ]);
    // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
    expect(() => visitMergedSegments(a, b, () => undefined)).toThrow(RangeError);
  });
});
