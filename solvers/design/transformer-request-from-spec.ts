import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { MATERIAL_CLASSES } from '../magnetics/material-classes.js';
import { failure, success, type Result } from '../result.js';
import type { Spec } from '../spec/spec-schema.js';
import type { TransformerRequest } from '../transformer/transformer-request.js';

/**
 * Returns what the transformer design may choose from for `spec`: the catalog shapes (or the one
 * the spec names) and the materials: the spec's inline material when it has one, else the built-in
 * class its materialId names, else the classes whose frequency range holds the switching frequency
 * (every class when none covers it); with the spec's limits. An id naming no built-in class (and
 * no inline material) is an unknown_material issue at magnetics.materialId.
 */
export function transformerRequestFromSpec(spec: Spec): Result<TransformerRequest> {
  const { magnetics } = spec;
  const shapes = CORE_SHAPE_CATALOG.filter(
    (shape) => magnetics.coreShape === undefined || shape.designation === magnetics.coreShape,
  );
  const materials = specMaterials(spec, spec.switchingFrequencyHz);
  if (!materials.ok) return materials;
  return success({
    shapes,
    materials: materials.value,
    arrangement: magnetics.arrangement,
    ...(magnetics.primaryTurns === undefined ? {} : { primaryTurns: magnetics.primaryTurns }),
    wireChoice: { currentDensityAPerM2: magnetics.currentDensityAPerM2 },
    evaluation: {
      windowFillMax: magnetics.windowFillMax,
      fluxDensityUtilizationMax: magnetics.fluxDensityUtilizationMax,
      temperatureRiseMaxK: magnetics.temperatureRiseMaxK,
      ...(magnetics.hotSpotTemperatureMaxC === undefined
        ? {}
        : { hotSpotTemperatureMaxC: magnetics.hotSpotTemperatureMaxC }),
    },
  });
}

/**
 * The materials the spec allows for a core whose flux runs at `frequencyHz` (Hz): its inline
 * material, else the built-in class its materialId names, else the classes whose frequency range
 * holds the frequency (every class when none does). An unknown_material issue at
 * magnetics.materialId when the id names nothing the engine holds.
 */
export function specMaterials(spec: Spec, frequencyHz: number): Result<readonly MaterialClass[]> {
  const { material, materialId } = spec.magnetics;
  if (material !== undefined) return success([material]);
  if (materialId === undefined) {
    const inRange = MATERIAL_CLASSES.filter(
      (m) => m.frequencyMinHz <= frequencyHz && frequencyHz <= m.frequencyMaxHz,
    );
    return success(inRange.length > 0 ? inRange : MATERIAL_CLASSES);
  }
  const named = MATERIAL_CLASSES.filter((m) => m.id === materialId);
  if (named.length > 0) return success(named);
  return failure([
    {
      code: 'unknown_material',
      path: ['magnetics', 'materialId'],
      constraint: 'materialId names a built-in material class, or magnetics.material is given',
      quantity: 'materialMatchCount',
      required: 1,
      limit: 0,
    },
  ]);
}
