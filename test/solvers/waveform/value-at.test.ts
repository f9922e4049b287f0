import { describe, expect, it } from 'vitest';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { ascendingSampler, valueAt } from '../../../solvers/waveform/value-at.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;
// Invented: a ramp 1 → 3 over 0.4·T, a jump down to −1, a ramp back to 1 at T.
const w = piecewiseLinear(T, [
  [0, 1],
  [0.4 * T, 3],
  [0.4 * T, -1],
  [T, 1],
]);

describe('valueAt', () => {
  it('valueAt(w, t) interpolates linearly inside a segment', () => {
    // ref: common practice (linear interpolation between breakpoints)
    expectClose(valueAt(w, 0.1 * T), 1.5, { rel: 1e-12 });
    // ref: common practice (linear interpolation between breakpoints)
    expectClose(valueAt(w, 0.7 * T), 0, { abs: 1e-12 });
  });

  it('valueAt(w, jump time) returns the value after the jump', () => {
    // ref: common practice (right-continuous convention, as for a switch that has just turned off)
    expectClose(valueAt(w, 0.4 * T), -1, { abs: 0 });
  });

  it('valueAt(w, t) is periodic: t + k·T and negative t give the same value', () => {
    // ref: common practice (periodic extension w(t + T) = w(t))
    expectClose(valueAt(w, 0.1 * T + 3 * T), 1.5, { rel: 1e-9 });
    // ref: common practice (periodic extension w(t + T) = w(t))
    expectClose(valueAt(w, -0.3 * T), valueAt(w, 0.7 * T), { abs: 1e-9 });
  });

  it('valueAt(w, T) returns the value at the start of the period', () => {
    const sawtooth = piecewiseLinear(T, [
      [0, -2],
      [T, 2],
    ]);
    // ref: common practice (periodic extension; at the wrap-around jump the later side is w(0))
    expectClose(valueAt(sawtooth, T), -2, { abs: 0 });
    // ref: common practice (periodic extension; a tiny negative time is just before the wrap)
    expectClose(valueAt(sawtooth, -1e-30), 2, { rel: 1e-12 });
  });

  it('valueAt(w, t just before T) returns the value before a jump at the end of the period', () => {
    const w = piecewiseLinear(T, [
      [0, 0],
      [T, 3],
      [T, 0],
    ]);
    // ref: common practice (a time before a jump takes the earlier side; −1e-30 s folds onto T)
    expectClose(valueAt(w, -1e-30), 3, { abs: 0 });
  });

  it('valueAt throws RangeError for a non-finite time', () => {
    // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
    expect(() => valueAt(w, NaN)).toThrow(RangeError);
  });
});

describe('ascendingSampler', () => {
  it('ascendingSampler gives valueAt bit for bit over ascending times, jumps and the period end', () => {
    const jumpy = piecewiseLinear(4, [
      [0, 1],
      [1, 3],
      [1, -2],
      [2.5, 0.5],
      [2.5, 0.5],
      [4, 1],
    ]);
    const sample = ascendingSampler(jumpy);
    // ref: common practice (linear interpolation between breakpoints, right-continuous at a
    // jump), here as valueAt defines it: the sampler must agree exactly, read in ascending order
    const times = [0, 0.3, 1, 1, 1.7, 2.5, 3.99, 4, 5];
    for (const t of times) expect(sample(t)).toBe(valueAt(jumpy, t));
    // A time before the last one read falls back to the search.
    expect(sample(0.5)).toBe(valueAt(jumpy, 0.5));
  });
});
