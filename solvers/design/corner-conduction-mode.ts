import type { AnyCorner, ConductionMode } from './design-schema.js';

/**
 * Returns the conduction mode a corner is summarized by: the magnetizing current's for the
 * flyback, the first output inductor's for the forward family.
 */
export function cornerConductionMode(corner: AnyCorner): ConductionMode {
  return 'conductionMode' in corner
    ? corner.conductionMode
    : (corner.outputInductorModes[0] ?? 'ccm');
}
