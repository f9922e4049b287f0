import { jobComputation, type Issue, type JobKind, type Result } from '../../solvers/index.js';
import type { JobRecord, JobRunner, SubmitOptions } from '../../workers/runners/job-runner.js';
import type { JobRequest } from '../schemas/job-request-schema.js';

/** Limits a submitted job is held against: the largest size (plan total) of each kind. */
export type JobLimits = Record<JobKind, number>;

/** The job_size_limit issue for a job whose plan has more items than its kind allows. */
function sizeIssue(required: number, limit: number): Issue {
  return {
    code: 'job_size_limit',
    path: [],
    constraint: 'jobSize <= jobSizeLimit',
    quantity: 'jobSize',
    required,
    limit,
  };
}

/**
 * Sizes a parsed job request (the plan's total: grid points, candidates, samples; the kind's
 * `size` when it has one, so the chunks are not cut), checks it against its kind's limit and
 * hands it to the runner with `submit` (owner, quota); a job over the limit is refused with a
 * job_size_limit issue (path: the whole input). The runner rejects with JobQuotaError when the
 * owner's quota is full.
 */
export async function submitJob(
  jobs: JobRunner,
  request: JobRequest,
  limits: JobLimits,
  submit: SubmitOptions,
): Promise<Result<JobRecord>> {
  // The request passed the union schema, so its input is what its kind's computation takes.
  const computation = jobComputation(request.kind);
  if (computation === undefined) throw new TypeError(`submitJob: no job kind '${request.kind}'`);
  // The size without the plan's chunks where the kind can tell it: an oversized job is refused
  // before anything in proportion to its size is built.
  const total = computation.size?.(request.input) ?? computation.plan(request.input).total;
  const limit = limits[request.kind];
  if (total > limit) return { ok: false, issues: [sizeIssue(total, limit)] };
  return { ok: true, value: await jobs.submit(request.kind, request.input, submit) };
}
