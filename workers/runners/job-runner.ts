/**
 * The job contract both backends keep (BullMQ on Redis and the embedded in-process runner).
 * Everything that crosses it is plain JSON.
 */

import type { JobKind } from '../../solvers/index.js';

export { JOB_KINDS } from '../../solvers/index.js';
export type { JobKind } from '../../solvers/index.js';

export const JOB_STATES = ['queued', 'running', 'completed', 'failed', 'cancelled'] as const;
export type JobState = (typeof JOB_STATES)[number];

/**
 * How far a job has got: items done of the plan's total, and once known the rate so far
 * (items per second between the first chunk's start and the latest progress report) and the
 * estimated time to completion at that rate (running jobs only).
 */
export interface JobProgress {
  done: number;
  total: number;
  ratePerS?: number;
  etaS?: number;
}

export interface JobRecord {
  id: string;
  kind: JobKind;
  state: JobState;
  progress: JobProgress;
  /** ISO 8601 times. */
  createdAt: string;
  startedAt?: string;
  finishedAt?: string;
  /** The plain result (a JobResult for every chunked kind), once completed. */
  result?: unknown;
  /** Why it failed, once failed (never a stack trace). */
  failureReason?: string;
  /** The tenant that submitted it (the API shows a job to its owner only). */
  owner?: string;
}

/** Who submits a job, and how many unfinished jobs they may have. */
export interface SubmitOptions {
  /** The submitting tenant, kept on the record as `owner`. */
  owner?: string;
  /**
   * With `owner`: the job is accepted only if the owner has fewer unfinished jobs than this,
   * checked and the place taken in one step (no two concurrent submissions, from any process,
   * can both take the last place); otherwise submit rejects with JobQuotaError.
   * @defaultValue no limit
   */
  ownerUnfinishedMax?: number;
}

export type CancelOutcome = 'cancelled' | 'not-found' | 'already-finished';

export interface JobRunner {
  /**
   * Queues a job; resolves once it is accepted. Rejects with InvalidPayloadError, queuing
   * nothing, when the payload fails its kind's schema (so every accepted job has a plan and its
   * chunks to run), and with JobQuotaError when `ownerUnfinishedMax` is reached; takes no place
   * in the owner's count when it rejects for any reason.
   */
  submit(kind: JobKind, payload: unknown, options?: SubmitOptions): Promise<JobRecord>;
  get(id: string): Promise<JobRecord | undefined>;
  cancel(id: string): Promise<CancelOutcome>;
  /** True when the backend can accept and run jobs (Redis reachable, for BullMQ). */
  isReady(): Promise<boolean>;
  /**
   * What waits and what runs now, for the queue-depth metric: jobs on the embedded backend;
   * queue entries (jobs and their chunks) on BullMQ.
   */
  counts(): Promise<QueueCounts>;
  /** Jobs of `owner` not yet finished (queued or running), for the per-tenant job quota. */
  unfinishedCount(owner: string): Promise<number>;
  close(): Promise<void>;
}

/** Entries waiting to run and running now. */
export interface QueueCounts {
  waiting: number;
  running: number;
}
