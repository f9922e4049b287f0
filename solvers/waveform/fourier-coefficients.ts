import { halfPeriodSign } from './half-period-sign.js';
import { addSegmentCoefficients } from './segment-coefficients.js';
import type { Waveform } from './waveform.js';

/**
 * Segments shorter than this fraction of the period go through the closed form of
 * {@link addSegmentCoefficients} rather than the breakpoint sums, whose two end terms cancel
 * for a short steep segment: the rounding of each (a few ulp, ε) is amplified by T/(2π·h), so
 * above this limit the segment's share of Xn keeps about 10·ε·T/(2π·h) < 4e-11 of itself
 * (measured against the closed form over h/T = 1e-7…1e-2: an edge of 3e-5 of the period,
 * about the bench flyback's shortest, within 1.2e-11).
 */
const SHORT_SEGMENT_FRACTION = 1e-5;
/**
 * Orders between exact evaluations of a breakpoint's e^(−i·2πn·u). In between, each order is
 * one complex rotation from the last, whose error grows by a few ulp an order: at most about
 * 1e-13 by order 256, as large as the phase error 2πn·u·ε/2 that rounding 2π·u already gives.
 * The seeds fall on fixed orders (1, 257, …), so Xn does not depend on how many are taken.
 */
const RESEED_INTERVAL = 256;

/**
 * Module scratch, grown as needed: per breakpoint k (index 0 for the period's ends, where
 * e^(−i·2πn·u) = 1), its time as a fraction u of the period, its jump Jk and its slope change
 * Sk (per period); and per order the four sums Σ Jk·cos, Σ Jk·sin, Σ Sk·cos and Σ Sk·sin of
 * 2πn·uk. A design takes hundreds of spectra.
 */
let phases = new Float64Array(64);
let jumps = new Float64Array(64);
let slopeChanges = new Float64Array(64);
let sums = new Float64Array(256);

/**
 * Writes the complex Fourier coefficients Xn = (1/T)∫ w(t)·e^(−i·2πnt/T) dt of orders
 * n = 1..count into re[n − 1] and im[n − 1] (overwriting them; the arrays may be longer). Each
 * linear piece integrated by parts twice leaves terms at its ends only; summed over the
 * period they give, with uk = tk/T, the jump Jk = w(tk+) − w(tk−) and the slope change
 * Sk = T·(w′(tk+) − w′(tk−)) at each breakpoint,
 * Xn = −i·Σ Jk·e^(−i·2πn·uk)/(2πn) − Σ Sk·e^(−i·2πn·uk)/(2πn)²
 * (the decay as 1/n from jumps and 1/n² from corners; e.g. Kreyszig, Advanced Engineering
 * Mathematics, 10th ed., Sec. 11.1, integration by parts, from memory): one rotation per
 * breakpoint and order. Segments shorter than 1e-5 of the period take the closed form of
 * {@link addSegmentCoefficients} instead.
 */
