import { setImmediate as yieldToEventLoop } from 'node:timers/promises';

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
}

/**
 * Runs a chunk's generator to its end on this event loop: it yields to the loop after every
 * `computeSliceMs` of computation (so locks are renewed and an API sharing the process stays
 * responsive), throws the signal's reason once aborted, and reports progress as it goes.
 * Resolves to the chunk's output.
 */
export async function driveChunk<Output>(
  steps: Generator<number, Output, void>,
  { signal, onProgress }: ChunkDriver,
  options: DriveChunkOptions = {},
): Promise<Output> {
  const { computeSliceMs, progressIntervalMs } = { ...DEFAULTS, ...options };
  signal.throwIfAborted();
  let sliceStartMs = performance.now();
  let reportedAtMs = sliceStartMs;
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    const nowMs = performance.now();
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
