import { describe, expect, it } from 'vitest';
import { pushPullShortDeadTime } from '../../../../solvers/topologies/double-ended/push-pull-short-dead-time.js';

// An invented push-pull primary (not any product): 200 V, 10 µH of leakage a half, 100 pF
// switches, the damping resistance 10·√(Llk/C) across each leakage, Lm 5 mH, the outputs' 0.5 A
// referred held, 100 kHz (5 µs a half), the gate on for 2 µs, a clamp 600 V above the rail.
// The dead time, 3 µs, is some 15 periods of one leakage's ring with one drain (199 ns), so the
// drain that opened has rung down to the rail by the other switch's turn-on (its Q of 10 takes
// e^(−π·15/10), under 1 %, of it): the turn-on ring starts from the rail, and its first crests
// are a damped LC step's.
const LLK = 10e-6;
const C = 100e-12;
const Z = Math.sqrt(LLK / C);
const BASE = {
  inputV: 200,
  leakageH: LLK,
  capacitanceF: C,
  loopOhm: 0,
  dampingOhm: 10 * Z,
  magnetizingH: 5e-3,
  magnetizingStartA: -0.04,
  clampV: 600,
  halfS: 5e-6,
  onS: 2e-6,
  releaseS: 0.1e-6,
  referredInductorA: () => 0.5,
};

describe('pushPullShortDeadTime', () => {
  it('a long dead time: the turn-on ring is a damped LC step from the rail', () => {
    const half = pushPullShortDeadTime(BASE);
    if (half === undefined) throw new Error('no periodic half');
    // The ring of both leakages with the off drain: ω = 1/√(2·Llk·C), Z2 = √(2·Llk/C), each
    // leakage's R across it puts R/(ω·Llk) = 10·√2 on the ring's Q. A second-order step's first
    // overshoot is e^(−π·ζ/√(1−ζ²)), ζ = 1/(2·Q), of the step, and its current's first crest
    // about e^(−π/(4·Q)) of step/Z2 (ref: the damped second-order step response, common
    // practice, from memory). The step: the off drain from the rail (Vin above ground) to its
    // driven level, Vp = Vin above the rail.
    const q = 10 * Math.SQRT2;
    const zeta = 1 / (2 * q);
    const overshoot = Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta));
    const vp = BASE.inputV;
    expect(half.turnOnDrainV).toBeCloseTo(BASE.inputV, -1);
    expect(half.drainPeakV - BASE.inputV).toBeGreaterThan(0.98 * vp * (1 + overshoot));
    expect(half.drainPeakV - BASE.inputV).toBeLessThan(1.02 * vp * (1 + overshoot));
    // The driven switch: the referred load and the magnetizing current (−Vp·onS/(2·Lm) at the
    // turn-on, the flux's balance; some −0.036 A at the crest) with the ring's current on top,
    // within 4 % (the ring starts as the commutation ends, not as a clean step).
    const ringA = (vp / Math.sqrt((2 * LLK) / C)) * Math.exp(-Math.PI / (4 * q));
    const imA = -(vp * BASE.onS) / (2 * BASE.magnetizingH) + (vp * 0.1e-6) / BASE.magnetizingH;
    expect(half.switchPeakA / (0.5 + imA + ringA)).toBeGreaterThan(0.96);
    expect(half.switchPeakA / (0.5 + imA + ringA)).toBeLessThan(1.04);
  });

  it('takes no half without damping, leakage or a gate turn-off within the half', () => {
    expect(pushPullShortDeadTime({ ...BASE, dampingOhm: 0 })).toBeUndefined();
    expect(pushPullShortDeadTime({ ...BASE, leakageH: 0 })).toBeUndefined();
    expect(pushPullShortDeadTime({ ...BASE, onS: BASE.halfS })).toBeUndefined();
  });
});
