import { coreGeometry } from '../magnetics/core-geometry.js';
import {
  zeroCounts,
  type CoreSearchCandidate,
  type CoreSearchCounts,
} from './core-search-candidate.js';
import type { CoreSearchRequest } from './core-search-request-schema.js';
import { passesOf } from './first-pass-cache.js';
import { paretoFront, topByLoss } from './pareto-front.js';
import { NO_INCUMBENTS, runBlock, type BlockOutput } from './run-core-search-block.js';
import type { CoreSearchSpace, FrequencySpace } from './search-space.js';

/** The scout block's run (by its first candidate), and its top N and Pareto front. */
export interface Scouts {
  blocks: Map<number, BlockOutput & { counts: CoreSearchCounts }>;
  top: CoreSearchCandidate[];
  front: CoreSearchCandidate[];
}

/** Scouts per space, by top N and margin (the rest of the request is the space's). */
const SCOUTS = new WeakMap<CoreSearchSpace, Map<string, Scouts>>();

/**
 * The scouts of a search: one block, the shape with the largest core volume (the first such in
 * catalog order) at the searched frequency nearest the spec's own, run whole against its own
 * candidates only. They are a pure function of the request, so every worker computes the same
 * (once per job: cached on the space) and every block may prune against them; one block, so that
 * what each worker repeats stays small beside a search over many frequencies. Yields 0 (no item
 * of any chunk is done).
 */
export function* scoutsOf(
  request: CoreSearchRequest,
  space: CoreSearchSpace,
): Generator<number, Scouts, void> {
  let bySettings = SCOUTS.get(space);
  if (bySettings === undefined) {
    bySettings = new Map();
    SCOUTS.set(space, bySettings);
  }
  const key = `${request.topN}|${request.lossBoundMargin}`;
  const known = bySettings.get(key);
  if (known !== undefined) return known;
  const blocks = new Map<number, BlockOutput & { counts: CoreSearchCounts }>();
  // One frequency: the one nearest the spec's own (the lower on a tie) that enumerates anything.
  let f: FrequencySpace | undefined;
  const ownHz = request.spec.switchingFrequencyHz;
  for (const candidate of space.frequencies) {
    if (candidate.count === 0) continue;
    if (
      f === undefined ||
      Math.abs(candidate.frequencyHz - ownHz) < Math.abs(f.frequencyHz - ownHz)
    ) {
      f = candidate;
    }
  }
  if (f !== undefined) {
    let s = 0;
    for (let i = 1; i < f.shapes.length; i++) {
      const volumeM3 = coreGeometry(f.shapes[i]!).effectiveVolumeM3;
      if (volumeM3 > coreGeometry(f.shapes[s]!).effectiveVolumeM3) s = i;
    }
    const blockStart = f.offset + s * f.blockSize;
    const counts = zeroCounts();
    const steps = runBlock(
      request,
      space,
      f,
      s,
      blockStart,
      blockStart + f.blockSize,
      passesOf(f),
      counts,
      NO_INCUMBENTS,
    );
    let step = steps.next();
    while (step.done !== true) {
      yield 0;
      step = steps.next();
    }
    blocks.set(blockStart, { ...step.value, counts });
  }
  const outputs = [...blocks.values()];
  const scouts: Scouts = {
    blocks,
    top: topByLoss(
      outputs.flatMap((output) => output.top),
      request.topN,
    ),
    front: paretoFront(outputs.flatMap((output) => output.front)),
  };
  bySettings.set(key, scouts);
  return scouts;
}
