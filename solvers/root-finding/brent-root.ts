/** Options of {@link brentRoot}. */
export interface BrentRootOptions {
  /**
   * Absolute tolerance on x, in x's unit.
   * @defaultValue 1e-12
   */
  absoluteTolerance?: number;
  /**
   * Iteration cap; the best bracketed estimate is returned when it is reached.
   * @defaultValue 100
   */
  maxIterations?: number;
  /**
   * f(lo), when the caller has it already: then f is not evaluated at lo again.
   * @defaultValue NaN (f is evaluated at lo)
   */
  valueAtLo?: number;
  /**
   * f(hi), when the caller has it already.
   * @defaultValue NaN (f is evaluated at hi)
   */
  valueAtHi?: number;
}

const DEFAULTS = {
  absoluteTolerance: 1e-12,
  maxIterations: 100,
  valueAtLo: NaN,
  valueAtHi: NaN,
} satisfies Required<BrentRootOptions>;

/**
 * Returns x in [lo, hi] with f(x) = 0 for a continuous f whose values at lo and hi differ in
 * sign, by Brent's method (bisection safeguarding inverse quadratic and secant steps); NaN when
 * the ends do not bracket a root. ref: R. P. Brent, Algorithms for Minimization without
 * Derivatives, 1973, ch. 4 (zero); the form of Press et al., Numerical Recipes, §9.3 (from memory).
 */
export function brentRoot(
  f: (x: number) => number,
  lo: number,
  hi: number,
  options: BrentRootOptions = {},
): number {
  // Each option read on its own: a spread of the defaults made an object per call, and the
  // root finders run thousands of times a design.
  const absoluteTolerance = options.absoluteTolerance ?? DEFAULTS.absoluteTolerance;
  const maxIterations = options.maxIterations ?? DEFAULTS.maxIterations;
  const valueAtLo = options.valueAtLo ?? DEFAULTS.valueAtLo;
  const valueAtHi = options.valueAtHi ?? DEFAULTS.valueAtHi;
  let a = lo;
  let b = hi;
  let fa = Number.isNaN(valueAtLo) ? f(a) : valueAtLo;
  let fb = Number.isNaN(valueAtHi) ? f(b) : valueAtHi;
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (!(fa * fb < 0)) return NaN;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iteration = 0; iteration < maxIterations; iteration++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tolerance = 2 * Number.EPSILON * Math.abs(b) + 0.5 * absoluteTolerance;
    const half = 0.5 * (c - b);
    if (Math.abs(half) <= tolerance || fb === 0) return b;
    if (Math.abs(e) >= tolerance && Math.abs(fa) > Math.abs(fb)) {
      // Interpolate: secant when only two distinct points, inverse quadratic otherwise.
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * half * s;
        q = 1 - s;
      } else {
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * half * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * half * q - Math.abs(tolerance * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = half;
        e = d;
      }
    } else {
      d = half;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tolerance ? d : half > 0 ? tolerance : -tolerance;
    fb = f(b);
  }
  return b;
}
