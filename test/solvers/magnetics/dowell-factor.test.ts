import { describe, expect, it } from 'vitest';
import { dowellFactor } from '../../../solvers/magnetics/dowell-factor.js';
import { expectClose } from '../../helpers/expect-close.js';
import { layerFieldLoss } from './layer-field-loss.js';

describe('dowellFactor', () => {
  it('dowellFactor(Δ, M) is the mean of the layer losses of the 1-D field solution', () => {
    for (const m of [1, 2, 3, 5]) {
      for (const d of [0.3, 1, 2, 4]) {
        let sum = 0;
        for (let layer = 1; layer <= m; layer++) sum += layerFieldLoss(d, layer - 1, layer);
        // ref: Dowell, Proc. IEE, 1966, d²H/dx² = jωμσH per layer, surface fields (m − 1) and
        // m; Simpson quadrature with 4000 intervals is good to ~1e-10 here
        expectClose(dowellFactor(d, m), sum / m, { rel: 1e-8 });
      }
    }
  });

  it('dowellFactor → 1 + (5M² − 1)·Δ⁴/45 as Δ → 0', () => {
    for (const m of [1, 3, 8]) {
      const d = 0.02;
      // ref: Maclaurin series of Dowell's portion factor, derived by hand (1 + 4Δ⁴/45 from ς1,
      // (M² − 1)Δ⁴/9 from ς2); the next term is O(Δ⁸), ~1e-6 relative to Δ⁴ here
      expectClose((dowellFactor(d, m) - 1) / d ** 4, (5 * m * m - 1) / 45, { rel: 1e-4 });
      expectClose(dowellFactor(0, m), 1, { abs: 1e-15 });
    }
  });

  it('dowellFactor(Δ, 1) ≈ Δ and dowellFactor(Δ, M) ≈ Δ·(2M² + 1)/3 for Δ ≫ 1', () => {
    // ref: Dowell, Proc. IEE, 1966, high-frequency asymptote (ς1, ς2 → 1)
    expectClose(dowellFactor(50, 1), 50, { rel: 1e-12 });
    expectClose(dowellFactor(50, 4), (50 * 33) / 3, { rel: 1e-12 });
    expectClose(dowellFactor(1e200, 10), (1e200 * 201) / 3, { rel: 1e-12 });
  });

  it('dowellFactor(Δ, 0.5) equals a single layer between equal and opposite fields', () => {
    for (const d of [0.5, 2]) {
      // ref: Dowell, Proc. IEE, 1966, 1-D field with surface fields −0.5 and +0.5
      expectClose(dowellFactor(d, 0.5), layerFieldLoss(d, -0.5, 0.5), { rel: 1e-8 });
    }
    expect(() => dowellFactor(1, 0.4)).toThrow(RangeError);
  });
});
