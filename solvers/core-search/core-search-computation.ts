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
 * Frequencies at the end of a search whose blocks are planned one a chunk (the rest are planned
 * a whole frequency a chunk). Two: the workers that finish their last whole frequency first share
 * these blocks while the others finish theirs, so the job ends within about a block of the
 * even share (the tail holds more than one frequency's work however the head fell out).
 */
export const CORE_SEARCH_BLOCK_TAIL_FREQUENCIES = 2;

/**
 * Most candidates one frequency may hold to be planned as one chunk; a larger one is planned one
 * block a chunk. A chunk must stay well inside the chunk time limit (`JOB_CHUNK_TIMEOUT_S`, 300 s
 * by default) on a loaded machine, and a worker that dies loses its chunk: the whole-catalog
 * push-pull at one frequency (1,170,000 candidates) takes about 20 s of CPU warmed up, and took
 * 150 s at solver 0.21.0 (DEVELOPERS.md). A frequency of this size is a quarter of the default
 * job size limit (1,000,000); over so many candidates its first passes are a small part of it.
 */
export const FREQUENCY_CHUNK_CANDIDATES_MAX = 250_000;

/**
 * The plan of a core search job: one chunk per switching frequency (all its blocks), except the
 * last {@link CORE_SEARCH_BLOCK_TAIL_FREQUENCIES} frequencies and any frequency of more than
 * {@link FREQUENCY_CHUNK_CANDIDATES_MAX} candidates, which get one chunk per block (a block
 * being one core shape at one frequency). So a search at one or two frequencies (the usual) is
 * planned block by block as before. Why whole frequencies: a block needs about two thirds of its
 * frequency's first passes (kept per frequency, shared by its blocks: `first-pass-cache.ts`), so
 * workers that took the blocks of every frequency in turn, as the queue hands them out, each
 * solved nearly every first pass of the search again (DEVELOPERS.md, "Split chunks repeat
 * work"). Chunks never split a block, and the counts and result do not depend on how blocks are
 * grouped ({@link coreSearchBlockPlan} groups them otherwise).
 */
export function coreSearchPlan(
  request: CoreSearchRequest,
  space: CoreSearchSpace = searchSpaceOf(request),
): JobPlan {
  const searched = space.frequencies.filter((f) => f.blockSize > 0 && f.shapes.length > 0);
  const chunks: ChunkPlan[] = [];
  searched.forEach((f, i) => {
    const isWhole =
      i < searched.length - CORE_SEARCH_BLOCK_TAIL_FREQUENCIES &&
      f.count <= FREQUENCY_CHUNK_CANDIDATES_MAX;
    if (isWhole) {
      chunks.push({ index: chunks.length, start: f.offset, count: f.count });
      return;
    }
    for (let s = 0; s < f.shapes.length; s++) {
      chunks.push({ index: chunks.length, start: f.offset + s * f.blockSize, count: f.blockSize });
    }
  });
  return { total: space.total, chunks };
}

/**
 * A plan of `blocksPerChunk` consecutive blocks a chunk, in candidate order (a chunk may span two
 * frequencies): the same result as {@link coreSearchPlan}'s whatever the number, which the tests
 * check with it. Chunks never split a block, since the loss bound works within a block: then the
 * counts do not depend on how blocks are grouped.
 */
export function coreSearchBlockPlan(
  request: CoreSearchRequest,
  blocksPerChunk: number,
  space: CoreSearchSpace = searchSpaceOf(request),
): JobPlan {
  if (!Number.isInteger(blocksPerChunk) || blocksPerChunk < 1) {
    throw new RangeError(`coreSearchBlockPlan: blocksPerChunk must be an integer ≥ 1`);
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
