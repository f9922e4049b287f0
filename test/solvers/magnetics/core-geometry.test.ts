import { describe, expect, it } from 'vitest';
import { coreGeometry } from '../../../solvers/magnetics/core-geometry.js';
import { CORE_SHAPE_CATALOG } from '../../../solvers/magnetics/core-shape-catalog.js';
import { expectClose } from '../../helpers/expect-close.js';

const shape = (designation: string) => {
  const found = CORE_SHAPE_CATALOG.find((s) => s.designation === designation);
  if (found === undefined) throw new Error(`no ${designation} in the catalog`);
  return found;
};

describe('coreGeometry', () => {
  it('coreGeometry(E 42/21/15) is within 10 % of the published le, Ae and Ve', () => {
    // ref: IEC 62317 E-core family, E 42/21/15 effective parameters by IEC 60205: le ≈ 97 mm,
    // Ae ≈ 178 mm², Ve ≈ 17 300 mm³ (from memory). Loose: the values are recalled, the
    // dimensions are recalled nominals, and the corner sections are from memory.
    const g = coreGeometry(shape('E 42/21/15'));
    expectClose(g.effectiveLengthM, 97e-3, { rel: 0.1 });
    expectClose(g.effectiveAreaM2, 178e-6, { rel: 0.1 });
    expectClose(g.effectiveVolumeM3, 17300e-9, { rel: 0.1 });
  });

  it('coreGeometry(E) window is ((E − F)/2)·2D and the mean turn 2(F + C) + π·w', () => {
    // ref: common practice (geometry of a bobbinless E core window and a turn at mid-window)
    const g = coreGeometry(shape('E 42/21/15'));
    const w = (29.5e-3 - 12.2e-3) / 2;
    expectClose(g.windowWidthM, w, { rel: 1e-12 });
    expectClose(g.windowBreadthM, 29.6e-3, { rel: 1e-12 });
    expectClose(g.windowAreaM2, w * 29.6e-3, { rel: 1e-12 });
    expectClose(g.meanTurnLengthM, 2 * (12.2e-3 + 15.2e-3) + Math.PI * w, { rel: 1e-12 });
  });

  it('coreGeometry(ring) window is the bore, π·r1²', () => {
    // ref: common practice (geometry): a toroid winds through its bore
    const g = coreGeometry(shape('R 20/10/7'));
    expectClose(g.windowAreaM2, Math.PI * 25e-6, { rel: 1e-12 });
    expectClose(g.surfaceAreaM2, 2 * Math.PI * 10e-3 * 7e-3 + 2 * Math.PI * 100e-6, { rel: 1e-12 });
  });

  it('coreGeometry(every catalog shape) is finite, with Amin ≤ Ae for sectioned shapes', () => {
    // ref: IEC 60205, for series sections Ae = C1/C2 ≥ Amin since every l/A² ≤ (l/A)/Amin;
    // for a ring the log formulas give Ae below its geometric section h·(r2 − r1) = Amin.
    for (const s of CORE_SHAPE_CATALOG) {
      const g = coreGeometry(s);
      for (const value of Object.values(g)) expect(Number.isFinite(value) && value > 0).toBe(true);
      if (s.family === 'ring') expect(g.minimumAreaM2).toBeGreaterThan(g.effectiveAreaM2);
      else expect(g.minimumAreaM2).toBeLessThanOrEqual(g.effectiveAreaM2 * (1 + 1e-12));
    }
  });

  it('coreGeometry over each catalog family grows in volume with the size designation', () => {
    // ref: common practice, a family's sizes are listed smallest first
    for (const family of ['e', 'etd', 'efd', 'ring']) {
      const volumes = CORE_SHAPE_CATALOG.filter((s) => s.family === family).map(
        (s) => coreGeometry(s).effectiveVolumeM3,
      );
      expect(volumes.length).toBeGreaterThanOrEqual(3);
      for (let i = 1; i < volumes.length; i++) {
        expect(volumes[i] as number).toBeGreaterThan(volumes[i - 1] as number);
      }
    }
  });
});
