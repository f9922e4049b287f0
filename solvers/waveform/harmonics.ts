import type { Waveform } from './waveform.js';

/** One Fourier component of a periodic waveform: amplitude·cos(2π·frequencyHz·t + phaseRad). */
export interface Harmonic {
  /** Harmonic order n ≥ 1 (multiple of the fundamental). */
  order: number;
  /** n divided by the period, Hz. */
  frequencyHz: number;
  /** Peak amplitude of the sinusoid, in the waveform's unit (≥ 0). */
  amplitude: number;
  /** Phase of the cosine, rad, in [−π, π]; 0 when the amplitude is exactly 0. */
  phaseRad: number;
}

/** Orders between exact evaluations of the stepped sines; bounds recurrence drift to ~16 ulp. */
const RESEED_INTERVAL = 16;
/** Below this x the kernels' differences cancel; their Maclaurin series are used instead. */
const SERIES_LIMIT = 0.3;

/**
 * Returns harmonics 1..count of the waveform (the average is `average(w)`), in closed form from
 * each linear segment; w(t) = average + Σ amplitude·cos(2π·f·t + phase). Stable for orders in
 * the thousands and for segments much shorter than the period.
 * @throws RangeError when count is not a non-negative integer.
 */
export function harmonics(w: Waveform, count: number): Harmonic[] {
  if (!Number.isInteger(count) || count < 0) {
    throw new RangeError(`harmonics: count must be a non-negative integer, got ${count}`);
  }
  const re = new Float64Array(count);
  const im = new Float64Array(count);
  fourierCoefficients(w, count, re, im);
  const result: Harmonic[] = [];
  for (let n = 1; n <= count; n++) {
    const x = re[n - 1] as number;
    const y = im[n - 1] as number;
    // The real series' cosine amplitude is 2·|Xn| and its phase arg(Xn).
    const amplitude = 2 * Math.sqrt(x * x + y * y);
    const phaseRad = amplitude === 0 ? 0 : Math.atan2(y, x);
    result.push({ order: n, frequencyHz: n / w.periodS, amplitude, phaseRad });
  }
  return result;
}

/**
 * Writes the complex Fourier coefficients Xn = (1/T)∫ w(t)·e^(−i·2πnt/T) dt of orders
 * n = 1..count into re[n − 1] and im[n − 1] (overwriting them; the arrays may be longer), in
 * closed form from each linear segment: what {@link harmonics} reads its amplitudes and phases
 * from, for callers that need no Harmonic objects.
 */
export function fourierCoefficients(
  w: Waveform,
  count: number,
  re: Float64Array,
  im: Float64Array,
): void {
  const { periodS, timesS, values } = w;
  re.fill(0, 0, count);
  im.fill(0, 0, count);
  let t0 = timesS[0] as number;
  let v0 = values[0] as number;
  for (let k = 1; k < timesS.length; k++) {
    const t1 = timesS[k] as number;
    const v1 = values[k] as number;
    const durationS = t1 - t0;
    // Zero-length segments (jumps) and segments flat at zero (a current idling between pulses)
    // contribute nothing to the integral: their terms would add ±0 to every order.
    if (durationS > 0 && (v0 !== 0 || v1 !== 0)) {
      addSegment(re, im, count, durationS / periodS, (t0 + t1) / periodS, v0, v1);
    }
    t0 = t1;
    v0 = v1;
  }
}

/**
 * Adds one segment's term to Xn for every order. About the segment's midpoint tc, with
 * x = πnh/T, (1/T)∫ (vm + m·s)·e^(−iωn·t) dt = (h/T)·e^(−iωn·tc)·[vm·sinc x − i·(Δv/2)·g(x)],
 * g(x) = (sin x − x·cos x)/x² (integration by parts). Unlike the usual form with 1/(nω)² terms
 * it does not cancel for short segments or high orders.
 */
function addSegment(
  re: Float64Array,
  im: Float64Array,
  count: number,
  durationFraction: number,
  midpointTwiceFraction: number,
  v0: number,
  v1: number,
): void {
  const mean = 0.5 * (v0 + v1);
  const halfRise = 0.5 * (v1 - v0);
  // Angles for order 1: x = π·h/T and θ = 2π·tc/T; order n multiplies both by n.
  const xStep = Math.PI * durationFraction;
  const thetaStep = Math.PI * midpointTwiceFraction;
  const cosXStep = Math.cos(xStep);
  const sinXStep = Math.sin(xStep);
  const cosThetaStep = Math.cos(thetaStep);
  const sinThetaStep = Math.sin(thetaStep);
  let cosX = 1;
  let sinX = 0;
  let cosTheta = 1;
  let sinTheta = 0;
  for (let n = 1; n <= count; n++) {
    if (n % RESEED_INTERVAL === 0) {
      cosX = Math.cos(n * xStep);
      sinX = Math.sin(n * xStep);
      cosTheta = Math.cos(n * thetaStep);
      sinTheta = Math.sin(n * thetaStep);
    } else {
      // Angle addition steps both angles from order n − 1 to n without calling trig functions.
      const c = cosX;
      cosX = c * cosXStep - sinX * sinXStep;
      sinX = sinX * cosXStep + c * sinXStep;
      const d = cosTheta;
      cosTheta = d * cosThetaStep - sinTheta * sinThetaStep;
      sinTheta = sinTheta * cosThetaStep + d * sinThetaStep;
    }
    const x = n * xStep;
    let even: number;
    let odd: number;
    if (x < SERIES_LIMIT) {
      // Maclaurin series of sin(x)/x and of g(x) = Σ (−1)^(j+1)·2j·x^(2j−1)/(2j+1)!, j = 1..6;
      // truncation is below 1e-16 relative for x < 0.3.
      const x2 = x * x;
      even =
        1 - x2 * (1 / 6 - x2 * (1 / 120 - x2 * (1 / 5040 - x2 * (1 / 362880 - x2 / 39916800))));
      const tail = 1 / 45360 - x2 * (1 / 3991680 - x2 / 518918400);
      odd = x * (1 / 3 - x2 * (1 / 30 - x2 * (1 / 840 - x2 * tail)));
    } else {
      even = sinX / x;
      odd = (sinX - x * cosX) / (x * x);
    }
    even *= mean;
    odd *= halfRise;
    const i = n - 1;
    re[i] = (re[i] as number) + durationFraction * (even * cosTheta - odd * sinTheta);
    im[i] = (im[i] as number) - durationFraction * (even * sinTheta + odd * cosTheta);
  }
}
