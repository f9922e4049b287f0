import { describe, it } from 'vitest';
import { switchingOverlapLoss } from '../../../solvers/losses/switching-overlap-loss.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { productAverage } from '../../../solvers/waveform/product-average.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('switchingOverlapLoss', () => {
  it('switchingOverlapLoss(V, I, tc, fs) equals the mean of v·i over a clamped-inductive turn-on', () => {
    // Clamped inductive load: the current rises at full voltage, then the voltage falls at full
    // current; the edge lasts tc = tri + tfv. Invented numbers, only to exercise the formula.
    const periodS = 10e-6;
    const riseS = 8e-9;
    const fallS = 12e-9;
    const voltageV = 100;
    const currentA = 3;
    const v = piecewiseLinear(periodS, [
      [0, voltageV],
      [riseS, voltageV],
      [riseS + fallS, 0],
      [periodS, 0],
    ]);
    const i = piecewiseLinear(periodS, [
      [0, 0],
      [riseS, currentA],
      [periodS, currentA],
    ]);
    // ref: Mohan, Undeland, Robbins, Power Electronics, 3rd ed., §2-7, eq. 2-6 (from memory): Ps =
    // ½·Vd·Io·fs·tc
    expectClose(
      switchingOverlapLoss(voltageV, currentA, riseS + fallS, 1 / periodS),
      productAverage(v, i),
      { rel: 1e-12 },
    );
  });

  it('switchingOverlapLoss(V, 0, t, fs) is zero: no current, no overlap', () => {
    // ref: Mohan, Undeland, Robbins, 3rd ed., eq. 2-6 (from memory), with Io = 0
    expectClose(switchingOverlapLoss(400, 0, 50e-9, 65e3), 0, { abs: 0 });
  });
});