export function fourierCoefficients(
  w: Waveform,
  count: number,
  re: Float64Array,
  im: Float64Array,
): void {
  re.fill(0, 0, count);
  im.fill(0, 0, count);
  const sign = halfPeriodSign(w);
  const size = collectBreakpoints(
    w,
    count,
    re,
    im,
    sign === 0 ? w.timesS.length : w.timesS.length / 2,
  );
  if (sums.length < 4 * count) sums = new Float64Array(4 * count);
  const s = sums;
  s.fill(0, 0, 4 * count);
  // Four breakpoints a pass over the orders: four independent rotations in flight, and one
  // load and store of each sum for four (1.3–1.7 times as fast as one at a time).
  const last = keepNonZero(size);
  let k = 1;
  for (; k + 3 <= last; k += 4) {
    if (jumps[k] === 0 && jumps[k + 1] === 0 && jumps[k + 2] === 0 && jumps[k + 3] === 0) {
      addFourSlopeChangeSums(s, count, k);
    } else addFourBreakpointSums(s, count, k);
  }
  for (; k <= last; k++) addBreakpointSums(s, count, k);
  // At the period's ends e^(−i·2πn·u) = 1 exactly: those terms join the cosine sums.
  const endJump = jumps[0] as number;
  const endSlopeChange = slopeChanges[0] as number;
  for (let n = 1; n <= count; n++) {
    const i = 4 * (n - 1);
    const omega = 2 * Math.PI * n;
    const omega2 = omega * omega;
    // −i·(C1 − i·D1)/ω − (C2 − i·D2)/ω² with C = Σ J·cos or S·cos and D the sine sums.
    re[n - 1] =
      (re[n - 1] as number) -
      (s[i + 1] as number) / omega -
      ((s[i + 2] as number) + endSlopeChange) / omega2;
    im[n - 1] =
      (im[n - 1] as number) - ((s[i] as number) + endJump) / omega + (s[i + 3] as number) / omega2;
  }
  if (sign !== 0) {
    // The first half's share, once more from the second (e^(−iπn) = (−1)^n times the sign).
    for (let n = 1; n <= count; n++) {
      const factor = n % 2 === 0 ? 1 + sign : 1 - sign;
      re[n - 1] = factor * (re[n - 1] as number);
      im[n - 1] = factor * (im[n - 1] as number);
    }
  }
}

/**
 * Moves the breakpoints 1..size − 1 with a jump or a slope change to the front (collinear points
 * and points between segments flat at zero have neither) and returns the last one's index.
 */
function keepNonZero(size: number): number {
  let last = 0;
  for (let k = 1; k < size; k++) {
    const jump = jumps[k] as number;
    const slopeChange = slopeChanges[k] as number;
    if (jump !== 0 || slopeChange !== 0) {
      last++;
      phases[last] = phases[k] as number;
      jumps[last] = jump;
      slopeChanges[last] = slopeChange;
    }
  }
  return last;
}

/**
 * Adds Jk·(cos, sin)(n·θk) and Sk·(cos, sin)(n·θk) of breakpoint k, θk = 2π·uk, to the sums of
 * orders 1..count.
 */
function addBreakpointSums(s: Float64Array, count: number, k: number): void {
  const theta = 2 * Math.PI * (phases[k] as number);
  const jump = jumps[k] as number;
  const slopeChange = slopeChanges[k] as number;
  const cosStep = Math.cos(theta);
  const sinStep = Math.sin(theta);
  for (let first = 1; first <= count; first += RESEED_INTERVAL) {
    let c = first === 1 ? cosStep : Math.cos(first * theta);
    let sn = first === 1 ? sinStep : Math.sin(first * theta);
    const end = 4 * Math.min(count, first + RESEED_INTERVAL - 1);
    for (let i = 4 * (first - 1); i < end; i += 4) {
      s[i] = (s[i] as number) + jump * c;
      s[i + 1] = (s[i + 1] as number) + jump * sn;
      s[i + 2] = (s[i + 2] as number) + slopeChange * c;
      s[i + 3] = (s[i + 3] as number) + slopeChange * sn;
      // Angle addition: from order n to n + 1 without calling trig functions.
      const p = c;
      c = p * cosStep - sn * sinStep;
      sn = sn * cosStep + p * sinStep;
    }
  }
}

