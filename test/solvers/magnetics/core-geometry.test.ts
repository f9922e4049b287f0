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

  // ref: the effective parameters commonly published for these standard sizes, computed by the
  // IEC 60205 method from the IEC 62317 / IEC 63093 dimensions (recalled, from memory; le mm,
  // Ae mm², Ve mm³). 6 %: the catalog's dimensions are recalled nominals, and the PQ back
  // plates are a simplification of IEC 60205's own sections (the model's note says which);
  // the PQ sizes left out of the catalog miss by 8–12 % on le and up to 21 % on Ve under the
  // same model (DEVELOPERS.md), so this tolerance does separate them.
  const published: Array<[string, number, number, number]> = [
    ['EQ 30/8/20', 46.0, 108, 4970], // recalled
    ['PQ 20/16', 37.4, 62.0, 2330], // recalled
    ['PQ 20/20', 45.7, 62.0, 2850], // recalled
    ['PQ 26/20', 46.3, 119, 5470], // recalled
    ['PQ 26/25', 55.5, 118, 6530], // recalled
    ['PQ 50/50', 113, 328, 37100], // recalled
  ];
  for (const [designation, le, ae, ve] of published) {
    it(`coreGeometry(${designation}) is within 6 % of the published le, Ae and Ve`, () => {
      const g = coreGeometry(shape(designation));
      expectClose(g.effectiveLengthM, le * 1e-3, { rel: 0.06 });
      expectClose(g.effectiveAreaM2, ae * 1e-6, { rel: 0.06 });
      expectClose(g.effectiveVolumeM3, ve * 1e-9, { rel: 0.06 });
    });
  }

  it('coreGeometry(PQ 26/20) window and mean turn follow from the drawing letters by hand', () => {
    // ref: common practice (geometry of a bobbinless round-leg window, a turn at mid-window).
    // By hand from A 26.5, B 10.075, C 19.0, D 5.75, E 22.5, F 12.0 (mm):
    // window width (E − F)/2 = 5.25 mm, breadth 2D = 11.5 mm, area 5.25·11.5 = 60.375 mm²;
    // mean turn π·(F + 5.25) = π·17.25 = 54.19 mm; box 26.5 × 20.15 × max(19.0, 22.5):
    // 2·(533.975 + 596.25 + 453.375) = 3167.2 mm².
    const g = coreGeometry(shape('PQ 26/20'));
    expectClose(g.windowWidthM, 5.25e-3, { rel: 1e-9 });
    expectClose(g.windowBreadthM, 11.5e-3, { rel: 1e-9 });
    expectClose(g.windowAreaM2, 60.375e-6, { rel: 1e-9 });
    expectClose(g.meanTurnLengthM, 54.19e-3, { rel: 1e-3 });
    expectClose(g.surfaceAreaM2, 3167.2e-6, { rel: 1e-4 });
    // ref: common practice, a PQ 26/20 bobbin's mean turn is about 56 mm and its winding
    // area about 50 mm² (recalled): the bobbinless figures must lie near, the window above.
    expectClose(g.meanTurnLengthM, 56e-3, { rel: 0.1 });
    expect(g.windowAreaM2).toBeGreaterThan(50e-6);
  });

  it('coreGeometry(EQ 30/8/20) window and mean turn follow from the drawing letters by hand', () => {
    // ref: common practice (geometry), by hand from A 30, B 8, C 20, D 5.3, E 26, F 11 (mm):
    // window width (26 − 11)/2 = 7.5 mm, breadth 10.6 mm, area 79.5 mm²; mean turn
    // π·(11 + 7.5) = 58.12 mm.
    const g = coreGeometry(shape('EQ 30/8/20'));
    expectClose(g.windowWidthM, 7.5e-3, { rel: 1e-9 });
    expectClose(g.windowBreadthM, 10.6e-3, { rel: 1e-9 });
    expectClose(g.windowAreaM2, 79.5e-6, { rel: 1e-9 });
    expectClose(g.meanTurnLengthM, 58.12e-3, { rel: 1e-3 });
  });

  it('coreGeometry(ring) window is the bore, π·r1²', () => {
    // ref: common practice (geometry): a toroid winds through its bore
    const g = coreGeometry(shape('R 20/10/7'));
    expectClose(g.windowAreaM2, Math.PI * 25e-6, { rel: 1e-12 });
    expectClose(g.surfaceAreaM2, 2 * Math.PI * 10e-3 * 7e-3 + 2 * Math.PI * 100e-6, { rel: 1e-12 });
  });

  it('coreGeometry(every catalog shape) is finite, Ve = le·Ae, and Amin ≤ Ae for sectioned shapes', () => {
    // ref: IEC 60205, for series sections Ae = C1/C2 ≥ Amin since every l/A² ≤ (l/A)/Amin;
    // for a ring the log formulas give Ae below its geometric section h·(r2 − r1) = Amin.
    for (const s of CORE_SHAPE_CATALOG) {
      const g = coreGeometry(s);
      for (const value of Object.values(g)) expect(Number.isFinite(value) && value > 0).toBe(true);
      // ref: IEC 60205, Ve = le·Ae
      expectClose(g.effectiveVolumeM3, g.effectiveLengthM * g.effectiveAreaM2, { rel: 1e-12 });
      if (s.family === 'ring') expect(g.minimumAreaM2).toBeGreaterThan(g.effectiveAreaM2);
      else expect(g.minimumAreaM2).toBeLessThanOrEqual(g.effectiveAreaM2 * (1 + 1e-12));
    }
  });

  it('coreGeometry over each catalog family grows in volume with the size designation', () => {
    // ref: common practice, a family's sizes are listed smallest first
    for (const family of ['e', 'etd', 'efd', 'pq', 'ring']) {
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
