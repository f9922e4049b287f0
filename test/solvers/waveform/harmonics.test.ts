import { describe, expect, it } from 'vitest';
import { average } from '../../../solvers/waveform/average.js';
import { harmonics } from '../../../solvers/waveform/harmonics.js';
import type { Waveform } from '../../../solvers/waveform/waveform.js';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { valueAt } from '../../../solvers/waveform/value-at.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: 100 kHz switching. Coefficients in double precision: absolute errors of
// order ε·T/(2π·h) of the waveform's scale for its shortest segment h (1e-13 at h = 1e-4·T; the
// breakpoint sums of fourierCoefficients), so 1e-12 of the amplitude scale is ample.
const T = 1e-5;

function squareWave(amplitude: number): Waveform {
  return piecewiseLinear(T, [
    [0, amplitude],
    [0.5 * T, amplitude],
    [0.5 * T, -amplitude],
    [T, -amplitude],
  ]);
}

function pulseTrain(height: number, duty: number): Waveform {
  return piecewiseLinear(T, [
    [0, height],
    [duty * T, height],
    [duty * T, 0],
    [T, 0],
  ]);
}

/** A triangle of base `widthS` and given height, starting at 0, zero elsewhere. */
function triangleSpike(height: number, widthS: number): Waveform {
  return piecewiseLinear(T, [
    [0, 0],
    [widthS / 2, height],
    [widthS, 0],
    [T, 0],
  ]);
}

/** The partial sum of Parseval's identity: average² + Σ amplitude²/2. */
function parsevalSum(w: Waveform, count: number): number {
  let sum = average(w) ** 2;
  for (const h of harmonics(w, count)) sum += h.amplitude ** 2 / 2;
  return sum;
}

