import { RANKING_FIGURES, compareTopologies, resultMeta } from '../../solvers/index.js';
import { CAUTION } from '../caution.js';
import { issuesDetail } from '../issue-messages.js';
import type { ComparisonRequest } from '../schemas/comparison-request-schema.js';
import type { ComparisonView } from '../schemas/comparison-view-schema.js';

/**
 * Compares the request's topologies on its spec and returns the answer with its provenance: the
 * hash is of the request as evaluated (the spec without its ignored topology, the candidates in
 * registry order, the figure), so requests that mean the same hash the same.
 */
export async function evaluateComparison(request: ComparisonRequest): Promise<ComparisonView> {
  const { topology: _ignored, ...spec } = request.spec;
  const comparison = compareTopologies(spec, {
    rankBy: request.rankBy,
    ...(request.topologies ? { topologies: request.topologies } : {}),
  });
  const evaluated = { spec, topologies: comparison.topologies, rankBy: comparison.rankBy };
  return {
    rankBy: comparison.rankBy,
    order: comparison.order,
    figureDescription: RANKING_FIGURES[comparison.rankBy].description,
    topologies: comparison.topologies,
    ranked: comparison.ranked,
    rejected: comparison.rejected.map(({ topology, spec: evaluatedSpec, issues }) => ({
      topology,
      spec: evaluatedSpec,
      detail: issuesDetail(issues),
      issues,
    })),
    meta: await resultMeta(evaluated),
    caution: CAUTION,
  };
}
