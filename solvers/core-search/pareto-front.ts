import type { CoreSearchCandidate } from './core-search-candidate.js';

/**
 * True when `a` dominates `b` over the three objectives, each to be minimized (worst-corner
 * loss, core volume, temperature rise): no worse in any and better in at least one (the usual
 * definition of Pareto dominance).
 */
export function dominates(a: CoreSearchCandidate, b: CoreSearchCandidate): boolean {
  const noWorse =
    a.lossWorstCornerW <= b.lossWorstCornerW &&
    a.coreVolumeM3 <= b.coreVolumeM3 &&
    a.temperatureRiseK <= b.temperatureRiseK;
  return (
    noWorse &&
    (a.lossWorstCornerW < b.lossWorstCornerW ||
      a.coreVolumeM3 < b.coreVolumeM3 ||
      a.temperatureRiseK < b.temperatureRiseK)
  );
}

/** Orders by worst-corner loss, then the candidate number. */
export function byLoss(a: CoreSearchCandidate, b: CoreSearchCandidate): number {
  return a.lossWorstCornerW - b.lossWorstCornerW || a.index - b.index;
}

/** Orders by worst-corner loss, core volume, temperature rise, then the candidate number. */
export function byObjectives(a: CoreSearchCandidate, b: CoreSearchCandidate): number {
  return (
    a.lossWorstCornerW - b.lossWorstCornerW ||
    a.coreVolumeM3 - b.coreVolumeM3 ||
    a.temperatureRiseK - b.temperatureRiseK ||
    a.index - b.index
  );
}

/** The candidates no other dominates, one per candidate number, in {@link byObjectives} order. */
export function paretoFront(candidates: readonly CoreSearchCandidate[]): CoreSearchCandidate[] {
  const unique = uniqueByIndex(candidates).sort(byObjectives);
  // Sorted by loss first: a dominating candidate never comes after one it dominates.
  const front: CoreSearchCandidate[] = [];
  for (const candidate of unique) {
    if (!front.some((member) => dominates(member, candidate))) front.push(candidate);
  }
  return front;
}

/** The best `count` by {@link byLoss}, one per candidate number. */
export function topByLoss(
  candidates: readonly CoreSearchCandidate[],
  count: number,
): CoreSearchCandidate[] {
  return uniqueByIndex(candidates).sort(byLoss).slice(0, count);
}

function uniqueByIndex(candidates: readonly CoreSearchCandidate[]): CoreSearchCandidate[] {
  const seen = new Set<number>();
  const out: CoreSearchCandidate[] = [];
  for (const candidate of candidates) {
    if (seen.has(candidate.index)) continue;
    seen.add(candidate.index);
    out.push(candidate);
  }
  return out;
}
