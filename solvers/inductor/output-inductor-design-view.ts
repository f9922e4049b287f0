import type { GappedCore } from '../magnetics/gapped-core.js';
import { inductanceTolerance } from '../magnetics/inductance-tolerance.js';
import type { TransformerEvaluation } from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import { largestOver } from '../transformer/wound-core-corner-view.js';
import { average } from '../waveform/average.js';
import { minimum } from '../waveform/minimum.js';
import { peak } from '../waveform/peak.js';
import type { InductorDuty } from './inductor-duty.js';
import type { OutputInductorDesign } from './output-inductor-design-schema.js';

/**
 * Tolerance taken on a ground centre-leg gap, ± m. ref: common practice (recalled: ground gaps
 * are held to a few hundredths of a millimetre).
 */
export const INDUCTOR_GAP_TOLERANCE_M = 2e-5;

/** Returns the designed output inductor as a design carries it: the build, and every corner. */
export function outputInductorDesignView(
  duty: InductorDuty,
  build: TransformerBuild,
  evaluation: TransformerEvaluation,
): OutputInductorDesign {
  const layout = evaluation.stack.layouts[0];
  if (layout === undefined) throw new RangeError('outputInductorDesignView: no winding');
  const { geometry, gapLengthM } = evaluation;
  const core: GappedCore = {
    turns: layout.turns,
    effectiveLengthM: geometry.effectiveLengthM,
    effectiveAreaM2: geometry.effectiveAreaM2,
    relativePermeability: build.material.initialPermeability,
    windowHeightM: geometry.windowBreadthM,
    fringing: 'mclyman',
  };
  const permeabilityTolerance = build.material.initialPermeabilityTolerance;
  // Without a gap the material's permeability alone sets L (∂ln L/∂ln μ = 1).
  const tolerance =
    gapLengthM > 0
      ? inductanceTolerance(core, gapLengthM, INDUCTOR_GAP_TOLERANCE_M, permeabilityTolerance)
      : { worstCaseTolerance: permeabilityTolerance, rssTolerance: permeabilityTolerance };
  const corners = evaluation.corners.map((corner, index) => {
    const current = duty.currentsA[index];
    const copper = corner.windings[0];
    if (current === undefined || copper === undefined) {
      throw new RangeError(`outputInductorDesignView: no corner ${index}`);
    }
    const peakA = peak(current);
    const valleyA = minimum(current);
    // Literals in the views' key order (see transformerDesignView), not spreads of them.
    return {
      label: corner.label,
      peakFluxDensityT: corner.peakFluxDensityT,
      fluxDensitySwingT: corner.fluxDensitySwingT,
      saturationFluxDensityT: corner.saturationFluxDensityT,
      fluxDensityUtilization: corner.fluxDensityUtilization,
      coreLossW: corner.coreLossW,
      currentAverageA: average(current),
      currentPeakA: peakA,
      currentRippleA: peakA - valleyA,
      // The current idles at zero where the corner is discontinuous (round-off aside).
      conductionMode:
        valleyA <= 1e-9 * Math.max(peakA, 1e-12) ? ('dcm' as const) : ('ccm' as const),
      resistanceOhm: copper.resistanceOhm,
      copperDcLossW: copper.dcLossW,
      copperAcLossW: copper.acLossW,
      totalLossW: corner.totalLossW,
      temperatureRiseK: corner.temperatureRiseK,
      temperatureC: corner.temperatureC,
    };
  });
  const worst = corners.reduce(
    (most, corner) => (corner.fluxDensityUtilization > most.fluxDensityUtilization ? corner : most),
    corners[0] ?? { label: '', fluxDensityUtilization: 0 },
  );
  return {
    outputIndex: duty.outputIndex,
    name: duty.name,
    coreShape: build.shape.designation,
    core: { ...geometry },
    materialId: build.material.id,
    gapLengthM,
    inductanceH: evaluation.magnetizingInductanceH,
    inductanceTolerance: {
      gapToleranceM: gapLengthM > 0 ? INDUCTOR_GAP_TOLERANCE_M : 0,
      permeabilityTolerance,
      worstCase: tolerance.worstCaseTolerance,
      rss: tolerance.rssTolerance,
    },
    turns: layout.turns,
    wire: { ...layout.wire },
    turnsPerLayer: layout.turnsPerLayer,
    layerCount: layout.layerCount,
    heightM: layout.heightM,
    resistanceAt20COhm: evaluation.resistancesAt20COhm[0] ?? 0,
    dowellLayerCount: evaluation.stack.equivalentLayerCounts[0] ?? 0.5,
    windowFill: evaluation.windowFill,
    windowHeightFill: evaluation.windowHeightFill,
    corners,
    summary: {
      currentPeakMaxA: largestOver(corners, (corner) => corner.currentPeakA),
      worstCorner: worst.label,
      peakFluxDensityMaxT: largestOver(corners, (corner) => corner.peakFluxDensityT),
      fluxDensityUtilizationMax: worst.fluxDensityUtilization,
      saturationMargin: 1 - worst.fluxDensityUtilization,
      temperatureRiseMaxK: largestOver(corners, (corner) => corner.temperatureRiseK),
      lossMaxW: largestOver(corners, (corner) => corner.totalLossW),
    },
  };
}
