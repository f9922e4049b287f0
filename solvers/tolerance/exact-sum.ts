/**
 * Exact floating-point summation, so that sums over Monte Carlo samples are the same to the last
 * bit however the samples were split into chunks: each sum is kept as non-overlapping partials
 * whose exact total is the exact sum of everything added (J. R. Shewchuk, "Adaptive precision
 * floating-point arithmetic and fast robust geometric predicates", Discrete & Computational
 * Geometry 18, 1997; the grow-expansion step as in Python's math.fsum), and read out correctly
 * rounded. The read-out depends only on the exact sum, never on the order of additions.
 */

/** Partials of an exact sum, smallest magnitude first (plain JSON: finite numbers). */
export type ExactSum = number[];

/** Adds `value` to the exact sum `partials` in place. @throws RangeError for a non-finite value. */
export function addExact(partials: ExactSum, value: number): void {
  if (!Number.isFinite(value)) throw new RangeError(`addExact: non-finite value ${value}`);
  let x = value;
  let kept = 0;
  for (let i = 0; i < partials.length; i++) {
    let y = partials[i] as number;
    if (Math.abs(x) < Math.abs(y)) [x, y] = [y, x];
    const high = x + y;
    const low = y - (high - x);
    if (low !== 0) partials[kept++] = low;
    x = high;
  }
  partials.length = kept;
  partials.push(x);
}

/** Adds every partial of `other` to `partials` in place (the exact sum of both). */
export function mergeExact(partials: ExactSum, other: readonly number[]): void {
  for (const value of other) addExact(partials, value);
}

/** The exact sum rounded to the nearest double (ties to even), as Python's math.fsum. */
export function exactValue(partials: readonly number[]): number {
  let n = partials.length;
  if (n === 0) return 0;
  let high = partials[--n] as number;
  let low = 0;
  while (n > 0) {
    const x = high;
    const y = partials[--n] as number;
    high = x + y;
    low = y - (high - x);
    if (low !== 0) break;
  }
  // Half-way case: the rest of the partials decide the rounding direction.
  const next = n > 0 ? (partials[n - 1] as number) : 0;
  if ((low < 0 && next < 0) || (low > 0 && next > 0)) {
    const y = low * 2;
    const x = high + y;
    if (y === x - high) high = x;
  }
  return high;
}
