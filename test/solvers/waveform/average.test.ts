import { describe, it } from 'vitest';
import { average } from '../../../solvers/waveform/average.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: 100 kHz switching; a handful of double roundings justify rel 1e-12.
const T = 1e-5;
const TIGHT = { rel: 1e-12 };

describe('average', () => {
  it('average(triangle 0 → Ipk → 0) equals Ipk/2', () => {
    const peakA = 3;
    const w = piecewiseLinear(T, [
      [0, 0],
      [0.3 * T, peakA],
      [T, 0],
    ]);
    // ref: common practice (the mean of a triangle is half its height)
    expectClose(average(w), peakA / 2, TIGHT);
  });

  it('average(pulse of height I for duty D) equals D·I, jumps adding nothing', () => {
    const duty = 0.35;
    const currentA = 4;
    const w = piecewiseLinear(T, [
      [0, currentA],
      [duty * T, currentA],
      [duty * T, 0],
      [T, 0],
    ]);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., ch. 2 (from memory)
    expectClose(average(w), duty * currentA, TIGHT);
  });

  it('average(trapezoidal pulse Ia → Ib for duty D) equals D·(Ia + Ib)/2', () => {
    const duty = 0.42;
    const [startA, endA] = [1.5, 4.5];
    const w = piecewiseLinear(T, [
      [0, 0],
      [0, startA],
      [duty * T, endA],
      [duty * T, 0],
      [T, 0],
    ]);
    // ref: common practice (area of a trapezoid over the period)
    expectClose(average(w), (duty * (startA + endA)) / 2, TIGHT);
  });

  it('average(symmetric square wave ±A) equals 0', () => {
    const w = piecewiseLinear(T, [
      [0, 2],
      [T / 2, 2],
      [T / 2, -2],
      [T, -2],
    ]);
    // ref: common practice (equal areas above and below zero)
    expectClose(average(w), 0, { abs: 1e-15 });
  });
});
