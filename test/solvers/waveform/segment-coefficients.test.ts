import { describe, it } from 'vitest';
import { addSegmentCoefficients } from '../../../solvers/waveform/segment-coefficients.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: a 100 kHz period.
const T = 1e-5;

describe('addSegmentCoefficients', () => {
  it('addSegmentCoefficients(zero-mean ramp) match Simpson quadrature for δ of 1e-7…1e-3 of T, orders to 1000', () => {
    // The ramp −A → +A over δ alone: only the odd (ramp) kernel g(x) contributes, whose
    // textbook form cancels when n·π·δ/T is small; both its series (x < 0.3) and its closed
    // form near the switch (x = 0.31 at n = 1000, δ = 1e-4·T) are reached.
    const heightA = 2;
    const count = 1000;
    for (const widthFraction of [1e-7, 1e-4, 1e-3]) {
      const widthS = widthFraction * T;
      const midpointS = 0.3 * T;
      const re = new Float64Array(count);
      const im = new Float64Array(count);
      addSegmentCoefficients(re, im, count, widthFraction, (2 * midpointS) / T, -heightA, heightA);
      for (let n = 1; n <= count; n++) {
        const omega = (2 * Math.PI * n) / T;
        // About the midpoint, w = 2A·u/δ is odd in u, so |Xn| = (1/T)·2∫₀^(δ/2) (2A·u/δ)·sin(ωu) du,
        // a positive integrand (ω·δ/2 ≤ π here) free of cancellation; Simpson's error ~(ω·δ/2)⁴/(180·m⁴) relative.
        const intervals = 400;
        const stepS = widthS / 2 / intervals;
        let sum = 0;
        for (let j = 0; j <= intervals; j++) {
          const weight = j === 0 || j === intervals ? 1 : j % 2 === 1 ? 4 : 2;
          const u = j * stepS;
          sum += weight * ((2 * heightA * u) / widthS) * Math.sin(omega * u);
        }
        const expected = (1 / T) * 2 * (stepS / 3) * sum;
        const x = re[n - 1] as number;
        const y = im[n - 1] as number;
        // ref: Abramowitz & Stegun, Handbook of Mathematical Functions, 25.4.5 Simpson's rule (from memory)
        expectClose(Math.sqrt(x * x + y * y), expected, { rel: 1e-9 });
        // ref: common practice (an odd function about tc has a purely imaginary transform about tc: arg Xn = −ω·tc − π/2)
        expectClose(Math.cos(Math.atan2(y, x) + omega * midpointS + Math.PI / 2), 1, { abs: 1e-9 });
      }
    }
  });
});
