import { z } from 'zod';
import { CORE_SHAPE_CATALOG } from '../magnetics/core-shape-catalog.js';
import { MATERIAL_CLASSES } from '../magnetics/material-classes.js';
import { SpecSchema } from '../spec/spec-schema.js';
import { WindingWireSchema } from '../transformer/winding-wire-schema.js';

const designations = CORE_SHAPE_CATALOG.map((shape) => shape.designation) as [string, ...string[]];

/** How the gap dimension of a gapped (energy-storing) core is enumerated. */
export const GapSpaceSchema = z
  .discriminatedUnion('kind', [
    z.strictObject({
      kind: z
        .literal('inductance-steps')
        .describe(
          'Gaps cut for magnetizing inductances spread geometrically around the target: each step is the gap that gives factor × Lm on that core with those turns.',
        ),
      stepCount: z
        .int()
        .min(1)
        .max(15)
        .default(3)
        .describe('Number of magnetizing-inductance steps (dimensionless).'),
      factorMin: z
        .number()
        .positive()
        .max(1)
        .default(0.7)
        .describe('Smallest magnetizing inductance as a fraction of the target (dimensionless).'),
      factorMax: z
        .number()
        .min(1)
        .max(10)
        .default(1.4)
        .describe('Largest magnetizing inductance as a multiple of the target (dimensionless).'),
    }),
    z.strictObject({
      kind: z
        .literal('lengths')
        .describe(
          'Explicit total gap lengths; each core and turn count then has its own magnetizing inductance (and its own first converter solve, so this is the slower form).',
        ),
      lengthsM: z
        .array(z.number().positive().max(0.02))
        .min(1)
        .max(32)
        .describe('Total gap lengths in the magnetic path, m.'),
    }),
  ])
  .describe(
    'The gap dimension, for topologies whose core sets the magnetizing inductance (flyback, or any spec that fixes transformer.magnetizingInductanceH). Ignored for ungapped cores, whose single gap is none.',
  );

/** Every dimension of the search; each may be restricted, and each has a default. */
export const SearchSpaceSchema = z
  .strictObject({
    coreShapes: z
      .array(z.enum(designations))
      .min(1)
      .optional()
      .describe(
        "Core shape designations to search (GET /v1/catalog/core-shapes); the spec's magnetics.coreShape, else the whole catalog, when omitted. Enumerated in catalog order.",
      ),
    materialIds: z
      .array(z.string().min(1).max(80))
      .min(1)
      .optional()
      .describe(
        "Built-in material class ids to search (or the id of the spec's inline magnetics.material); when omitted, the spec's material, else every built-in class whose frequency range holds the switching frequency.",
      ),
    primaryTurns: z
      .strictObject({
        min: z.int().min(1).max(2000).describe('Fewest primary turns searched.'),
        max: z.int().min(1).max(2000).describe('Most primary turns searched.'),
      })
      .refine((range) => range.max >= range.min, {
        message: 'max must be at least min',
        path: ['max'],
      })
      .optional()
      .describe(
        'Primary turns searched on every shape; when omitted, primaryTurnsCount consecutive counts per shape from about 0.9 of the fewest that keep the peak flux under the limit with the most permissive material.',
      ),
    primaryTurnsCount: z
      .int()
      .min(1)
      .max(400)
      .default(12)
      .describe('Consecutive primary turn counts per shape when primaryTurns is omitted.'),
    gaps: GapSpaceSchema.default({
      kind: 'inductance-steps',
      stepCount: 3,
      factorMin: 0.7,
      factorMax: 1.4,
    }),
    wires: z
      .array(z.array(WindingWireSchema).min(1).max(32))
      .min(1)
      .max(8)
      .optional()
      .describe(
        "The conductors tried on each winding, primary first, in the order of the design's transformer windings; the list must have one entry per winding. When omitted, each winding gets the engine's wire choice at the spec's current density times each of wireCurrentDensityFactors (duplicates dropped).",
      ),
    wireCurrentDensityFactors: z
      .array(z.number().min(0.1).max(10))
      .min(1)
      .max(12)
      .default([0.5, 0.7, 1, 1.4, 2])
      .describe(
        'Multiples of magnetics.currentDensityAPerM2 the default wires are sized for (dimensionless).',
      ),
    arrangements: z
      .array(z.enum(['stacked', 'interleaved']))
      .min(1)
      .default(['interleaved', 'stacked'])
      .describe('Winding arrangements searched (enumerated interleaved first).'),
    switchingFrequenciesHz: z
      .array(z.number().min(1e3).max(10e6))
      .min(1)
      .max(16)
      .optional()
      .describe(
        "Switching frequencies searched, Hz (enumerated in increasing order); the spec's switchingFrequencyHz when omitted.",
      ),
  })
  .describe(
    'The search space: core shape × material × primary turns × gap × wire per winding × arrangement (× frequency).',
  );

