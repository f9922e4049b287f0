/** Orders between exact evaluations of the stepped sines; bounds recurrence drift to ~16 ulp. */
const RESEED_INTERVAL = 16;
/** Below this x the kernels' differences cancel; their Maclaurin series are used instead. */
const SERIES_LIMIT = 0.3;

/**
 * Adds one linear segment's share of the Fourier coefficients Xn to re[n − 1] and im[n − 1] for
 * n = 1..count, from the segment's duration h and midpoint tc as fractions of the period T
 * (`durationFraction` = h/T, `midpointTwiceFraction` = 2·tc/T) and its end values v0 and v1.
 * About the midpoint, with x = πnh/T, (1/T)∫ (vm + m·s)·e^(−iωn·t) dt =
 * (h/T)·e^(−iωn·tc)·[vm·sinc x − i·(Δv/2)·g(x)], g(x) = (sin x − x·cos x)/x² (integration by
 * parts). Unlike the forms with 1/(nω)² terms it does not cancel for short segments or high
 * orders: `fourierCoefficients` takes it for segments too short for its breakpoint sums.
 */
export function addSegmentCoefficients(
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
