import { z } from 'zod';
import { IssueSchema } from '../result-schema.js';
import { DistributionSchema } from './tolerance-distribution.js';
import { LIMIT_IDS } from './tolerance-limits.js';

/**
 * The result of a tolerance job, as the reducer returns it (plain JSON). Schemas for the OpenAPI
 * document; the reducer's output is typed by them.
 */

const LimitIdSchema = z.enum(LIMIT_IDS).describe('Which limit.');

const BandEndSchema = z.enum(['lower', 'upper']).describe('Which end of its band.');

export const YieldFigureSchema = z.object({
  passCount: z.int().describe('Samples that keep the limit(s).'),
  count: z.int().describe('Samples the yield is counted over.'),
  fraction: z.number().describe('passCount / count (0 when count is 0).'),
  interval95: z
    .tuple([z.number(), z.number()])
    .describe('95 % Wilson score interval of the fraction (E. B. Wilson, JASA 22, 1927).'),
});

export const FailingSampleSchema = z.object({
  sample: z.int().describe('Index of the sample (0-based); with the seed it reproduces the unit.'),
  parameters: z
    .record(z.string(), z.number())
    .describe("Every parameter's value in this sample, by id, in the quantity's unit."),
  value: z.number().optional().describe('The checked quantity, when the unit solved.'),
  issueCodes: z
    .array(z.string())
    .optional()
    .describe("The engine's issue codes, when the unit could not be solved."),
});

const ExtremeSchema = z.object({
  value: z.number().describe('The extreme value.'),
  sample: z.int().describe('The first sample that reached it.'),
});

