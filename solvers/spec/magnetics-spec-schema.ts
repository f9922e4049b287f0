import { z } from 'zod';
import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import { MaterialClassSchema } from '../magnetics/catalog-schemas.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import { WindingWireSchema } from '../transformer/winding-wire-schema.js';

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
 * One output inductor's build, fixed by the request: the fields an output inductor of a design
 * reports under the same names (outputIndex, coreShape, materialId, turns, wire, gapLengthM), so a
 * design's `outputInductors[k]` round-trips into the spec. Whatever is omitted is chosen by the
 * engine; with coreShape, a material and turns all fixed nothing is searched.
 */
export const OutputInductorBuildSchema = z
  .strictObject({
    outputIndex: z
      .int()
      .min(0)
      .max(3)
      .describe('Which output the inductor filters (0-based index into outputs).'),
    coreShape: z
      .enum(designations)
      .optional()
      .describe(
        'Designation of the catalog core shape (GET /v1/catalog/core-shapes); the smallest E-type shape inside every limit when omitted. A ring takes no cut gap: with a ring, gapLengthM must be given as 0 (a distributed-gap material), otherwise 422 non_physical_value.',
      ),
    materialId: z
      .string()
      .min(1)
      .max(80)
      .optional()
      .describe(
        "Id of the core material: a built-in class id, or magnetics.material's id. When omitted, the transformer's material rule applies (magnetics.material or magnetics.materialId when given, else the built-in class with the least loss whose frequency range holds the ripple's frequency). An id naming neither answers 422 unknown_material.",
      ),
    turns: z
      .int()
      .min(1)
      .max(2000)
      .optional()
      .describe(
        'Turns of the winding (dimensionless); the fewest that keep B in bounds and two more are tried when omitted.',
      ),
    wire: WindingWireSchema.optional().describe(
      "The winding's conductor; sized from currentDensityAPerM2 and the skin depth at the ripple's frequency when omitted.",
    ),
    gapLengthM: z
      .number()
      .min(0)
      .max(0.02)
      .optional()
      .describe(
        "Total air gap in the magnetic path, m (0: ungapped, for a distributed-gap material). When given (with coreShape, a material and turns), the inductance is the one this gapped core gives (McLyman's fringing factor), and the output is solved with it; an outputs[k].inductanceH given as well must agree within 1 % (422 non_physical_value otherwise). When omitted, the gap is cut for the output's inductance. A gap over half the window height answers 422 non_physical_value.",
      ),
  })
  .describe(
    "One output inductor's build, fixed: buck-derived topologies only (the flyback has no output inductor and ignores it); used with magnetics.mode 'design'.",
  );

/** One fixed output inductor build as parsed. */
export type OutputInductorBuild = z.infer<typeof OutputInductorBuildSchema>;

/** Each output inductor is fixed at most once; a gap needs the core, material and turns it acts in. */
function checkOutputInductors(
  magnetics: {
    material?: MaterialClass | undefined;
    outputInductors?: readonly OutputInductorBuild[] | undefined;
  },
  ctx: z.RefinementCtx,
): void {
  const seen = new Set<number>();
  (magnetics.outputInductors ?? []).forEach((entry, i) => {
    if (seen.has(entry.outputIndex)) {
      ctx.addIssue({
        code: 'custom',
        path: ['outputInductors', i, 'outputIndex'],
        message: `output ${entry.outputIndex} has an inductor build already`,
      });
    }
    seen.add(entry.outputIndex);
    if (entry.gapLengthM === undefined) return;
    const missing = [
      entry.coreShape === undefined ? 'coreShape' : undefined,
      entry.materialId === undefined && magnetics.material === undefined ? 'materialId' : undefined,
      entry.turns === undefined ? 'turns' : undefined,
    ].filter((name) => name !== undefined);
    if (missing.length > 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['outputInductors', i, 'gapLengthM'],
        message: `a fixed gap sets the inductance only with ${missing.join(', ')} fixed too`,
      });
    }
  });
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
    wires: z
      .array(WindingWireSchema)
      .min(1)
      .max(8)
      .optional()
      .describe(
        "Conductor of every winding, primary first, in the order of the design's transformer windings, when fixed; the engine sizes each from currentDensityAPerM2 and the skin depth when omitted. A list whose length differs from the topology's winding count is a 422 non_physical_value issue at magnetics.wires.",
      ),
    arrangement: z
      .enum(['stacked', 'interleaved'])
      .default('interleaved')
      .describe(
        "'stacked': primary next to the centre leg, secondaries outside it; 'interleaved': the primary split in two halves around the secondaries (about a quarter of the leakage; common practice). A forward's reset winding goes inside both, next to the centre leg.",
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
    outputInductors: z
      .array(OutputInductorBuildSchema)
      .max(4)
      .optional()
      .describe(
        "Output inductor builds fixed by the request, at most one per output (outputIndex); a design's outputInductors[k] fields of the same names fit here unchanged, so a stored design can be evaluated again without a search. Outputs not listed get a designed inductor.",
      ),
  })
  .superRefine(checkMaterialId)
  .superRefine(checkOutputInductors)
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
