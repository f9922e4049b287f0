import type { Issue } from '../../solvers/index.js';
import { issuesDetail } from '../issue-messages.js';
import { ProblemError } from './problem-error.js';
import { PROBLEM_TYPES, type ProblemType } from './problem-types.js';

/**
 * A 422 problem carrying the engine's issues unchanged as `issues`, with a detail rendered from
 * them; a job_size_limit issue gets the job-too-large type, any other the infeasible-spec type,
 * unless the caller names the 422 type (as the material fit does).
 */
export function infeasibleProblem(
  issues: Issue[],
  { problemType }: { problemType?: ProblemType } = {},
): ProblemError {
  const isJobSize = issues.length > 0 && issues.every((issue) => issue.code === 'job_size_limit');
  const fallback = isJobSize ? PROBLEM_TYPES.jobTooLarge : PROBLEM_TYPES.infeasibleSpec;
  return new ProblemError(problemType ?? fallback, {
    detail: issuesDetail(issues),
    extensions: { issues },
  });
}
