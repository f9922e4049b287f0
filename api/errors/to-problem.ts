import { HTTPException } from 'hono/http-exception';
import { BackendUnavailableError } from '../../workers/runners/backend-unavailable-error.js';
import { StoreUnavailableError } from '../stores/store-unavailable-error.js';
import { ProblemError } from './problem-error.js';
import { PROBLEM_TYPES } from './problem-types.js';

/**
 * Maps anything thrown while serving a request to a ProblemError: problems pass through, an
 * unreachable store or job backend becomes 503 with Retry-After, Hono's own exceptions keep
 * their status, and anything else is a bug: 500 with no detail of the internals.
 */
export function toProblem(error: unknown, { retryAfterS }: { retryAfterS: number }): ProblemError {
  if (error instanceof ProblemError) return error;
  if (error instanceof StoreUnavailableError) {
    return new ProblemError(PROBLEM_TYPES.unavailable, {
      detail: 'a store (designs or materials) is unavailable; retry later',
      retryAfterS,
    });
  }
  if (error instanceof BackendUnavailableError) {
    return new ProblemError(PROBLEM_TYPES.unavailable, {
      detail: 'the job backend is unavailable; retry later',
      retryAfterS: Math.max(retryAfterS, Math.ceil(error.retryAfterS)),
    });
  }
  if (error instanceof HTTPException) {
    const known = Object.values(PROBLEM_TYPES).find((type) => type.status === error.status);
    if (known && error.status < 500) return new ProblemError(known);
  }
  return new ProblemError(PROBLEM_TYPES.internal, {
    detail: 'the service failed to answer; the failure has been logged',
  });
}
