import type { KeepJobs } from 'bullmq';

/**
 * BullMQ settings that every worker process and producer must share. They live in code, not in
 * the environment, so two workers on one queue can never disagree about stall detection.
 *
 * Handlers yield to the event loop every few milliseconds, so the lock is renewed on time
 * (every lockDurationMs / 2) even during a long sweep; a worker that dies loses its lock after
 * lockDurationMs and the next stall check (at most stalledIntervalMs later) hands the job to
 * another worker. A job that stalls twice (it keeps killing its worker) fails instead of looping.
 */
export const BULLMQ_SETTINGS = {
  /** Lock held by the worker computing a job, ms. */
  lockDurationMs: 30_000,
  /** Time between two checks for jobs whose lock has expired, ms. */
  stalledIntervalMs: 30_000,
  /** Times a job may be recovered from a stall before it fails. */
  maxStalledCount: 1,
  /** Completed jobs kept in Redis for `get`: the newest 1000, for at most 7 days. */
  keepCompleted: { count: 1000, age: 7 * 24 * 3600 } satisfies KeepJobs,
  /** Failed (and cancelled) jobs kept: the newest 5000, for at most 14 days. */
  keepFailed: { count: 5000, age: 14 * 24 * 3600 } satisfies KeepJobs,
} as const;

/** The default queue name of producer and worker. */
export const DEFAULT_QUEUE_NAME = 'converter-jobs';
