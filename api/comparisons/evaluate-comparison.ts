import { RANKING_FIGURES, compareTopologies, resultMeta } from '../../solvers/index.js';
import { CAUTION } from '../caution.js';
import { issuesDetail } from '../issue-messages.js';
import type { ComparisonRequest } from '../schemas/comparison-request-schema.js';
import type { ComparisonView } from '../schemas/comparison-view-schema.js';
import { resolveSpecMaterial } from '../designs/resolve-spec-material.js';
import type { MaterialStore } from '../stores/material-store.js';

/**
 * Compares the request's topologies on its spec and returns the answer with its provenance: the
 * hash is of the request as evaluated (the spec without its ignored topology, the candidates in
 * registry order, the figure), so requests that mean the same hash the same. A user material the
 * spec names is put inline first (422 when the id names nothing), so each entry's spec carries it.
 */
export async function evaluateComparison(
  request: ComparisonRequest,
  { materials, tenant }: { materials: MaterialStore; tenant: string },
): Promise<ComparisonView> {
  const { topology: _ignored, ...sent } = request.spec;
  const { spec, notes } = await resolveSpecMaterial(sent, materials, tenant);
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
    ranked:
      notes.length === 0
        ? comparison.ranked
        : comparison.ranked.map((entry) => ({
            ...entry,
            design: { ...entry.design, modelNotes: [...entry.design.modelNotes, ...notes] },
          })),
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
