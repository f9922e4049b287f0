import { describe, expect, it } from 'vitest';
import { rectifierModel } from '../../../solvers/devices/rectifier-model.js';
import { RectifierSchema } from '../../../solvers/spec/spec-schema.js';

describe('rectifierModel', () => {
  it('rectifierModel(diode) is its forward-voltage intercept and slope resistance', () => {
    const diode = RectifierSchema.parse({
      kind: 'diode',
      forwardVoltageV: 0.45,
      resistanceOhm: 0.02,
    });
    // ref: Mohan, Undeland, Robbins, 3rd ed., ch. 2, linear diode model v = Vf + Rd·i (from memory)
    expect(rectifierModel(diode)).toEqual({ forwardVoltageV: 0.45, resistanceOhm: 0.02 });
  });

  it('rectifierModel(synchronous) is a resistor: no intercept, its on-resistance', () => {
    const sync = RectifierSchema.parse({ kind: 'synchronous', onResistanceOhm: 0.008 });
    // ref: common practice, a conducting MOSFET channel is resistive in both directions
    expect(rectifierModel(sync)).toEqual({ forwardVoltageV: 0, resistanceOhm: 0.008 });
  });
});
