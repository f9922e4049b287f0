import { describe, expect, it } from 'vitest';
import { deadTimeSwing } from '../../../../solvers/topologies/active-clamp-forward/dead-time-swing.js';
import { expectClose } from '../../../helpers/expect-close.js';

describe('deadTimeSwing', () => {
  // Vin 48 V, Vc 40 V, Im,v −0.4 A, 200 pF: the drain falls Vc in C·Vc/|Im,v| = 20 ns.
  const C = 200e-12;

  it('deadTimeSwing(held) stops the drain at Vin and adds −Vc/2 over the fall to the reset', () => {
    const swing = deadTimeSwing(48, 40, -0.4, 0.5, C, 100e-9);
    const fallS = (C * 40) / 0.4;
    // ref: common practice, a capacitance charged at constant current ramps linearly,
    // t = C·ΔV/I, and the area of a linear ramp from −Vc to 0 is Vc·t/2
    expectClose(swing.negativeVoltSecondsVs, (40 * fallS) / 2, { rel: 1e-12 });
    expect(swing.positiveVoltSecondsVs).toBe(0);
    expectClose(swing.turnOnVoltageV, 48, { rel: 1e-12 });
  });

  it('deadTimeSwing(unheld) carries the drain to zero and counts the body diode time at Vin', () => {
    const swing = deadTimeSwing(48, 40, -0.4, -0.4, C, 100e-9);
    const fallS = (C * 40) / 0.4;
    const dropS = (C * 48) / 0.4;
    // ref: common practice, t = C·ΔV/I per ramp; the winding then sits at Vin for the rest
    expectClose(swing.bodyDiodeS, 100e-9 - fallS - dropS, { rel: 1e-12 });
    expectClose(swing.positiveVoltSecondsVs, (48 * dropS) / 2 + 48 * swing.bodyDiodeS, {
      rel: 1e-12,
    });
    expect(swing.turnOnVoltageV).toBe(0);
  });

  it('deadTimeSwing(short dead time) turns on partway down, at Vin + Vc − |Im,v|·td/C', () => {
    const swing = deadTimeSwing(48, 40, -0.4, -0.4, C, 10e-9);
    // ref: common practice, constant-current discharge of a capacitance, ΔV = I·t/C
    expectClose(swing.turnOnVoltageV, 48 + 40 - (0.4 * 10e-9) / C, { rel: 1e-12 });
    expect(swing.positiveVoltSecondsVs).toBe(0);
  });
});
