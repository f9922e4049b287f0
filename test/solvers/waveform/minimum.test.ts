import { describe, it } from 'vitest';
import { minimum } from '../../../solvers/waveform/minimum.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;

describe('minimum', () => {
  it('minimum(square wave ±A) equals −A', () => {
    const w = piecewiseLinear(T, [
      [0, 12],
      [0.5 * T, 12],
      [0.5 * T, -12],
      [T, -12],
    ]);
    // ref: common practice (a square wave of amplitude A swings to −A)
    expectClose(minimum(w), -12, { abs: 0 });
  });

  it('minimum(all-positive sawtooth) equals its starting value after the jump', () => {
    const w = piecewiseLinear(T, [
      [0, 0.8],
      [T, 3.3],
    ]);
    // ref: common practice (a linear segment attains its minimum at an end)
    expectClose(minimum(w), 0.8, { abs: 0 });
  });
});
