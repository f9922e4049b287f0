import { z } from 'zod';
import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import { MaterialClassSchema } from '../magnetics/catalog-schemas.js';
import type { MaterialClass } from '../magnetics/material-class.js';

const designations = CORE_SHAPE_CATALOG.map((shape) => shape.designation) as [string, ...string[]];

/**
 * A whole material in the spec (MaterialClassSchema), with the orderings the engine divides by:
 * two distinct saturation temperatures, a frequency range that is not reversed.
 */
export const InlineMaterialSchema = MaterialClassSchema.superRefine(checkInlineMaterial).describe(
  "The core material's numbers in full, used as given (SI units, temperatures in °C). When present, the transformer is designed with this material only. POST /v1/designs fills it in from a stored user material named by materialId, so the stored design shows the numbers used.",
);

function checkInlineMaterial(material: MaterialClass, ctx: z.RefinementCtx): void {
  const { lowTemperatureC, highTemperatureC } = material.saturation;
  if (!(highTemperatureC > lowTemperatureC)) {
    ctx.addIssue({
      code: 'custom',
      path: ['saturation', 'highTemperatureC'],
      message: `must be above lowTemperatureC ${lowTemperatureC} °C`,
    });
  }
  if (material.frequencyMaxHz < material.frequencyMinHz) {
    ctx.addIssue({
      code: 'custom',
      path: ['frequencyMaxHz'],
      message: `must be at least frequencyMinHz ${material.frequencyMinHz} Hz`,
    });
  }
}

/** materialId and an inline material, when both are given, must name the same material. */
function checkMaterialId(
  magnetics: { materialId?: string | undefined; material?: MaterialClass | undefined },
  ctx: z.RefinementCtx,
): void {
  const { materialId, material } = magnetics;
  if (materialId !== undefined && material !== undefined && material.id !== materialId) {
    ctx.addIssue({
      code: 'custom',
      path: ['material', 'id'],
      message: `must equal materialId '${materialId}' when both are given`,
    });
  }
}

/**
 * How the transformer is obtained: designed by the engine from the catalog (the default), or
 * assumed from the transformer block's resistances and leakage as given.
 */
export const MagneticsSpecSchema = z
  .strictObject({
    mode: z
      .enum(['design', 'assume'])
      .default('design')
      .describe(
        "'design': the engine designs the transformer (core, material, gap, turns, wires, layers) and feeds its winding resistances, leakage inductance and whole-turns ratios back into the operating point; 'assume': the transformer block is taken as given and no transformer is designed.",
      ),
    coreShape: z
      .enum(designations)
      .optional()
      .describe(
        'Designation of the catalog core shape to use (GET /v1/catalog/core-shapes), for example "ETD 34"; the smallest shape inside every limit when omitted.',
      ),
    materialId: z
      .string()
      .min(1)
      .max(80)
      .optional()
      .describe(
        'Id of the material to use: a built-in class id or the id of a user material (both listed by GET /v1/catalog/materials; a user material is looked up by POST /v1/designs and put inline as `material`). When omitted (and no `material` is given), the built-in class with the least loss among those whose frequency range holds the switching frequency. An id that names no material answers 422.',
      ),
    material: InlineMaterialSchema.optional(),
    primaryTurns: z
      .int()
      .min(1)
      .max(2000)
      .optional()
      .describe('Primary turns, when fixed; the secondaries follow from the turns ratios.'),
    arrangement: z
      .enum(['stacked', 'interleaved'])
      .default('interleaved')
      .describe(
        "'stacked': primary next to the centre leg, secondaries outside it; 'interleaved': the primary split in two halves around the secondaries (about a quarter of the leakage; common practice).",
      ),
    windowFillMax: z
      .number()
      .gt(0)
      .max(1)
      .default(0.5)
      .describe('Largest outside area of all turns over the window area (dimensionless).'),
    fluxDensityUtilizationMax: z
      .number()
      .gt(0)
      .max(1)
      .default(0.8)
      .describe(
        'Largest peak flux density over the saturation flux density at the core temperature (dimensionless).',
      ),
    temperatureRiseMaxK: z
      .number()
      .gt(0)
      .max(150)
      .default(40)
      .describe('Largest temperature rise of the wound core above the ambient, K.'),
    hotSpotTemperatureMaxC: z
      .number()
      .gt(0)
      .max(250)
      .optional()
      .describe(
        "Highest estimated winding hot-spot temperature, °C: the wound core's surface temperature plus the conduction rise across the winding build. 120 °C when omitted (common practice for a class-B-like insulation system of enamelled wire, tape and bobbin, with margin below its rating); the insulation system's own rating and the applicable safety standard decide.",
      ),
    currentDensityAPerM2: z
      .number()
      .gt(0)
      .max(50e6)
      .default(4.5e6)
      .describe(
        'Current density the winding copper is sized for, A/m² (RMS current per copper area in m²).',
      ),
  })
  .superRefine(checkMaterialId)
  .default({
    mode: 'design',
    arrangement: 'interleaved',
    windowFillMax: 0.5,
    fluxDensityUtilizationMax: 0.8,
    temperatureRiseMaxK: 40,
    currentDensityAPerM2: 4.5e6,
  })
  .describe('The transformer: designed by the engine, or assumed from the transformer block.');

/** The parsed magnetics block. */
export type MagneticsSpec = z.infer<typeof MagneticsSpecSchema>;
