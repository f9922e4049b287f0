import { describe, it } from 'vitest';
import { resistiveLoss } from '../../../solvers/losses/resistive-loss.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { productAverage } from '../../../solvers/waveform/product-average.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { scaleWaveform } from '../../../solvers/waveform/scale-waveform.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('resistiveLoss', () => {
  it('resistiveLoss(Irms, R) equals the mean of i·(R·i) for a trapezoidal switch current', () => {
    const i = piecewiseLinear(10e-6, [
      [0, 1.2],
      [4.5e-6, 2.1],
      [4.5e-6, 0],
      [10e-6, 0],
    ]);
    const resistanceOhm = 0.085;
    // ref: common practice (Joule's law), p = i²·R averaged over the period
    expectClose(
      resistiveLoss(rms(i), resistanceOhm),
      productAverage(i, scaleWaveform(i, resistanceOhm)),
      {
        rel: 1e-12,
      },
    );
  });
});
