import { describe, expect, it } from 'vitest';
import {
  dowellKernels,
  writeDowellKernelSlopes,
  writeDowellKernels,
} from '../../../solvers/magnetics/dowell-kernels.js';
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

  it('writeDowellKernelSlopes equals the derivatives of the closed forms of Dowell (1966)', () => {
    const skinSlope = new Float64Array(2);
    const proximitySlope = new Float64Array(2);
    for (const d of [0.05, 0.3, 0.7, 0.999, 1, 1.001, 1.5, 3, 10, 25]) {
      writeDowellKernelSlopes(d, skinSlope, proximitySlope, 1);
      // ref: Dowell, Proc. IEE, 1966, ς1 and ς2 (closedForms above), differentiated by a
      // central difference of step 1e-4·Δ in the test (error O(h²) ≈ 1e-8 relative, plus
      // round-off of about 1e-16/h where the skin term's slope is small)
      const h = 1e-4 * d;
      const skinDiff = (closedForms(d + h).skin - closedForms(d - h).skin) / (2 * h);
      const proximityDiff = (closedForms(d + h).proximity - closedForms(d - h).proximity) / (2 * h);
      expectClose(skinSlope[1] as number, skinDiff, { rel: 1e-6, abs: 1e-10 });
      expectClose(proximitySlope[1] as number, proximityDiff, { rel: 1e-6 });
    }
  });

  it('writeDowellKernelSlopes follows the series slopes 16Δ³/45 and 2Δ³/3 for small Δ, 1 for large', () => {
    const skinSlope = new Float64Array(1);
    const proximitySlope = new Float64Array(1);
    for (const d of [1e-6, 1e-3, 0.0099, 0.0101, 0.02]) {
      writeDowellKernelSlopes(d, skinSlope, proximitySlope, 0);
      // ref: Maclaurin series of the Dowell (1966) terms, 1 + 4Δ⁴/45 and Δ⁴/6 (derived by hand),
      // differentiated; the next terms are O(Δ⁷)
      expectClose(skinSlope[0] as number, (16 * d ** 3) / 45, { rel: 1e-6 });
      expectClose(proximitySlope[0] as number, (2 * d ** 3) / 3, { rel: 1e-6 });
    }
    for (const d of [39.9, 40, 400]) {
      writeDowellKernelSlopes(d, skinSlope, proximitySlope, 0);
      // ref: Dowell, Proc. IEE, 1966: both terms → Δ as Δ → ∞, so both slopes → 1
      expectClose(skinSlope[0] as number, 1, { rel: 1e-12 });
      expectClose(proximitySlope[0] as number, 1, { rel: 1e-12 });
    }
    expect(() => writeDowellKernelSlopes(-1, skinSlope, proximitySlope, 0)).toThrow(RangeError);
  });
});
