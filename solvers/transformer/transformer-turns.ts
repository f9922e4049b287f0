/**
 * Returns integer turns for every winding (winding 0 is the reference primary) with
 * `regulatedTurns` turns on winding `regulatedIndex` (the regulated output's):
 * Np = round(Nr/(Nr/Np)), Nk = round(Np·(Nk/Np)) for the others, each at least 1.
 * `turnsPerPrimaryTurn` holds the ideal Nk/Np of every winding (1 for the primary).
 */
export function transformerTurns(
  turnsPerPrimaryTurn: readonly number[],
  regulatedTurns: number,
  regulatedIndex = 1,
): number[] {
  const regulatedShare = turnsPerPrimaryTurn[regulatedIndex];
  if (regulatedShare === undefined || !(regulatedShare > 0) || regulatedIndex === 0) {
    throw new RangeError('transformerTurns: need a primary and a regulated winding');
  }
  const primaryTurns = Math.max(1, Math.round(regulatedTurns / regulatedShare));
  return turnsPerPrimaryTurn.map((share, k) =>
    k === regulatedIndex ? regulatedTurns : Math.max(1, Math.round(primaryTurns * share)),
  );
}

/**
 * Returns turns for every winding with the primary fixed at `primaryTurns`:
 * Nk = round(Np·(Nk/Np)), each at least 1.
 */
export function turnsFromPrimary(
  turnsPerPrimaryTurn: readonly number[],
  primaryTurns: number,
): number[] {
  return turnsPerPrimaryTurn.map((share, k) =>
    k === 0 ? primaryTurns : Math.max(1, Math.round(primaryTurns * share)),
  );
}
