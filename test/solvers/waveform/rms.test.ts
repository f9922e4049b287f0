import { describe, it } from 'vitest';
import { piecewiseLinear } from '../../../solvers/waveform/piecewise-linear.js';
import { rms } from '../../../solvers/waveform/rms.js';
import { expectClose } from '../../helpers/expect-close.js';

// Invented scenario: 100 kHz switching; closed forms in a few roundings justify rel 1e-12.
const T = 1e-5;
const TIGHT = { rel: 1e-12 };

describe('rms', () => {
  it('rms(triangle wave ±Ipk) equals Ipk/√3', () => {
    const peakA = 2.5;
    const w = piecewiseLinear(T, [
      [0, -peakA],
      [0.5 * T, peakA],
      [T, -peakA],
    ]);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.1, triangular waveform (from memory)
    expectClose(rms(w), peakA / Math.sqrt(3), TIGHT);
  });

  it('rms(sawtooth 0 → Ipk with a jump back) equals Ipk/√3', () => {
    const peakA = 6;
    const w = piecewiseLinear(T, [
      [0, 0],
      [T, peakA],
    ]);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.1, triangular waveform (from memory)
    expectClose(rms(w), peakA / Math.sqrt(3), TIGHT);
  });

  it('rms(symmetric square wave ±A) equals A', () => {
    const amplitudeV = 48;
    const w = piecewiseLinear(T, [
      [0, amplitudeV],
      [T / 2, amplitudeV],
      [T / 2, -amplitudeV],
      [T, -amplitudeV],
    ]);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.1, square wave (from memory)
    expectClose(rms(w), amplitudeV, TIGHT);
  });

  it('rms(ramp on a pedestal Ia → Ib for duty D) equals I·√D·√(1 + (ΔI/I)²/3)', () => {
    const duty = 0.4;
    const [startA, endA] = [2, 5];
    const w = piecewiseLinear(T, [
      [0, 0],
      [0, startA],
      [duty * T, endA],
      [duty * T, 0],
      [T, 0],
    ]);
    // Erickson states it with the centre value I and the half ripple ΔI; equal to
    // sqrt(D·(Ia² + Ia·Ib + Ib²)/3), so this checks the segment integral independently.
    const centreA = (startA + endA) / 2;
    const halfRippleA = (endA - startA) / 2;
    const expected = centreA * Math.sqrt(duty) * Math.sqrt(1 + (halfRippleA / centreA) ** 2 / 3);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.1, pulsating waveform with linear ripple (from memory)
    expectClose(rms(w), expected, TIGHT);
    // ref: Erickson & Maksimović, 2nd ed., App. A.2, eq. (A.15) trapezoidal segment (from memory)
    expectClose(rms(w), Math.sqrt((duty * (startA ** 2 + startA * endA + endA ** 2)) / 3), TIGHT);
  });

  it('rms(pieces of several segments) combines as √(Σ Dk·rms_k²)', () => {
    // A flyback-like primary current: ramp 1 → 3 A over 0.45·T, then zero (invented values),
    // plus a constant 0.5 A segment, composed from independent pieces.
    const w = piecewiseLinear(T, [
      [0, 1],
      [0.45 * T, 3],
      [0.45 * T, 0.5],
      [0.7 * T, 0.5],
      [0.7 * T, 0],
      [T, 0],
    ]);
    const expected = Math.sqrt(0.45 * ((1 + 3 + 9) / 3) + 0.25 * 0.25);
    // ref: Erickson & Maksimović, Fundamentals of Power Electronics, 2nd ed., App. A.2, eqs. (A.12)–(A.15) (from memory)
    expectClose(rms(w), expected, TIGHT);
  });
});
