import { designNetlist } from '../../solvers/index.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import type { DesignRevisionRecord } from '../stores/design-store.js';

/**
 * The SPICE netlist of a stored revision at one corner (the engine's default corner when none is
 * named); the engine writes the caution into the deck as comments. Throws a 400 ProblemError
 * listing the valid labels for an unknown corner.
 */
export function netlistText(record: DesignRevisionRecord, cornerLabel: string | undefined): string {
  const validCorners = record.design.corners.map((corner) => corner.label);
  if (cornerLabel !== undefined && !validCorners.includes(cornerLabel)) {
    throw new ProblemError(PROBLEM_TYPES.invalidParameter, {
      detail: `unknown corner '${cornerLabel}'; valid corners: ${validCorners.join(', ')}`,
      extensions: { errors: [{ path: ['corner'], message: 'unknown corner' }], validCorners },
    });
  }
  return designNetlist(
    record.spec,
    record.design,
    cornerLabel === undefined ? {} : { cornerLabel },
  );
}
