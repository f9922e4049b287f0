import type { z } from 'zod';
import { ProblemError } from './problem-error.js';
import { PROBLEM_TYPES } from './problem-types.js';

/** One bad field of a request: its path as an array of keys and indexes, and what is wrong. */
export interface FieldError {
  path: (string | number)[];
  message: string;
}

/**
 * Flattens zod issues into one FieldError per bad field. Paths are arrays (the form zod and the
 * engine's Issue use), from the root of what was parsed; an unknown key gets its own path.
 */
export function fieldErrors(issues: readonly z.core.$ZodIssue[]): FieldError[] {
  return issues.flatMap((issue) => {
    const path = issue.path.map((key) => (typeof key === 'symbol' ? String(key) : key));
    if (issue.code === 'unrecognized_keys') {
      return issue.keys.map((key) => ({ path: [...path, key], message: 'unknown field' }));
    }
    return [{ path, message: issue.message }];
  });
}

/** A 400 problem listing each bad field of a request body (or of the parameters, when asked). */
export function validationProblem(
  issues: readonly z.core.$ZodIssue[],
  { where }: { where: 'body' | 'parameters' } = { where: 'body' },
): ProblemError {
  return fieldProblem(fieldErrors(issues), { where });
}

/** A 400 problem listing `errors`, bad fields of the body or of the parameters. */
export function fieldProblem(
  errors: FieldError[],
  { where }: { where: 'body' | 'parameters' },
): ProblemError {
  const fields = errors.map((error) => error.path.join('/') || '(root)').join(', ');
  return new ProblemError(
    where === 'body' ? PROBLEM_TYPES.invalidBody : PROBLEM_TYPES.invalidParameter,
    { detail: `${errors.length} invalid field(s): ${fields}`, extensions: { errors } },
  );
}
