import type { ForwardCorner, ForwardDesign } from '../design/design-schema.js';
import { forwardTransformerDuty } from './two-switch-forward/forward-transformer-duty.js';
import type { Topology } from './topology.js';
import { chooseTwoSwitchForward } from './two-switch-forward/two-switch-forward-choices.js';
import { solveTwoSwitchForwardCorner } from './two-switch-forward/two-switch-forward-corner.js';

/**
 * The two-switch forward: both switches gated together, two clamp diodes that reset the core at
 * −Vin and return the magnetizing energy to the input (D ≤ 0.5, each switch blocks Vin), and the
 * buck-derived output stage (CCM or DCM) per output, output 0 regulated (Mohan, Undeland, Robbins,
 * 3rd ed. (from memory), §10-4; Erickson & Maksimović, 2nd ed. (from memory), §6.3.2).
 */
export const twoSwitchForward: Topology<ForwardDesign['choices'], ForwardCorner> = {
  id: 'two-switch-forward',
  choose: (spec) => chooseTwoSwitchForward(spec),
  solveCorner: (spec, choices, corner) => solveTwoSwitchForwardCorner(spec, choices, corner),
  transformerDuty: (spec, choices, corners) => forwardTransformerDuty(spec, choices, corners),
};