/** {@link addBreakpointSums} of breakpoints k…k + 3 in one pass over the orders. */
function addFourBreakpointSums(s: Float64Array, count: number, k: number): void {
  const theta0 = 2 * Math.PI * (phases[k] as number);
  const theta1 = 2 * Math.PI * (phases[k + 1] as number);
  const theta2 = 2 * Math.PI * (phases[k + 2] as number);
  const theta3 = 2 * Math.PI * (phases[k + 3] as number);
  const j0 = jumps[k] as number;
  const j1 = jumps[k + 1] as number;
  const j2 = jumps[k + 2] as number;
  const j3 = jumps[k + 3] as number;
  const m0 = slopeChanges[k] as number;
  const m1 = slopeChanges[k + 1] as number;
  const m2 = slopeChanges[k + 2] as number;
  const m3 = slopeChanges[k + 3] as number;
  const cs0 = Math.cos(theta0);
  const ss0 = Math.sin(theta0);
  const cs1 = Math.cos(theta1);
  const ss1 = Math.sin(theta1);
  const cs2 = Math.cos(theta2);
  const ss2 = Math.sin(theta2);
  const cs3 = Math.cos(theta3);
  const ss3 = Math.sin(theta3);
  for (let first = 1; first <= count; first += RESEED_INTERVAL) {
    const isFirst = first === 1;
    let c0 = isFirst ? cs0 : Math.cos(first * theta0);
    let s0 = isFirst ? ss0 : Math.sin(first * theta0);
    let c1 = isFirst ? cs1 : Math.cos(first * theta1);
    let s1 = isFirst ? ss1 : Math.sin(first * theta1);
    let c2 = isFirst ? cs2 : Math.cos(first * theta2);
    let s2 = isFirst ? ss2 : Math.sin(first * theta2);
    let c3 = isFirst ? cs3 : Math.cos(first * theta3);
    let s3 = isFirst ? ss3 : Math.sin(first * theta3);
    const end = 4 * Math.min(count, first + RESEED_INTERVAL - 1);
    for (let i = 4 * (first - 1); i < end; i += 4) {
      s[i] = (s[i] as number) + (j0 * c0 + j1 * c1 + (j2 * c2 + j3 * c3));
      s[i + 1] = (s[i + 1] as number) + (j0 * s0 + j1 * s1 + (j2 * s2 + j3 * s3));
      s[i + 2] = (s[i + 2] as number) + (m0 * c0 + m1 * c1 + (m2 * c2 + m3 * c3));
      s[i + 3] = (s[i + 3] as number) + (m0 * s0 + m1 * s1 + (m2 * s2 + m3 * s3));
      let p = c0;
      c0 = p * cs0 - s0 * ss0;
      s0 = s0 * cs0 + p * ss0;
      p = c1;
      c1 = p * cs1 - s1 * ss1;
      s1 = s1 * cs1 + p * ss1;
      p = c2;
      c2 = p * cs2 - s2 * ss2;
      s2 = s2 * cs2 + p * ss2;
      p = c3;
      c3 = p * cs3 - s3 * ss3;
      s3 = s3 * cs3 + p * ss3;
    }
  }
}

/**
 * {@link addFourBreakpointSums} of four breakpoints without a jump (the samples inside a
 * continuous stretch: most of a sampled ring's): only the slope-change sums. The same numbers to
 * the bit, since there the jump sums would each add a signed zero (0·c0 + 0·c1 + (0·c2 + 0·c3)),
 * which leaves a sum unchanged; half the multiply-adds.
 */
