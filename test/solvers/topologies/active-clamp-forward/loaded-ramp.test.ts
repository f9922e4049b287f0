import { describe, expect, it } from 'vitest';
import {
  loadedRamp,
  type RampStage,
} from '../../../../solvers/topologies/active-clamp-forward/loaded-ramp.js';
import { expectClose } from '../../../helpers/expect-close.js';

/**
 * The same circuit stepped in time (midpoint rule, 1 ps): C·dv/dt = I − Σ ik, Lk·dik/dt = v − Vk
 * while the rectifier conducts (ik > 0, or v > Vk from zero), v held at Vin while the body diode
 * conducts (I > Σ ik there).
 */
function stepped(vin: number, drivingA: number, c: number, restS: number, stages: RampStage[]) {
  const dt = 1e-12;
  const i = stages.map(() => 0);
  let v = 0;
  let area = 0;
  let diode = 0;
  const steps = Math.round(restS / dt);
  for (let n = 0; n < steps; n++) {
    const sum = i.reduce((a, b) => a + b, 0);
    const vMid = Math.min(vin, v + ((drivingA - sum) * dt) / (2 * c));
    stages.forEach((s, k) => {
      const next = (i[k] as number) + ((vMid - s.thresholdV) * dt) / s.inductanceH;
      i[k] = Math.max(0, next);
    });
    const after = i.reduce((a, b) => a + b, 0);
    const vNext = v + ((drivingA - (sum + after) / 2) * dt) / c;
    if (vNext >= vin && drivingA > after) diode += dt;
    area += ((v + Math.min(vin, vNext)) / 2) * dt;
    v = Math.min(vin, vNext);
  }
  return { v, area, diode, i };
}

describe('loadedRamp', () => {
  const C = 200e-12;

  it('loadedRamp(one stage) follows the driven LC: v − Vk = I·Z·sin ωt, ik = I·(1 − cos ωt)', () => {
    // Vin 72 V, 0.125 A unheld, one stage at 16 V with 33 µH referred, 86 ns to the gate.
    const stage = { thresholdV: 16, inductanceH: 33e-6 };
    const ramp = loadedRamp(72, 0.125, C, 86e-9, [stage], 72);
    const reachS = (C * 16) / 0.125;
    const t = 86e-9 - reachS;
    const omega = 1 / Math.sqrt(33e-6 * C);
    const z = Math.sqrt(33e-6 / C);
    // ref: Erickson & Maksimović, 2nd ed. (from memory), ch. 19: a parallel LC driven by a
    // constant current from rest (the inductor's current and the capacitor's voltage excursion
    // as the tank's state-plane circle); before the threshold a constant-current ramp (v = I·t/C)
    expectClose(ramp.stageCurrentsA[0] ?? NaN, 0.125 * (1 - Math.cos(omega * t)), { rel: 1e-9 });
    expectClose(72 - ramp.turnOnVoltageV, 16 + 0.125 * z * Math.sin(omega * t), { rel: 1e-9 });
    expectClose(
      ramp.positiveVoltSecondsVs,
      (16 * reachS) / 2 + 16 * t + (0.125 * z * (1 - Math.cos(omega * t))) / omega,
      { rel: 1e-9 },
    );
    expect(ramp.bodyDiodeS).toBe(0);
  });

  it('loadedRamp(two stages, the winding reaching Vin) agrees with the circuit stepped in time', () => {
    // A lighter 0.4 A swing into two stages of thresholds 15.8 and 16.1 V, 120 ns to the gate: the
    // winding reaches Vin, the body diode holds it there, the stages ramp on.
    const stages = [
      { thresholdV: 15.8, inductanceH: 33e-6 },
      { thresholdV: 16.1, inductanceH: 100e-6 },
    ];
    const ramp = loadedRamp(72, 0.4, C, 120e-9, stages, 72);
    const ref = stepped(72, 0.4, C, 120e-9, stages);
    // ref: common practice, Kirchhoff's laws for the node and the inductors, integrated numerically
    expect(ramp.bodyDiodeS).toBeGreaterThan(10e-9);
    expectClose(ramp.bodyDiodeS, ref.diode, { rel: 2e-3 });
    expectClose(ramp.positiveVoltSecondsVs, ref.area, { rel: 1e-4 });
    expectClose(ramp.stageCurrentsA[0] ?? NaN, ref.i[0] ?? NaN, { rel: 1e-4 });
    expectClose(ramp.stageCurrentsA[1] ?? NaN, ref.i[1] ?? NaN, { rel: 1e-4 });
    expectClose(ramp.turnOnVoltageV, 72 - ref.v, { abs: 1e-3 });
  });

  it('loadedRamp(a long dead time) lets a stage stop once the winding falls back below its threshold', () => {
    // 0.05 A into a 10 µH stage at 5 V and a 1 mH one at 3 V over 600 ns: the winding rings about
    // its thresholds and the first stage's current returns to zero.
    const stages = [
      { thresholdV: 5, inductanceH: 10e-6 },
      { thresholdV: 3, inductanceH: 1e-3 },
    ];
    const ramp = loadedRamp(72, 0.05, C, 600e-9, stages, 72);
    const ref = stepped(72, 0.05, C, 600e-9, stages);
    // ref: common practice, Kirchhoff's laws, integrated numerically, the rectifiers blocking
    expectClose(ramp.positiveVoltSecondsVs, ref.area, { rel: 1e-4 });
    expectClose(ramp.stageCurrentsA[0] ?? NaN, ref.i[0] ?? NaN, { abs: 1e-5 });
    expectClose(ramp.stageCurrentsA[1] ?? NaN, ref.i[1] ?? NaN, { rel: 1e-3 });
    expectClose(ramp.turnOnVoltageV, 72 - ref.v, { abs: 1e-2 });
  });

  it('loadedRamp(a stage of huge inductance) gives it the ramp area above its threshold over L', () => {
    const ramp = loadedRamp(72, 0.125, C, 86e-9, [{ thresholdV: 16, inductanceH: 1e3 }], 72);
    const top = (0.125 * 86e-9) / C;
    // ref: common practice, a linear ramp (v = I·t/C) and the triangle above the level
    expectClose(ramp.stageCurrentsA[0] ?? NaN, ((top - 16) ** 2 * C) / (2 * 0.125) / 1e3, {
      rel: 1e-6,
    });
    expectClose(72 - ramp.turnOnVoltageV, top, { rel: 1e-6 });
  });
});
