import { describe, it } from 'vitest';
import { rotateWaveform } from '../../../../solvers/topologies/active-clamp-forward/rotate-waveform.js';
import { average } from '../../../../solvers/waveform/average.js';
import { piecewiseLinear } from '../../../../solvers/waveform/piecewise-linear.js';
import { rms } from '../../../../solvers/waveform/rms.js';
import { valueAt } from '../../../../solvers/waveform/value-at.js';
import { expectClose } from '../../../helpers/expect-close.js';

describe('rotateWaveform', () => {
  // A ramp 0 → 2 over the first 0.4 µs, then a jump to −1 held to the period end (1 µs).
  const w = piecewiseLinear(1e-6, [
    [0, 0],
    [0.4e-6, 2],
    [0.4e-6, -1],
    [1e-6, -1],
  ]);

  it('rotateWaveform(w, s) takes the value w(t + s) at t, jumps included', () => {
    const r = rotateWaveform(w, 0.3e-6);
    // ref: common practice, a time shift: r(t) = w(t + s), periodic
    for (const t of [0, 0.05e-6, 0.1e-6, 0.2e-6, 0.5e-6, 0.69e-6, 0.75e-6]) {
      expectClose(valueAt(r, t), valueAt(w, t + 0.3e-6), { abs: 1e-12 });
    }
  });

  it('rotateWaveform(w, s) keeps the average and the RMS', () => {
    const r = rotateWaveform(w, 0.4e-6);
    // ref: common practice, the mean and RMS of a periodic signal do not depend on its phase
    expectClose(average(r), average(w), { rel: 1e-12 });
    expectClose(rms(r), rms(w), { rel: 1e-12 });
  });
});
