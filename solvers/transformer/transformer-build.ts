import type { CoreShape } from '../magnetics/core-shape.js';
import type { MaterialClass } from '../magnetics/material-class.js';
import type { WindingWire } from './winding-wire.js';

/**
 * How the windings are stacked across the window: 'stacked', the primary next to the centre leg
 * and the secondaries outside it; 'interleaved', the primary split into two halves with the
 * secondaries between them (one more interface, about a quarter of the leakage). A reset winding
 * goes inside either, next to the centre leg (transformerStack).
 */
export type WindingArrangement = 'stacked' | 'interleaved';

/** A concrete transformer: what a builder needs to wind it. Plain data, SI units. */
export interface TransformerBuild {
  shape: CoreShape;
  material: MaterialClass;
  /** Turns of every winding, primary first (integers ≥ 1). */
  turns: readonly number[];
  /** Conductor of every winding, primary first. */
  wires: readonly WindingWire[];
  arrangement: WindingArrangement;
  /** Total length of the air gap in the magnetic path, m (0: ungapped). */
  gapLengthM: number;
  /**
   * Each winding's share of the ampere-turns balancing the primary's (0 for the primary), fixed
   * when the transformer is designed so that its leakage and field do not move with the corners
   * it is later evaluated at.
   */
  ampereTurnShares?: readonly number[];
}
