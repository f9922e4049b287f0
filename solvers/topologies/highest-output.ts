/** Options of {@link highestOutputV}. */
export interface HighestOutputOptions {
  /**
   * Grid cells over the range before the golden-section refinement.
   * @defaultValue 20
   */
  gridCells?: number;
  /**
   * Golden-section steps: the bracket of two cells shrinks 0.618 a step (24: to some 1e-5 of a
   * cell).
   * @defaultValue 24
   */
  goldenSteps?: number;
}

const DEFAULTS = { gridCells: 20, goldenSteps: 24 } satisfies Required<HighestOutputOptions>;

/**
 * Returns the largest value of `outputV` (V) over [lo, hi]: a grid (21 points by default), then
 * the golden-section search on the two cells beside the best of them (ref: J. Kiefer, Proc. AMS 4
 * (1953) 502 (from memory); Press et al., Numerical Recipes, §10.2 (from memory)). Vo(n) at a
 * fixed duty cycle has one hump where the drops grow with the reflected current (the maximum
 * power transfer through the primary's resistance, the leakage's commutation), so the grid's
 * best cell holds it. NaN values (no physical output there) are skipped; NaN when all are.
 */
export function highestOutputV(
  outputV: (x: number) => number,
  lo: number,
  hi: number,
  options: HighestOutputOptions = {},
): number {
  const { gridCells, goldenSteps } = { ...DEFAULTS, ...options };
  const value = (x: number) => {
    const v = outputV(x);
    return Number.isFinite(v) ? v : -Infinity;
  };
  const step = (hi - lo) / gridCells;
  let best = -Infinity;
  let bestX = lo;
  for (let i = 0; i <= gridCells; i++) {
    const x = lo + i * step;
    const v = value(x);
    if (v > best) {
      best = v;
      bestX = x;
    }
  }
  if (best === -Infinity) return NaN;
  const ratio = (Math.sqrt(5) - 1) / 2;
  let a = Math.max(lo, bestX - step);
  let b = Math.min(hi, bestX + step);
  let c = b - ratio * (b - a);
  let d = a + ratio * (b - a);
  let fc = value(c);
  let fd = value(d);
  for (let k = 0; k < goldenSteps; k++) {
    if (fc >= fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - ratio * (b - a);
      fc = value(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + ratio * (b - a);
      fd = value(d);
    }
  }
  return Math.max(best, fc, fd);
}
