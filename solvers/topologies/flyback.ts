import type { FlybackDesign } from '../design/design-schema.js';
import { chooseFlyback } from './flyback/flyback-choices.js';
import { solveFlybackCorner } from './flyback/flyback-corner.js';
import { flybackTransformerDuty } from './flyback/flyback-transformer-duty.js';
import type { Topology } from './topology.js';

/**
 * The flyback converter with an RCD clamp: CCM, BCM and DCM, diode or synchronous rectifiers,
 * up to four outputs with output 0 regulated. Solves the steady state with conduction drops and
 * both leakage commutations (Erickson & Maksimović, 2nd ed. (from memory), ch. 6; Mohan, Undeland,
 * Robbins,
 * 3rd ed., ch. 10), then stresses, losses and limits at the corner.
 */
export const flyback: Topology<FlybackDesign['choices']> = {
  id: 'flyback',
  choose: (spec) => chooseFlyback(spec),
  solveCorner: (spec, choices, corner) => solveFlybackCorner(spec, choices, corner),
  transformerDuty: (spec, choices, corners) => flybackTransformerDuty(spec, choices, corners),
};
