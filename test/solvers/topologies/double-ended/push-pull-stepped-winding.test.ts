import { describe, expect, it } from 'vitest';
import {
  FREE,
  ON,
  steppedStretch,
  type SteppedCircuit,
} from '../../../../solvers/topologies/double-ended/push-pull-stepped-stretch.js';
import {
  WINDING_A,
  WINDING_HELD,
  stepWindingStretch,
  windingMaps,
} from '../../../../solvers/topologies/double-ended/push-pull-stepped-winding.js';

// An invented push-pull primary (not any product): 36 V, 1 µH of leakage a half, 100 pF
// switches, 10·√(Llk/C) across each leakage, 0.08 Ω a half, Lm 150 µH, the clamp 108 V above
// the rail, 24 pF of rectifier capacitance referred across the winding; switch a on, drain b
// free, the winding held at zero as the referred load rises from 0.4 to 0.7 A over 300 ns, so
// the transformer's current passes the load and the winding is let go within the stretch.
const VIN = 36;
const LLK = 1e-6;
const C = 100e-12;
const RD = 10 * Math.sqrt(LLK / C);
const RP = 0.08;
const LM = 150e-6;
const CW = 24e-12;
const SPAN_S = 300e-9;
const STEPS = 300;
const load = (t: number) => 0.4 + (0.3 * t) / SPAN_S;

/**
 * The same equations stepped by RK4 as written in a textbook (ref: the classical fourth-order
 * Runge–Kutta method, common practice; the circuit's equations as the header of
 * push-pull-stepped-winding.ts states them): the winding held at zero until the transformer's
 * current less Im passes the load, then free with Cw·de/dt = ia − ib − Im − il.
 */
function reference(start: number[]): { s: number[]; peakA: number; heldSteps: number } {
  let isHeld = true;
  const currents = (y: number[]) => {
    const e = y[5]!;
    return [(RD * y[0]! + VIN - y[2]! - e) / (RD + RP), (RD * y[1]! + VIN - y[3]! + e) / (RD + RP)];
  };
  const rates = (y: number[], il: number): number[] => {
    const e = y[5]!;
    const [ia, ib] = currents(y) as [number, number];
    return [
      (VIN - y[2]! - e - RP * ia) / LLK,
      (VIN - y[3]! + e - RP * ib) / LLK,
      0,
      ib / C,
      e / LM,
      isHeld ? 0 : (ia - ib - y[4]! - il) / CW,
    ];
  };
  let s = [...start];
  let peakA = -Infinity;
  let heldSteps = 0;
  const h = SPAN_S / STEPS;
  for (let n = 0; n < STEPS; n++) {
    const t = n * h;
    const k1 = rates(s, load(t));
    const k2 = rates(
      s.map((x, i) => x + (h / 2) * k1[i]!),
      load(t + h / 2),
    );
    const k3 = rates(
      s.map((x, i) => x + (h / 2) * k2[i]!),
      load(t + h / 2),
    );
    const k4 = rates(
      s.map((x, i) => x + h * k3[i]!),
      load(t + h),
    );
    s = s.map((x, i) => x + (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!));
    const [ia, ib] = currents(s) as [number, number];
    if (isHeld) {
      heldSteps += 1;
      if (ia - ib - s[4]! > load(t + h)) isHeld = false;
    }
    peakA = Math.max(peakA, ia);
  }
  return { s, peakA, heldSteps };
}

describe('stepWindingStretch', () => {
  it('steps as RK4 itself, the winding let go as the transformer’s current passes the load', () => {
    const k: SteppedCircuit = {
      vin: VIN,
      llk: LLK,
      c: C,
      rp: RP,
      rd: RD,
      lm: LM,
      top: VIN + 108,
      perSum: 1 / (RD + RP),
      halfSum: (RD + RP) / 2,
    };
    // Half a’s leakage at 0.3 A and b’s at 0.2 A: the transformer’s current at e = 0, less
    // Im = −0.1 A, starts at 0.24 A against the load’s 0.4 A and rises with a’s leakage.
    const start = [0.3, 0.2, 0, VIN, -0.1, 0];
    const s = Float64Array.from(start);
    const drains = Int8Array.from([ON, FREE]);
    const winding = Int8Array.from([WINDING_HELD]);
    const peaks = { switchPeakA: -Infinity, drainAPeakV: 0, drainBPeakV: 0 };
    const stretch = steppedStretch(load, 0, SPAN_S, STEPS);
    stepWindingStretch(k, CW, s, stretch, windingMaps(), drains, winding, peaks);
    const want = reference(start);
    // The winding was let go within the stretch, not at its start or end.
    expect(want.heldSteps).toBeGreaterThan(1);
    expect(want.heldSteps).toBeLessThan(STEPS);
    expect(winding[0]).toBe(WINDING_A);
    // The drain stays inside its clamps, so both run the same steps; the maps' products differ
    // from the stages' in rounding alone.
    for (let i = 0; i < 6; i++) {
      expect(Math.abs(s[i]! - want.s[i]!)).toBeLessThan(1e-9 * Math.max(1, Math.abs(want.s[i]!)));
    }
    expect(peaks.switchPeakA).toBeCloseTo(want.peakA, 9);
    expect(drains[1]).toBe(FREE);
  });
});
