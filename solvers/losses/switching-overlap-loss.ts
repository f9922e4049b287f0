/**
 * Returns the average power of one hard-switched edge, W: ½·V·I·t·fs, the linear overlap of a
 * voltage V (V) and a current I (A) over a transition of t (s), repeated at fs (Hz).
 * ref: Mohan, Undeland, Robbins, Power Electronics, 3rd ed., §2-7, eq. 2-6 (from memory).
 */
export function switchingOverlapLoss(
  voltageV: number,
  currentA: number,
  transitionTimeS: number,
  frequencyHz: number,
): number {
  return 0.5 * voltageV * currentA * transitionTimeS * frequencyHz;
}
