import type { OutputStagePoint } from '../buck-derived/output-stage.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/**
 * Returns the steady state at duty cycle D from its solved parts, completed with the reset: the
 * winding voltage during reset (V) and the reset interval over the period (volt-second balance on
 * Lm: Dr = Lm·Im,pk/(Vr·T)).
 */
export function completeForwardState(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  commutationFraction: number,
  primaryVoltageV: number,
  magnetizingPeakA: number,
  points: OutputStagePoint[],
): TwoSwitchForwardState {
  const vin = circuit.inputVoltageV;
  // Two-switch: the winding sees −(Vin + 2·Vf + Rp·Im). Reset winding: −(Vin + Vf)·Np/Nr (its
  // own resistance is not modelled).
  const resetVoltageV =
    circuit.reset.kind === 'clamp-diodes'
      ? vin + 2 * circuit.clampDiodeV + (circuit.primaryResistanceOhm * magnetizingPeakA) / 2
      : (vin + circuit.clampDiodeV) / circuit.reset.resetTurnsRatio;
  return {
    dutyCycle,
    commutationFraction,
    primaryVoltageV,
    magnetizingPeakA,
    resetVoltageV,
    resetDutyCycle:
      (circuit.magnetizingInductanceH * magnetizingPeakA) / (resetVoltageV * circuit.periodS),
    points,
  };
}
