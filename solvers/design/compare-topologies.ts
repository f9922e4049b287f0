import type { Issue } from '../result.js';
import { TOPOLOGY_IDS, type Spec } from '../spec/spec-schema.js';
import { designConverter } from './design-converter.js';
import type { Design } from './design-schema.js';
import { RANKING_FIGURES, type RankingFigureId, type RankingOrder } from './ranking-figures.js';

type TopologyId = Spec['topology'];

/** Options of {@link compareTopologies}; every field optional. */
export interface CompareTopologiesOptions {
  /** The candidates; every registered topology when omitted. Order and repeats do not matter. */
  topologies?: readonly TopologyId[];
  /** The figure to rank by. @defaultValue 'efficiency-nominal' */
  rankBy?: RankingFigureId;
}

const DEFAULTS = {
  topologies: TOPOLOGY_IDS,
  rankBy: 'efficiency-nominal',
} satisfies Required<CompareTopologiesOptions>;

/** One feasible candidate: its place, the figure's value and the design it was ranked on. */
export interface RankedDesign {
  /** 1 for the best. */
  rank: number;
  topology: TopologyId;
  /** The ranking figure's value for this design, in the figure's unit. */
  figure: number;
  /** The spec as evaluated: the comparison's spec with this topology. */
  spec: Spec;
  design: Design;
}

/** One infeasible candidate and the engine's issues that rule it out. */
export interface RejectedTopology {
  topology: TopologyId;
  spec: Spec;
  issues: Issue[];
}

/** A comparison of topologies on one spec. */
export interface TopologyComparison {
  rankBy: RankingFigureId;
  order: RankingOrder;
  /** The candidates evaluated, in registry order. */
  topologies: TopologyId[];
  /** The feasible designs, best first. */
  ranked: RankedDesign[];
  /** The infeasible candidates, in registry order. */
  rejected: RejectedTopology[];
}

/**
 * Designs the spec with each candidate topology (the spec's own topology, if any, is replaced)
 * and ranks the feasible designs by the figure, best first; infeasible candidates come back with
 * their issues. Ties keep registry order (TOPOLOGY_IDS), so the answer never depends on the
 * order of the request's list.
 * @throws RangeError for an empty candidate list.
 */
export function compareTopologies(
  spec: Omit<Spec, 'topology'>,
  options: CompareTopologiesOptions = {},
): TopologyComparison {
  const { topologies, rankBy } = { ...DEFAULTS, ...options };
  const candidates = TOPOLOGY_IDS.filter((id) => topologies.includes(id));
  if (candidates.length === 0) throw new RangeError('compareTopologies: no candidate topology');
  const figure = RANKING_FIGURES[rankBy];
  const feasible: Omit<RankedDesign, 'rank'>[] = [];
  const rejected: RejectedTopology[] = [];
  for (const topology of candidates) {
    const candidateSpec = specFor(spec, topology);
    const designed = designConverter(candidateSpec);
    if (!designed.ok) {
      rejected.push({ topology, spec: candidateSpec, issues: designed.issues });
      continue;
    }
    const value = figure.value(designed.value, candidateSpec);
    feasible.push({ topology, figure: value, spec: candidateSpec, design: designed.value });
  }
  const sign = figure.order === 'higher-first' ? -1 : 1;
  // Array.prototype.sort is stable (ES2019), so equal figures keep registry order.
  feasible.sort((a, b) => sign * (a.figure - b.figure));
  return {
    rankBy,
    order: figure.order,
    topologies: candidates,
    ranked: feasible.map((entry, index) => ({ rank: index + 1, ...entry })),
    rejected,
  };
}

/** The spec with `topology` as its topology, first among its keys as SpecSchema writes it. */
function specFor(
  spec: Omit<Spec, 'topology'> & { topology?: TopologyId },
  topology: TopologyId,
): Spec {
  const { topology: _ignored, ...rest } = spec;
  return { topology, ...rest };
}
