import { z } from 'zod';
import { IssueSchema } from '../result-schema.js';
import { SpecSchema } from '../spec/spec-schema.js';
import { WindingWireSchema } from '../transformer/winding-wire-schema.js';
import type { CoreSearchCandidate, CoreSearchResult } from './core-search-candidate.js';

/**
 * The result of a core-search job, as the reducer returns it (plain JSON), for the OpenAPI
 * document and its tests. The types stay in core-search-candidate.ts; these schemas are checked
 * against them (`z.ZodType<…>`), so the two cannot drift apart.
 */

export const CoreSearchCandidateSchema = z
  .object({
    index: z
      .int()
      .min(0)
      .describe(
        'The candidate’s number in the enumeration (frequency, shape, material, turns, gap, wires, arrangement; the last fastest).',
      ),
    frequencyHz: z.number().describe('Switching frequency, in Hz.'),
    coreShape: z.string().describe('Core shape designation (GET /v1/catalog/core-shapes).'),
    materialId: z.string().describe('Material class id (GET /v1/catalog/materials).'),
    turns: z
      .array(z.int())
      .describe('Turns of every winding, primary first, in the order of windingNames.'),
    windingNames: z.array(z.string()).describe('Names of the windings, primary first.'),
    wires: z.array(WindingWireSchema).describe('The conductor of every winding, primary first.'),
    arrangement: z.enum(['stacked', 'interleaved']).describe('How the windings are laid.'),
    gapLengthM: z.number().describe('Total gap length in the magnetic path, in m (0: ungapped).'),
    magnetizingInductanceH: z
      .number()
      .describe('Magnetizing inductance the wound core gives, referred to the primary, in H.'),
    leakageInductanceH: z
      .number()
      .describe('Leakage inductance from the winding geometry, referred to the primary, in H.'),
    lossWorstCornerW: z
      .number()
      .describe(
        'Largest total converter loss over the corners, transformer included, in W (the ranking).',
      ),
    lossNominalW: z
      .number()
      .describe('Total converter loss at the nominal input and largest load fraction, in W.'),
    transformerLossWorstCornerW: z
      .number()
      .describe('Largest transformer loss (core and copper) over the corners, in W.'),
    efficiencyNominal: z
      .number()
      .describe('Efficiency at the nominal input and largest load fraction (fraction 0..1).'),
    temperatureRiseK: z
      .number()
      .describe('Largest temperature rise of the wound core over the corners, in K.'),
    fluxDensityUtilization: z
      .number()
      .describe(
        'Largest peak flux density over the saturation flux density at the corner’s temperature (fraction).',
      ),
    windowFill: z
      .number()
      .describe('Outside area of every turn over the window area (fraction 0..1).'),
    coreVolumeM3: z.number().describe('Effective core volume Ve (IEC 60205), in m³.'),
    spec: SpecSchema.describe(
      'The spec that reproduces this build through POST /v1/designs: the request’s spec with magnetics.coreShape, materialId, primaryTurns, wires and arrangement fixed (and, for a gapped core, transformer.magnetizingInductanceH, which fixes the gap, with the whole-turns ratios).',
    ),
  })
  .describe(
    'A fully evaluated candidate inside every constraint: its build and its figures with this transformer fixed in (converter solved again at every corner).',
  ) satisfies z.ZodType<CoreSearchCandidate>;

export const CoreSearchCountsSchema = z
  .object({
    enumerated: z.int().describe('Candidates enumerated (the sum of the next eight counts).'),
    saturation: z
      .int()
      .describe('Peak flux density over the limit at every temperature the core may have.'),
    inductanceUnreachable: z
      .int()
      .describe(
        'Gapped core: no gap up to half the window gives the magnetizing inductance with these turns.',
      ),
    windowFill: z
      .int()
      .describe(
        'A winding that does not fit the breadth, or window fill or stack height over the limit.',
      ),
    temperatureRise: z
      .int()
      .describe('Temperature rise over the limit (by the bound, or when evaluated).'),
    saturationEvaluated: z
      .int()
      .describe('Flux density over the limit when evaluated (after the second converter solve).'),
    converterInfeasible: z
      .int()
      .describe('The converter cannot meet the spec with this transformer (or with this Lm).'),
    boundedOut: z
      .int()
      .describe(
        'Skipped: a loss and temperature lower bound shows it can enter neither the top N nor the Pareto front. Bounds come before the design: a candidate a bound puts out counts here even where its design would have failed for another reason.',
      ),
    accepted: z.int().describe('Evaluated in full and inside every constraint.'),
    fullyEvaluated: z
      .int()
      .describe(
        'Of all the above, the candidates evaluated in full (not part of the sum that makes enumerated).',
      ),
  })
  .describe(
    'Candidates counted by what became of them: every enumerated one in exactly one count but fullyEvaluated, under the first test that rejects it, in the order the search tests: its (material, turns, gap) (converterInfeasible when the converter cannot run with that Lm, saturation, inductanceUnreachable), the window checks and saturation of its build, then the loss and temperature bounds (boundedOut, or temperatureRise for a bound over the limit), all before its design; then the design on the first converter solve (its checks: saturationEvaluated, temperatureRise, windowFill, converterInfeasible), bounds on that design and on the second converter solve (boundedOut), and the full evaluation (its checks, or accepted).',
  );

export const CoreSearchResultSchema = z
  .object({
    counts: CoreSearchCountsSchema,
    top: z
      .array(CoreSearchCandidateSchema)
      .describe('The best topN by worst-corner converter loss, ties by index.'),
    paretoFront: z
      .array(CoreSearchCandidateSchema)
      .describe(
        'Candidates no other accepted one beats on worst-corner loss, core volume and temperature rise together; sorted by loss, volume, rise, index.',
      ),
    frequencies: z
      .array(
        z.object({
          frequencyHz: z.number().describe('Switching frequency searched, in Hz.'),
          candidateCount: z.int().describe('Candidates enumerated at it.'),
          issues: z
            .array(IssueSchema)
            .exactOptional()
            .describe('Why none, when the converter cannot be solved at this frequency.'),
        }),
      )
      .describe('Each switching frequency searched, in increasing order.'),
    lossBoundMargin: z
      .number()
      .describe('The request’s loss-bound margin (fraction; 1: the bound was off).'),
  })
  .describe('The result of a core-search job.') satisfies z.ZodType<CoreSearchResult>;
