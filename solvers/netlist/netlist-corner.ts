import type { Corner, Design } from '../design/design-schema.js';

/**
 * Returns the design's corner named `label`, or, for an empty label, the corner at the lowest
 * input voltage with the largest load fraction (the corner of largest duty cycle and current).
 * @throws RangeError when the design has no corners or no corner carries that label.
 */
export function netlistCorner(design: Design, label: string): Corner {
  if (label !== '') {
    const named = design.corners.find((corner) => corner.label === label);
    if (named === undefined) {
      const known = design.corners.map((corner) => corner.label).join(', ');
      throw new RangeError(`netlistCorner: no corner labelled '${label}' (known: ${known})`);
    }
    return named;
  }
  let chosen: Corner | undefined;
  for (const corner of design.corners) {
    if (
      chosen === undefined ||
      corner.inputVoltageV < chosen.inputVoltageV ||
      (corner.inputVoltageV === chosen.inputVoltageV && corner.loadFraction > chosen.loadFraction)
    ) {
      chosen = corner;
    }
  }
  if (chosen === undefined) throw new RangeError('netlistCorner: the design has no corners');
  return chosen;
}
