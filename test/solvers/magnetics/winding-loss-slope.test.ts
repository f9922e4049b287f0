import { describe, it } from 'vitest';
import {
  windingAcResistance,
  type CurrentSpectrum,
} from '../../../solvers/magnetics/winding-ac-resistance.js';
import { windingLossSlope } from '../../../solvers/magnetics/winding-loss-slope.js';
import type { WindingPortion } from '../../../solvers/magnetics/winding-portion.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: 100 kHz, three layers of 12 turns of 0.5 mm wire on a 10 mm breadth, 50 mΩ
// at 20 °C.
const PERIOD_S = 1e-5;
const PORTION: WindingPortion = {
  layerCount: 3,
  turnsPerLayer: 12,
  breadthM: 10e-3,
  conductor: { kind: 'round', bareDiameterM: 0.5e-3 },
};
const R20_OHM = 0.05;

/**
 * The loss of a DC part and harmonics of mean squares `squaresA2` by the textbook: copper's
 * resistance and resistivity by IEC 60028 (ρ20 = 1/58 Ω·mm²/m, α20 = 0.00393/K), the skin depth
 * δ = √(ρ/(π·f·μ0)), Dowell's (1966) factor of M layers from the closed forms, with the round
 * wire as the square of equal area (side d·√π/2, porosity N·side/b).
 */
function textbookLossW(temperatureC: number, dcA: number, squaresA2: readonly number[]): number {
  const scale = 1 + 0.00393 * (temperatureC - 20);
  const resistivityOhmM = scale / 58e6;
  const side = (0.5e-3 * Math.sqrt(Math.PI)) / 2;
  const porosity = (12 * side) / 10e-3;
  let weightedA2 = 0;
  squaresA2.forEach((squareA2, i) => {
    const frequencyHz = (i + 1) / PERIOD_S;
    const depthM = Math.sqrt(resistivityOhmM / (Math.PI * frequencyHz * 4e-7 * Math.PI));
    const d = (side / depthM) * Math.sqrt(porosity);
    const skin = (d * (Math.sinh(2 * d) + Math.sin(2 * d))) / (Math.cosh(2 * d) - Math.cos(2 * d));
    const proximity = (d * (Math.sinh(d) - Math.sin(d))) / (Math.cosh(d) + Math.cos(d));
    weightedA2 += (skin + (2 / 3) * (3 * 3 - 1) * proximity) * squareA2;
  });
  return R20_OHM * scale * (dcA * dcA + weightedA2);
}

describe('windingLossSlope', () => {
  it('windingLossSlope equals the temperature derivative of the textbook loss (no tail)', () => {
    // Invented: 2 A DC with harmonics 1, 3 and 5 of a square-ish ripple (mean squares in A²).
    const squaresA2 = [0.8, 0, 0.089, 0, 0.032];
    const spectrum: CurrentSpectrum = {
      periodS: PERIOD_S,
      dcA: 2,
      acSquareA2: squaresA2.reduce((sum, x) => sum + x, 0),
      harmonicSquaresA2: squaresA2,
    };
    for (const temperatureC of [25, 60, 100]) {
      const resistanceOhm = R20_OHM * (1 + 0.00393 * (temperatureC - 20));
      const loss = windingAcResistance(spectrum, PORTION, resistanceOhm, {
        temperatureC,
        harmonicCount: 5,
        maxHarmonicCount: 5,
      });
      // ref: IEC 60028 (ρ20, α20) and Dowell, Proc. IEE, 1966 (closed forms), textbookLossW
      // above, differentiated by a central difference of ±0.01 K (error O(h²), about 1e-9)
      const h = 0.01;
      const slopeWPerK =
        (textbookLossW(temperatureC + h, 2, squaresA2) -
          textbookLossW(temperatureC - h, 2, squaresA2)) /
        (2 * h);
      expectClose(loss.totalLossW, textbookLossW(temperatureC, 2, squaresA2), { rel: 1e-9 });
      expectClose(
        windingLossSlope(spectrum, PORTION, resistanceOhm, temperatureC, loss),
        slopeWPerK,
        {
          rel: 1e-6,
        },
      );
    }
  });
});
