import type { z } from 'zod';
import { validationProblem } from '../errors/validation-problem.js';

/**
 * Parses path and query parameters (plain strings) with `schema`. Throws a 400 ProblemError
 * naming each bad parameter.
 */
export function readParams<S extends z.ZodType>(
  params: Record<string, unknown>,
  schema: S,
): z.output<S> {
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw validationProblem(parsed.error.issues, { where: 'parameters' });
  return parsed.data;
}
