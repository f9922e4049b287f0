import { describe, expect, it } from 'vitest';
import {
  FOIL_THICKNESSES_M,
  foilWindingChoice,
} from '../../../solvers/transformer/foil-winding-choice.js';
import { expectClose } from '../../helpers/expect-close.js';

/** Dowell's portion factor by hand (P. L. Dowell, Proc. IEE 113(8), 1966); see layout-portion.test. */
function dowellByHand(delta: number, layers: number): number {
  const s1 =
    (Math.sinh(2 * delta) + Math.sin(2 * delta)) / (Math.cosh(2 * delta) - Math.cos(2 * delta));
  const s2 = (Math.sinh(delta) - Math.sin(delta)) / (Math.cosh(delta) + Math.cos(delta));
  return delta * (s1 + (2 / 3) * (layers * layers - 1) * s2);
}

describe('foilWindingChoice', () => {
  const frequencyHz = 100e3;
  const sinusoid = {
    periodS: 1 / frequencyHz,
    dcA: 0,
    acSquareA2: 100,
    harmonicSquaresA2: [100],
  };
  // ref: IEC 60028: ρ = ρ20·(1 + 0.00393·(100 − 20)) at 100 °C, ρ20 = 1/58 Ω·mm²/m;
  // δ = sqrt(ρ/(π·f·μ0)).
  const hotDepthM = Math.sqrt(
    ((1 / 58e6) * (1 + 0.00393 * 80)) / (Math.PI * frequencyHz * 4e-7 * Math.PI),
  );
  // A fine grid of thicknesses, 0.5 % apart, from 0.2 to 2 skin depths.
  const fine = Array.from({ length: 470 }, (_, i) => 0.2 * hotDepthM * 1.005 ** i);

  // ref: Dowell, Proc. IEE, 1966: at a fixed width the loss of a sinusoid goes as Fr(Δ)/Δ,
  // which for one layer is ς1(Δ), least at Δ = π/2 (sin 2Δ = 0 there: tanh(π/2) = 0.917;
  // the classic optimum single-layer foil of π/2 skin depths, common practice).
  it('foilWindingChoice(sinusoid, one layer) takes about π/2 skin depths', () => {
    const foil = foilWindingChoice(sinusoid, 1, 20e-3, { thicknessesM: fine });
    expectClose(foil.thicknessM, (Math.PI / 2) * hotDepthM, { rel: 0.006 });
    expect(foil.widthM).toBe(20e-3);
  });

  // ref: Dowell, Proc. IEE, 1966, the factor by hand above, minimised by a scan of Δ; and its
  // Maclaurin series Fr ≈ 1 + (5M² − 1)Δ⁴/45 (derived by hand), whose optimum
  // Δ⁴ = 15/(5M² − 1) is 0.590 for M = 5 (within 0.3 % of the scan there).
  it("foilWindingChoice(sinusoid, M layers) takes Dowell's optimum thickness", () => {
    for (const layers of [2, 3, 5]) {
      let bestDelta = 0;
      let bestLoss = Infinity;
      for (let delta = 0.01; delta < 3; delta += 1e-4) {
        const loss = dowellByHand(delta, layers) / delta;
        if (loss < bestLoss) [bestDelta, bestLoss] = [delta, loss];
      }
      const foil = foilWindingChoice(sinusoid, layers, 20e-3, { thicknessesM: fine });
      expectClose(foil.thicknessM / hotDepthM, bestDelta, { rel: 0.006 });
      if (layers === 5) expectClose(bestDelta, (15 / (5 * 25 - 1)) ** 0.25, { rel: 0.005 });
    }
  });

  // ref: Ohm's law — with no AC part the loss is Rdc·I², least for the thickest copper.
  it('foilWindingChoice(direct current) takes the thickest foil offered', () => {
    const direct = { periodS: 1e-5, dcA: 10, acSquareA2: 0, harmonicSquaresA2: [0, 0] };
    const foil = foilWindingChoice(direct, 4, 20e-3);
    expect(foil.thicknessM).toBe(Math.max(...FOIL_THICKNESSES_M));
  });

  it('foilWindingChoice rejects an empty thickness list or a non-positive breadth', () => {
    expect(() => foilWindingChoice(sinusoid, 1, 20e-3, { thicknessesM: [] })).toThrow(RangeError);
    expect(() => foilWindingChoice(sinusoid, 1, 0)).toThrow(RangeError);
  });
});
