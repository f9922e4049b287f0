import { describe, expect, it } from 'vitest';
import { average } from '../../../solvers/waveform/average.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { productAverage } from '../../../solvers/waveform/product-average.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;
// Invented flyback-like switch current with jumps and ramps.
const current = piecewiseLinear(T, [
  [0, 0],
  [0, 1.2],
  [0.37 * T, 2.6],
  [0.37 * T, 0],
  [0.81 * T, 0.2],
  [T, 0],
]);

describe('productAverage', () => {
  it('productAverage(w, w) equals rms(w)²', () => {
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A, definition of the RMS value (from memory)
    expectClose(productAverage(current, current), rms(current) ** 2, { rel: 1e-12 });
  });

  it('productAverage(constant c, w) equals c·average(w)', () => {
    const constant = piecewiseLinear(T, [
      [0, 48],
      [T, 48],
    ]);
    // ref: common practice (linearity of the integral: mean(c·w) = c·mean(w))
    expectClose(productAverage(constant, current), 48 * average(current), { rel: 1e-12 });
  });

  it('productAverage(v, i) equals ½·V·I·fs·(sum of transition times) for linearized switching', () => {
    // Invented hard-switched transitions: at turn-on the current rises at full voltage, then the
    // voltage falls at full current; at turn-off the reverse. Ideal switch: no conduction loss.
    const [voltageV, currentA] = [48, 3];
    const [riseIS, fallVS, riseVS, fallIS] = [20e-9, 30e-9, 25e-9, 15e-9];
    const onS = 1e-6;
    const offS = 4.5e-6;
    const i = piecewiseLinear(T, [
      [0, 0],
      [onS, 0],
      [onS + riseIS, currentA],
      [offS + riseVS, currentA],
      [offS + riseVS + fallIS, 0],
      [T, 0],
    ]);
    const v = piecewiseLinear(T, [
      [0, voltageV],
      [onS + riseIS, voltageV],
      [onS + riseIS + fallVS, 0],
      [offS, 0],
      [offS + riseVS, voltageV],
      [T, voltageV],
    ]);
    const expectedW = 0.5 * voltageV * currentA * (1 / T) * (riseIS + fallVS + riseVS + fallIS);
    // Transitions of ~1e-8 s at times of ~1e-6 s cost a few digits of the differences: rel 1e-12.
    // ref: Mohan, Undeland, Robbins, Power Electronics, 3rd ed., ch. 2, linearized switching losses (from memory)
    expectClose(productAverage(v, i), expectedW, { rel: 1e-12 });
  });

  it('productAverage(a, b) equals productAverage(b, a)', () => {
    const square = piecewiseLinear(T, [
      [0, 5],
      [0.5 * T, 5],
      [0.5 * T, -5],
      [T, -5],
    ]);
    // ref: common practice (multiplication commutes)
    expectClose(productAverage(square, current), productAverage(current, square), { rel: 1e-12 });
  });

  it('productAverage throws RangeError for different periods', () => {
    const other = piecewiseLinear(2 * T, [
      [0, 1],
      [2 * T, 1],
    ]);
    // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
    expect(() => productAverage(current, other)).toThrow(RangeError);
  });
});