/**
 * A core search: the converter spec (its topology, operating corners and magnetics limits:
 * windowFillMax, fluxDensityUtilizationMax, temperatureRiseMaxK), the space, how many ranked
 * candidates to return, and how much the loss bound is trusted.
 */
export const CoreSearchRequestSchema = z
  .strictObject({
    spec: SpecSchema.describe(
      'The converter to design the transformer for. Its magnetics limits are the constraints every returned candidate meets.',
    ),
    space: SearchSpaceSchema.default({
      primaryTurnsCount: 12,
      gaps: { kind: 'inductance-steps', stepCount: 3, factorMin: 0.7, factorMax: 1.4 },
      wireCurrentDensityFactors: [0.5, 0.7, 1, 1.4, 2],
      arrangements: ['interleaved', 'stacked'],
    }),
    topN: z
      .int()
      .min(1)
      .max(100)
      .default(10)
      .describe('Candidates returned ranked by total converter loss at the worst corner.'),
    lossBoundMargin: z
      .number()
      .min(0)
      .max(1)
      .default(0.03)
      .describe(
        "Share by which the loss and temperature bounds used to skip candidates are lowered before they are compared (dimensionless). The bounds are proven lower bounds on a converter solve that has the candidate's magnetizing inductance and whole-turns ratios but not yet its winding resistances and leakage; the margin covers how far fixing those in moves the loss (not proven: on the benchmark's whole-catalog searches at most 1.1 %, and checked against exhaustive searches in the tests). 1 turns the bound off: every candidate that passes the saturation, inductance and window checks is then evaluated in full. The push-pull's bound pass is solved without leakage (its clamp and ring losses do not scale with the leakage), and every topology's with output inductors carries a proven floor of the designed inductors' loss in place of the spec's assumed inductor resistance (which can be above the designed inductor's); at the default the small test searches and the whole-catalog two-switch forward, half-bridge, full-bridge and push-pull searches return what their exhaustive runs return.",
      ),
  })
  .superRefine((request, ctx) => {
    const inline = request.spec.magnetics.material;
    for (const [i, id] of (request.space.materialIds ?? []).entries()) {
      if (inline?.id === id || MATERIAL_CLASSES.some((material) => material.id === id)) continue;
      ctx.addIssue({
        code: 'custom',
        path: ['space', 'materialIds', i],
        message: `names no built-in material class and is not the spec's inline material: '${id}'`,
      });
    }
    const { materialId } = request.spec.magnetics;
    if (
      inline === undefined &&
      materialId !== undefined &&
      !MATERIAL_CLASSES.some((material) => material.id === materialId)
    ) {
      ctx.addIssue({
        code: 'custom',
        path: ['spec', 'magnetics', 'materialId'],
        message: `names no built-in material class: '${materialId}' (put a user material inline as magnetics.material)`,
      });
    }
  })
  .describe('Input of a core-search job.');

/** A parsed core-search request (defaults applied). */
export type CoreSearchRequest = z.infer<typeof CoreSearchRequestSchema>;
/** A core-search request as sent. */
export type CoreSearchRequestInput = z.input<typeof CoreSearchRequestSchema>;
