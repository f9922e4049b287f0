import { describe, expect, it } from 'vitest';
import { addWaveforms } from '../../../solvers/waveform/add-waveforms.js';
import { average } from '../../../solvers/waveform/average.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { valueAt } from '../../../solvers/waveform/value-at.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;
const duty = 0.4;

describe('addWaveforms', () => {
  it('addWaveforms(pulse, ramp) has the RMS of a pulsating waveform with linear ripple', () => {
    // Invented: a 3 A pulse for D·T plus a ramp −0.8 → +0.8 A in the same interval.
    const [centreA, halfRippleA] = [3, 0.8];
    const pulse = piecewiseLinear(T, [
      [0, centreA],
      [duty * T, centreA],
      [duty * T, 0],
      [T, 0],
    ]);
    const ripple = piecewiseLinear(T, [
      [0, -halfRippleA],
      [duty * T, halfRippleA],
      [duty * T, 0],
      [T, 0],
    ]);
    const expected = centreA * Math.sqrt(duty) * Math.sqrt(1 + (halfRippleA / centreA) ** 2 / 3);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.1, pulsating waveform with linear ripple (from memory)
    expectClose(rms(addWaveforms(pulse, ripple)), expected, { rel: 1e-12 });
  });

  it('addWaveforms(magnetizing, reflected load) equals the sum at every time, jumps included', () => {
    // Invented forward-converter primary: magnetizing current rises 0 → 0.3 A during D·T and
    // resets by 0.75·T (no jumps); reflected load current is a 2 → 2.4 A pulse (two jumps).
    const magnetizing = piecewiseLinear(T, [
      [0, 0],
      [duty * T, 0.3],
      [0.75 * T, 0],
      [T, 0],
    ]);
    const reflected = piecewiseLinear(T, [
      [0, 2],
      [duty * T, 2.4],
      [duty * T, 0],
      [T, 0],
    ]);
    const sum = addWaveforms(magnetizing, reflected);
    for (let k = 0; k <= 200; k++) {
      const t = (k / 200) * T;
      // ref: common practice (the sum of two functions is taken pointwise, (a + b)(t) = a(t) + b(t))
      expectClose(valueAt(sum, t), valueAt(magnetizing, t) + valueAt(reflected, t), { abs: 1e-12 });
    }
    // ref: common practice (the mean is linear: mean(a + b) = mean(a) + mean(b))
    expectClose(average(sum), average(magnetizing) + average(reflected), { rel: 1e-12 });
  });

  it('addWaveforms(a, b) merges jumps at different times in either waveform', () => {
    // Invented square waves shifted by a quarter period: the sum is a three-level staircase.
    const a = piecewiseLinear(T, [
      [0, 1],
      [0.5 * T, 1],
      [0.5 * T, -1],
      [T, -1],
    ]);
    const b = piecewiseLinear(T, [
      [0, -1],
      [0.25 * T, -1],
      [0.25 * T, 1],
      [0.75 * T, 1],
      [0.75 * T, -1],
      [T, -1],
    ]);
    const sum = addWaveforms(a, b);
    // ref: common practice (pointwise sum: 0, 2, 0, −2 on the four quarters)
    expect(sum.values).toEqual([0, 0, 2, 2, 0, 0, -2, -2]);
    // ref: common practice (RMS of a waveform at ±2 for half the period and 0 otherwise: 2/√2)
    expectClose(rms(sum), Math.SQRT2, { rel: 1e-12 });
  });

  it('addWaveforms throws RangeError for different periods', () => {
    const a = piecewiseLinear(T, [
      [0, 1],
      [T, 1],
    ]);
    const b = piecewiseLinear(2 * T, [
      [0, 1],
      [2 * T, 1],
    ]);
    // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
    expect(() => addWaveforms(a, b)).toThrow(RangeError);
  });
});
