import { setImmediate as yieldToEventLoop } from 'node:timers/promises';
import { ChunkTimeoutError, ComputationError, TransientError } from './chunk-failures.js';

/** How a chunk's generator is driven. */
export interface DriveChunkOptions {
  /** Longest stretch of computation between two yields to the event loop, ms. @defaultValue 10 */
  computeSliceMs?: number;
  /** Shortest time between two progress reports, ms. @defaultValue 100 */
  progressIntervalMs?: number;
}

const DEFAULTS = {
  computeSliceMs: 10,
  progressIntervalMs: 100,
} satisfies Required<DriveChunkOptions>;

/** What the runner does at the chunk's pauses. */
export interface ChunkDriver {
  /** Aborted when the job is cancelled or the chunk handed back; checked at every pause. */
  signal: AbortSignal;
  /** Receives the chunk's items done so far, at most every progressIntervalMs (never its end). */
  onProgress(doneInChunk: number): Promise<void> | void;
  /**
   * Longest the chunk may run (wall time from its first step, checked at every pause), ms; past
   * it the chunk throws ChunkTimeoutError. @defaultValue no limit
   */
  timeoutMs?: number;
}

/** One step of the computation; what it throws is a ComputationError (unless transient). */
function nextStep<Output>(steps: Generator<number, Output, void>): IteratorResult<number, Output> {
  try {
    return steps.next();
  } catch (error) {
    throw error instanceof TransientError ? error : new ComputationError(error);
  }
}

/**
 * Runs a chunk's generator to its end on this event loop: it yields to the loop after every
 * `computeSliceMs` of computation (so locks are renewed and an API sharing the process stays
 * responsive), throws the signal's reason once aborted, ChunkTimeoutError once past
 * `timeoutMs`, and ComputationError for what the computation throws, and reports progress as
 * it goes. Resolves to the chunk's output.
 */
export async function driveChunk<Output>(
  steps: Generator<number, Output, void>,
  { signal, onProgress, timeoutMs = Infinity }: ChunkDriver,
  options: DriveChunkOptions = {},
): Promise<Output> {
  const { computeSliceMs, progressIntervalMs } = { ...DEFAULTS, ...options };
  signal.throwIfAborted();
  const startMs = performance.now();
  let sliceStartMs = startMs;
  let reportedAtMs = sliceStartMs;
  for (;;) {
    const step = nextStep(steps);
    if (step.done) return step.value;
    const nowMs = performance.now();
    if (nowMs - startMs > timeoutMs) throw new ChunkTimeoutError(timeoutMs);
    if (nowMs - reportedAtMs >= progressIntervalMs) {
      reportedAtMs = nowMs;
      await onProgress(step.value);
    }
    if (nowMs - sliceStartMs >= computeSliceMs) {
      await yieldToEventLoop();
      sliceStartMs = performance.now();
    }
    signal.throwIfAborted();
  }
}
