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
import type { CoreSearchSpace } from './search-space.js';

/** The scout blocks' runs (by first candidate), and their top N and Pareto front together. */
export interface Scouts {
  blocks: Map<number, BlockOutput & { counts: CoreSearchCounts }>;
  top: CoreSearchCandidate[];
  front: CoreSearchCandidate[];
}

/** Scouts per space, by top N and margin (the rest of the request is the space's). */
const SCOUTS = new WeakMap<CoreSearchSpace, Map<string, Scouts>>();

/**
 * The scouts of a search: at every frequency, the block of the shape with the largest core
 * volume (the first such in catalog order), run whole with its own incumbents only. They are a
 * pure function of the request, so every worker computes the same (once per job: cached on the
 * space) and every block may prune against them. Yields 0 (no item of any chunk is done).
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
  for (const f of space.frequencies) {
    if (f.count === 0) continue;
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
