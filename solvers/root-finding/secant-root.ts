/** Options of {@link secantRoot}. */
export interface SecantRootOptions {
  /**
   * Absolute tolerance on x, in x's unit: the iteration stops when a step is smaller.
   * @defaultValue 1e-12
   */
  absoluteTolerance?: number;
  /**
   * Iteration cap; NaN is returned when it is reached without convergence.
   * @defaultValue 12
   */
  maxIterations?: number;
  /**
   * f(x0), when the caller has it already: then f is not evaluated at x0 again.
   * @defaultValue NaN (f is evaluated at x0)
   */
  valueAtX0?: number;
}

const DEFAULTS = {
  absoluteTolerance: 1e-12,
  maxIterations: 12,
  valueAtX0: NaN,
} satisfies Required<SecantRootOptions>;

/**
 * Returns x in [lo, hi] with f(x) = 0 by the secant method from the guesses x0 and x1, or NaN
 * when a step leaves [lo, hi], f is flat or not finite, or the cap is reached: a fast path for
 * smooth, nearly linear f, to be backed by a bracketing method. ref: Press et al., Numerical
 * Recipes, §9.2 (from memory).
 */
export function secantRoot(
  f: (x: number) => number,
  x0: number,
  x1: number,
  lo: number,
  hi: number,
  options: SecantRootOptions = {},
): number {
  // Each option read on its own: a spread of the defaults made an object per call.
  const absoluteTolerance = options.absoluteTolerance ?? DEFAULTS.absoluteTolerance;
  const maxIterations = options.maxIterations ?? DEFAULTS.maxIterations;
  const valueAtX0 = options.valueAtX0 ?? DEFAULTS.valueAtX0;
  let a = x0;
  let b = x1;
  let fa = Number.isNaN(valueAtX0) ? f(a) : valueAtX0;
  let fb = f(b);
  for (let i = 0; i < maxIterations; i++) {
    if (!Number.isFinite(fa) || !Number.isFinite(fb) || fb === fa) return fb === 0 ? b : NaN;
    const next = b - (fb * (b - a)) / (fb - fa);
    if (!(next >= lo && next <= hi)) return NaN;
    if (Math.abs(next - b) <= absoluteTolerance) return next;
    a = b;
    fa = fb;
    b = next;
    fb = f(b);
  }
  return NaN;
}
