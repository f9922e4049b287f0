/**
 * How a chunk's failure is told apart: whether another attempt could succeed. The engine is
 * pure and deterministic, so an error it throws, a chunk that runs past its time limit and a
 * payload that fails its schema would only happen again: such a chunk fails its job at once.
 * Anything else around the computation (a Redis command that failed, a lost lock, a worker
 * restart) is transient and retried per the kind's policy (job-retry-policy.ts), with
 * exponential backoff. A worker that dies is a stall, not a failure: BullMQ hands its chunk to
 * another worker (bullmq-settings.ts).
 */
import { InvalidPayloadError } from './invalid-payload-error.js';

/** Thrown when a job's computation (plan, chunk or reduce) throws; never retried. */
export class ComputationError extends Error {
  override readonly name = 'ComputationError';

  constructor(cause: unknown) {
    super(cause instanceof Error ? cause.message : String(cause), { cause });
  }
}

/** Thrown when a chunk runs longer than its limit (JOB_CHUNK_TIMEOUT_S); never retried. */
export class ChunkTimeoutError extends Error {
  override readonly name = 'ChunkTimeoutError';
  readonly timeoutMs: number;

  constructor(timeoutMs: number) {
    super(`ran longer than the chunk time limit of ${timeoutMs / 1000} s (JOB_CHUNK_TIMEOUT_S)`);
    this.timeoutMs = timeoutMs;
  }
}

/**
 * An error that a later attempt may not meet, thrown on purpose by code around a chunk (or by a
 * computation that depends on something outside itself: none of the engine's does). Passes
 * through `driveChunk` as itself, so it is retried.
 */
export class TransientError extends Error {
  override readonly name = 'TransientError';
}

/** False for a failure that would happen again on another attempt (see the module comment). */
export function isRetryable(error: unknown): boolean {
  return !(
    error instanceof InvalidPayloadError ||
    error instanceof ComputationError ||
    error instanceof ChunkTimeoutError
  );
}

/** Runs a step of the computation outside a chunk (plan, reduce): what it throws is a ComputationError. */
export function computing<T>(step: () => T): T {
  try {
    return step();
  } catch (error) {
    throw error instanceof TransientError ? error : new ComputationError(error);
  }
}

/** The reason a job failed by one of its chunks shows: which chunk, which items, and why. */
export function chunkFailureReason(
  chunk: { index: number; start: number; count: number },
  error: unknown,
): string {
  const why = error instanceof Error ? error.message : String(error);
  const last = chunk.start + chunk.count - 1;
  return `chunk ${chunk.index} (items ${chunk.start}-${last}) failed: ${why}`;
}
