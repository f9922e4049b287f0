import { designNetlist } from '../../solvers/index.js';
import { ProblemError } from '../errors/problem-error.js';
import { PROBLEM_TYPES } from '../errors/problem-types.js';
import type { DesignContent } from '../stores/design-store.js';
import type { EvaluatedContent } from './evaluate-spec.js';

/**
 * Throws a 400 ProblemError listing the valid labels when `cornerLabel` names no corner of
 * `design` (nothing when it is undefined: the engine's default corner).
 */
export function checkCornerLabel(
  design: DesignContent['design'],
  cornerLabel: string | undefined,
): void {
  const validCorners = design.corners.map((corner) => corner.label);
  if (cornerLabel !== undefined && !validCorners.includes(cornerLabel)) {
    throw new ProblemError(PROBLEM_TYPES.invalidParameter, {
      detail: `unknown corner '${cornerLabel}'; valid corners: ${validCorners.join(', ')}`,
      extensions: { errors: [{ path: ['corner'], message: 'unknown corner' }], validCorners },
    });
  }
}

/**
 * The SPICE netlist of a revision's content at one corner (the engine's default corner when none
 * is named); the engine writes the caution into the deck as comments. The content has its
 * waveforms: some topologies' decks start from their values (contentWithWaveforms). Throws a 400
 * ProblemError listing the valid labels for an unknown corner.
 */
export function netlistText(
  content: Pick<EvaluatedContent, 'spec' | 'design'>,
  cornerLabel: string | undefined,
): string {
  checkCornerLabel(content.design, cornerLabel);
  return designNetlist(
    content.spec,
    content.design,
    cornerLabel === undefined ? {} : { cornerLabel },
  );
}
