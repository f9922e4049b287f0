import type { ChunkPlan } from '../jobs/chunked-computation.js';
import { coreGeometry } from '../magnetics/core-geometry.js';
import {
  addCountsTo,
  zeroCounts,
  type CoreSearchCandidate,
  type CoreSearchChunkOutput,
} from './core-search-candidate.js';
import type { CoreSearchRequest } from './core-search-request-schema.js';
import { scoutsOf } from './core-search-scouts.js';
import { passesOf } from './first-pass-cache.js';
import { paretoFront, topByLoss } from './pareto-front.js';
import { accounted, runBlock, type BlockOutput, type Incumbents } from './run-core-search-block.js';
import { resolveSearchSpace, type CoreSearchSpace } from './search-space.js';
/**
 * Runs the candidates [start, start + count) of a core search: first the search's scouts
 * (`scoutsOf`: the same for every chunk, run once per worker and job), then, one block (a shape
 * at a frequency) at a time, hierarchical cheap checks (a subtree pruned is counted whole) and
 * full evaluation in order of increasing loss bound until no remaining candidate can enter the
 * search's top N or its Pareto front, judged against the block's own accepted candidates and the
 * scouts. Every decision depends on the request and the block alone, so a plan of whole blocks
 * gives the same counts however the blocks are grouped into chunks. The output holds the scouts
 * within the chunk's range, so the reduce sees every candidate any bound was compared against.
 * Yields the candidates accounted for so far.
 */
export function* runCoreSearchChunk(
  request: CoreSearchRequest,
  chunk: ChunkPlan,
  space: CoreSearchSpace = resolveSearchSpace(request),
): Generator<number, CoreSearchChunkOutput, void> {
  const counts = zeroCounts();
  const from = chunk.start;
  const to = chunk.start + chunk.count;
  if (from < 0 || to > space.total || chunk.count < 1) {
    throw new RangeError(`core-search: chunk [${from}, ${to}) outside [0, ${space.total})`);
  }
  const scouts = yield* scoutsOf(request, space);
  // The scouts this chunk's range holds: the reduce sees every scout through the chunk holding it.
  const held = [...scouts.top, ...scouts.front].filter((c) => c.index >= from && c.index < to);
  let top: CoreSearchCandidate[] = topByLoss(held, request.topN);
  let front: CoreSearchCandidate[] = paretoFront(held);
  for (const f of space.frequencies) {
    if (f.count === 0 || f.offset >= to || f.offset + f.count <= from) continue;
    const passes = passesOf(f);
    for (let s = 0; s < f.shapes.length; s++) {
      const blockStart = f.offset + s * f.blockSize;
      const lo = Math.max(from, blockStart);
      const hi = Math.min(to, blockStart + f.blockSize);
      if (lo >= hi) continue;
      const scouted = scouts.blocks.get(blockStart);
      let block: BlockOutput;
      if (scouted !== undefined && lo === blockStart && hi === blockStart + f.blockSize) {
        // A scout block: its run is the one every worker made for the incumbents, unchanged.
        addCountsTo(counts, scouted.counts);
        block = scouted;
        yield accounted(counts);
      } else {
        const volumeM3 = coreGeometry(f.shapes[s]!).effectiveVolumeM3;
        const incumbents: Incumbents = {
          top: scouts.top,
          front: scouts.front.filter((member) => member.coreVolumeM3 <= volumeM3),
        };
        block = yield* runBlock(request, space, f, s, lo, hi, passes, counts, incumbents);
      }
      top = topByLoss([...top, ...block.top], request.topN);
      front = paretoFront([...front, ...block.front]);
    }
  }
  counts.enumerated = accounted(counts);
  if (counts.enumerated !== chunk.count) {
    throw new Error(
      `core-search: chunk ${chunk.index} accounted for ${counts.enumerated} of ${chunk.count} candidates`,
    );
  }
  return { counts, top, paretoFront: front };
}
