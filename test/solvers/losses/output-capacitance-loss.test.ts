import { describe, it } from 'vitest';
import { outputCapacitanceLoss } from '../../../solvers/losses/output-capacitance-loss.js';
import { expectClose } from '../../helpers/expect-close.js';

describe('outputCapacitanceLoss', () => {
  it('outputCapacitanceLoss(C, V, fs) is the stored energy ½·C·V² once per period', () => {
    const capacitanceF = 150e-12;
    const voltageV = 390;
    const frequencyHz = 65e3;
    // Stored energy by integrating v·dq = C·v·dv from 0 to V (midpoint rule, exact for a line).
    const steps = 1000;
    let energyJ = 0;
    for (let k = 0; k < steps; k++) {
      const v = ((k + 0.5) / steps) * voltageV;
      energyJ += capacitanceF * v * (voltageV / steps);
    }
    // ref: Erickson & Maksimović, 2nd ed., §4.3.3 (from memory): E = ½·C·V² lost at hard turn-on
    expectClose(outputCapacitanceLoss(capacitanceF, voltageV, frequencyHz), energyJ * frequencyHz, {
      rel: 1e-9,
    });
  });
});
