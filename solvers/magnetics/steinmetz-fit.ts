import { failure, success, type Issue, type Result } from '../result.js';
import type { SteinmetzCoefficients } from './steinmetz-coefficients.js';

/** One measured loss point: sinusoidal frequency (Hz), peak flux density (T), loss (W/m³). */
export interface LossPoint {
  frequencyHz: number;
  peakFluxDensityT: number;
  lossDensityWPerM3: number;
}

/** Fitted coefficients and how well they reproduce the points. */
export interface SteinmetzFit {
  coefficients: SteinmetzCoefficients;
  /** RMS over the points of log10(fitted/measured), dimensionless (0 for a perfect fit). */
  rmsLog10Error: number;
  /** Largest |fitted/measured − 1| over the points, a fraction. */
  worstRelativeError: number;
}

/** Options of {@link steinmetzFit}. */
export interface SteinmetzFitOptions {
  /**
   * Smallest accepted ratio of the normal matrix's determinant to the product of its diagonal;
   * below it the points cannot separate α from β (one frequency, or one flux density).
   * @defaultValue 1e-9
   */
  singularityRatio?: number;
}

const DEFAULTS = { singularityRatio: 1e-9 } satisfies Required<SteinmetzFitOptions>;

/** Largest |α| or |β| a fit may return before it is refused as not a material's losses. */
const EXPONENT_MAGNITUDE_MAX = 20;
/** Decades of loss density reported as the limit when a fit cannot be carried in floating point. */
const LOSS_DECADES_FITTABLE = 13;

/**
 * Fits k, α, β of Pv = k·f^α·B^β to measured points by least squares on log10 Pv = log10 k +
 * α·log10 f + β·log10 B (linear regression; ref: common practice for Steinmetz parameters).
 * Issues (non_physical_value) for fewer than 3 points, a value ≤ 0, a singular fit, or an
 * exponent beyond ±20 (points that are not a material's losses).
 */
export function steinmetzFit(
  points: readonly LossPoint[],
  options: SteinmetzFitOptions = {},
): Result<SteinmetzFit> {
  const { singularityRatio } = { ...DEFAULTS, ...options };
  if (points.length < 3) {
    return failure([issue(['points'], 'points.length >= 3', 'lossPointCount', points.length, 3)]);
  }
  const bad = points.findIndex(
    (p) =>
      !(p.frequencyHz > 0 && p.peakFluxDensityT > 0 && p.lossDensityWPerM3 > 0) ||
      ![p.frequencyHz, p.peakFluxDensityT, p.lossDensityWPerM3].every(Number.isFinite),
  );
  if (bad >= 0) {
    const p = points[bad] as LossPoint;
    const value = Math.min(p.frequencyHz, p.peakFluxDensityT, p.lossDensityWPerM3);
    return failure([issue(['points', bad], 'f, B, Pv > 0 and finite', 'lossPoint', value, 0)]);
  }
  const x = points.map((p) => Math.log10(p.frequencyHz));
  const y = points.map((p) => Math.log10(p.peakFluxDensityT));
  const z = points.map((p) => Math.log10(p.lossDensityWPerM3));
  // The 3×3 normal equations in (log10 k, α, β) reduce, after centring x, y and z on their
  // means, to a 2×2 system for (α, β) and log10 k = z̄ − α·x̄ − β·ȳ: the same solution, better
  // conditioned (log10 f is about 5 for every point).
  const n = points.length;
  const xMean = mean(x);
  const yMean = mean(y);
  const zMean = mean(z);
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  let sxz = 0;
  let syz = 0;
  for (let i = 0; i < n; i++) {
    const dx = (x[i] as number) - xMean;
    const dy = (y[i] as number) - yMean;
    const dz = (z[i] as number) - zMean;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
    sxz += dx * dz;
    syz += dy * dz;
  }
  const determinant = sxx * syy - sxy * sxy;
  if (!(determinant > singularityRatio * sxx * syy) || !(sxx > 0 && syy > 0)) {
    const ratio = sxx > 0 && syy > 0 ? determinant / (sxx * syy) : 0;
    return failure([
      issue(
        ['points'],
        'det/(Sff·SBB) > singularityRatio',
        'fitDeterminantRatio',
        ratio,
        singularityRatio,
      ),
    ]);
  }
  const alpha = (sxz * syy - syz * sxy) / determinant;
  const beta = (syz * sxx - sxz * sxy) / determinant;
  // Power materials have α of about 1 to 3 and β of about 2 to 3 (common practice); an exponent
  // far outside says the points are not a material's losses (and would overflow k).
  const exponent = Math.max(Math.abs(alpha), Math.abs(beta));
  if (!(exponent <= EXPONENT_MAGNITUDE_MAX)) {
    return failure([
      issue(['points'], '|α|, |β| <= 20', 'steinmetzExponent', exponent, EXPONENT_MAGNITUDE_MAX),
    ]);
  }
  const log10K = zMean - alpha * xMean - beta * yMean;
  const k = 10 ** log10K;
  let sumSquares = 0;
  let worstRelativeError = 0;
  for (let i = 0; i < n; i++) {
    // In logs, so that a fit far off a wild point reports a large error instead of overflowing.
    const log10Ratio =
      log10K + alpha * (x[i] as number) + beta * (y[i] as number) - (z[i] as number);
    sumSquares += log10Ratio ** 2;
    worstRelativeError = Math.max(worstRelativeError, Math.abs(10 ** log10Ratio - 1));
  }
  const fit = {
    coefficients: { k, alpha, beta },
    rmsLog10Error: Math.sqrt(sumSquares / n),
    worstRelativeError,
  };
  if (![k, alpha, beta, fit.rmsLog10Error, worstRelativeError].every(Number.isFinite)) {
    const spread = Math.max(...z) - Math.min(...z);
    return failure([
      issue(['points'], 'a finite fit', 'lossDensityDecades', spread, LOSS_DECADES_FITTABLE),
    ]);
  }
  return success(fit);
}

function mean(values: readonly number[]): number {
  let sum = 0;
  for (const v of values) sum += v;
  return sum / values.length;
}

function issue(
  path: (string | number)[],
  constraint: string,
  quantity: string,
  required: number,
  limit: number,
): Issue {
  return { code: 'non_physical_value', path, constraint, quantity, required, limit };
}
