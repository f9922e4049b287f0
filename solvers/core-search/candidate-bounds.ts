import { igseCoreLoss } from '../magnetics/igse-core-loss.js';
import { lossTemperatureFactor } from '../magnetics/loss-temperature-factor.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { saturationFluxDensity } from '../magnetics/saturation-flux-density.js';
import type { TransformerEvaluationOptions } from '../transformer/transformer-evaluation-options.js';
import { rampJumps } from '../waveform/ramp-jumps.js';
import { scaleWaveform } from '../waveform/scale-waveform.js';
import { steepestSlope } from '../waveform/steepest-slope.js';
import type { Waveform } from '../waveform/waveform.js';

/**
 * Harmonics of each winding current the copper-loss bound weighs one by one (Dowell's factor at
 * each); the rest of the AC mean square is weighed at the next order's factor. At most the
 * transformer evaluation's first harmonic count (32), so that every order the bound weighs
 * exactly the evaluation weighs exactly too; at that count (8 until 2026-12-03) the leaf bound
 * is tighter, and the sums are memoized per grid temperature (`CopperBound`), so the longer
 * spectrum costs little (whole-catalog two-switch forward: 5,856 first-pass designs where 8
 * harmonics left 6,499).
 */
export const BOUND_HARMONIC_COUNT = 32;

/**
 * Harmonics the proven bound on a candidate's second solve (`secondSolveBounds`) weighs one by
 * one: the transformer evaluation's first harmonic count, the most the argument above allows. It
 * runs once per candidate past the leaf bound, not per leaf, so the longer spectrum is cheap there.
 */
export const SECOND_SOLVE_HARMONIC_COUNT = 32;

/**
 * The orders the copper bound's tail reads (`CopperBound`, since 2026-12-05): where the
 * evaluation is proven to sum past its first 32 orders it sums 64 (its default most), and the
 * bound then weighs orders 33…64 one by one.
 */
export const BOUND_TAIL_HARMONIC_COUNT = 64;

/**
 * A lower bound of Σ Fr(n)·I_n,rms² over every harmonic of a winding current, A² (the AC part
 * of its copper loss over Rdc): `factors[n − 1]` is Dowell's factor of the winding at order
 * n = 1…H + 1 (H = {@link BOUND_HARMONIC_COUNT}), each at most the evaluation's at that order,
 * `squaresA2[n − 1]` the harmonics 1…H, `unsummedA2` the AC mean square they leave. Orders above
 * H are weighed at Fr(H + 1): the factor does not fall with the order (Dowell's Δ ∝ √n), and the
 * evaluation sums orders up to at least its first harmonic count exactly and weighs the rest at
 * least at the next order's factor. `harmonicCount` (H) may be raised up to that first count
 * (`SECOND_SOLVE_HARMONIC_COUNT`), with factors and squares as long.
 */
export function acSquareBoundA2(
  factors: readonly number[],
  squaresA2: readonly number[],
  unsummedA2: number,
  harmonicCount: number = BOUND_HARMONIC_COUNT,
): number {
  let boundA2 = (factors[harmonicCount] as number) * unsummedA2;
  for (let n = 0; n < harmonicCount; n++) {
    boundA2 += (factors[n] as number) * (squaresA2[n] as number);
  }
  return boundA2;
}

/**
 * The largest peak flux density any accepted build of `material` can have: the utilization
 * limit times the largest saturation flux density between the ambient and the hottest allowed
 * core (ambient + temperatureRiseMaxK), T. A build is accepted only when at every corner its peak
 * is under the limit times the saturation at that corner's temperature, and that temperature lies
 * in this range (a hotter core breaks the rise limit); the saturation model is linear in
 * temperature, so its largest value over the range is at an end.
 */
export function saturationLimitT(
  material: MaterialClass,
  ambientC: number,
  settings: Required<TransformerEvaluationOptions>,
): number {
  const hotC = ambientC + settings.temperatureRiseMaxK;
  return (
    settings.fluxDensityUtilizationMax *
    Math.max(saturationFluxDensity(material, ambientC), saturationFluxDensity(material, hotC))
  );
}

/**
 * The smallest core-loss temperature factor between `lowC` and `highC` (°C): the factor is a
 * quadratic ct2·T² − ct1·T + ct0, so its least value over the range is at an end or, when it
 * opens upwards, at its vertex T = ct1/(2·ct2) if that lies inside.
 */
export function minimumLossTemperatureFactor(
  material: MaterialClass,
  lowC: number,
  highC: number,
): number {
  const { ct2, ct1 } = material.lossTemperatureFactor;
  let least = Math.min(
    lossTemperatureFactor(material, lowC),
    lossTemperatureFactor(material, highC),
  );
  if (ct2 > 0) {
    const vertexC = ct1 / (2 * ct2);
    if (vertexC > lowC && vertexC < highC) {
      least = Math.min(least, lossTemperatureFactor(material, vertexC));
    }
  }
  return least;
}

/** The largest |dv/dt| over the segments of non-zero length, unit per second. */

/**
 * The iGSE loss density, W/m³, of the flux waveform that one primary turn on a core of 1 m²
 * would carry: B1(t) = Lm·im(t) (the flux linkage, Wb), with current steps made ramps exactly as
 * the transformer evaluation makes them. The iGSE (Venkatachalam, Sullivan, Abdallah, Tacca,
 * "Accurate prediction of ferrite core loss with nonsinusoidal waveforms using only Steinmetz
 * parameters", IEEE COMPEL 2002, eq. 15) is ki·(1/T)·∫|dB/dt|^α·ΔB^(β−α) dt, homogeneous of
 * degree β in B; so a build with Np turns and area Ae has the density
 * `unitCoreLossDensity` · (Np·Ae)^−β, with no second iGSE evaluation.
 */
export function unitCoreLossDensity(
  magnetizingCurrentA: Waveform,
  magnetizingInductanceH: number,
  material: MaterialClass,
): number {
  const stepped = scaleWaveform(magnetizingCurrentA, magnetizingInductanceH);
  const flux = rampJumps(stepped, Math.max(steepestSlope(stepped), 1e-30));
  return igseCoreLoss(flux, material.steinmetz);
}
