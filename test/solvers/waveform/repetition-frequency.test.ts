import { describe, expect, it } from 'vitest';
import { repetitionFrequencyHz } from '../../../solvers/waveform/repetition-frequency.js';

describe('repetitionFrequencyHz', () => {
  // ref: common practice — a double-ended converter drives its output inductor twice per
  // switching period, so the inductor ripple repeats at 2·fs.
  it('repetitionFrequencyHz gives 2/T when the second half repeats the first', () => {
    const twice = { periodS: 10e-6, timesS: [0, 2e-6, 5e-6, 7e-6, 10e-6], values: [4, 6, 4, 6, 4] };
    expect(repetitionFrequencyHz(twice)).toBeCloseTo(200e3, 6);
  });

  it('repetitionFrequencyHz gives 1/T for a single-ended ripple', () => {
    const once = { periodS: 10e-6, timesS: [0, 4e-6, 10e-6], values: [4, 6, 4] };
    expect(repetitionFrequencyHz(once)).toBeCloseTo(100e3, 6);
  });

  it('repetitionFrequencyHz gives 1/T when the halves differ only a little', () => {
    const unequal = {
      periodS: 10e-6,
      timesS: [0, 2e-6, 5e-6, 7e-6, 10e-6],
      values: [4, 6, 4, 6.1, 4],
    };
    expect(repetitionFrequencyHz(unequal)).toBeCloseTo(100e3, 6);
  });
});
