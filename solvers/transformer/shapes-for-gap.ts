import type { CoreShape } from '../magnetics/core-shape.js';
import type { Issue } from '../result.js';
import type { TransformerDuty } from './transformer-duty.js';

/**
 * The shapes a core whose gap has role `gapRole` can be built on: every shape when the core is
 * ungapped, else the shapes that take a cut gap. A ring (toroid) takes none: it is one closed
 * piece (ref: common practice — a gapped ferrite ring is not a stock part; a ring stores energy
 * only in a distributed-gap material, which this engine's cut-gap model does not describe).
 */
export function shapesForGap(
  shapes: readonly CoreShape[],
  gapRole: TransformerDuty['gapRole'],
): CoreShape[] {
  return gapRole === 'ungapped' ? [...shapes] : shapes.filter((shape) => shape.family !== 'ring');
}

/**
 * The issue at `path` when every shape asked for is a ring and the core needs a cut gap (the
 * magnetizing inductance of a flyback, say, is set by the gap).
 */
export function ringNeedsCutGapIssue(path: readonly (string | number)[]): Issue {
  return {
    code: 'non_physical_value',
    path: [...path],
    constraint:
      'a core whose gap sets the inductance takes a cut gap, which a ring core does not (choose an E, ETD, EFD, EQ or PQ shape)',
    quantity: 'cutGapShapeCount',
    required: 1,
    limit: 0,
  };
}
