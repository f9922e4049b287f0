import type { Context } from 'hono';
import { fieldProblem, type FieldError } from '../errors/validation-problem.js';

/** What the `include` query parameter can add to an answer. */
export const INCLUDE_VALUES = ['waveforms'] as const;

/** The optional parts of an answer a request asked for. */
export interface Included {
  /** Each corner's `waveforms`. */
  waveforms: boolean;
}

/**
 * Reads the `include` query parameter: a comma-separated list of INCLUDE_VALUES, which may also
 * be repeated (`include=waveforms`). Absent, nothing is added. Throws a 400 ProblemError naming
 * each unknown value at path `include` (with its index in the list when there are several).
 */
export function readInclude(c: Context): Included {
  const values = (c.req.queries('include') ?? []).flatMap((value) => value.split(','));
  const errors: FieldError[] = [];
  values.forEach((value, index) => {
    if (!(INCLUDE_VALUES as readonly string[]).includes(value)) {
      errors.push({
        path: values.length === 1 ? ['include'] : ['include', index],
        message: `unknown include value '${value}'; expected ${INCLUDE_VALUES.map((v) => `'${v}'`).join(', ')}`,
      });
    }
  });
  if (errors.length > 0) throw fieldProblem(errors, { where: 'parameters' });
  return { waveforms: values.includes('waveforms') };
}