function addFourSlopeChangeSums(s: Float64Array, count: number, k: number): void {
  const theta0 = 2 * Math.PI * (phases[k] as number);
  const theta1 = 2 * Math.PI * (phases[k + 1] as number);
  const theta2 = 2 * Math.PI * (phases[k + 2] as number);
  const theta3 = 2 * Math.PI * (phases[k + 3] as number);
  const m0 = slopeChanges[k] as number;
  const m1 = slopeChanges[k + 1] as number;
  const m2 = slopeChanges[k + 2] as number;
  const m3 = slopeChanges[k + 3] as number;
  const cs0 = Math.cos(theta0);
  const ss0 = Math.sin(theta0);
  const cs1 = Math.cos(theta1);
  const ss1 = Math.sin(theta1);
  const cs2 = Math.cos(theta2);
  const ss2 = Math.sin(theta2);
  const cs3 = Math.cos(theta3);
  const ss3 = Math.sin(theta3);
  for (let first = 1; first <= count; first += RESEED_INTERVAL) {
    const isFirst = first === 1;
    let c0 = isFirst ? cs0 : Math.cos(first * theta0);
    let s0 = isFirst ? ss0 : Math.sin(first * theta0);
    let c1 = isFirst ? cs1 : Math.cos(first * theta1);
    let s1 = isFirst ? ss1 : Math.sin(first * theta1);
    let c2 = isFirst ? cs2 : Math.cos(first * theta2);
    let s2 = isFirst ? ss2 : Math.sin(first * theta2);
    let c3 = isFirst ? cs3 : Math.cos(first * theta3);
    let s3 = isFirst ? ss3 : Math.sin(first * theta3);
    const end = 4 * Math.min(count, first + RESEED_INTERVAL - 1);
    for (let i = 4 * (first - 1); i < end; i += 4) {
      s[i + 2] = (s[i + 2] as number) + (m0 * c0 + m1 * c1 + (m2 * c2 + m3 * c3));
      s[i + 3] = (s[i + 3] as number) + (m0 * s0 + m1 * s1 + (m2 * s2 + m3 * s3));
      let p = c0;
      c0 = p * cs0 - s0 * ss0;
      s0 = s0 * cs0 + p * ss0;
      p = c1;
      c1 = p * cs1 - s1 * ss1;
      s1 = s1 * cs1 + p * ss1;
      p = c2;
      c2 = p * cs2 - s2 * ss2;
      s2 = s2 * cs2 + p * ss2;
      p = c3;
      c3 = p * cs3 - s3 * ss3;
      s3 = s3 * cs3 + p * ss3;
    }
  }
}

/**
 * Fills the breakpoint scratch from the waveform's segments and returns the number of
 * breakpoints (index 0 the period's ends). A segment of duration h from (t0, v0) to (t1, v1)
 * adds v0 and its slope m·T to the terms at t0 and takes v1 and m·T from those at t1; equal
 * times share one breakpoint, so a continuous waveform keeps only its slope changes and a jump
 * its step. A segment shorter than SHORT_SEGMENT_FRACTION adds its closed form to re and im
 * instead; segments of zero length or flat at zero add nothing.
 */
function collectBreakpoints(
  w: Waveform,
  count: number,
  re: Float64Array,
  im: Float64Array,
  pointCount: number,
): number {
  const { periodS, timesS, values } = w;
  if (phases.length < timesS.length + 1) {
    phases = new Float64Array(2 * timesS.length);
    jumps = new Float64Array(2 * timesS.length);
    slopeChanges = new Float64Array(2 * timesS.length);
  }
  const u = phases;
  const jump = jumps;
  const slopeChange = slopeChanges;
  u[0] = 0;
  jump[0] = 0;
  slopeChange[0] = 0;
  let size = 1;
  let t0 = timesS[0] as number;
  let v0 = values[0] as number;
  for (let k = 1; k < pointCount; k++) {
    const t1 = timesS[k] as number;
    const v1 = values[k] as number;
    const durationS = t1 - t0;
    if (durationS > 0 && (v0 !== 0 || v1 !== 0)) {
      const h = durationS / periodS;
      if (h < SHORT_SEGMENT_FRACTION) {
        addSegmentCoefficients(re, im, count, h, (t0 + t1) / periodS, v0, v1);
      } else {
        const slopePerPeriod = (v1 - v0) / h;
        let index = breakpointAt(t0 / periodS, size);
        if (index === size) size++;
        jump[index] = (jump[index] as number) + v0;
        slopeChange[index] = (slopeChange[index] as number) + slopePerPeriod;
        index = breakpointAt(t1 / periodS, size);
        if (index === size) size++;
        jump[index] = (jump[index] as number) - v1;
        slopeChange[index] = (slopeChange[index] as number) - slopePerPeriod;
      }
    }
    t0 = t1;
    v0 = v1;
  }
  return size;
}

/**
 * The breakpoint at fraction u of the period: 0 at the period's ends, the last one when u is
 * its time (times do not decrease), else a new one at index `size`, zeroed.
 */
function breakpointAt(u: number, size: number): number {
  if (u === 0 || u === 1) return 0;
  if (size > 1 && phases[size - 1] === u) return size - 1;
  phases[size] = u;
  jumps[size] = 0;
  slopeChanges[size] = 0;
  return size;
}
