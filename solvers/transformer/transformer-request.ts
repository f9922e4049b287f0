import type { CoreShape } from '../magnetics/core-shape.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import type { WindingArrangement } from './transformer-build.js';
import type { TransformerEvaluationOptions } from './transformer-evaluation-options.js';
import type { FoilWindingChoiceOptions } from './foil-winding-choice.js';
import type { WindingWireChoiceOptions } from './winding-wire-choice.js';
import type { WindingWire } from './winding-wire.js';

/**
 * What the transformer design may choose from, and what the request fixes. Plain data: the
 * caller resolves catalog or user entries into shapes and materials.
 */
export interface TransformerRequest {
  /** Core shapes to choose from; the smallest feasible one is taken. */
  shapes: readonly CoreShape[];
  /** Materials to choose from; at a given core the one with the least loss is taken. */
  materials: readonly MaterialClass[];
  /** Primary turns, when fixed; the other windings follow from their turns ratios. */
  primaryTurns?: number;
  /** Conductor of each winding (primary first), when fixed. */
  wires?: readonly WindingWire[];
  arrangement: WindingArrangement;
  /** Secondary turn counts tried above the smallest that keeps the flux in bounds. @defaultValue 3 */
  turnsOptionCount?: number;
  wireChoice?: WindingWireChoiceOptions;
  /** How foil is offered when the engine chooses the wires (ungapped cores only). */
  foilChoice?: FoilWindingChoiceOptions;
  evaluation?: TransformerEvaluationOptions;
}
