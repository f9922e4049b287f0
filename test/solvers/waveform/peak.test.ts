import { describe, it } from 'vitest';
import { peak } from '../../../solvers/waveform/peak.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;

describe('peak', () => {
  it('peak(ramp on a pedestal) equals the value just before the jump down', () => {
    // Invented flyback-like primary current: 1.2 A pedestal ramping to 2.5 A, then off.
    const w = piecewiseLinear(T, [
      [0, 0],
      [0, 1.2],
      [0.4 * T, 2.5],
      [0.4 * T, 0],
      [T, 0],
    ]);
    // ref: common practice (a linear segment attains its maximum at an end; both sides of a jump count)
    expectClose(peak(w), 2.5, { abs: 0 });
  });

  it('peak(all-negative triangle) equals its least negative vertex', () => {
    const w = piecewiseLinear(T, [
      [0, -5],
      [0.5 * T, -1],
      [T, -5],
    ]);
    // ref: common practice (a linear segment attains its maximum at an end)
    expectClose(peak(w), -1, { abs: 0 });
  });
});
