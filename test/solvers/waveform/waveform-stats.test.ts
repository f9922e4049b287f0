import { describe, it } from 'vitest';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { waveformStats, WaveformStatsMemo } from '../../../solvers/waveform/waveform-stats.js';
import { acRms } from '../../../solvers/waveform/ac-rms.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: 100 kHz switching; closed forms in a few roundings justify rel 1e-12.
const T = 1e-5;
const TIGHT = { rel: 1e-12 };

describe('waveformStats', () => {
  it('gives a trapezoidal switch current its peak, mean and RMS in one pass', () => {
    // A forward's switch current: a ramp from Ia to Ib over D·T, zero after (a jump down).
    const d = 0.4;
    const ia = 2;
    const ib = 3;
    const w = piecewiseLinear(T, [
      [0, ia],
      [d * T, ib],
      [d * T, 0],
      [T, 0],
    ]);
    const stats = waveformStats(w, { peak: 0, rms: 0, average: 0 });
    expectClose(stats.peak, ib, TIGHT);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.1,
    // trapezoidal waveform: rms = √(D·(Ia² + Ia·Ib + Ib²)/3), mean D·(Ia + Ib)/2 (from memory)
    expectClose(stats.average, (d * (ia + ib)) / 2, TIGHT);
    expectClose(stats.rms, Math.sqrt((d * (ia * ia + ia * ib + ib * ib)) / 3), TIGHT);
  });

  it('gives acRms of a square wave 0/I at duty D as I·√(D·(1 − D))', () => {
    const d = 0.3;
    const i = 5;
    const w = piecewiseLinear(T, [
      [0, i],
      [d * T, i],
      [d * T, 0],
      [T, 0],
    ]);
    // ref: common practice: a pulse train's AC RMS, √(I²·D − (I·D)²)
    expectClose(acRms(w), i * Math.sqrt(d * (1 - d)), TIGHT);
  });

  it("keeps each waveform's stats apart in a memo, looked up by the waveform", () => {
    // Two pulse trains 0/I at duty D: mean I·D, RMS I·√D (common practice).
    const pulse = (i: number, d: number) =>
      piecewiseLinear(T, [
        [0, i],
        [d * T, i],
        [d * T, 0],
        [T, 0],
      ]);
    const first = pulse(4, 0.25);
    const second = pulse(2, 0.64);
    const memo = new WaveformStatsMemo();
    for (const round of [0, 1]) {
      expectClose(memo.of(first).rms, 4 * Math.sqrt(0.25), TIGHT);
      expectClose(memo.of(second).average, 2 * 0.64, TIGHT);
      expectClose(memo.of(first).average, 4 * 0.25, TIGHT);
      expectClose(memo.of(second).rms, 2 * Math.sqrt(0.64), TIGHT);
      if (round === 0) memo.clear();
    }
  });
});
