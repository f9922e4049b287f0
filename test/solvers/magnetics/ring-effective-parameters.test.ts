import { describe, expect, it } from 'vitest';
import { ringEffectiveParameters } from '../../../solvers/magnetics/ring-effective-parameters.js';
import { expectClose } from '../../helpers/expect-close.js';

const ring = (outerDiameterM: number, innerDiameterM: number, heightM: number) =>
  ({ family: 'ring', designation: 'test', outerDiameterM, innerDiameterM, heightM }) as const;

describe('ringEffectiveParameters', () => {
  it('ringEffectiveParameters(20/10/7 mm) matches le = 2π·ln(r2/r1)/(1/r1 − 1/r2) by hand', () => {
    // ref: IEC 60205, ring cores of rectangular section: le = 2π·ln(r2/r1)/(1/r1 − 1/r2),
    // Ae = h·ln²(r2/r1)/(1/r1 − 1/r2); by hand for r1 = 5 mm, r2 = 10 mm, h = 7 mm:
    // le = 2π·0.693147/100 /m = 43.551 mm, Ae = 7e-3·0.480453/100 = 33.632 mm²
    const p = ringEffectiveParameters(ring(20e-3, 10e-3, 7e-3));
    expectClose(p.effectiveLengthM, 43.551e-3, { rel: 1e-4 });
    expectClose(p.effectiveAreaM2, 33.632e-6, { rel: 1e-4 });
    expectClose(p.effectiveVolumeM3, 43.551e-3 * 33.632e-6, { rel: 2e-4 });
    // ref: IEC 60205, Amin of a ring is its cross-section h·(r2 − r1)
    expectClose(p.minimumAreaM2, 35e-6, { rel: 1e-12 });
  });

  it('ringEffectiveParameters approaches the mean-path values as r2/r1 → 1', () => {
    // ref: IEC 60205; a thin ring is a uniform path: le → 2π·rmean, Ae → h·(r2 − r1).
    // The relative difference falls as (Δr/r)², so it shrinks a hundredfold per tenfold thinner.
    const errors = [1.1, 1.01, 1.001].map((ratio) => {
      const r1 = 10e-3;
      const r2 = r1 * ratio;
      const p = ringEffectiveParameters(ring(2 * r2, 2 * r1, 5e-3));
      return Math.abs(p.effectiveLengthM / (Math.PI * (r1 + r2)) - 1);
    });
    expectClose(errors[2] as number, 0, { abs: 1e-6 });
    expect(errors[1] as number).toBeLessThan((errors[0] as number) / 50);
    expect(errors[2] as number).toBeLessThan((errors[1] as number) / 50);
    const thin = ringEffectiveParameters(ring(20.02e-3, 20e-3, 5e-3));
    expectClose(thin.effectiveAreaM2, 5e-3 * 0.01e-3, { rel: 1e-6 });
    expectClose(thin.effectiveLengthM, Math.PI * 20.01e-3, { rel: 1e-6 });
  });

  it('ringEffectiveParameters throws RangeError when the bore is not inside the ring', () => {
    // ref: common practice, a ring needs 0 < ID < OD
    expect(() => ringEffectiveParameters(ring(10e-3, 12e-3, 5e-3))).toThrow(RangeError);
  });
});
