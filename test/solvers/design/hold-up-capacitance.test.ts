import { describe, expect, it } from 'vitest';
import { holdUpCapacitance } from '../../../solvers/design/hold-up-capacitance.js';
import { expectClose } from '../../helpers/expect-close.js';

/**
 * Discharges `capacitanceF` from `startVoltageV` into a constant-power load for `timeS` by
 * fourth-order Runge–Kutta on dv/dt = −P/(C·v), and returns the final voltage, V.
 */
function constantPowerDischarge(
  capacitanceF: number,
  powerW: number,
  startVoltageV: number,
  timeS: number,
): number {
  const steps = 20_000;
  const h = timeS / steps;
  const slope = (voltageV: number) => -powerW / (capacitanceF * voltageV);
  let voltageV = startVoltageV;
  for (let step = 0; step < steps; step++) {
    const k1 = slope(voltageV);
    const k2 = slope(voltageV + (h / 2) * k1);
    const k3 = slope(voltageV + (h / 2) * k2);
    const k4 = slope(voltageV + h * k3);
    voltageV += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
  }
  return voltageV;
}

describe('holdUpCapacitance', () => {
  it('holdUpCapacitance(100 W, 20 ms, 300 V → 200 V) equals 2·P·t/(V1² − V2²) = 80 µF', () => {
    // ref: common practice: the energy a capacitor stores is ½·C·V², so supplying P for t between
    // V1 and V2 takes C = 2·P·t/(V1² − V2²) (the hold-up relation of off-line supply design, as in
    // Pressman, Billings, Morey, Switching Power Supply Design, 3rd ed., input stage; from memory)
    expectClose(
      holdUpCapacitance({ powerW: 100, timeS: 0.02, startVoltageV: 300, endVoltageV: 200 }),
      80e-6,
      { rel: 1e-12 },
    );
  });

  it('holdUpCapacitance(...) discharged into the constant-power load ends at the end voltage', () => {
    for (const duty of [
      { powerW: 250, timeS: 0.02, startVoltageV: 400, endVoltageV: 330 },
      { powerW: 60, timeS: 0.016, startVoltageV: 325, endVoltageV: 120 },
      { powerW: 5, timeS: 0.001, startVoltageV: 48, endVoltageV: 36 },
    ]) {
      const capacitanceF = holdUpCapacitance(duty);
      // ref: common practice: a capacitor's current is i = C·dv/dt and a constant-power load
      // draws i = P/v; integrated independently by fourth-order Runge–Kutta (error ≪ 1e-6 here)
      expectClose(
        constantPowerDischarge(capacitanceF, duty.powerW, duty.startVoltageV, duty.timeS),
        duty.endVoltageV,
        { rel: 1e-6 },
      );
    }
  });

  it('holdUpCapacitance throws RangeError when the voltage does not fall', () => {
    // ref: common practice: with Vend ≥ Vstart the capacitor gives up no energy
    expect(() =>
      holdUpCapacitance({ powerW: 10, timeS: 0.01, startVoltageV: 100, endVoltageV: 100 }),
    ).toThrow(RangeError);
    expect(() =>
      holdUpCapacitance({ powerW: 10, timeS: 0.01, startVoltageV: 90, endVoltageV: 100 }),
    ).toThrow(RangeError);
  });
});
