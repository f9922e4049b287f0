import { z } from 'zod';
import { IssueSchema, RANKING_FIGURE_IDS, SpecSchema, TOPOLOGY_IDS } from '../../solvers/index.js';
import { DesignAnswerSchema } from './design-answer-schema.js';
import { ResultMetaSchema } from './result-meta-schema.js';

const TopologyIdSchema = z.enum(TOPOLOGY_IDS).describe('A topology id.');

/** The answer of POST /v1/comparisons: the feasible designs ranked, the others with reasons. */
export const ComparisonViewSchema = z
  .strictObject({
    rankBy: z.enum(RANKING_FIGURE_IDS).describe('The ranking figure.'),
    order: z
      .enum(['higher-first', 'lower-first'])
      .describe('Whether a higher or a lower figure ranks first.'),
    figureDescription: z.string().describe('What the ranking figure is, and in which unit.'),
    topologies: z.array(TopologyIdSchema).describe('The candidates designed, in registry order.'),
    ranked: z
      .array(
        z.strictObject({
          rank: z.int().min(1).describe('Place in the ranking, 1 for the best.'),
          topology: TopologyIdSchema,
          figure: z
            .number()
            .describe(
              "The ranking figure's value for this design, in the figure's unit (dimensionless for efficiencies and utilization).",
            ),
          spec: SpecSchema.describe(
            'The spec as evaluated with this topology; POST it to /v1/designs to keep the design.',
          ),
          design: DesignAnswerSchema,
        }),
      )
      .describe('The feasible designs, best first; equal figures keep registry order.'),
    rejected: z
      .array(
        z.strictObject({
          topology: TopologyIdSchema,
          spec: SpecSchema.describe('The spec as evaluated with this topology.'),
          detail: z.string().describe('The issues in words, as a 422 for this spec would say.'),
          issues: z.array(IssueSchema).describe('Why the topology cannot meet the spec, as data.'),
        }),
      )
      .describe('The infeasible candidates, in registry order.'),
    meta: ResultMetaSchema,
    caution: z.string().describe('Read before use.'),
  })
  .describe(
    "A comparison of topologies on one spec. Not stored: POST the chosen entry's spec to /v1/designs to keep it.",
  );

export type ComparisonView = z.infer<typeof ComparisonViewSchema>;
