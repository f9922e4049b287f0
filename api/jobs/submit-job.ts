import { sweepPointCount } from '../../solvers/index.js';
import type { Issue, Result } from '../../solvers/index.js';
import type { JobRecord, JobRunner } from '../../workers/runners/job-runner.js';
import type { JobRequest } from '../schemas/job-request-schema.js';

/** Limits a submitted job is held against. */
export interface JobLimits {
  /** Largest number of grid points one sweep may have. */
  sweepPointLimit: number;
}

/** The job_size_limit issue for a job that asks for more work than allowed. */
function sizeIssue(path: string[], required: number, limit: number): Issue {
  return {
    code: 'job_size_limit',
    path,
    constraint: 'pointCount <= sweepPointLimit',
    quantity: 'pointCount',
    required,
    limit,
  };
}

/**
 * Checks a parsed job request against the limits and hands it to the runner; a job over its
 * size limit is refused with a job_size_limit issue (path relative to the job's input).
 */
export async function submitJob(
  jobs: JobRunner,
  request: JobRequest,
  limits: JobLimits,
): Promise<Result<JobRecord>> {
  switch (request.kind) {
    case 'sweep': {
      const pointCount = sweepPointCount(request.input);
      if (pointCount > limits.sweepPointLimit) {
        return { ok: false, issues: [sizeIssue(['grid'], pointCount, limits.sweepPointLimit)] };
      }
      return { ok: true, value: await jobs.submit('sweep', request.input) };
    }
  }
}
