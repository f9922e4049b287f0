import { describe, it } from 'vitest';
import { peakToPeak } from '../../../solvers/waveform/peak-to-peak.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;

describe('peakToPeak', () => {
  it('peakToPeak(inductor ripple triangle) equals the ripple ΔI = V·D·T/L', () => {
    // Invented buck-like inductor current: 12 V across 47 µH for D·T, rising from 1.8 A.
    const duty = 0.3;
    const rippleA = (12 * duty * T) / 47e-6;
    const w = piecewiseLinear(T, [
      [0, 1.8],
      [duty * T, 1.8 + rippleA],
      [T, 1.8],
    ]);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., ch. 2, inductor current ripple (from memory)
    expectClose(peakToPeak(w), rippleA, { rel: 1e-12 });
  });

  it('peakToPeak(square wave ±A) equals 2A', () => {
    const w = piecewiseLinear(T, [
      [0, 5],
      [0.5 * T, 5],
      [0.5 * T, -5],
      [T, -5],
    ]);
    // ref: common practice (peak-to-peak of a ±A square wave)
    expectClose(peakToPeak(w), 10, { abs: 0 });
  });
});
