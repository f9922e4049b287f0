import type {
  ActiveClampForwardCorner,
  ActiveClampForwardDesign,
} from '../design/design-schema.js';
import { chooseActiveClampForward } from './active-clamp-forward/active-clamp-forward-choices.js';
import { solveActiveClampForwardCorner } from './active-clamp-forward/active-clamp-forward-corner.js';
import { forwardTransformerDuty } from './two-switch-forward/forward-transformer-duty.js';
import type { Topology } from './topology.js';

/**
 * The active-clamp forward: one main switch, and an auxiliary switch with a clamp capacitor across
 * the primary (high-side clamp) that resets the core at Vc = Vin·D/(1 − D), so D may exceed 0.5
 * and the main switch blocks Vin/(1 − D); the buck-derived output stage per output, output 0
 * regulated (volt-second balance on Lm, Erickson & Maksimović, 2nd ed. (from memory), §2.2).
 */
export const activeClampForward: Topology<
  ActiveClampForwardDesign['choices'],
  ActiveClampForwardCorner
> = {
  id: 'active-clamp-forward',
  choose: (spec) => chooseActiveClampForward(spec),
  solveCorner: (spec, choices, corner) => solveActiveClampForwardCorner(spec, choices, corner),
  transformerDuty: (spec, choices, corners) => forwardTransformerDuty(spec, choices, corners),
};
