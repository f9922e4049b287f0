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
 * defaults). The engine is pure and deterministic, so a thrown error is a bug a retry would only
 * repeat; one retry is kept for a transient failure around the computation (a Redis write of
 * progress, a worker restart). A payload that fails its schema is never retried.
 */
export const DEFAULT_JOB_RETRY_POLICY: JobRetryPolicy = { attempts: 2, backoffMs: 2_000 };

/** The retry policy of each job kind: every kind takes the default unless it has its own line. */
export const JOB_RETRY_POLICIES: Record<JobKind, JobRetryPolicy> = Object.fromEntries(
  JOB_KINDS.map((kind) => [kind, DEFAULT_JOB_RETRY_POLICY]),
) as Record<JobKind, JobRetryPolicy>;
