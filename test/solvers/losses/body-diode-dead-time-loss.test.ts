import { describe, it } from 'vitest';
import { bodyDiodeDeadTimeLoss } from '../../../solvers/losses/body-diode-dead-time-loss.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { productAverage } from '../../../solvers/waveform/product-average.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('bodyDiodeDeadTimeLoss', () => {
  it('bodyDiodeDeadTimeLoss(Vbd, I, tdead, fs) equals v·i averaged over two dead-time windows', () => {
    const periodS = 10e-6;
    const bodyV = 0.8;
    const currentA = 4;
    // Two 25 ns windows at the body-diode voltage, carrying the current, 50 ns in all.
    const window = (startS: number): [number, number][] => [
      [startS, 0],
      [startS, 1],
      [startS + 25e-9, 1],
      [startS + 25e-9, 0],
    ];
    const gate = piecewiseLinear(periodS, [[0, 0], ...window(1e-6), ...window(6e-6), [periodS, 0]]);
    const v = piecewiseLinear(
      periodS,
      gate.timesS.map((t, k) => [t, bodyV * (gate.values[k] ?? 0)]),
    );
    const i = piecewiseLinear(
      periodS,
      gate.timesS.map((t, k) => [t, currentA * (gate.values[k] ?? 0)]),
    );
    // ref: common practice, P = Vbd·I·tdead·fs for the body diode conducting in the dead time
    expectClose(bodyDiodeDeadTimeLoss(bodyV, currentA, 50e-9, 1 / periodS), productAverage(v, i), {
      rel: 1e-12,
    });
  });
});
