import { describe, expect, it } from 'vitest';
import { fourierCoefficients } from '../../../solvers/waveform/fourier-coefficients.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import type { Waveform } from '../../../solvers/waveform/waveform.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: a 100 kHz period.
const T = 1e-5;

/** The coefficients of orders 1..count as [re, im] pairs. */
function coefficients(w: Waveform, count: number): Array<[number, number]> {
  const re = new Float64Array(count);
  const im = new Float64Array(count);
  fourierCoefficients(w, count, re, im);
  return Array.from(re, (x, i) => [x, im[i] as number]);
}

/** sin(πx)/(πx), 1 at 0. */
function sinc(x: number): number {
  return x === 0 ? 1 : Math.sin(Math.PI * x) / (Math.PI * x);
}

describe('fourierCoefficients', () => {
  it('fourierCoefficients(trapezoid pulse train) equal A·(τ/T)·sinc(nτ/T)·sinc(n·tr/T)·e^(−iω·tc)', () => {
    // Rise and fall of tr, width τ between the half-height points, centred on tc. Edges of
    // 2e-2, 2e-5 (steep, still in the breakpoint sums) and 5e-6 of T (the segments' closed form
    // beside the breakpoint sums).
    const heightA = 3;
    const startS = 0.1 * T;
    const widthS = 0.37 * T;
    for (const riseFraction of [2e-2, 2e-5, 5e-6]) {
      const riseS = riseFraction * T;
      const w = piecewiseLinear(T, [
        [0, 0],
        [startS, 0],
        [startS + riseS, heightA],
        [startS + widthS, heightA],
        [startS + widthS + riseS, 0],
        [T, 0],
      ]);
      const centreS = startS + (widthS + riseS) / 2;
      coefficients(w, 300).forEach(([x, y], i) => {
        const n = i + 1;
        const magnitude = heightA * (widthS / T) * sinc((n * widthS) / T) * sinc(n * riseFraction);
        const angle = (-2 * Math.PI * n * centreS) / T;
        // ref: C. R. Paul, Introduction to Electromagnetic Compatibility, 2nd ed., Sec. 3.2, spectrum of a trapezoidal pulse train (from memory)
        expectClose(x, magnitude * Math.cos(angle), { abs: 1e-10 * heightA });
        // ref: same, the pulse's delay tc as the phase factor e^(−iω·tc) (time-shift theorem)
        expectClose(y, magnitude * Math.sin(angle), { abs: 1e-10 * heightA });
      });
    }
  });

  it('fourierCoefficients(triangle on a large pedestal) give 8A/(π²n²) for odd n, 0 for even n', () => {
    // A triangle of ±A about 1000·A: only the slope changes enter, so the pedestal costs no
    // precision.
    const amplitudeA = 1;
    const pedestalA = 1000;
    const w = piecewiseLinear(T, [
      [0, pedestalA - amplitudeA],
      [0.5 * T, pedestalA + amplitudeA],
      [T, pedestalA - amplitudeA],
    ]);
    coefficients(w, 64).forEach(([x, y], i) => {
      const n = i + 1;
      const amplitude = 2 * Math.sqrt(x * x + y * y);
      const expected = n % 2 === 1 ? (8 * amplitudeA) / (Math.PI ** 2 * n * n) : 0;
      // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.1, f(x) = |x| on (−π, π): π/2 − (4/π)·Σ cos(nx)/n², n odd (from memory)
      expectClose(amplitude, expected, { rel: 1e-12, abs: 1e-15 * amplitudeA });
    });
  });

  it('fourierCoefficients(a wave that repeats, or repeats negated, half a period on) give its odd or even orders only', () => {
    // Invented: a triangle of ±A drawn as two halves meeting at T/2 (as the double-ended grids
    // draw a period), so its second half is its first negated: the sum over the first half
    // alone, doubled at odd orders, zero at even ones. And the same triangle at twice the
    // frequency on a pedestal (each half alike): its even orders are the triangle's at T/2.
    const a = 1.5;
    const negated: Waveform = {
      periodS: T,
      timesS: [0, 0.25 * T, 0.5 * T, 0.5 * T, 0.75 * T, T],
      values: [-a, 0, a, a, 0, -a],
    };
    const repeated: Waveform = {
      periodS: T,
      timesS: [0, 0.25 * T, 0.5 * T, 0.5 * T, 0.75 * T, T],
      values: [2 - a, 2 + a, 2 - a, 2 - a, 2 + a, 2 - a],
    };
    coefficients(negated, 64).forEach(([x, y], i) => {
      const n = i + 1;
      const amplitude = 2 * Math.sqrt(x * x + y * y);
      // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.1, f(x) = |x| on (−π, π): π/2 − (4/π)·Σ cos(nx)/n², n odd (from memory)
      const expected = n % 2 === 1 ? (8 * a) / (Math.PI ** 2 * n * n) : 0;
      expectClose(amplitude, expected, { rel: 1e-12, abs: 1e-15 * a });
    });
    coefficients(repeated, 64).forEach(([x, y], i) => {
      const n = i + 1;
      const m = n / 2;
      const amplitude = 2 * Math.sqrt(x * x + y * y);
      // The same series over T/2: order n = 2m of T is order m of the half period.
      const expected = n % 2 === 0 && m % 2 === 1 ? (8 * a) / (Math.PI ** 2 * m * m) : 0;
      expectClose(amplitude, expected, { rel: 1e-12, abs: 1e-15 * a });
    });
    // The half-period sums against the whole period's: one collinear point more in the first
    // half only (it changes nothing of the wave) takes the general path.
    const general: Waveform = {
      periodS: T,
      timesS: [0, 0.125 * T, 0.25 * T, 0.5 * T, 0.5 * T, 0.75 * T, T],
      values: [-a, -0.5 * a, 0, a, a, 0, -a],
    };
    const viaHalves = coefficients(negated, 64);
    coefficients(general, 64).forEach(([x, y], i) => {
      const [hx, hy] = viaHalves[i] as [number, number];
      expectClose(hx, x, { rel: 1e-12, abs: 1e-15 * a });
      expectClose(hy, y, { rel: 1e-12, abs: 1e-15 * a });
    });
  });

  it('fourierCoefficients(invented mixed waveform) match composite Simpson quadrature', () => {
    // Ramps, jumps (one at the period's end), a flat stretch at zero, a sampled decaying ring,
    // and steep edges of 0.9e-5 and 1.1e-5 of T on either side of the closed-form limit.
    const points: Array<[number, number]> = [
      [0, 0.3],
      [0.05, 2.0],
      [0.05, 2.4],
      [0.35, 3.1],
      [0.35 + 0.9e-5, -0.5],
      [0.5, -0.5],
      [0.5 + 1.1e-5, 1.0],
      [0.6, 1.0],
      [0.6, 0],
      [0.7, 0],
    ];
    for (let j = 1; j <= 12; j++) {
      const fraction = 0.7 + (0.2 * j) / 12;
      points.push([fraction, 0.4 * Math.exp(-j / 4) * Math.sin((j * Math.PI) / 3)]);
    }
    points.push([1, 0.8]);
    const w = piecewiseLinear(
      T,
      points.map(([fraction, value]) => [fraction * T, value] as [number, number]),
    );
    const count = 64;
    coefficients(w, count).forEach(([x, y], i) => {
      const omega = (2 * Math.PI * (i + 1)) / T;
      let sumRe = 0;
      let sumIm = 0;
      for (let k = 1; k < w.timesS.length; k++) {
        const t0 = w.timesS[k - 1] as number;
        const t1 = w.timesS[k] as number;
        if (t1 <= t0) continue;
        const v0 = w.values[k - 1] as number;
        const v1 = w.values[k] as number;
        // Even interval counts with ω·step ≤ 0.01: Simpson's error ~(ω·step)⁴/180 per unit.
        const intervals = 2 * Math.ceil((omega * (t1 - t0)) / 0.02 + 1);
        const stepS = (t1 - t0) / intervals;
        for (let j = 0; j <= intervals; j++) {
          const weight = j === 0 || j === intervals ? 1 : j % 2 === 1 ? 4 : 2;
          const t = t0 + j * stepS;
          const value = v0 + ((v1 - v0) * j) / intervals;
          sumRe += ((weight * stepS) / 3) * value * Math.cos(omega * t);
          sumIm -= ((weight * stepS) / 3) * value * Math.sin(omega * t);
        }
      }
      // ref: Abramowitz & Stegun, Handbook of Mathematical Functions, 25.4.5 Simpson's rule (from memory)
      expectClose(x, sumRe / T, { abs: 1e-9 });
      // ref: same quadrature of (1/T)∫ w(t)·e^(−iωt) dt, the imaginary part
      expectClose(y, sumIm / T, { abs: 1e-9 });
    });
  });

  it('fourierCoefficients(w, N) are the first N of fourierCoefficients(w, 2N), bit for bit', () => {
    // A coefficient does not depend on how many are taken (the winding loss sums on from a
    // shorter spectrum); 300 and 600 orders cross the rotations' reseed at order 257.
    const w = piecewiseLinear(T, [
      [0, 0],
      [0, 1.2],
      [0.37 * T, 2.6],
      [0.37 * T + 3e-5 * T, 0],
      [T, 0],
    ]);
    const short = coefficients(w, 300);
    // ref: common practice (Xn = (1/T)∫ w·e^(−iωn·t) dt involves order n only)
    expect(coefficients(w, 600).slice(0, 300)).toEqual(short);
  });
});
