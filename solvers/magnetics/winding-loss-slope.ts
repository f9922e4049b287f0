import { COPPER_TEMPERATURE_COEFFICIENT_20C } from '../materials/copper-resistance.js';
import {
  dowellKernelTable,
  fillDowellKernelSlopes,
  fillDowellKernels,
} from './dowell-kernel-table.js';
import { dowellProximityWeight } from './dowell-factor.js';
import { equivalentFoilLayer, fundamentalPenetrationRatio } from './equivalent-foil-layer.js';
import type { CurrentSpectrum, WindingLoss } from './winding-ac-resistance.js';
import type { WindingPortion } from './winding-portion.js';

/**
 * A harmonic whose mean square is below this fraction of the AC mean square is round-off (the
 * even harmonics of a half-wave-symmetric current, about 1e-30 of the others): left out.
 */
const ROUND_OFF_FRACTION = 1e-12;

/**
 * Returns the slope in temperature, W/K, of the copper loss `loss` that writeWindingLoss gave
 * for `spectrum` in `portion` with DC resistance `dcResistanceOhm` (Ω, at `temperatureC`, °C),
 * harmonics 1…loss.harmonicsUsed and the tail above. With R ∝ 1 + α(T − 20) (IEC 60028) and
 * Δ ∝ 1/δ ∝ R^(−1/2), g = α/(1 + α(T − 20)) and Dowell's factor K = skin + w·proximity:
 * dP/dT = g·[P − ½·Rdc·Σ K′(Δn)·Δn·In,rms² − ½·tail·K′(ΔN+1)·ΔN+1/K(ΔN+1)]
 * (the tail taken to follow the factor of its first order). A model's slope, between exact
 * evaluations of the loss; not itself a loss.
 */
export function windingLossSlope(
  spectrum: CurrentSpectrum,
  portion: WindingPortion,
  dcResistanceOhm: number,
  temperatureC: number,
  loss: Pick<WindingLoss, 'totalLossW' | 'tailLossW' | 'harmonicsUsed'>,
): number {
  const g =
    COPPER_TEMPERATURE_COEFFICIENT_20C /
    (1 + COPPER_TEMPERATURE_COEFFICIENT_20C * (temperatureC - 20));
  const foil = equivalentFoilLayer(portion);
  // Δ1 as writeWindingLoss takes it, so the table is the one its sum filled.
  const delta1 = fundamentalPenetrationRatio(foil, spectrum.periodS, temperatureC);
  const proximityWeight = dowellProximityWeight(foil.layerCount);
  const count = loss.harmonicsUsed;
  const table = dowellKernelTable(delta1, count + 1);
  const squaresA2 = spectrum.harmonicSquaresA2;
  const roundOffA2 = ROUND_OFF_FRACTION * spectrum.acSquareA2;
  let slopeSumA2 = 0;
  for (let n = 1; n <= count && n <= squaresA2.length; n++) {
    const squareA2 = squaresA2[n - 1] as number;
    if (!(squareA2 > roundOffA2)) continue;
    fillDowellKernelSlopes(table, n);
    const factorSlope =
      (table.skinSlope[n] as number) + proximityWeight * (table.proximitySlope[n] as number);
    slopeSumA2 += factorSlope * delta1 * Math.sqrt(n) * squareA2;
  }
  let tailShare = 0;
  if (loss.tailLossW > 0) {
    const next = count + 1;
    fillDowellKernels(table, next);
    fillDowellKernelSlopes(table, next);
    const factor =
      (table.skin[next] as number) + proximityWeight * (table.proximity[next] as number);
    const factorSlope =
      (table.skinSlope[next] as number) + proximityWeight * (table.proximitySlope[next] as number);
    tailShare = (loss.tailLossW * factorSlope * delta1 * Math.sqrt(next)) / factor;
  }
  return g * (loss.totalLossW - 0.5 * dcResistanceOhm * slopeSumA2 - 0.5 * tailShare);
}
