import type { JobKind } from './job-runner.js';

/** How often a job of one kind is attempted and how long to wait before each retry. */
export interface JobRetryPolicy {
  /** Total attempts, including the first (1 means never retried). */
  attempts: number;
  /** Wait before the first retry, ms; doubled for each further retry. */
  backoffMs: number;
}

/**
 * Retry policy of every job kind, set explicitly (no library defaults). The engine is pure and
 * deterministic, so a thrown error is a bug a retry would only repeat; one retry is kept for a
 * transient failure around the computation (a Redis write of progress, a worker restart).
 * A payload that fails its schema is never retried, whatever the policy says.
 */
export const JOB_RETRY_POLICIES: Record<JobKind, JobRetryPolicy> = {
  sweep: { attempts: 2, backoffMs: 2_000 },
};
