import { describe, expect, it } from 'vitest';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { rampJumps } from '../../../solvers/waveform/ramp-jumps.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('rampJumps', () => {
  // ref: common practice — geometry of straight lines: a step of 2 at t = 1 followed by a flat
  // level, ramped at slope 4, ends 0.5 later; a falling ramp meets a rising segment where the
  // two lines cross, worked by hand.
  it('rampJumps(step, slope) replaces the step by a ramp that meets the level after it', () => {
    const w = piecewiseLinear(4, [
      [0, 0],
      [1, 0],
      [1, 2],
      [4, 2],
    ]);
    const ramped = rampJumps(w, 4);
    expect(ramped.timesS).toEqual([0, 1, 1.5, 4]);
    expect(ramped.values).toEqual([0, 0, 2, 2]);
  });

  it('rampJumps(falling step onto a rising segment) ends where the lines cross', () => {
    const w = piecewiseLinear(2, [
      [0, 1],
      [0, -1],
      [2, 1],
    ]);
    // Ramp 1 − 2t meets −1 + t at t = 2/3.
    const ramped = rampJumps(w, 2);
    expectClose(ramped.timesS[1] ?? NaN, 2 / 3, { rel: 1e-12 });
    expectClose(ramped.values[1] ?? NaN, -1 / 3, { rel: 1e-12 });
    expect(ramped.values[ramped.values.length - 1]).toBe(1);
  });

  // ref: common practice — geometry of straight lines, worked by hand: a step from 2 down to 0
  // at t = 3.9 of a period of 4, ramped at slope 4, falls 0.4 by the period's end (to 1.6) and
  // carries on from t = 0, where the waveform is 0 until t = 1: it meets it at t = 0.4. The
  // ramped waveform returns to its start, as a flux must.
  it('rampJumps(step near the period end) carries the ramp on from the period start', () => {
    const w = piecewiseLinear(4, [
      [0, 0],
      [1, 0],
      [2, 2],
      [3.9, 2],
      [3.9, 0],
      [4, 0],
    ]);
    const ramped = rampJumps(w, 4);
    expectClose(ramped.timesS[1] ?? NaN, 0.4, { rel: 1e-12 });
    expect(ramped.values[1]).toBe(0);
    expectClose(ramped.values[0] ?? NaN, 1.6, { rel: 1e-12 });
    expect(ramped.values[ramped.values.length - 1]).toBe(ramped.values[0]);
    expect(ramped.timesS.slice(2)).toEqual([1, 2, 3.9, 4]);
  });

  // ref: common practice (numerics) — halves of a period stitched at a breakpoint meet in their
  // last bits; a step of 2^-52 on a swing of 1 is round-off, as igseCoreLoss reads it, and
  // ramping it would replace the falling segment after it by a parallel ramp.
  it('rampJumps(round-off step) returns the waveform itself', () => {
    const w = piecewiseLinear(2, [
      [0, 0],
      [1, 1],
      [1, 1 - 2 ** -52],
      [2, 0],
    ]);
    expect(rampJumps(w, 1)).toBe(w);
  });

  it('rampJumps(no jump) returns the waveform itself', () => {
    const w = piecewiseLinear(1, [
      [0, 0],
      [0.5, 1],
      [1, 0],
    ]);
    expect(rampJumps(w, 1)).toBe(w);
  });
});
