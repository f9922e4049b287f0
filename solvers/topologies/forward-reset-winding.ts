import type { ForwardCorner, ResetWindingForwardDesign } from '../design/design-schema.js';
import { forwardTransformerDuty } from './two-switch-forward/forward-transformer-duty.js';
import type { Topology } from './topology.js';
import { chooseResetWindingForward } from './two-switch-forward/two-switch-forward-choices.js';
import { solveTwoSwitchForwardCorner } from './two-switch-forward/two-switch-forward-corner.js';

/**
 * The single-switch forward with a reset winding (Nr/Np a design variable, 1 by default): the
 * reset diode returns the magnetizing energy to the input at (Vin + Vf)·Np/Nr, so D ≤ 1/(1 + Nr/Np)
 * and the switch blocks Vin·(1 + Np/Nr); the buck-derived output stage per output (Mohan,
 * Undeland, Robbins, 3rd ed. (from memory), §10-4-1).
 */
export const forwardResetWinding: Topology<ResetWindingForwardDesign['choices'], ForwardCorner> = {
  id: 'forward-reset-winding',
  choose: (spec) => chooseResetWindingForward(spec),
  solveCorner: (spec, choices, corner) => solveTwoSwitchForwardCorner(spec, choices, corner),
  transformerDuty: (spec, choices, corners) => forwardTransformerDuty(spec, choices, corners),
};
