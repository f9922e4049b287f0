import { halfPeriodSign } from '../waveform/half-period-sign.js';
import { peakToPeak } from '../waveform/peak-to-peak.js';
import type { Waveform } from '../waveform/waveform.js';
import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';

/** Options of {@link igseCoreLoss}. */
export interface IgseOptions {
  /**
   * Absolute tolerance of the adaptive Simpson rule for ∫₀^{2π} |cos θ|^α dθ (a number near 3).
   * @defaultValue 1e-10
   */
  thetaIntegralTolerance?: number;
  /**
   * Largest bisection depth of that rule.
   * @defaultValue 40
   */
  maxDepth?: number;
}

const DEFAULTS = { thetaIntegralTolerance: 1e-10, maxDepth: 40 } satisfies Required<IgseOptions>;

/**
 * Returns the time-average core loss density, W/m³, of a periodic piecewise-linear flux-density
 * waveform (T) by the improved generalized Steinmetz equation. ΔB is the peak-to-peak swing of
 * the whole period: minor loops are not split out in this version. 0 for a constant flux.
 * @throws RangeError when the flux jumps (infinite dB/dt) or does not return to its start.
 */
export function igseCoreLoss(
  flux: Waveform,
  coefficients: SteinmetzCoefficients,
  options: IgseOptions = {},
): number {
  const thetaIntegralTolerance = options.thetaIntegralTolerance ?? DEFAULTS.thetaIntegralTolerance;
  const maxDepth = options.maxDepth ?? DEFAULTS.maxDepth;
  const { k, alpha, beta } = coefficients;
  const swingT = peakToPeak(flux);
  const { timesS, values, periodS } = flux;
  const closureT = Math.abs((values[values.length - 1] as number) - (values[0] as number));
  if (closureT > 1e-9 * swingT + 1e-15) {
    throw new RangeError(`igseCoreLoss: flux does not return to its start (off by ${closureT} T)`);
  }
  if (swingT === 0) return 0;
  // ref: Venkatachalam, Sullivan, Abdallah, Tacca, IEEE COMPEL 2002, definition of ki:
  // ki = k / ((2π)^(α−1)·∫₀^{2π} |cos θ|^α·2^(β−α) dθ). The θ-integral is taken numerically
  // (adaptive Simpson on a quarter period, by symmetry ×4), not by its Beta-function form.
  const cosineIntegral = cosinePowerIntegral(alpha, thetaIntegralTolerance, maxDepth);
  const ki = k / ((2 * Math.PI) ** (alpha - 1) * 2 ** (beta - alpha) * cosineIntegral);
  // Same paper: Pv = (1/T)∫ ki·|dB/dt|^α·(ΔB)^(β−α) dt. On a linear piece dB/dt is constant,
  // so the integral is exact: Σ |ΔBm/Δtm|^α·Δtm.
  // A flux whose second half repeats its first, negated or not (a double-ended transformer's),
  // has the same |ΔB| and Δt (but for rounding) in each: the first half's sum twice, and the
  // segment between the halves at T/2 (of zero length in the grids) once.
  const count = timesS.length;
  const half = count / 2;
  const sum =
    halfPeriodSign(flux) !== 0
      ? 2 * igseSum(timesS, values, 0, half - 1, swingT, alpha) +
        igseSum(timesS, values, half - 1, half, swingT, alpha)
      : igseSum(timesS, values, 0, count - 1, swingT, alpha);
  return finishIgse(ki, swingT, beta, alpha, sum, periodS, coefficients);
}

/** Σ |ΔBm/Δtm|^α·Δtm over the segments from point `from` to point `to`, T^α·s^(1−α). */
function igseSum(
  timesS: readonly number[],
  values: readonly number[],
  from: number,
  to: number,
  swingT: number,
  alpha: number,
): number {
  let sum = 0;
  for (let i = from; i < to; i++) {
    const durationS = (timesS[i + 1] as number) - (timesS[i] as number);
    const stepT = Math.abs((values[i + 1] as number) - (values[i] as number));
    if (durationS <= 0) {
      // A round-off step where a waveform was stitched is no jump; a real one is infinite dB/dt.
      if (stepT > 1e-9 * swingT)
        throw new RangeError(`igseCoreLoss: flux jumps by ${stepT} T at breakpoint ${i}`);
      continue;
    }
    sum += (stepT / durationS) ** alpha * durationS;
  }
  return sum;
}

/** The loss density from the iGSE's sum Σ |ΔBm/Δtm|^α·Δtm, W/m³; throws where not finite. */
function finishIgse(
  ki: number,
  swingT: number,
  beta: number,
  alpha: number,
  sum: number,
  periodS: number,
  coefficients: SteinmetzCoefficients,
): number {
  const lossDensityWPerM3 = (ki * swingT ** (beta - alpha) * sum) / periodS;
  if (!Number.isFinite(lossDensityWPerM3)) {
    throw new RangeError(
      `igseCoreLoss: non-finite loss from coefficients ${coefficients.k}, ${alpha}, ${beta}`,
    );
  }
  return lossDensityWPerM3;
}

/** A θ-integral already taken, with the rule's settings it was taken with. */
interface CosineIntegral {
  alpha: number;
  tolerance: number;
  maxDepth: number;
  value: number;
}

/**
 * The last few θ-integrals: a design evaluates a handful of materials. Matched on the numbers
 * themselves (no string key to format per call: the loss is taken hundreds of times a design).
 */
const COSINE_INTEGRALS: CosineIntegral[] = [];
const COSINE_INTEGRAL_CACHE_SIZE = 64;

/** Returns ∫₀^{2π} |cos θ|^α dθ, remembered per (α, tolerance, depth); a pure function's memo. */
function cosinePowerIntegral(alpha: number, tolerance: number, maxDepth: number): number {
  for (const known of COSINE_INTEGRALS) {
    if (known.alpha === alpha && known.tolerance === tolerance && known.maxDepth === maxDepth) {
      return known.value;
    }
  }
  const value =
    4 * adaptiveSimpson((t) => Math.cos(t) ** alpha, 0, Math.PI / 2, tolerance / 4, maxDepth);
  if (COSINE_INTEGRALS.length >= COSINE_INTEGRAL_CACHE_SIZE) COSINE_INTEGRALS.length = 0;
  COSINE_INTEGRALS.push({ alpha, tolerance, maxDepth, value });
  return value;
}

/** ∫_a^b f by adaptive Simpson with Richardson correction; ref: common practice (numerical analysis). */
function adaptiveSimpson(
  f: (x: number) => number,
  a: number,
  b: number,
  tolerance: number,
  maxDepth: number,
): number {
  const fa = f(a);
  const fb = f(b);
  const fm = f((a + b) / 2);
  return refine(f, a, b, fa, fm, fb, ((b - a) / 6) * (fa + 4 * fm + fb), tolerance, maxDepth);
}

function refine(
  f: (x: number) => number,
  a: number,
  b: number,
  fa: number,
  fm: number,
  fb: number,
  whole: number,
  tolerance: number,
  depth: number,
): number {
  const m = (a + b) / 2;
  const flm = f((a + m) / 2);
  const frm = f((m + b) / 2);
  const left = ((m - a) / 6) * (fa + 4 * flm + fm);
  const right = ((b - m) / 6) * (fm + 4 * frm + fb);
  const delta = left + right - whole;
  if (depth <= 0 || Math.abs(delta) <= 15 * tolerance) return left + right + delta / 15;
  return (
    refine(f, a, m, fa, flm, fm, left, tolerance / 2, depth - 1) +
    refine(f, m, b, fm, frm, fb, right, tolerance / 2, depth - 1)
  );
}
