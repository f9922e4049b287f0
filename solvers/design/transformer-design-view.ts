import type { TransformerEvaluation } from '../transformer/evaluate-transformer.js';
import type { TransformerBuild } from '../transformer/transformer-build.js';
import type { TransformerDesign } from '../transformer/transformer-design-schema.js';
import type { TransformerDuty } from '../transformer/transformer-duty.js';
import { largestOver } from '../transformer/wound-core-corner-view.js';

/** Returns the designed transformer as a design carries it: the build, and every corner. */
export function transformerDesignView(
  duty: TransformerDuty,
  build: TransformerBuild,
  evaluation: TransformerEvaluation,
): TransformerDesign {
  // Literals in the views' key order, not spreads of them: an object spread followed by more
  // properties takes V8's slow path, which made the views a few percent of an evaluation.
  const corners = evaluation.corners.map((corner) => ({
    label: corner.label,
    peakFluxDensityT: corner.peakFluxDensityT,
    fluxDensitySwingT: corner.fluxDensitySwingT,
    saturationFluxDensityT: corner.saturationFluxDensityT,
    fluxDensityUtilization: corner.fluxDensityUtilization,
    coreLossW: corner.coreLossW,
    copperLossW: corner.copperLossW,
    windings: corner.windings.map((w) => ({
      resistanceOhm: w.resistanceOhm,
      dcLossW: w.dcLossW,
      acLossW: w.acLossW,
    })),
    totalLossW: corner.totalLossW,
    temperatureRiseK: corner.temperatureRiseK,
    temperatureC: corner.temperatureC,
    hotSpotRiseK: corner.hotSpotRiseK,
    hotSpotTemperatureC: corner.hotSpotTemperatureC,
  }));
  return {
    coreShape: build.shape.designation,
    core: { ...evaluation.geometry },
    materialId: build.material.id,
    arrangement: build.arrangement,
    gapLengthM: evaluation.gapLengthM,
    magnetizingInductanceH: evaluation.magnetizingInductanceH,
    leakageInductanceH: evaluation.stack.leakageInductanceH,
    windowFill: evaluation.windowFill,
    windowHeightFill: evaluation.windowHeightFill,
    windings: evaluation.stack.layouts.map((layout, k) => ({
      name: duty.windings[k]?.name ?? `winding-${k}`,
      turns: layout.turns,
      wire: { ...layout.wire },
      turnsPerLayer: layout.turnsPerLayer,
      layerCount: layout.layerCount,
      heightM: layout.heightM,
      resistanceAt20COhm: evaluation.resistancesAt20COhm[k] ?? 0,
      dowellLayerCount: evaluation.stack.equivalentLayerCounts[k] ?? 0.5,
    })),
    corners,
    summary: {
      peakFluxDensityMaxT: largestOver(corners, (corner) => corner.peakFluxDensityT),
      fluxDensityUtilizationMax: largestOver(corners, (corner) => corner.fluxDensityUtilization),
      temperatureRiseMaxK: largestOver(corners, (corner) => corner.temperatureRiseK),
      // A temperature, not a magnitude: below-zero ambients stay below zero.
      hotSpotTemperatureMaxC: corners.reduce(
        (most, corner) => Math.max(most, corner.hotSpotTemperatureC),
        -Infinity,
      ),
      lossMaxW: largestOver(corners, (corner) => corner.totalLossW),
    },
  };
}