export const ToleranceResultSchema = z
  .object({
    feasible: z.literal(true),
    seed: z.int().describe('The seed used: the same request with it gives the same result.'),
    sampleCount: z.int().describe('Monte Carlo samples.'),
    topology: z.string().describe('The design’s topology.'),
    parameters: z
      .array(
        z.object({
          id: z.string().describe('Parameter id, as in the request’s tolerances.'),
          label: z.string().describe('What it is.'),
          unit: z.string().describe('Unit of its values.'),
          nominal: z
            .number()
            .describe('The frozen design’s value (a fixed parameter’s: its value).'),
          distribution: DistributionSchema,
          origin: z.enum(['request', 'default']).describe('Whether the request named its spread.'),
          defaultBasis: z
            .string()
            .optional()
            .describe('Why the default spread; "common practice" where it is.'),
          lower: z.number().describe('Lower band end the worst case uses.'),
          upper: z.number().describe('Upper band end the worst case uses.'),
        }),
      )
      .describe('Every uncertain quantity with the spread used, defaults filled in.'),
    limits: z
      .array(
        z.object({
          id: LimitIdSchema,
          quantity: z.string().describe('The checked quantity, with its unit suffix.'),
          description: z.string().describe('What is checked.'),
          sense: z.enum(['at-most', 'at-least']).describe('Held at most or at least at the limit.'),
          limit: z.number().describe('The limit.'),
          nominalValue: z.number().describe('The quantity of the nominal unit.'),
        }),
      )
      .describe('The limits that apply to this spec and design.'),
    yield: z.object({
      overall: YieldFigureSchema.describe(
        'Samples that keep every limit, over all samples (an unsolved sample fails).',
      ),
      perLimit: z
        .array(
          YieldFigureSchema.extend({
            limit: LimitIdSchema,
            failCount: z.int().describe('Samples failing this limit.'),
            firstFailures: z
              .array(FailingSampleSchema)
              .describe('The first failing samples (at most 3), by sample index.'),
          }),
        )
        .describe(
          'Per limit: regulation over all samples, the others over the solved samples (an unsolved unit has no such quantity).',
        ),
      unsolvedByIssueCode: z
        .record(z.string(), z.int())
        .describe("Unsolved samples by the engine's issue code."),
    }),
    worstCase: z.object({
      method: z
        .enum(['every-vertex', 'sensitivity-signed-vertex'])
        .describe(
          "'every-vertex': all 2^k vertices of the tolerance box; 'sensitivity-signed-vertex': per limit the vertex the one-at-a-time signs point to.",
        ),
      variedParameterCount: z.int().describe('Parameters that vary (k).'),
      evaluationCount: z.int().describe('Unit evaluations made (2k one-at-a-time plus vertices).'),
      perLimit: z.array(
        z.object({
          limit: LimitIdSchema,
          worstValue: z
            .number()
            .optional()
            .describe('Worst checked value over the solved vertices.'),
          violates: z
            .boolean()
            .describe('Whether some vertex violates the limit (unsolved: regulation).'),
          vertex: z.record(z.string(), BandEndSchema).describe('The worst vertex.'),
          unsolvedVertexCount: z.int().describe('Vertices the engine could not solve.'),
          agreesWithMonteCarlo: z
            .boolean()
            .describe(
              'False when Monte Carlo found failures no vertex showed (a quantity not monotonic in its parameters).',
            ),
          monteCarloExtreme: z
            .number()
            .optional()
            .describe("The Monte Carlo extreme on the limit's side."),
        }),
      ),
    }),
    sensitivity: z.object({
      method: z.string().describe('How the ranking is made.'),
      perLimit: z.array(
        z.object({
          limit: LimitIdSchema,
          ranking: z
            .array(
              z.object({
                parameter: z.string().describe('Parameter id.'),
                correlation: z
                  .number()
                  .optional()
                  .describe(
                    "Pearson correlation with the limit's quantity over the solved samples.",
                  ),
                oneAtATimeSwing: z
                  .number()
                  .optional()
                  .describe('Quantity at the upper band end less at the lower, the rest nominal.'),
                failureShift: z
                  .number()
                  .optional()
                  .describe(
                    'When the limit has failures: the parameter’s mean over the failing samples less its mean over all samples, in its standard deviations (which way, and how hard, failures push it).',
                  ),
              }),
            )
            .describe('Varied parameters, the strongest driver first.'),
        }),
      ),
    }),
    distributions: z
      .array(
        z.object({
          quantity: z.string().describe('The checked quantity.'),
          limit: LimitIdSchema,
          count: z.int().describe('Solved samples summarized.'),
          mean: z.number().optional().describe('Mean.'),
          standardDeviation: z.number().optional().describe('Sample standard deviation.'),
          min: ExtremeSchema.optional(),
          max: ExtremeSchema.optional(),
          p1: z
            .number()
            .optional()
            .describe(
              '1st percentile (nearest rank) from a mergeable histogram: within about 12 % of its deviation from the nominal.',
            ),
          p99: z.number().optional().describe('99th percentile, as p1.'),
        }),
      )
      .describe('Summaries of each checked quantity over the solved samples.'),
    nominalDesign: z.object({
      turnsRatio: z.number().describe('Np/Ns of the first output, as wound.'),
      outputTurnsRatios: z.array(z.number()).describe('Np/Ns of every output.'),
      magnetizingInductanceH: z.number().describe('Nominal magnetizing inductance, H.'),
      leakageInductanceH: z.number().describe('Nominal leakage inductance, H.'),
      hasDesignedTransformer: z
        .boolean()
        .describe('Whether the transformer was designed (and re-evaluated per sample).'),
    }),
    modelNotes: z.array(z.string()).describe('What the run holds fixed and leaves out.'),
    caution: z.string().describe('Read before use.'),
  })
  .describe('A tolerance job whose nominal design is feasible.');

export const InfeasibleToleranceResultSchema = z
  .object({
    feasible: z.literal(false),
    seed: z.int().describe('The seed of the request.'),
    sampleCount: z.int().describe('Samples asked for (none run).'),
    issues: z
      .array(IssueSchema)
      .describe(
        'Why the nominal design is infeasible, or which spread reaches a positive quantity’s zero (path tolerances.<id>).',
      ),
    caution: z.string().describe('Read before use.'),
  })
  .describe(
    'A tolerance job whose nominal design is infeasible, or whose spreads are not physical: no samples are run.',
  );

export const ToleranceJobResultSchema = z
  .discriminatedUnion('feasible', [ToleranceResultSchema, InfeasibleToleranceResultSchema])
  .describe('The result of a tolerance job.');

export type YieldFigure = z.infer<typeof YieldFigureSchema>;
export type FailingSample = z.infer<typeof FailingSampleSchema>;
export type ToleranceResult = z.infer<typeof ToleranceResultSchema>;
export type InfeasibleToleranceResult = z.infer<typeof InfeasibleToleranceResultSchema>;
