import { describe, expect, it } from 'vitest';
import { average } from '../../../solvers/waveform/average.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { scaleWaveform } from '../../../solvers/waveform/scale-waveform.js';
import { expectClose } from '../../helpers/expect-close.js';

const T = 1e-5;
// Invented primary current of a flyback: ramp 0.4 → 1.6 A over 0.45·T, then off.
const primary = piecewiseLinear(T, [
  [0, 0.4],
  [0.45 * T, 1.6],
  [0.45 * T, 0],
  [T, 0],
]);

describe('scaleWaveform', () => {
  it('scaleWaveform(i, n) scales average and RMS by n, as a reflected current through a turns ratio', () => {
    const turnsRatio = 5;
    const scaled = scaleWaveform(primary, turnsRatio);
    // ref: common practice (the mean is linear: mean(k·x) = k·mean(x))
    expectClose(average(scaled), turnsRatio * average(primary), { rel: 1e-12 });
    // ref: common practice (RMS is homogeneous: rms(k·x) = |k|·rms(x))
    expectClose(rms(scaled), turnsRatio * rms(primary), { rel: 1e-12 });
  });

  it('scaleWaveform(w, −k) scales RMS by |k| and negates the average', () => {
    const scaled = scaleWaveform(primary, -0.25);
    // ref: common practice (RMS is homogeneous: rms(k·x) = |k|·rms(x))
    expectClose(rms(scaled), 0.25 * rms(primary), { rel: 1e-12 });
    // ref: common practice (the mean is linear: mean(k·x) = k·mean(x))
    expectClose(average(scaled), -0.25 * average(primary), { rel: 1e-12 });
  });

  it('scaleWaveform(w, k) keeps the times and leaves its input unchanged', () => {
    const before = structuredClone(primary);
    const scaled = scaleWaveform(primary, 3);
    // ref: common practice (scaling the values of a function leaves its argument axis alone)
    expect(scaled.timesS).toEqual(primary.timesS);
    // ref: common practice (plain data in, plain data out: inputs are not mutated)
    expect(primary).toEqual(before);
  });

  it('scaleWaveform throws RangeError for a non-finite factor', () => {
    // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
    expect(() => scaleWaveform(primary, Infinity)).toThrow(RangeError);
  });
});
