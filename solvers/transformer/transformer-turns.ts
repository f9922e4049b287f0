/**
 * Returns integer turns for every winding (primary first) with `regulatedTurns` turns on the
 * first secondary: Np = round(n1·Ns1), Nk = round(Np·(Nk/Np)) for the others, each at least 1.
 * `turnsPerPrimaryTurn` holds the ideal Nk/Np of every winding (1 for the primary).
 */
export function transformerTurns(
  turnsPerPrimaryTurn: readonly number[],
  regulatedTurns: number,
): number[] {
  const regulatedShare = turnsPerPrimaryTurn[1];
  if (regulatedShare === undefined || !(regulatedShare > 0)) {
    throw new RangeError('transformerTurns: need a primary and at least one secondary');
  }
  const primaryTurns = Math.max(1, Math.round(regulatedTurns / regulatedShare));
  return turnsPerPrimaryTurn.map((share, k) =>
    k === 0
      ? primaryTurns
      : k === 1
        ? regulatedTurns
        : Math.max(1, Math.round(primaryTurns * share)),
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
