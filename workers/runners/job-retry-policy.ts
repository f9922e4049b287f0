import { JOB_KINDS, type JobKind } from './job-runner.js';

/** How often one chunk of a job is attempted and how long to wait before each retry. */
export interface JobRetryPolicy {
  /** Total attempts, including the first (1 means never retried). */
  attempts: number;
  /** Wait before the first retry, ms; doubled for each further retry. */
  backoffMs: number;
}

/**
 * The policy of a chunk (and of a job's final reduce) of every kind, set explicitly (no library
 * defaults). Only transient failures are retried (a Redis command that failed, a lost lock):
 * 3 attempts, 1 s then 2 s apart. The engine is pure and deterministic, so an error it throws, a
 * chunk past its time limit and a payload that fails its schema fail the job at once
 * (workers/chunks/chunk-failures.ts). A worker that dies is not a failure but a stall
 * (bullmq-settings.ts).
 */
export const DEFAULT_JOB_RETRY_POLICY: JobRetryPolicy = { attempts: 3, backoffMs: 1_000 };

/** The retry policy of each job kind: every kind takes the default unless it has its own line. */
export const JOB_RETRY_POLICIES: Record<JobKind, JobRetryPolicy> = Object.fromEntries(
  JOB_KINDS.map((kind) => [kind, DEFAULT_JOB_RETRY_POLICY]),
) as Record<JobKind, JobRetryPolicy>;
