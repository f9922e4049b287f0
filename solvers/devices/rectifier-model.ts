import type { Rectifier } from '../spec/spec-schema.js';

/** The linear conduction model of an output rectifier: v = forwardVoltageV + resistanceOhm·i. */
export interface RectifierModel {
  /** Forward-voltage intercept, V (0 for a synchronous rectifier). */
  forwardVoltageV: number;
  /** Slope resistance of a diode or on-resistance of a synchronous rectifier, Ω. */
  resistanceOhm: number;
}

/** Returns the rectifier's linear conduction model; a synchronous rectifier is a plain resistor. */
export function rectifierModel(rectifier: Rectifier): RectifierModel {
  return rectifier.kind === 'diode'
    ? { forwardVoltageV: rectifier.forwardVoltageV, resistanceOhm: rectifier.resistanceOhm }
    : { forwardVoltageV: 0, resistanceOhm: rectifier.onResistanceOhm };
}
