import type { ActiveClampForwardDesign } from '../../design/design-schema.js';
import { rectifierModel } from '../../devices/rectifier-model.js';
import type { Spec } from '../../spec/spec-schema.js';
import type { OutputStage } from '../buck-derived/output-stage.js';
import type { OperatingCorner } from '../topology.js';

/** What an active-clamp forward design chooses: the design's choices block. */
export type ActiveClampChoices = ActiveClampForwardDesign['choices'];

/** Clamp capacitor ESR when the spec gives none, Ω (common practice: a film or ceramic part). */
export const CLAMP_CAPACITOR_ESR_DEFAULT_OHM = 0.01;
/** Dead time at each edge between the two switches when the spec gives none, s (common practice). */
export const CLAMP_DEAD_TIME_DEFAULT_S = 100e-9;

/** The active-clamp forward at one corner, as the steady state sees it (SI units). */
export interface ActiveClampCircuit {
  inputVoltageV: number;
  periodS: number;
  magnetizingInductanceH: number;
  /** Primary-referred leakage inductance, H. */
  leakageInductanceH: number;
  /** Main switch on-resistance plus the primary winding resistance, Ω. */
  onLoopResistanceOhm: number;
  /** Auxiliary switch on-resistance, primary winding and clamp capacitor ESR, Ω. */
  clampLoopResistanceOhm: number;
  /** Dead time before the main switch turns on, over the period. */
  deadTimeFraction: number;
  /** Both switches' output capacitance, which the drain swings in the dead time, F. */
  switchNodeCapacitanceF: number;
  turnsRatios: readonly number[];
  stages: readonly OutputStage[];
}

/** Returns the auxiliary switch: the spec's, or the main switch's device when omitted. */
export function auxiliarySwitchOf(spec: Spec): Spec['primarySwitch'] {
  return spec.activeClamp?.auxiliarySwitch ?? spec.primarySwitch;
}

/** Returns the circuit of `corner`: the spec's devices, the chosen parts, the corner's load. */
export function activeClampCircuit(
  spec: Spec,
  choices: ActiveClampChoices,
  corner: OperatingCorner,
): ActiveClampCircuit {
  const periodS = 1 / spec.switchingFrequencyHz;
  const deadS = spec.activeClamp?.deadTimeS ?? CLAMP_DEAD_TIME_DEFAULT_S;
  return {
    inputVoltageV: corner.inputVoltageV,
    periodS,
    magnetizingInductanceH: choices.magnetizingInductanceH,
    leakageInductanceH: choices.leakageInductanceH,
    onLoopResistanceOhm: spec.primarySwitch.onResistanceOhm + choices.primaryResistanceOhm,
    clampLoopResistanceOhm:
      auxiliarySwitchOf(spec).onResistanceOhm +
      choices.primaryResistanceOhm +
      choices.clampCapacitorEsrOhm,
    deadTimeFraction: deadS / periodS,
    switchNodeCapacitanceF:
      spec.primarySwitch.outputCapacitanceF + auxiliarySwitchOf(spec).outputCapacitanceF,
    turnsRatios: choices.outputTurnsRatios,
    stages: spec.outputs.map((output, k) => ({
      loadA: output.currentA * corner.loadFraction,
      inductanceH: choices.outputInductancesH[k] ?? 0,
      inductorResistanceOhm: choices.outputInductorResistancesOhm[k] ?? 0,
      windingResistanceOhm: choices.outputWindingResistancesOhm[k] ?? 0,
      rectifier: rectifierModel(output.rectifier),
    })),
  };
}
