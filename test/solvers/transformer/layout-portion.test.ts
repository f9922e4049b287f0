import { describe, expect, it } from 'vitest';
import { skinDepth } from '../../../solvers/magnetics/skin-depth.js';
import { windingAcResistance } from '../../../solvers/magnetics/winding-ac-resistance.js';
import { layoutPortion } from '../../../solvers/transformer/layout-portion.js';
import { windingLayout } from '../../../solvers/transformer/winding-layout.js';
import { expectClose } from '../../helpers/expect-close.js';

/**
 * Dowell's portion factor written out by hand: Fr = Δ·[ς1 + (2/3)(M² − 1)·ς2] with
 * ς1 = (sinh 2Δ + sin 2Δ)/(cosh 2Δ − cos 2Δ), ς2 = (sinh Δ − sin Δ)/(cosh Δ + cos Δ)
 * (P. L. Dowell, Effects of eddy currents in transformer windings, Proc. IEE 113(8), 1966).
 */
function dowellByHand(delta: number, layers: number): number {
  const s1 =
    (Math.sinh(2 * delta) + Math.sin(2 * delta)) / (Math.cosh(2 * delta) - Math.cos(2 * delta));
  const s2 = (Math.sinh(delta) - Math.sin(delta)) / (Math.cosh(delta) + Math.cos(delta));
  return delta * (s1 + (2 / 3) * (layers * layers - 1) * s2);
}

describe('layoutPortion', () => {
  const frequencyHz = 100e3;
  const sinusoid = (rmsA: number) => ({
    periodS: 1 / frequencyHz,
    dcA: 0,
    acSquareA2: rmsA * rmsA,
    harmonicSquaresA2: [rmsA * rmsA],
  });

  // ref: Dowell, Proc. IEE, 1966: a foil layer is its own equivalent foil (one turn, width w).
  it('layoutPortion(foil layout) is one foil turn to a layer of the laid width', () => {
    const layout = windingLayout(
      3,
      { kind: 'foil', thicknessM: 0.2e-3, insulationThicknessM: 0 },
      20e-3,
    );
    if (layout === undefined) throw new Error('the foil should fit');
    expect(layoutPortion(layout, 3, 20e-3)).toEqual({
      layerCount: 3,
      turnsPerLayer: 1,
      breadthM: 20e-3,
      conductor: { kind: 'foil', thicknessM: 0.2e-3, widthM: 20e-3 },
    });
  });

  // ref: Dowell, Proc. IEE, 1966: for foil Δ = (t/δ)·√η with η = w/b (no round-wire square
  // correction); the factor computed by hand above at δ = sqrt(ρ/(π·f·μ0)), ρ = ρ20 of IEC 60028.
  it('layoutPortion(foil) gives Dowell 1966 foil factors at several thicknesses, widths and M', () => {
    const breadthM = 20e-3;
    const rhoOhmM = 1 / 58e6;
    const deltaM = Math.sqrt(rhoOhmM / (Math.PI * frequencyHz * 4e-7 * Math.PI));
    expectClose(skinDepth(frequencyHz), deltaM, { rel: 1e-12 });
    for (const thicknessM of [0.05e-3, 0.2e-3, 0.5e-3]) {
      for (const widthM of [20e-3, 10e-3]) {
        for (const layers of [1, 2, 4.5]) {
          const layout = windingLayout(
            4,
            { kind: 'foil', thicknessM, widthM, insulationThicknessM: 50e-6 },
            breadthM,
          );
          if (layout === undefined) throw new Error('the foil should fit');
          const loss = windingAcResistance(sinusoid(2), layoutPortion(layout, layers, breadthM), 1);
          const delta = (thicknessM / deltaM) * Math.sqrt(widthM / breadthM);
          expectClose(loss.totalLossW / 4, dowellByHand(delta, layers), { rel: 1e-9 });
        }
      }
    }
  });
});
