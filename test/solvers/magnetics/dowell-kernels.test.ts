import { describe, expect, it } from 'vitest';
import { dowellKernels, writeDowellKernels } from '../../../solvers/magnetics/dowell-kernels.js';
import { expectClose } from '../../helpers/expect-close.js';
import { singleLayerSurfaceImpedance } from './layer-field-loss.js';

/** The textbook closed forms, evaluated directly (fine for moderate Δ). */
function closedForms(d: number): { skin: number; proximity: number } {
  return {
    skin: (d * (Math.sinh(2 * d) + Math.sin(2 * d))) / (Math.cosh(2 * d) - Math.cos(2 * d)),
    proximity: (d * (Math.sinh(d) - Math.sin(d))) / (Math.cosh(d) + Math.cos(d)),
  };
}

describe('dowellKernels', () => {
  it('dowellKernels equals the closed forms of Dowell (1966) for 0.3 ≤ Δ ≤ 10', () => {
    for (const d of [0.3, 0.7, 0.999, 1, 1.001, 1.5, 3, 10]) {
      const k = dowellKernels(d);
      const c = closedForms(d);
      // ref: Dowell, Proc. IEE, 1966, ς1 and ς2; direct evaluation loses ~1e-14 here
      expectClose(k.skin, c.skin, { rel: 1e-12 });
      expectClose(k.proximity, c.proximity, { rel: 1e-12 });
    }
  });

  it('dowellKernels(Δ).skin equals Re{γ·coth γ}, γ = (1 + j)Δ', () => {
    for (const d of [0.05, 0.5, 1, 2, 5, 20]) {
      // ref: Kazimierczuk, High-Frequency Magnetic Components, 2nd ed., one-layer Fr as the
      // real part of the complex surface impedance (from memory); complex arithmetic in the test
      expectClose(dowellKernels(d).skin, singleLayerSurfaceImpedance(d), { rel: 1e-11 });
    }
  });

  it('dowellKernels follows the Maclaurin series 1 + 4Δ⁴/45 and Δ⁴/6 for small Δ', () => {
    for (const d of [1e-8, 1e-4, 1e-3, 0.01]) {
      const k = dowellKernels(d);
      // ref: Maclaurin series of the Dowell (1966) terms, derived by hand; next terms O(Δ⁸)
      expectClose(k.skin, 1 + (4 * d ** 4) / 45, { rel: 1e-15 });
      expectClose(k.proximity, d ** 4 / 6, { rel: 1e-4 });
    }
    expect(dowellKernels(0)).toEqual({ skin: 1, proximity: 0 });
  });

  it('dowellKernels tends to Δ for both terms at large Δ, without overflow', () => {
    for (const d of [30, 400, 1e6, 1e300]) {
      const k = dowellKernels(d);
      // ref: Dowell, Proc. IEE, 1966: ς1 and ς2 → 1 as Δ → ∞
      expectClose(k.skin / d, 1, { rel: 1e-12 });
      expectClose(k.proximity / d, 1, { rel: 1e-12 });
    }
    expect(() => dowellKernels(-1)).toThrow(RangeError);
    expect(() => dowellKernels(Number.NaN)).toThrow(RangeError);
  });

  it('writeDowellKernels writes the closed forms of Dowell (1966) at its index, in every range', () => {
    const skin = new Float64Array(4).fill(Number.NaN);
    const proximity = new Float64Array(4).fill(Number.NaN);
    for (const d of [0.3, 0.999, 1, 3, 10, 39.9]) {
      writeDowellKernels(d, skin, proximity, 2);
      const c = closedForms(d);
      // ref: Dowell, Proc. IEE, 1966, ς1 and ς2 (as the first test)
      expectClose(skin[2] as number, c.skin, { rel: 1e-12 });
      expectClose(proximity[2] as number, c.proximity, { rel: 1e-12 });
    }
    writeDowellKernels(400, skin, proximity, 1);
    // ref: Dowell, Proc. IEE, 1966: ς1 and ς2 → 1 as Δ → ∞
    expectClose((skin[1] as number) / 400, 1, { rel: 1e-12 });
    expectClose((proximity[1] as number) / 400, 1, { rel: 1e-12 });
    expect(Number.isNaN(skin[0] as number) && Number.isNaN(skin[3] as number)).toBe(true);
    expect(() => writeDowellKernels(-1, skin, proximity, 0)).toThrow(RangeError);
    expect(() => writeDowellKernels(Number.POSITIVE_INFINITY, skin, proximity, 0)).toThrow(
      RangeError,
    );
  });
  it('dowellKernels stays within skin ≤ 1 + Δ and proximity ≤ 1.1·Δ (the harmonic sum relies on it)', () => {
    // ref: Dowell, Proc. IEE, 1966, ς1 and ς2 (closed forms above): the skin term rises from 1
    // to Δ from above by e^(−2Δ) terms, the proximity term's ratio to Δ peaks near 1.09 at Δ ≈ π
    // (derived for this engine's bound; checked here on a fine grid to Δ = 1000)
    let proximityRatioMax = 0;
    for (let i = 0; i <= 200000; i++) {
      const d = i < 100000 ? i * 1e-4 : 10 + (i - 100000) * 0.0099;
      const k = dowellKernels(d);
      expect(k.skin).toBeLessThanOrEqual(1 + d);
      if (d > 0) proximityRatioMax = Math.max(proximityRatioMax, k.proximity / d);
    }
    expect(proximityRatioMax).toBeLessThan(1.1);
    expectClose(proximityRatioMax, 1.0903, { rel: 1e-3 });
  });
});
