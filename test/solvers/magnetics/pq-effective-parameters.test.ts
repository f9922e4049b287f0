import { describe, expect, it } from 'vitest';
import type { PqShape } from '../../../solvers/magnetics/core-shape.js';
import {
  pqEffectiveParameters,
  pqSections,
} from '../../../solvers/magnetics/pq-effective-parameters.js';
import { expectClose } from '../../helpers/expect-close.js';

const mm = 1e-3;
/** An invented PQ-like pair (mm): A 26, B 10, C 19, D 6, E 22, F 12, G 15. */
const pq: PqShape = {
  family: 'pq',
  designation: 'test PQ',
  overallWidthM: 26 * mm,
  halfHeightM: 10 * mm,
  depthM: 19 * mm,
  halfWindowHeightM: 6 * mm,
  windowSpanM: 22 * mm,
  centreLegDiameterM: 12 * mm,
  slotWidthM: 15 * mm,
};

describe('pqSections', () => {
  it('pqSections gives outer legs the area of the outline outside the circle and the wire exits', () => {
    // ref: common practice (plane geometry): the legs are the rectangle A × C where |x| ≥ G/2
    // and outside the circle of diameter E; counted here cell by cell on a 2000 × 2000 grid
    // of one quarter (midpoints), independently of the engine's closed form.
    const a = 13 * mm;
    const c = 9.5 * mm;
    const r = 11 * mm;
    const steps = 2000;
    let quarter = 0;
    for (let i = 0; i < steps; i++) {
      const x = ((i + 0.5) * a) / steps;
      if (x < 7.5 * mm) continue;
      for (let j = 0; j < steps; j++) {
        const y = ((j + 0.5) * c) / steps;
        if (x * x + y * y >= r * r) quarter += (a / steps) * (c / steps);
      }
    }
    const { outerLegsAreaM2, uniform } = pqSections(pq);
    expectClose(outerLegsAreaM2, 4 * quarter, { rel: 2e-3 });
    // ref: IEC 60205 (from memory): leg sections are as long as the pair's window height, 2D
    expectClose(uniform[0]?.lengthM ?? NaN, 12 * mm, { rel: 1e-12 });
    expectClose(uniform[0]?.areaM2 ?? NaN, (Math.PI * (12 * mm) ** 2) / 4, { rel: 1e-12 });
    expectClose(uniform[1]?.lengthM ?? NaN, 12 * mm, { rel: 1e-12 });
  });

  it('pqSections takes the plate sector half-angle where the legs meet the winding circle', () => {
    // ref: common practice (plane geometry): the leg faces at x = G/2 meet the circle of
    // radius E/2 at acos(G/E); the faces y = ±C/2 at asin(C/E); the smaller one bounds a leg
    const { sectorHalfAngleRad } = pqSections(pq);
    expectClose(sectorHalfAngleRad, Math.min(Math.acos(15 / 22), Math.asin(19 / 22)), {
      rel: 1e-12,
    });
  });

  it('pqSections throws RangeError when the wire exits are as wide as the core', () => {
    // ref: common practice, a PQ pair needs outer legs to close the path
    expect(() => pqSections({ ...pq, slotWidthM: 26 * mm })).toThrow(RangeError);
    expect(() => pqSections({ ...pq, windowSpanM: 27 * mm })).toThrow(RangeError);
  });
});

describe('pqEffectiveParameters', () => {
  it('pqEffectiveParameters with legs all round has the pot-core plate term ln(r3/r2)/(π·h)', () => {
    // ref: IEC 60205, pot cores: radial flow in both plates adds ln(r3/r2)/(π·h) to C1 and
    // (1/r2 − 1/r3)/(2π²·h²) to C2 (from memory; the integrals of dr/(2πrh) over both
    // plates). With no wire exit and a depth wider than the winding space, the PQ sectors are
    // the whole circle and the PQ plate term must reduce to it.
    const round: PqShape = { ...pq, depthM: 24 * mm, slotWidthM: 0 };
    const { uniform, sectorHalfAngleRad } = pqSections(round);
    expectClose(sectorHalfAngleRad, Math.PI / 2, { rel: 1e-12 });
    const p = pqEffectiveParameters(round);
    let c1 = 0;
    let c2 = 0;
    for (const s of uniform) {
      c1 += s.lengthM / s.areaM2;
      c2 += s.lengthM / s.areaM2 ** 2;
    }
    const h = 4 * mm;
    const r2 = 6 * mm;
    const r3 = 11 * mm;
    expectClose(p.coreConstantC1PerM - c1, Math.log(r3 / r2) / (Math.PI * h), { rel: 1e-9 });
    expectClose(p.coreConstantC2PerM3 - c2, (1 / r2 - 1 / r3) / (2 * Math.PI ** 2 * h * h), {
      rel: 1e-9,
    });
  });

  it('pqEffectiveParameters gives Ve = le·Ae and le = C1²/C2, and Amin ≤ Ae', () => {
    // ref: IEC 60205, definitions of le, Ae, Ve from C1 and C2
    const p = pqEffectiveParameters(pq);
    const c1 = p.coreConstantC1PerM;
    const c2 = p.coreConstantC2PerM3;
    expectClose(p.effectiveLengthM, (c1 * c1) / c2, { rel: 1e-12 });
    expectClose(p.effectiveAreaM2, c1 / c2, { rel: 1e-12 });
    expectClose(p.effectiveVolumeM3, p.effectiveLengthM * p.effectiveAreaM2, { rel: 1e-12 });
    expect(p.minimumAreaM2).toBeLessThanOrEqual(p.effectiveAreaM2);
    // ref: common practice, the round centre leg is the narrowest section of a PQ pair
    expectClose(p.minimumAreaM2, (Math.PI * (12 * mm) ** 2) / 4, { rel: 1e-12 });
  });
});
