import { describe, expect, it } from 'vitest';
import { eFamilySections } from '../../../solvers/magnetics/e-family-sections.js';
import { expectClose } from '../../helpers/expect-close.js';

const mm = 1e-3;
const eShape = {
  family: 'e',
  designation: 'test E',
  overallWidthM: 42 * mm,
  halfHeightM: 21 * mm,
  depthM: 15 * mm,
  halfWindowHeightM: 15 * mm,
  windowSpanM: 30 * mm,
  centreLegWidthM: 12 * mm,
} as const;

describe('eFamilySections', () => {
  it('eFamilySections(E) gives legs of length 2D, yokes E − F and the leg and yoke areas', () => {
    // ref: IEC 60205, E cores: l1 = l3 = 2D, A1 = (A − E)·C, A3 = F·C, l2 = E − F,
    // A2 = 2·(B − D)·C; corners (π/4)(w + h) over the mean of the two areas (from memory)
    const [outer, yoke, centre, outerCorner, innerCorner] = eFamilySections(eShape);
    expectClose(outer?.lengthM ?? NaN, 30 * mm, { rel: 1e-12 });
    expectClose(outer?.areaM2 ?? NaN, 12 * 15 * mm * mm, { rel: 1e-12 });
    expectClose(yoke?.lengthM ?? NaN, 18 * mm, { rel: 1e-12 });
    expectClose(yoke?.areaM2 ?? NaN, 2 * 6 * 15 * mm * mm, { rel: 1e-12 });
    expectClose(centre?.areaM2 ?? NaN, 12 * 15 * mm * mm, { rel: 1e-12 });
    expectClose(outerCorner?.lengthM ?? NaN, (Math.PI / 4) * 12 * mm, { rel: 1e-12 });
    expectClose(innerCorner?.lengthM ?? NaN, (Math.PI / 4) * 12 * mm, { rel: 1e-12 });
  });

  it('eFamilySections(ETD) gives arc-faced outer legs the area of the clipped outline', () => {
    // ref: common practice (plane geometry): the legs are the rectangle A × C outside the
    // circle of diameter E; integrated here by the midpoint rule over the depth.
    const etd = { ...eShape, family: 'etd', centreLegDiameterM: 12 * mm } as const;
    const { centreLegWidthM: _unused, ...round } = etd;
    void _unused;
    const [outer, , centre] = eFamilySections(round);
    const r = 15 * mm;
    const steps = 20000;
    let area = 0;
    for (let i = 0; i < steps; i++) {
      const y = -7.5 * mm + ((i + 0.5) * 15 * mm) / steps;
      area += 2 * (21 * mm - Math.sqrt(r * r - y * y)) * ((15 * mm) / steps);
    }
    expectClose(outer?.areaM2 ?? NaN, area, { rel: 1e-6 });
    expectClose(centre?.areaM2 ?? NaN, (Math.PI * (12 * mm) ** 2) / 4, { rel: 1e-12 });
  });

  it('eFamilySections throws RangeError when the centre leg is wider than the window span', () => {
    // ref: common practice, the window must have a width
    expect(() => eFamilySections({ ...eShape, centreLegWidthM: 31 * mm })).toThrow(RangeError);
  });
});
