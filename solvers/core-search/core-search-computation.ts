import type { ChunkedComputation, ChunkPlan, JobPlan } from '../jobs/chunked-computation.js';
import {
  zeroCounts,
  type CoreSearchChunkOutput,
  type CoreSearchCounts,
  type CoreSearchResult,
} from './core-search-candidate.js';
import { coreSearchCsvTable } from './core-search-csv.js';
import { CoreSearchRequestSchema, type CoreSearchRequest } from './core-search-request-schema.js';
import { CoreSearchResultSchema } from './core-search-result-schema.js';
import { paretoFront, topByLoss } from './pareto-front.js';
import { runCoreSearchChunk } from './run-core-search-chunk.js';
import { searchSpaceOf, type CoreSearchSpace } from './search-space.js';

/**
 * The plan of a core search: one chunk per `blocksPerChunk` blocks, a block being one core shape
 * at one switching frequency (a few thousand candidates, about 50–200 ms of work on the invented
 * scenarios). Chunks never split a block, since the loss bound works within a block: then the
 * counts do not depend on how blocks are grouped.
 */
export function coreSearchPlan(
  request: CoreSearchRequest,
  blocksPerChunk = 1,
  space: CoreSearchSpace = searchSpaceOf(request),
): JobPlan {
  if (!Number.isInteger(blocksPerChunk) || blocksPerChunk < 1) {
    throw new RangeError(`coreSearchPlan: blocksPerChunk must be an integer ≥ 1`);
  }
  const chunks: ChunkPlan[] = [];
  let pending: { start: number; count: number; blocks: number } | undefined;
  const flush = () => {
    if (pending !== undefined) {
      chunks.push({ index: chunks.length, start: pending.start, count: pending.count });
    }
    pending = undefined;
  };
  for (const f of space.frequencies) {
    for (let s = 0; s < f.shapes.length; s++) {
      if (f.blockSize === 0) continue;
      const start = f.offset + s * f.blockSize;
      if (pending === undefined) pending = { start, count: 0, blocks: 0 };
      pending.count += f.blockSize;
      pending.blocks += 1;
      if (pending.blocks >= blocksPerChunk) flush();
    }
  }
  flush();
  return { total: space.total, chunks };
}

/** Adds counts field by field. */
function addCounts(sum: CoreSearchCounts, more: CoreSearchCounts): CoreSearchCounts {
  const out = { ...sum };
  for (const key of Object.keys(out) as Array<keyof CoreSearchCounts>) out[key] += more[key];
  return out;
}

/**
 * Combines chunk outputs (in chunk order) into the result: counts summed, the top N of every
 * chunk's top N (by worst-corner loss, ties by candidate number), and the Pareto front of every
 * chunk's front (a candidate on the global front is on its own chunk's).
 */
export function reduceCoreSearch(
  request: CoreSearchRequest,
  outputs: readonly CoreSearchChunkOutput[],
  space: CoreSearchSpace = searchSpaceOf(request),
): CoreSearchResult {
  let counts = zeroCounts();
  for (const output of outputs) counts = addCounts(counts, output.counts);
  return {
    counts,
    top: topByLoss(
      outputs.flatMap((output) => output.top),
      request.topN,
    ),
    paretoFront: paretoFront(outputs.flatMap((output) => output.paretoFront)),
    frequencies: space.frequencies.map((f) => ({
      frequencyHz: f.frequencyHz,
      candidateCount: f.count,
      ...(f.issues === undefined ? {} : { issues: f.issues }),
    })),
    lossBoundMargin: request.lossBoundMargin,
  };
}

/**
 * The core search as a chunked computation (`kind: 'core-search'`): enumerate shape × material
 * × primary turns × gap × wire per winding × arrangement (× frequency), prune by cheap bounds,
 * evaluate the survivors in full, return the top N and the Pareto front with counts.
 */
export const CORE_SEARCH_COMPUTATION: ChunkedComputation<
  CoreSearchRequest,
  CoreSearchChunkOutput,
  CoreSearchResult
> = {
  kind: 'core-search',
  requestSchema: CoreSearchRequestSchema,
  outputSchema: CoreSearchResultSchema,
  plan: (request) => coreSearchPlan(request),
  runChunk: (request, chunk) => runCoreSearchChunk(request, chunk, searchSpaceOf(request)),
  reduce: (request, outputs) => reduceCoreSearch(request, outputs),
  csvTable: coreSearchCsvTable,
};
