import { describe, expect, it } from 'vitest';
import {
  forwardLeakageSpike,
  plateauClampA,
  spikeAt,
  stageA,
} from '../../../../solvers/topologies/two-switch-forward/leakage-spike.js';
import { expectClose } from '../../../helpers/expect-close.js';

// Invented values near the audit's reset-winding forward (seed 53 spec 0 at 400 V, full load):
// 10 µH of leakage, 3.33 mH of Lm, 100 pF at the drain, the reset clamp 400.8 V, 1.509 A at
// turn-off of which 0.0628 A magnetizing; damping across the leakage 3·√(Llk/C) or none.
const LLK = 10e-6;
const LM = 3.33e-3;
const C = 100e-12;
const CLAMP_V = 400.8;
const ZL = Math.sqrt(LLK / C);
const WL = 1 / Math.sqrt(LLK * C);
const R = 3 * ZL;

describe('forwardLeakageSpike', () => {
  it('forwardLeakageSpike(lossless, the leakage alone reaches the clamp) holds the node at Vr while the leakage decays to Im', () => {
    const spike = forwardLeakageSpike(LLK, LM, C, Infinity, CLAMP_V, 1.509, 0.0628);
    if (spike === undefined) throw new Error('no spike');
    expect(spike.reachesClamp).toBe(true);
    expect(spike.topV).toBe(CLAMP_V);
    // ref: lossless LC (common practice): ½·Llk·I² = ½·C·Vr² + ½·Llk·i² as the node meets the
    // clamp, reached at asin(Vr/(I·Zl))/ωl
    expectClose(
      0.5 * LLK * 1.509 ** 2,
      0.5 * C * CLAMP_V ** 2 + 0.5 * LLK * spike.clampEntryA ** 2,
      { rel: 1e-9 },
    );
    expectClose(spike.riseS, Math.asin(CLAMP_V / (1.509 * ZL)) / WL, { rel: 1e-7 });
    // ref: Mohan, Undeland, Robbins, 3rd ed. (from memory), §5-3: a current through a series
    // inductance at a fixed voltage falls at V/L, so the plateau lasts Llk·(i − Im)/Vr
    expectClose(spike.holdS, (LLK * (spike.clampEntryA - 0.0628)) / CLAMP_V, { rel: 1e-12 });
    expectClose(plateauClampA(spike, spike.riseS + spike.holdS), 0.0628, { rel: 1e-9 });
    // The drawn spike: the clamp at the rise's end, through the plateau, back to zero after a
    // quarter of the leakage's ring (common practice: an LC ring's quarter period).
    expectClose(spikeAt(spike, spike.riseS * (1 - 1e-9)).voltageV, CLAMP_V, { rel: 1e-6 });
    expect(spikeAt(spike, spike.riseS + spike.holdS / 2)).toEqual({
      voltageV: CLAMP_V,
      currentA: 0,
    });
    expectClose(spike.fallS, Math.PI / (2 * WL), { rel: 1e-12 });
    expectClose(spikeAt(spike, spike.riseS + spike.holdS + spike.fallS * (1 - 1e-9)).voltageV, 0, {
      abs: 1e-5,
    });
  });

  it('forwardLeakageSpike(damped) stage A obeys the circuit: C·dv/dt = iL − v/R, Llk·diL/dt = −v, and the energy R takes', () => {
    // 2.5 A at turn-off: damped, stage A still carries the node to the clamp.
    const spike = forwardLeakageSpike(LLK, LM, C, R, CLAMP_V, 2.5, 0.0628);
    if (spike === undefined) throw new Error('no spike');
    expect(spike.holdS).toBeGreaterThan(0);
    // ref: Kirchhoff's laws on the node and the leakage with R across it (common practice),
    // by central differences along the closed form
    const h = 1e-12;
    for (const t of [5e-9, 20e-9, 40e-9]) {
      const before = stageA(spike, t - h);
      const after = stageA(spike, t + h);
      const at = stageA(spike, t);
      expectClose((C * (after.voltageV - before.voltageV)) / (2 * h), at.currentA, { rel: 1e-5 });
      expectClose(at.leakageA - at.voltageV / R, at.currentA, { rel: 1e-12 });
      expectClose((LLK * (after.leakageA - before.leakageA)) / (2 * h), -at.voltageV, {
        rel: 1e-5,
      });
    }
    // ref: energy balance (common practice): ½·Llk·I² = ½·C·v² + ½·Llk·iL² + ∫v²/R dt at the
    // clamp's entry (the trapezoid rule over 20,000 steps)
    const steps = 20000;
    let dissipatedJ = 0;
    for (let k = 0; k < steps; k++) {
      const a = stageA(spike, (spike.riseS * k) / steps).voltageV;
      const b = stageA(spike, (spike.riseS * (k + 1)) / steps).voltageV;
      dissipatedJ += ((a * a + b * b) / (2 * R)) * (spike.riseS / steps);
    }
    const entry = stageA(spike, spike.riseS);
    expectClose(entry.voltageV, CLAMP_V, { rel: 1e-6 });
    expectClose(
      0.5 * LLK * 2.5 ** 2,
      0.5 * C * CLAMP_V ** 2 + 0.5 * LLK * entry.leakageA ** 2 + dissipatedJ,
      { rel: 1e-6 },
    );
    // Damped, the node meets the clamp later than the lossless ring would.
    expect(spike.riseS).toBeGreaterThan(Math.asin(CLAMP_V / (2.5 * ZL)) / WL);
  });

  it('forwardLeakageSpike(short of the clamp) peaks where the leakage energy above Im plus Lm’s fills C', () => {
    // 0.2 A at turn-off: the rectifier lets go at v1 = Zl·√(I² − Im²) (lossless), then Lm + Llk
    // ring on.
    const spike = forwardLeakageSpike(LLK, LM, C, Infinity, CLAMP_V, 0.2, 0.0628);
    if (spike === undefined) throw new Error('no spike');
    expect(spike.reachesClamp).toBe(false);
    expect(spike.holdS).toBe(0);
    // ref: lossless LC (common practice): ½·C·A² = ½·Llk·(I² − Im²) + ½·(Lm + Llk)·Im²
    expectClose(
      0.5 * C * spike.topV ** 2,
      0.5 * LLK * (0.2 ** 2 - 0.0628 ** 2) + 0.5 * (LM + LLK) * 0.0628 ** 2,
      { rel: 1e-7 },
    );
    expect(spike.topV).toBeLessThan(CLAMP_V);
    // Above the magnetizing ring's own peak Im·Z: the leakage's energy adds to Lm's.
    expect(spike.topV).toBeGreaterThan(0.0628 * Math.sqrt(LM / C));
    // Continuous at the release (the leakage's arc meets Lm's) and at the top.
    const v1 = ZL * Math.sqrt(0.2 ** 2 - 0.0628 ** 2);
    expectClose(spikeAt(spike, spike.releaseS * (1 - 1e-9)).voltageV, v1, { rel: 1e-6 });
    expectClose(spikeAt(spike, spike.releaseS * (1 + 1e-9)).voltageV, v1, { rel: 1e-6 });
    expectClose(spikeAt(spike, spike.releaseS * (1 + 1e-9)).currentA, 0.0628, { rel: 1e-6 });
    expectClose(spikeAt(spike, spike.riseS * (1 - 1e-9)).voltageV, spike.topV, { rel: 1e-9 });
  });

  it('forwardLeakageSpike(released short of the clamp, Lm carries it on) reaches the clamp without a plateau', () => {
    // As the audit's two-switch forward (seed 53 spec 19 at 400 V): 6.78 mH, 50 pF (two
    // switches in series), clamp Vin + 2·Vf = 401.6 V, 0.742 A at turn-off, 0.0309 A magnetizing.
    const spike = forwardLeakageSpike(LLK, 6.78e-3, 50e-12, R, 401.6, 0.742, 0.0309);
    if (spike === undefined) throw new Error('no spike');
    expect(spikeAt(spike, spike.releaseS).voltageV).toBeLessThan(401.6);
    expect(spike.reachesClamp).toBe(true);
    expect(spike.topV).toBe(401.6);
    expect(spike.holdS).toBe(0);
    expectClose(spikeAt(spike, spike.riseS * (1 - 1e-9)).voltageV, 401.6, { rel: 1e-6 });
  });

  it('forwardLeakageSpike(leakage towards zero) tends to the magnetizing ring’s peak Im·Z', () => {
    const spike = forwardLeakageSpike(
      1e-15,
      LM,
      C,
      3 * Math.sqrt(1e-15 / C),
      CLAMP_V,
      1.509,
      0.0628,
    );
    // ref: lossless LC (common practice): without the leakage's energy the node peaks at Im·Z
    expectClose(spike?.topV ?? NaN, 0.0628 * Math.sqrt(LM / C), { rel: 1e-5 });
  });

  it('forwardLeakageSpike() is undefined without leakage, capacitance or load current at turn-off', () => {
    expect(forwardLeakageSpike(0, LM, C, R, CLAMP_V, 1.509, 0.0628)).toBeUndefined();
    expect(forwardLeakageSpike(LLK, LM, 0, R, CLAMP_V, 1.509, 0.0628)).toBeUndefined();
    expect(forwardLeakageSpike(LLK, LM, C, R, CLAMP_V, 0.0628, 0.0628)).toBeUndefined();
  });
});
