import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import { MATERIAL_CLASSES } from '../magnetics/material-classes.js';
import type { Spec } from '../spec/spec-schema.js';
import type { TransformerRequest } from '../transformer/transformer-request.js';

/**
 * Returns what the transformer design may choose from for `spec`: the catalog shapes (or the one
 * the spec names) and the material classes whose frequency range holds the switching frequency
 * (or the one named; every class when none covers it), with the spec's limits.
 */
export function transformerRequestFromSpec(spec: Spec): TransformerRequest {
  const { magnetics } = spec;
  const fs = spec.switchingFrequencyHz;
  const shapes = CORE_SHAPE_CATALOG.filter(
    (shape) => magnetics.coreShape === undefined || shape.designation === magnetics.coreShape,
  );
  const named = MATERIAL_CLASSES.filter((material) => material.id === magnetics.materialId);
  const inRange = MATERIAL_CLASSES.filter(
    (material) => material.frequencyMinHz <= fs && fs <= material.frequencyMaxHz,
  );
  const materials =
    magnetics.materialId !== undefined ? named : inRange.length > 0 ? inRange : MATERIAL_CLASSES;
  return {
    shapes,
    materials,
    arrangement: magnetics.arrangement,
    ...(magnetics.primaryTurns === undefined ? {} : { primaryTurns: magnetics.primaryTurns }),
    wireChoice: { currentDensityAPerM2: magnetics.currentDensityAPerM2 },
    evaluation: {
      windowFillMax: magnetics.windowFillMax,
      fluxDensityUtilizationMax: magnetics.fluxDensityUtilizationMax,
      temperatureRiseMaxK: magnetics.temperatureRiseMaxK,
    },
  };
}
