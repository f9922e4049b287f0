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
