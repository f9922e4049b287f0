import { describe, it } from 'vitest';
import { diodeConductionLoss } from '../../../solvers/losses/diode-conduction-loss.js';
import { average } from '../../../solvers/waveform/average.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { productAverage } from '../../../solvers/waveform/product-average.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('diodeConductionLoss', () => {
  it('diodeConductionLoss(Vf, Rd, Iavg, Irms) equals the mean of v·i for v = Vf + Rd·i', () => {
    const periodS = 10e-6;
    const forwardV = 0.45;
    const slopeOhm = 0.03;
    // A flyback-like secondary current: a falling ramp, then zero.
    const i = piecewiseLinear(periodS, [
      [0, 0],
      [4e-6, 0],
      [4e-6, 5],
      [10e-6, 2],
    ]);
    const v = piecewiseLinear(periodS, [
      [0, forwardV],
      [4e-6, forwardV],
      [4e-6, forwardV + slopeOhm * 5],
      [10e-6, forwardV + slopeOhm * 2],
    ]);
    // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 2, linear forward model of a diode (from memory);
    // instantaneous power v·i averaged over the period
    expectClose(diodeConductionLoss(forwardV, slopeOhm, average(i), rms(i)), productAverage(v, i), {
      rel: 1e-12,
    });
  });
});
