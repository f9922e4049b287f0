import { describe, expect, it } from 'vitest';
import {
  iec60205EffectiveParameters,
  iec60205FromCoreConstants,
} from '../../../solvers/magnetics/iec-60205-effective-parameters.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('iec60205EffectiveParameters', () => {
  it('iec60205EffectiveParameters(one uniform section) returns its own length and area', () => {
    // ref: IEC 60205, definitions: C1 = l/A, C2 = l/A², le = C1²/C2 = l, Ae = C1/C2 = A
    const p = iec60205EffectiveParameters([{ lengthM: 0.1, areaM2: 1e-4 }]);
    expectClose(p.coreConstantC1PerM, 1000, { rel: 1e-12 });
    expectClose(p.coreConstantC2PerM3, 1e7, { rel: 1e-12 });
    expectClose(p.effectiveLengthM, 0.1, { rel: 1e-12 });
    expectClose(p.effectiveAreaM2, 1e-4, { rel: 1e-12 });
    expectClose(p.effectiveVolumeM3, 1e-5, { rel: 1e-12 });
    expectClose(p.minimumAreaM2, 1e-4, { rel: 1e-12 });
  });

  it('iec60205EffectiveParameters(two sections) matches C1, C2, le, Ae computed by hand', () => {
    // ref: IEC 60205, definitions; by hand: C1 = 0.02/1e-4 + 0.03/2e-4 = 350 /m,
    // C2 = 0.02/1e-8 + 0.03/4e-8 = 2.75e6 /m³, le = 350²/2.75e6 m, Ae = 350/2.75e6 m²
    const p = iec60205EffectiveParameters([
      { lengthM: 0.02, areaM2: 1e-4 },
      { lengthM: 0.03, areaM2: 2e-4 },
    ]);
    expectClose(p.coreConstantC1PerM, 350, { rel: 1e-12 });
    expectClose(p.coreConstantC2PerM3, 2.75e6, { rel: 1e-12 });
    expectClose(p.effectiveLengthM, 49 / 1100, { rel: 1e-12 });
    expectClose(p.effectiveAreaM2, 7 / 55000, { rel: 1e-12 });
    expectClose(p.minimumAreaM2, 1e-4, { rel: 1e-12 });
    // ref: IEC 60205, Ae is a weighted mean of the sections, so Amin ≤ Ae ≤ the largest area
    expect(p.effectiveAreaM2).toBeGreaterThanOrEqual(p.minimumAreaM2);
    expect(p.effectiveAreaM2).toBeLessThanOrEqual(2e-4);
  });

  it('iec60205FromCoreConstants(C1, C2) gives Ve = C1³/C2²', () => {
    // ref: IEC 60205, Ve = le·Ae = C1³/C2²
    const p = iec60205FromCoreConstants(350, 2.75e6, 1e-4);
    expectClose(p.effectiveVolumeM3, 350 ** 3 / 2.75e6 ** 2, { rel: 1e-12 });
  });

  it('iec60205EffectiveParameters throws RangeError for no sections or a zero area', () => {
    // ref: common practice, a path section needs a length and an area
    expect(() => iec60205EffectiveParameters([])).toThrow(RangeError);
    expect(() => iec60205EffectiveParameters([{ lengthM: 0.01, areaM2: 0 }])).toThrow(RangeError);
  });
});
