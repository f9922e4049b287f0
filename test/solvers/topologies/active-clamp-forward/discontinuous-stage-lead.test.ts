import { describe, expect, it } from 'vitest';
import { deadTimeSwing } from '../../../../solvers/topologies/active-clamp-forward/dead-time-swing.js';
import { discontinuousStageLeadS } from '../../../../solvers/topologies/active-clamp-forward/discontinuous-stage-lead.js';
import { expectClose } from '../../../helpers/expect-close.js';

/** ∫ max(0, v(t) − level) dt by the midpoint rule over `steps` pieces of [0, t1]. */
function areaAbove(v: (t: number) => number, t1: number, level: number, steps = 200_000): number {
  let sum = 0;
  const dt = t1 / steps;
  for (let i = 0; i < steps; i++) sum += Math.max(0, v((i + 0.5) * dt) - level) * dt;
  return sum;
}

describe('discontinuousStageLeadS', () => {
  // Vin 72 V, Vc 9 V, Im,v −0.125 A, 200 pF, 100 ns: the drain reaches Vin after C·Vc/|Im,v|
  // = 14.4 ns, then the unheld 0.125 A ramps the winding at |I|/C = 0.625 V/ns.
  const C = 200e-12;
  const fallS = (C * 9) / 0.125;

  it('discontinuousStageLeadS(partial swing) is the ramp area above the threshold over the headroom', () => {
    const swing = deadTimeSwing(72, 9, -0.125, -0.125, C, 100e-9);
    expect(swing.bodyDiodeS).toBe(0);
    const ramp = (t: number) => (0.125 * t) / C;
    // ref: common practice, a capacitance charged at constant current ramps linearly (v = I·t/C);
    // the area above the level integrated numerically (midpoint rule), against the closed form's
    // similar triangles
    const expectedVs = areaAbove(ramp, 100e-9 - fallS, 16);
    expectClose(discontinuousStageLeadS(swing, 72, 16, 71.5), expectedVs / (71.5 - 16), {
      rel: 1e-6,
    });
  });

  it('discontinuousStageLeadS(complete swing) adds the body diode time whole, the on-state', () => {
    // −0.4 A: the drain falls 72 V in 36 ns and the body diode conducts for the rest; the
    // on-voltage 70 V (the on-state's drops).
    const swing = deadTimeSwing(72, 9, -0.4, -0.4, C, 100e-9);
    const fall = (C * 9) / 0.4;
    const drop = (C * 72) / 0.4;
    const ramp = (t: number) => (0.4 * t) / C;
    // ref: common practice, the winding ramps at I/C until the body diode conducts
    // (t = C·ΔV/I); with the diode on the circuit is the on-state's, which the stage sees
    const expectedVs = areaAbove(ramp, drop, 30);
    expectClose(swing.bodyDiodeS, 100e-9 - fall - drop, { rel: 1e-12 });
    expectClose(
      discontinuousStageLeadS(swing, 72, 30, 70),
      expectedVs / (70 - 30) + swing.bodyDiodeS,
      { rel: 1e-6 },
    );
  });

  it('discontinuousStageLeadS(zero threshold) is the whole area over Vin, the lead Lm takes', () => {
    const swing = deadTimeSwing(72, 9, -0.125, -0.125, C, 100e-9);
    // ref: common practice, with no threshold the stage sees the whole volt-seconds (as Lm does)
    expectClose(discontinuousStageLeadS(swing, 72, 0, 72), swing.positiveVoltSecondsVs / 72, {
      rel: 1e-12,
    });
  });

  it('discontinuousStageLeadS(threshold above the ramp, inductors holding) is 0', () => {
    const partial = deadTimeSwing(72, 9, -0.125, -0.125, C, 100e-9);
    const top = 72 - partial.turnOnVoltageV;
    // ref: common practice, a diode below its threshold carries nothing
    expect(discontinuousStageLeadS(partial, 72, top + 0.1, 71.5)).toBe(0);
    expect(discontinuousStageLeadS(deadTimeSwing(72, 9, -0.125, 0.2, C, 100e-9), 72, 5, 72)).toBe(
      0,
    );
  });
});
