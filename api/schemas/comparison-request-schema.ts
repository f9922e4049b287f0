import { z } from 'zod';
import {
  RANKING_FIGURE_IDS,
  SpecSchema,
  TOPOLOGY_IDS,
  checkSpecConsistency,
} from '../../solvers/index.js';

/** A spec to compare topologies on: the design spec with its topology optional and ignored. */
export const ComparisonSpecSchema = z
  .strictObject({
    ...SpecSchema.shape,
    topology: z
      .enum(TOPOLOGY_IDS)
      .optional()
      .describe(
        'Ignored: each candidate topology replaces it. Allowed so a design spec can be sent as is.',
      ),
  })
  .superRefine(checkSpecConsistency)
  .describe('A converter specification without a topology; every candidate is designed from it.');

/** Body of POST /v1/comparisons. */
export const ComparisonRequestSchema = z
  .strictObject({
    spec: ComparisonSpecSchema,
    topologies: z
      .array(z.enum(TOPOLOGY_IDS))
      .min(1)
      .optional()
      .describe(
        'The candidate topologies; every topology the service knows when omitted. Order and repeats do not matter.',
      ),
    rankBy: z
      .enum(RANKING_FIGURE_IDS)
      .default('efficiency-nominal')
      .describe(
        'The figure the feasible designs are ranked by: efficiency-nominal (efficiency at nominal input and the largest load point) and efficiency-lowest (lowest over the corners) rank higher first; loss-largest (largest total loss, W), switch-voltage-utilization (peak switch voltage over its rating) and switch-current-peak (A) rank lower first.',
      ),
  })
  .describe('A spec to design with several topologies, and the figure to rank them by.');

export type ComparisonRequest = z.infer<typeof ComparisonRequestSchema>;
