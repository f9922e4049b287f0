import type { FlybackDesign } from '../../design/design-schema.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { OperatingCorner } from '../topology.js';

/** One output's path as the lumped flyback sees it at one corner. */
export interface FlybackOutputPath {
  /** Load current at this corner, A. */
  currentA: number;
  /** Np/Nsk of this output (dimensionless). */
  turnsRatio: number;
  /** αk: this secondary's current over the primary-referred secondary current (dimensionless). */
  currentShare: number;
  /** Forward-voltage intercept of the rectifier, V (0 for a synchronous rectifier). */
  forwardVoltageV: number;
  /** Slope resistance of the diode or on-resistance of the synchronous rectifier, Ω. */
  rectifierResistanceOhm: number;
  /** Winding resistance at the ambient temperature, Ω. */
  windingResistanceOhm: number;
  /** Equivalent series resistance of the output capacitor, Ω. */
  capacitorEsrOhm: number;
}

/**
 * The lumped flyback of one operating corner, referred to the primary: every secondary is folded
 * into one equivalent output through the regulated output 0, each secondary current assumed to be
 * a scaled copy of one shape in proportion to its average current. Private to the flyback.
 */
export interface FlybackCircuit {
  /** Input voltage, V. */
  inputVoltageV: number;
  /** Switching period, s. */
  periodS: number;
  /** Magnetizing inductance, H. */
  magnetizingInductanceH: number;
  /** Primary-referred leakage inductance, H (0 allowed). */
  leakageInductanceH: number;
  /** Voltage across the clamp capacitor, above the input rail, V. */
  clampVoltageV: number;
  /**
   * Capacitance of the drain node that rings with Lm + Llk in the DCM idle interval: the switch's
   * output capacitance (the rectifiers are taken without capacitance), F.
   */
  drainCapacitanceF: number;
  /** Switch on-resistance plus primary winding resistance, Ω. */
  primaryLoopResistanceOhm: number;
  /** Reflected voltage at zero secondary current, n0·(Vo0 + Vf0 − ESR0·I0), V. */
  reflectedOffsetV: number;
  /** Slope of the reflected voltage against the primary-referred secondary current, Ω. */
  reflectedResistanceOhm: number;
  /** Average secondary current referred to the primary, Σ Ik/nk, A. */
  referredLoadCurrentA: number;
  outputs: FlybackOutputPath[];
}

/**
 * Returns the lumped circuit of `corner` for the given turns ratios and inductances. Loads are
 * the spec's full-load currents times the corner's load fraction; windings at the ambient.
 */
export function flybackCircuit(
  spec: Spec,
  choices: FlybackDesign['choices'],
  corner: OperatingCorner,
): FlybackCircuit {
  const outputs: FlybackOutputPath[] = [];
  let referredLoadCurrentA = 0;
  spec.outputs.forEach((output, k) => {
    const turnsRatio = choices.outputTurnsRatios[k] ?? choices.turnsRatio;
    const currentA = output.currentA * corner.loadFraction;
    referredLoadCurrentA += currentA / turnsRatio;
    const model = rectifierModel(output.rectifier);
    outputs.push({
      currentA,
      turnsRatio,
      currentShare: 0,
      forwardVoltageV: model.forwardVoltageV,
      rectifierResistanceOhm: model.resistanceOhm,
      windingResistanceOhm: windingResistanceOhm(choices, k),
      capacitorEsrOhm: output.capacitorEsrOhm,
    });
  });
  // αk = Ik / Σ(Ij/nj), so that Σ αk/nk = 1: the secondaries together carry the referred current.
  for (const path of outputs) path.currentShare = path.currentA / referredLoadCurrentA;
  const first = outputs[0];
  const regulated = spec.outputs[0];
  if (first === undefined || regulated === undefined) {
    throw new RangeError('flybackCircuit: the spec has no outputs');
  }
  const n0 = first.turnsRatio;
  return {
    inputVoltageV: corner.inputVoltageV,
    periodS: 1 / spec.switchingFrequencyHz,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    leakageInductanceH: choices.leakageInductanceH,
    clampVoltageV: choices.clampVoltageV,
    drainCapacitanceF: spec.primarySwitch.outputCapacitanceF,
    primaryLoopResistanceOhm: spec.primarySwitch.onResistanceOhm + choices.primaryResistanceOhm,
    // The regulated output fixes the reflected voltage. While the secondary conducts, the output
    // node sits at the capacitor voltage (Vo0, by charge balance) plus ESR0·(is0 − I0), so the
    // winding sees n0·(Vo0 + Vf0 − ESR0·I0 + (R0 + ESR0)·is0) with is0 = α0·i' (common practice:
    // the capacitor's ESR carries the AC part of the rectifier current).
    reflectedOffsetV:
      n0 * (regulated.voltageV + first.forwardVoltageV - first.capacitorEsrOhm * first.currentA),
    reflectedResistanceOhm:
      n0 *
      first.currentShare *
      (first.rectifierResistanceOhm + first.windingResistanceOhm + first.capacitorEsrOhm),
    referredLoadCurrentA,
    outputs,
  };
}

/** Output k's winding resistance at the ambient, Ω, as the choices carry it. */
function windingResistanceOhm(choices: FlybackDesign['choices'], k: number): number {
  const value = choices.outputWindingResistancesOhm[k];
  if (value === undefined)
    throw new RangeError(`flybackCircuit: no winding resistance for output ${k}`);
  return value;
}
