import type { Design } from '../design/design-schema.js';

/**
 * Returns the design's corner named `label`, or, for an empty label, the corner at the lowest
 * input voltage with the largest load fraction (the corner of largest duty cycle and current).
 * @throws RangeError when the design has no corners or no corner carries that label.
 */
export function netlistCorner<D extends Design>(design: D, label: string): D['corners'][number] {
  type Corner = D['corners'][number];
  const corners: readonly Corner[] = design.corners;
  if (label !== '') {
    const named = corners.find((corner) => corner.label === label);
    if (named === undefined) {
      const known = corners.map((corner) => corner.label).join(', ');
      throw new RangeError(`netlistCorner: no corner labelled '${label}' (known: ${known})`);
    }
    return named;
  }
  let chosen: Corner | undefined;
  for (const corner of corners) {
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
