/**
 * Share of the off-interval the turn-off swing is held to: past it the constant-current picture
 * is far from the node's resonance with Lm and the output inductors anyway.
 */
export const SWING_HOLD = 0.5;

/**
 * Returns the turn-off swing of a forward's switch node over the period (0..holdFraction): the
 * time the primary current at turn-off, taken constant, needs to carry the node capacitance the
 * winding sees from the on-voltage to zero, C·Vp/(I·T). Over it the winding falls linearly from
 * Vp to zero and the secondaries keep conducting, so they receive half of it at the on-voltage
 * (common practice (from memory): the drain's linear rise at turn-off under an inductive load,
 * taken at constant current). 0 without capacitance or current.
 */
export function turnOffSwingFraction(
  capacitanceF: number,
  primaryVoltageV: number,
  turnOffCurrentA: number,
  periodS: number,
  holdFraction: number,
): number {
  if (!(capacitanceF > 0) || !(turnOffCurrentA > 0) || !(primaryVoltageV > 0)) return 0;
  return Math.min((capacitanceF * primaryVoltageV) / (turnOffCurrentA * periodS), holdFraction);
}
