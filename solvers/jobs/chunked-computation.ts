import type { z } from 'zod';

/**
 * The contract every heavy job's computation keeps so that it can be split across any number of
 * workers and give the same result wherever and however its chunks run.
 *
 * A job's work is an enumeration of `total` items (grid points, candidates, Monte Carlo samples),
 * numbered 0 … total − 1. `plan` cuts it into chunks of consecutive items; `runChunk` computes one
 * chunk from the request and the chunk alone (no shared state, no clock, no Math.random: random
 * streams are derived from the request's seed and the item or chunk index); `reduce` combines the
 * outputs of every chunk, handed over in chunk-index order, into the job's result. The same request
 * therefore gives byte-identical results with 1 or 16 workers and on the embedded backend.
 *
 * Everything that crosses the contract is plain JSON (chunk outputs travel through Redis).
 */
export interface ChunkedComputation<Request, ChunkOutput, Output> {
  /** Job kind, as in `POST /v1/jobs` `{ kind }`. */
  kind: string;
  /** Validates and completes (defaults) the job's `input`. */
  requestSchema: z.ZodType<Request>;
  /** The enumeration's size and its chunks; cheap, deterministic in the request. */
  plan(request: Request): JobPlan;
  /**
   * `plan(request).total` without cutting the chunks, for a size check that stays cheap however
   * large the request (a sweep's grid admits 10^9 points, whose plan in chunks of one point would
   * not fit in memory). Optional: without it the size is `plan(request).total`.
   */
  size?(request: Request): number;
  /**
   * Computes one chunk. A generator so the engine stays free of timers and I/O: it yields the
   * number of the chunk's items finished so far whenever it likes (at least every few
   * milliseconds of computation), and the runner uses those pauses to report progress, yield to
   * the event loop and stop a cancelled job. Its return value is the chunk's output.
   */
  runChunk(request: Request, chunk: ChunkPlan): Generator<number, ChunkOutput, void>;
  /** Combines every chunk's output (index order, one per chunk of the plan) into the result. */
  reduce(request: Request, outputs: readonly ChunkOutput[]): Output;
  /**
   * The result's schema, for the API's documentation and its tests (optional: a kind without it
   * is documented as a plain object).
   */
  outputSchema?: z.ZodType<Output>;
  /** The result as one table (`GET /v1/jobs/{id}/result` as CSV); a kind without it offers JSON only. */
  csvTable?(output: Output): CsvTable;
}

/** A cell of a CSV export: a number, a word, a flag, or empty (null). */
export type CsvCell = number | string | boolean | null;

/** A result flattened to one table: column names (with their unit suffixes) and rows of cells. */
export interface CsvTable {
  columns: string[];
  /** Each row has one cell per column, in column order. */
  rows: CsvCell[][];
}

/** One chunk: the items [start, start + count) of the job's enumeration. */
export interface ChunkPlan {
  /** Position of the chunk in the plan, 0-based. */
  index: number;
  /** First item of the chunk. */
  start: number;
  /** Number of items in the chunk (≥ 1). */
  count: number;
}

/** The size of a job and how it is cut. */
export interface JobPlan {
  /** Items the job enumerates (what `progress.total` counts and the size limit applies to). */
  total: number;
  /** Consecutive, non-overlapping chunks covering 0 … total − 1, in index order. */
  chunks: ChunkPlan[];
}

/**
 * Most chunks one job is cut into. Every chunk is a queue entry (a BullMQ child job added in the
 * submitting request's one flow): measured on this machine's Redis, 1,000 children take under
 * a second to add, 10,000 about 4.5 s and 100,000 about 45 s and 100 MB, long past any client's
 * patience. A plan that would need more chunks takes larger ones instead; no kind's result
 * depends on how its items are grouped into chunks.
 */
export const JOB_CHUNK_COUNT_MAX = 1000;

/** Items per chunk for `total` items and a wanted size: raised to keep ≤ JOB_CHUNK_COUNT_MAX chunks. */
export function cappedChunkSize(total: number, chunkSize: number): number {
  return Math.max(chunkSize, Math.ceil(total / JOB_CHUNK_COUNT_MAX));
}

/**
 * Cuts `total` items into chunks of `chunkSize` consecutive items (the last may be shorter), or
 * of larger ones where that size would need more than JOB_CHUNK_COUNT_MAX chunks.
 * Throws RangeError for a negative or fractional total or a chunk size below 1.
 */
export function evenChunks(total: number, wantedChunkSize: number): JobPlan {
  if (!Number.isInteger(total) || total < 0) {
    throw new RangeError(`evenChunks: total must be a non-negative integer, got ${total}`);
  }
  if (!Number.isInteger(wantedChunkSize) || wantedChunkSize < 1) {
    throw new RangeError(
      `evenChunks: chunkSize must be a positive integer, got ${wantedChunkSize}`,
    );
  }
  const chunkSize = cappedChunkSize(total, wantedChunkSize);
  const chunks: ChunkPlan[] = [];
  for (let start = 0, index = 0; start < total; start += chunkSize, index += 1) {
    chunks.push({ index, start, count: Math.min(chunkSize, total - start) });
  }
  return { total, chunks };
}

/**
 * Runs a chunk's generator to its end in one go, ignoring the progress it yields: for tests,
 * benchmarks and the reducer's own checks.
 */
export function runChunkToEnd<ChunkOutput>(
  chunk: Generator<number, ChunkOutput, void>,
): ChunkOutput {
  for (;;) {
    const step = chunk.next();
    if (step.done) return step.value;
  }
}
