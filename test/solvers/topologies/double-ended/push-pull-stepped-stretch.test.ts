import { describe, expect, it } from 'vitest';
import {
  FREE,
  ON,
  stepStretch,
  steppedStretch,
  type SteppedCircuit,
} from '../../../../solvers/topologies/double-ended/push-pull-stepped-stretch.js';

// An invented push-pull primary (not any product): 200 V, 10 µH of leakage a half, 100 pF
// switches, 10·√(Llk/C) across each leakage, 0.08 Ω a half, Lm 2.4 mH, the clamp 600 V above
// the rail; switch a on, drain b free. The referred load falls from 2 to 0 A over 1 µs, so the
// winding goes from freewheeling to rectifier a's conduction within the stretch (the case the
// affine maps hand back to RK4 itself).
const VIN = 200;
const LLK = 10e-6;
const C = 100e-12;
const RD = 10 * Math.sqrt(LLK / C);
const RP = 0.08;
const LM = 2.4e-3;
const TOP = VIN + 600;
const SPAN_S = 1e-6;
const STEPS = 320;
const load = (t: number) => 2 - (2 * t) / SPAN_S;

/**
 * The same equations stepped by RK4 as written in a textbook, the winding's mode read from the
 * state at each stage (ref: the classical fourth-order Runge–Kutta method, common practice; the
 * circuit's equations as the header of push-pull-short-dead-time.ts states them).
 */
function reference(start: number[]): { s: number[]; peakA: number } {
  const rates = (y: number[], il: number, isFreeB: boolean): number[] => {
    const sum = RD + RP;
    const xm = (RD * (y[0]! - y[1]!) + y[3]! - y[2]!) / sum - y[4]!;
    const e = xm > il ? (sum * (xm - il)) / 2 : xm < -il ? (sum * (xm + il)) / 2 : 0;
    const ia = (RD * y[0]! + VIN - y[2]! - e) / sum;
    const ib = (RD * y[1]! + VIN - y[3]! + e) / sum;
    return [
      (VIN - y[2]! - e - RP * ia) / LLK,
      (VIN - y[3]! + e - RP * ib) / LLK,
      0,
      isFreeB ? ib / C : 0,
      e / LM,
    ];
  };
  let s = [...start];
  let peakA = -Infinity;
  const h = SPAN_S / STEPS;
  for (let n = 0; n < STEPS; n++) {
    const t = n * h;
    const k1 = rates(s, load(t), true);
    const k2 = rates(
      s.map((x, i) => x + (h / 2) * k1[i]!),
      load(t + h / 2),
      true,
    );
    const k3 = rates(
      s.map((x, i) => x + (h / 2) * k2[i]!),
      load(t + h / 2),
      true,
    );
    const k4 = rates(
      s.map((x, i) => x + h * k3[i]!),
      load(t + h),
      true,
    );
    s = s.map((x, i) => x + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!));
    const sum = RD + RP;
    const il = load(t + h);
    const xm = (RD * (s[0]! - s[1]!) + s[3]! - s[2]!) / sum - s[4]!;
    const e = xm > il ? (sum * (xm - il)) / 2 : xm < -il ? (sum * (xm + il)) / 2 : 0;
    peakA = Math.max(peakA, (RD * s[0]! + VIN - s[2]! - e) / sum);
  }
  return { s, peakA };
}

describe('stepStretch', () => {
  it('steps as RK4 itself through the winding’s change of mode', () => {
    const k: SteppedCircuit = {
      vin: VIN,
      llk: LLK,
      c: C,
      rp: RP,
      rd: RD,
      lm: LM,
      top: TOP,
      perSum: 1 / (RD + RP),
      halfSum: (RD + RP) / 2,
    };
    const start = [1, 0, 0, VIN, -0.05];
    const s = Float64Array.from(start);
    const drains = Int8Array.from([ON, FREE]);
    const peaks = { switchPeakA: -Infinity, drainPeakV: -Infinity };
    stepStretch(k, s, steppedStretch(load, 0, SPAN_S, STEPS), drains, peaks);
    const want = reference(start);
    // The drain stays inside its clamps here, so both run the same steps; the maps' products
    // differ from the stages' in rounding alone.
    for (let i = 0; i < 5; i++) {
      expect(Math.abs(s[i]! - want.s[i]!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(want.s[i]!)));
    }
    expect(peaks.switchPeakA).toBeCloseTo(want.peakA, 9);
    expect(drains[1]).toBe(FREE);
  });
});
