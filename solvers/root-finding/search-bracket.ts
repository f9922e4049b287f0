/** A bracket [lo, hi] with f(lo) and f(hi) of opposite sign, or the best point tried. */
export type BracketSearch =
  { found: true; lo: number; hi: number } | { found: false; best: number; bestValue: number };

/** Geometric steps tried before the search gives up. */
const MAX_STEPS = 40;

/**
 * Brackets a root of an increasing f around a positive guess x0: steps x geometrically down when
 * f(x0) > 0 and up when f(x0) < 0, the relative step starting at `firstStep` and doubling, until
 * f changes sign. When it never does, returns the point with the smallest |f| tried.
 */
export function searchBracket(
  f: (x: number) => number,
  guess: number,
  firstStep: number,
): BracketSearch {
  let previous = guess;
  let previousValue = f(guess);
  let best = guess;
  let bestValue = previousValue;
  if (previousValue === 0) return { found: true, lo: guess, hi: guess };
  const isDown = previousValue > 0;
  let step = firstStep;
  for (let k = 0; k < MAX_STEPS; k++) {
    const x = isDown ? previous / (1 + step) : previous * (1 + step);
    const value = f(x);
    if (Math.abs(value) < Math.abs(bestValue)) {
      best = x;
      bestValue = value;
    }
    if (value > 0 !== previousValue > 0 || value === 0) {
      return isDown ? { found: true, lo: x, hi: previous } : { found: true, lo: previous, hi: x };
    }
    previous = x;
    previousValue = value;
    step *= 2;
  }
  return { found: false, best, bestValue };
}
