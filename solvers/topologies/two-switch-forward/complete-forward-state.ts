import type { OutputStagePoint } from '../buck-derived/output-stage.js';
import type { TwoSwitchForwardCircuit, TwoSwitchForwardState } from './two-switch-forward-state.js';

/**
 * Returns the steady state at duty cycle D from its solved parts (the turn-on commutation and
 * the turn-off swing over the period), completed with the reset: the winding voltage during reset
 * (V) and the interval from the gate's turn-off until the magnetizing current is zero, the swing
 * plus the reset at Vr (volt-second balance on Lm: Dr = Lm·Im,pk/(Vr·T)).
 */
export function completeForwardState(
  circuit: TwoSwitchForwardCircuit,
  dutyCycle: number,
  edges: { commutation: number; swing: number },
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
    commutationFraction: edges.commutation,
    turnOffSwingFraction: edges.swing,
    stageDutyCycle: Math.max(dutyCycle - edges.commutation + edges.swing / 2, 1e-9),
    primaryVoltageV,
    magnetizingPeakA,
    resetVoltageV,
    resetDutyCycle:
      edges.swing +
      (circuit.magnetizingInductanceH * magnetizingPeakA) / (resetVoltageV * circuit.periodS),
    points,
  };
}
