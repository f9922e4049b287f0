import type { KeepJobs } from 'bullmq';

/**
 * BullMQ settings that every worker process and producer must share. They live in code, not in
 * the environment, so two workers on one queue can never disagree about stall detection.
 *
 * A worker holds one chunk at a time (a fraction of a second to a few seconds of work) and
 * yields to the event loop every ~10 ms, so its lock is renewed on time (every
 * lockDurationMs / 2). A worker that dies (SIGKILL, a lost host) loses its lock after
 * lockDurationMs, and the next stall check, at most stalledIntervalMs later, hands the chunk to
 * another worker: about 6 s at most. The lock is short because re-running a chunk is cheap
 * (a falsely suspected worker costs one chunk's work, and the result is the same); a chunk that
 * stalls three times (it keeps killing its worker) fails its job instead of looping. A stall
 * caused by a Redis outage that outlasted the lock is not counted: the worker that kept running
 * the chunk through it gives the stall back once connected again (bullmq-outage-stalls.ts).
 */
export const BULLMQ_SETTINGS = {
  /** Lock held by the worker computing a chunk or reducing a job, ms. */
  lockDurationMs: 4_000,
  /** Time between two checks for jobs whose lock has expired, ms. */
  stalledIntervalMs: 2_000,
  /** Times a job may be recovered from a stall before it fails (stalls of Redis outages aside). */
  maxStalledCount: 2,
  /** Completed jobs kept in Redis for `get`: the newest 1000, for at most 7 days. */
  keepCompleted: { count: 1000, age: 7 * 24 * 3600 } satisfies KeepJobs,
  /** Failed (and cancelled) jobs kept: the newest 5000, for at most 14 days. */
  keepFailed: { count: 5000, age: 14 * 24 * 3600 } satisfies KeepJobs,
} as const;

/** The default queue name of producer and worker. */
export const DEFAULT_QUEUE_NAME = 'converter-jobs';