describe('harmonics', () => {
  it('harmonics(square wave ±A) has amplitude 4A/(nπ) for odd n and 0 for even n', () => {
    const amplitudeV = 10;
    const result = harmonics(squareWave(amplitudeV), 60);
    for (const h of result) {
      const n = h.order;
      const expected = n % 2 === 1 ? (4 * amplitudeV) / (n * Math.PI) : 0;
      // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.1, Example 1 (from memory)
      expectClose(h.amplitude, expected, { abs: 1e-12 * amplitudeV });
      if (n % 2 === 1) {
        // ref: Kreyszig, 10th ed., Sec. 11.1, Example 1: a pure sine series, sin = cos(· − π/2) (from memory)
        expectClose(h.phaseRad, -Math.PI / 2, { abs: 1e-12 });
      }
    }
  });

  it('harmonics(sawtooth −A → A) has amplitude 2A/(nπ) and phase +π/2 for every n', () => {
    // x(t) = A·(2t/T − 1) = −(2A/π)·Σ sin(nωt)/n; Kreyszig's f(x) = x on (−π, π) shifted by half a period.
    const peakA = 1.5;
    const sawtooth = piecewiseLinear(T, [
      [0, -peakA],
      [T, peakA],
    ]);
    for (const h of harmonics(sawtooth, 60)) {
      // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.1, f(x) = x on (−π, π) (from memory)
      expectClose(h.amplitude, (2 * peakA) / (h.order * Math.PI), { rel: 1e-12 });
      // ref: same series: −sin(nωt) = cos(nωt + π/2)
      expectClose(h.phaseRad, Math.PI / 2, { abs: 1e-12 });
    }
  });

  it('harmonics(pulse train of duty D) has amplitude 2A·|sin(nπD)|/(nπ), up to order 2000', () => {
    const [heightA, duty] = [2, 0.3];
    const result = harmonics(pulseTrain(heightA, duty), 2000);
    for (const h of result) {
      const n = h.order;
      const expected = (2 * heightA * Math.abs(Math.sin(n * Math.PI * duty))) / (n * Math.PI);
      // ref: Oppenheim & Willsky, Signals and Systems, 2nd ed., Example 3.5, a_k = sin(kω₀T₁)/(kπ) (from memory)
      expectClose(h.amplitude, expected, { abs: 1e-12 * heightA });
    }
  });

  it('harmonics(pulse of width 1e-6·T) keeps full precision where ω·Δt is tiny', () => {
    const [heightA, duty] = [5, 1e-6];
    for (const h of harmonics(pulseTrain(heightA, duty), 1000)) {
      const expected = (2 * heightA * Math.sin(h.order * Math.PI * duty)) / (h.order * Math.PI);
      // ref: Oppenheim & Willsky, Signals and Systems, 2nd ed., Example 3.5 (from memory)
      expectClose(h.amplitude, expected, { rel: 1e-12 });
    }
  });

  it('harmonics(triangle spike) has amplitude (A·w/T)·sinc²(nπw/(2T)), for short and wide spikes', () => {
    // A periodic train's coefficients are the pulse's transform at nω divided by T; the
    // triangle Λ transforms to sinc². Both ramps of the spike exercise the odd (ramp) kernel.
    const heightA = 3;
    for (const widthFraction of [1e-7, 1e-3, 0.2]) {
      const widthS = widthFraction * T;
      for (const h of harmonics(triangleSpike(heightA, widthS), 1500)) {
        const u = (h.order * Math.PI * widthFraction) / 2;
        const expected = heightA * widthFraction * (Math.sin(u) / u) ** 2;
        // ref: Bracewell, The Fourier Transform and Its Applications, 3rd ed., Λ(x) ⊃ sinc²(s) (from memory)
        expectClose(h.amplitude, expected, { rel: 1e-10, abs: 1e-13 * heightA });
      }
    }
  });

  it('harmonics(short zero-mean ramp) match Simpson quadrature of the Fourier integral', () => {
    // Only the ramp −A → +A over δ is non-zero: its amplitudes, about A·ω·δ²/(3T), are far
    // below the jumps' A/(πn). At δ = 1e-7·T the segment's closed form takes it (relative
    // accuracy); at 1e-4·T the breakpoint sums, whose end terms cancel to an absolute error of
    // about ε·A·T/(2π·δ), 1e-13·A, held here to the file's 1e-12 of the amplitude scale.
    const heightA = 2;
    const startS = 0.3 * T;
    const cases = [
      { widthFraction: 1e-7, tolerance: { rel: 1e-9 } },
      { widthFraction: 1e-4, tolerance: { rel: 1e-9, abs: 1e-12 * heightA } },
    ];
    for (const { widthFraction, tolerance } of cases) {
      const widthS = widthFraction * T;
      const w = piecewiseLinear(T, [
        [0, 0],
        [startS, 0],
        [startS, -heightA],
        [startS + widthS, heightA],
        [startS + widthS, 0],
        [T, 0],
      ]);
      const result = harmonics(w, 1000);
      for (const h of result) {
        const omega = 2 * Math.PI * h.frequencyHz;
        // About the ramp's midpoint, w = 2A·u/δ is odd in u, so (2/T)·|∫ w·e^(−iωu) du| reduces
        // to (2/T)·2∫₀^(δ/2) (2A·u/δ)·sin(ωu) du: a positive integrand, free of cancellation.
        const intervals = 200;
        const stepS = widthS / 2 / intervals;
        let sum = 0;
        for (let j = 0; j <= intervals; j++) {
          const weight = j === 0 || j === intervals ? 1 : j % 2 === 1 ? 4 : 2;
          const u = j * stepS;
          sum += weight * ((2 * heightA * u) / widthS) * Math.sin(omega * u);
        }
        const expected = (2 / T) * 2 * (stepS / 3) * sum;
        // ref: Abramowitz & Stegun, Handbook of Mathematical Functions, 25.4.5 Simpson's rule (from memory); error ~(ωh)⁴/180 ≪ 1e-9 here
        expectClose(h.amplitude, expected, tolerance);
      }
    }
  });

  it('harmonics(w, N) satisfy Parseval for a discontinuous waveform within the 1/N tail bound', () => {
    // Invented flyback primary current: jump to 1.2 A, ramp to 2.6 A at 0.37·T, jump to 0.
    const w = piecewiseLinear(T, [
      [0, 0],
      [0, 1.2],
      [0.37 * T, 2.6],
      [0.37 * T, 0],
      [T, 0],
    ]);
    const count = 2000;
    // Integrating by parts twice bounds each amplitude by α/n + β/n², with α = Σ|jumps|/π and
    // β = T·Σ|slope changes|/(2π²); hence the tail Σ_{n>N} amplitude²/2 is at most
    // (α²/N + α·β/N² + β²/(3N³))/2.
    const slopeTimesT = 1.4 / 0.37;
    const alpha = (1.2 + 2.6) / Math.PI;
    const beta = (2 * slopeTimesT) / (2 * Math.PI ** 2);
    const tail =
      (alpha ** 2 / count + (alpha * beta) / count ** 2 + beta ** 2 / (3 * count ** 3)) / 2;
    const deficit = rms(w) ** 2 - parsevalSum(w, count);
    // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.6, Bessel's inequality (from memory)
    expect(deficit).toBeGreaterThanOrEqual(-1e-12);
    // ref: Kreyszig, 10th ed., Sec. 11.6, Parseval's identity, with the tail bound above (from memory)
    expect(deficit).toBeLessThanOrEqual(tail);
  });

  it('harmonics(w, N) satisfy Parseval for a continuous trapezoid within the 1/N³ tail bound', () => {
    // Invented trapezoid: rises over 0.1·T, holds to 0.5·T, falls by 0.6·T, rests at 0.
    const heightV = 4;
    const w = piecewiseLinear(T, [
      [0, 0],
      [0.1 * T, heightV],
      [0.5 * T, heightV],
      [0.6 * T, 0],
      [T, 0],
    ]);
    const count = 100;
    // No jumps (α = 0): four slope changes of heightV/(0.1·T) each.
    const beta = (4 * (heightV / 0.1)) / (2 * Math.PI ** 2);
    const tail = beta ** 2 / (6 * count ** 3);
    const deficit = rms(w) ** 2 - parsevalSum(w, count);
    // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.6, Bessel's inequality (from memory)
    expect(deficit).toBeGreaterThanOrEqual(-1e-12);
    // ref: Kreyszig, 10th ed., Sec. 11.6, Parseval's identity, with the tail bound above (from memory)
    expect(deficit).toBeLessThanOrEqual(tail);
  });

  it('harmonics(w, N) rebuild a continuous waveform as average + Σ amplitude·cos(2πft + phase)', () => {
    const w = piecewiseLinear(T, [
      [0, 0],
      [0.1 * T, 4],
      [0.5 * T, 4],
      [0.6 * T, 0],
      [T, 0],
    ]);
    const count = 1000;
    const result = harmonics(w, count);
    // Truncation error ≤ Σ_{n>N} β/n² ≤ β/N, with β as in the Parseval check above.
    const bound = (4 * (4 / 0.1)) / (2 * Math.PI ** 2) / count;
    for (const fraction of [0.03, 0.1, 0.27, 0.5, 0.55, 0.8, 0.99]) {
      const t = fraction * T;
      let sum = average(w);
      for (const h of result)
        sum += h.amplitude * Math.cos(2 * Math.PI * h.frequencyHz * t + h.phaseRad);
      // ref: Kreyszig, Advanced Engineering Mathematics, 10th ed., Sec. 11.1, Theorem 1: convergence at points of continuity (from memory)
      expectClose(sum, valueAt(w, t), { abs: bound });
    }
  });

  it('harmonics(w, count) reports order n at frequency n/T', () => {
    const result = harmonics(squareWave(1), 5);
    // ref: common practice (the n-th harmonic of a period T lies at n/T)
    expect(result.map((h) => h.order)).toEqual([1, 2, 3, 4, 5]);
    for (const h of result) {
      // ref: common practice (the n-th harmonic of a period T lies at n/T)
      expectClose(h.frequencyHz, h.order / T, { rel: 1e-15 });
    }
    // ref: common practice (zero harmonics requested, none returned)
    expect(harmonics(squareWave(1), 0)).toEqual([]);
  });

  it('harmonics throws RangeError for a count that is not a non-negative integer', () => {
    for (const count of [-1, 2.5, NaN, Infinity]) {
      // ref: common practice (ECMAScript RangeError for an argument outside its allowed range)
      expect(() => harmonics(squareWave(1), count)).toThrow(RangeError);
    }
  });
});
