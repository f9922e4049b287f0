import { describe, expect, it } from 'vitest';
import { dowellFactor } from '../../../solvers/magnetics/dowell-factor.js';
import { dowellLayerFactor } from '../../../solvers/magnetics/dowell-layer-factor.js';
import { expectClose } from '../../helpers/expect-close.js';
import { layerFieldLoss } from './layer-field-loss.js';

describe('dowellLayerFactor', () => {
  it('dowellLayerFactor(Δ, m) equals the 1-D field solution of layer m', () => {
    for (const m of [1, 2, 4, 1.5]) {
      for (const d of [0.2, 1, 3]) {
        // ref: Dowell, Proc. IEE, 1966, d²H/dx² = jωμσH, surface fields m − 1 and m
        expectClose(dowellLayerFactor(d, m), layerFieldLoss(d, m - 1, m), { rel: 1e-8 });
      }
    }
  });

  it('dowellLayerFactor averaged over m = 1…M equals dowellFactor(Δ, M)', () => {
    let sum = 0;
    for (let m = 1; m <= 6; m++) sum += dowellLayerFactor(1.3, m);
    // ref: Dowell, Proc. IEE, 1966, the portion factor is the layers' mean
    expectClose(sum / 6, dowellFactor(1.3, 6), { rel: 1e-14 });
  });

  it('dowellLayerFactor(Δ, 1) is the one-layer factor and stays finite for huge Δ', () => {
    // ref: Dowell, Proc. IEE, 1966, high-frequency asymptote Fr,m → Δ·(2m² − 2m + 1)
    expectClose(dowellLayerFactor(1e5, 3), 1e5 * 13, { rel: 1e-12 });
    expect(() => dowellLayerFactor(1, 0)).toThrow(RangeError);
  });
});
