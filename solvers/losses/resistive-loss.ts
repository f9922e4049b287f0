/**
 * Returns the Joule loss of a resistance carrying a current of the given RMS value, W: Irms²·R,
 * for a MOSFET channel (R = Rds(on)) or a winding (R = its DC resistance).
 * ref: common practice (Joule's law).
 */
export function resistiveLoss(currentRmsA: number, resistanceOhm: number): number {
  return currentRmsA * currentRmsA * resistanceOhm;
}
